import fs from 'node:fs';
import fc from 'fast-check';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createApp } from '../../../api/src/app';
import { hostileValue } from '../../support/hostile-bodies';
import { makePlace, storeVisitUnderWay } from '../../support/planner-visits';
import { countRows, createActor } from '../../support/register';

const photoDir = vi.hoisted(() => {
  const dir = `.data/photos-test-writes-${process.pid}-${Date.now()}`;
  process.env.PHOTO_DIR = dir;
  return dir;
});

const app = createApp();
let technician: Awaited<ReturnType<typeof createActor>>;
let visitId: string;
let bankId: string;
let jpeg: Buffer;

beforeAll(async () => {
  technician = await createActor(['technician']);
  const planner = await createActor(['planner']);
  const place = await makePlace(planner.actor);
  bankId = place.banks[0]!.id;
  ({ id: visitId } = await storeVisitUnderWay(place, technician.user.id));
  jpeg = await sharp({ create: { width: 16, height: 12, channels: 3, background: '#2f7f86' } }).jpeg().toBuffer();
}, 30_000);

afterAll(() => fs.rmSync(photoDir, { recursive: true, force: true }));

function fileCount(): number {
  if (!fs.existsSync(photoDir)) return 0;
  return fs.readdirSync(photoDir, { recursive: true, withFileTypes: true }).filter((e) => e.isFile()).length;
}

async function state() {
  return { photos: await countRows('photos'), audit: await countRows('audit_entries'), files: fileCount() };
}

const asFieldText = (v: unknown) => (typeof v === 'string' ? v : (JSON.stringify(v) ?? ''));

/** A form field's value: valid, hostile, or very long. */
const fieldValue = (valid: fc.Arbitrary<string>) =>
  fc.oneof(valid, hostileValue.map(asFieldText), fc.string({ unit: 'binary', maxLength: 40 }), fc.constant('x'.repeat(5000)));

const form = fc.record(
  {
    clientId: fieldValue(fc.uuid()),
    bankId: fieldValue(fc.constant('__BANK__')),
    caption: fieldValue(fc.string({ maxLength: 80 })),
    extra: fc.array(fc.tuple(fc.constantFrom('clientId', 'note', '__proto__', 'constructor', 'photo[]'), fc.string({ maxLength: 20 })), { maxLength: 5 }),
    file: fc.oneof(
      fc.constant<'jpeg' | 'none'>('jpeg'),
      fc.constant<'jpeg' | 'none'>('none'),
      fc.uint8Array({ maxLength: 600 }).map((a) => Buffer.from(a)),
      fc.uint8Array({ maxLength: 200 }).map((a) => Buffer.concat([jpeg.subarray(0, 40), Buffer.from(a)])),
    ),
    fileName: fc.oneof(fc.constant('IMG_1.jpg'), fc.constant('../../../etc/passwd'), fc.string({ unit: 'binary', maxLength: 30 })),
  },
  { requiredKeys: ['file', 'fileName', 'extra'] },
);

describe('POST /api/visits/:visitId/photos, hostile forms', () => {
  it('when 300 hostile forms are sent, then never a 5xx, and a refusal stores nothing (row, audit entry or file)', async () => {
    let before = await state();
    const tally: Record<number, number> = {};
    await fc.assert(
      fc.asyncProperty(form, async (f) => {
        let req = request(app).post(`/api/visits/${visitId}/photos`).set('Authorization', technician.auth);
        for (const name of ['clientId', 'bankId', 'caption'] as const) {
          const value = f[name];
          if (value !== undefined) req = req.field(name, value === '__BANK__' ? bankId : value);
        }
        for (const [name, value] of f.extra) req = req.field(name, value);
        if (f.file !== 'none') req = req.attach('photo', f.file === 'jpeg' ? jpeg : f.file, { filename: f.fileName || 'x', contentType: 'image/jpeg' });
        const res = await req;
        tally[res.status] = (tally[res.status] ?? 0) + 1;
        const what = `${JSON.stringify(f).slice(0, 300)} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`;
        expect(res.status, what).toBeLessThan(500);
        if (res.status >= 400) {
          expect(res.body.error?.code, what).toEqual(expect.any(String));
          expect(await state(), `refused yet stored: ${what}`).toEqual(before);
        } else {
          before = await state();
        }
      }),
      { numRuns: 300 },
    );
    // the corpus reached both sides: some photos made, many refused
    expect(Object.keys(tally).some((s) => Number(s) < 300)).toBe(true);
    expect(Object.keys(tally).some((s) => Number(s) >= 400)).toBe(true);
  }, 300_000);
});
