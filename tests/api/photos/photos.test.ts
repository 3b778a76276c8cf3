import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createApp } from '../../../api/src/app';
import { PHOTO_MAX_BYTES, PHOTO_MAX_MEGAPIXELS, PHOTO_THUMBNAIL_EDGE_PX } from '../../../shared/constants/photos';
import { makePlace, storeVisitUnderWay } from '../../support/planner-visits';
import { countRows, createActor } from '../../support/register';

// this file's own photo folder, known before the app reads its configuration
const photoDir = vi.hoisted(() => {
  const dir = `.data/photos-test-${process.pid}-${Date.now()}`;
  process.env.PHOTO_DIR = dir;
  return dir;
});

const app = createApp();
let technician: Awaited<ReturnType<typeof createActor>>;
let otherTechnician: Awaited<ReturnType<typeof createActor>>;
let planner: Awaited<ReturnType<typeof createActor>>;
let reliability: Awaited<ReturnType<typeof createActor>>;
let visitId: string;
let bankIds: string[];

beforeAll(async () => {
  technician = await createActor(['technician']);
  otherTechnician = await createActor(['technician']);
  planner = await createActor(['planner']);
  reliability = await createActor(['reliability']);
  const place = await makePlace(planner.actor);
  bankIds = place.banks.map((b) => b.id);
  ({ id: visitId } = await storeVisitUnderWay(place, technician.user.id));
}, 30_000);

afterAll(() => {
  fs.rmSync(photoDir, { recursive: true, force: true });
});

/** Every file in the photo folder. */
function storedFiles(): string[] {
  if (!fs.existsSync(photoDir)) return [];
  return fs.readdirSync(photoDir, { recursive: true, withFileTypes: true }).filter((e) => e.isFile()).map((e) => path.join(e.parentPath, e.name));
}

/** A 64 × 48 JPEG from a phone: camera make, GPS position, and "turn 90° clockwise to show". */
async function phoneJpeg(): Promise<Buffer> {
  const width = 64;
  const height = 48;
  const pixels = Buffer.alloc(width * height * 3);
  for (let i = 0; i < width * height; i += 1) pixels.set([(i * 7) % 256, (i * 3) % 256, 90], i * 3);
  return sharp(pixels, { raw: { width, height, channels: 3 } })
    .jpeg()
    .withMetadata({ orientation: 6 })
    .withExif({
      IFD0: { Make: 'Quellbrook', Model: 'Phone 7', Copyright: 'Technician' },
      IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '53/1 33/1 0/1', GPSLongitudeRef: 'E', GPSLongitude: '9/1 59/1 0/1' },
    })
    .toBuffer();
}

const upload = (caller: { auth: string }, bytes: Buffer, fields: Record<string, string>, filename = 'IMG_0042.jpg', contentType = 'image/jpeg') => {
  let req = request(app).post(`/api/visits/${visitId}/photos`).set('Authorization', caller.auth);
  for (const [name, value] of Object.entries(fields)) req = req.field(name, value);
  return req.attach('photo', bytes, { filename, contentType });
};

async function expectNothingStored(run: () => Promise<void>) {
  const rows = await countRows('photos');
  const files = storedFiles();
  await run();
  expect(await countRows('photos')).toBe(rows);
  expect(storedFiles()).toEqual(files);
}

describe('POST /api/visits/:visitId/photos', () => {
  it('when a technician of the visit sends a phone JPEG, then 201 and the stored copy is upright with no EXIF, GPS or other metadata', async () => {
    const original = await phoneJpeg();
    const before = await sharp(original).metadata();
    expect(before.exif).toBeDefined();
    expect(before.orientation).toBe(6);

    const res = await upload(technician, original, { clientId: crypto.randomUUID(), bankId: bankIds[0]!, caption: 'Bulged can, left row' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      visitId,
      bankId: bankIds[0],
      caption: 'Bulged can, left row',
      // turned upright from its orientation: 64 × 48 shown turned is 48 wide, 64 high
      widthPx: 48,
      heightPx: 64,
      url: `/api/photos/${res.body.id}`,
      thumbnailUrl: `/api/photos/${res.body.id}/thumbnail`,
      takenBy: { id: technician.user.id, name: technician.user.name },
    });

    const full = await request(app).get(res.body.url).set('Authorization', technician.auth);
    expect(full.status).toBe(200);
    const meta = await sharp(full.body as Buffer).metadata();
    expect(meta.format).toBe('jpeg');
    expect(meta.exif).toBeUndefined();
    expect(meta.xmp).toBeUndefined();
    expect(meta.iptc).toBeUndefined();
    expect(meta.orientation).toBeUndefined();
    expect([meta.width, meta.height]).toEqual([48, 64]);
    expect((full.body as Buffer).includes(Buffer.from('Quellbrook'))).toBe(false);
    expect(res.body.bytes).toBe((full.body as Buffer).length);

    // no copy with the metadata is kept anywhere: every stored file is metadata-free
    for (const file of storedFiles()) {
      expect((await sharp(fs.readFileSync(file)).metadata()).exif).toBeUndefined();
      expect(path.basename(file)).toMatch(/^[0-9a-f-]{36}(-thumb)?\.jpg$/);
    }
    const audit = await countAudit(res.body.id);
    expect(audit).toBe(1);
  }, 30_000);

  it('when the same clientId is sent twice, then one photo: 201, then 200 with the same photo, and no extra files', async () => {
    const clientId = crypto.randomUUID();
    const bytes = await phoneJpeg();
    const first = await upload(technician, bytes, { clientId });
    expect(first.status).toBe(201);
    const rows = await countRows('photos');
    const files = storedFiles();
    const again = await upload(technician, bytes, { clientId });
    expect(again.status).toBe(200);
    expect(again.body.id).toBe(first.body.id);
    expect(await countRows('photos')).toBe(rows);
    expect(storedFiles()).toEqual(files);
  }, 30_000);

  it('when five sends with one clientId arrive at once, then one photo and two files', async () => {
    const clientId = crypto.randomUUID();
    const bytes = await phoneJpeg();
    const rows = await countRows('photos');
    const files = storedFiles().length;
    const answers = await Promise.all(Array.from({ length: 5 }, () => upload(technician, bytes, { clientId })));
    expect(answers.map((a) => a.status).sort()).toEqual([200, 200, 200, 200, 201]);
    expect(new Set(answers.map((a) => a.body.id)).size).toBe(1);
    expect(await countRows('photos')).toBe(rows + 1);
    expect(storedFiles().length).toBe(files + 2);
  }, 60_000);

  it('when the file is one byte over the limit, then 413 naming the limit, and nothing is stored', async () => {
    const jpeg = await phoneJpeg();
    const big = Buffer.concat([jpeg, Buffer.alloc(PHOTO_MAX_BYTES + 1 - jpeg.length)]);
    expect(big.length).toBe(PHOTO_MAX_BYTES + 1);
    await expectNothingStored(async () => {
      const res = await upload(technician, big, { clientId: crypto.randomUUID() });
      expect(res.status).toBe(413);
      expect(res.body.error.code).toBe('file-too-large');
      expect(res.body.error.message).toContain('12 MB');
    });
    // exactly at the limit is taken
    const atLimit = Buffer.concat([jpeg, Buffer.alloc(PHOTO_MAX_BYTES - jpeg.length)]);
    expect((await upload(technician, atLimit, { clientId: crypto.randomUUID() })).status).toBe(201);
  }, 60_000);

  it('when the photo is a PNG, a WebP or an AVIF (HEIF), whatever its name says, then it is kept as a JPEG', async () => {
    const base = () => sharp({ create: { width: 40, height: 30, channels: 3, background: '#c9861a' } });
    for (const bytes of [await base().png().toBuffer(), await base().webp().toBuffer(), await base().avif().toBuffer()]) {
      const res = await upload(technician, bytes, { clientId: crypto.randomUUID() }, 'photo.txt', 'application/octet-stream');
      expect(res.status).toBe(201);
      expect([res.body.widthPx, res.body.heightPx]).toEqual([40, 30]);
      const full = await request(app).get(res.body.url).set('Authorization', technician.auth);
      expect((await sharp(full.body as Buffer).metadata()).format).toBe('jpeg');
    }
  }, 30_000);

  it('when a text file is renamed .jpg, then 415 not-an-image and nothing is stored', async () => {
    await expectNothingStored(async () => {
      const res = await upload(technician, Buffer.from('Bank DC1 looked fine.\n'), { clientId: crypto.randomUUID() }, 'photo.jpg', 'image/jpeg');
      expect(res.status).toBe(415);
      expect(res.body.error.code).toBe('not-an-image');
    });
  });

  it('when the image is an SVG, a GIF or a truncated JPEG, then 415 and nothing is stored', async () => {
    const svg = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script></svg>');
    const gif = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#336699' } }).gif().toBuffer();
    const jpeg = await phoneJpeg();
    await expectNothingStored(async () => {
      for (const bytes of [svg, gif, jpeg.subarray(0, Math.floor(jpeg.length / 2))]) {
        const res = await upload(technician, bytes, { clientId: crypto.randomUUID() });
        expect(res.status).toBe(415);
        expect(res.body.error.code).toBe('not-an-image');
      }
    });
  }, 30_000);

  it(`when the image has more than ${PHOTO_MAX_MEGAPIXELS} megapixels, then 413 naming the limit, and nothing is stored`, async () => {
    // 8000 × 6000 = 48 MP of one colour: a small file
    const huge = await sharp({ create: { width: 8000, height: 6000, channels: 3, background: '#808080' } }).png({ compressionLevel: 9 }).toBuffer();
    expect(huge.length).toBeLessThan(PHOTO_MAX_BYTES);
    await expectNothingStored(async () => {
      const res = await upload(technician, huge, { clientId: crypto.randomUUID() }, 'huge.png', 'image/png');
      expect(res.status).toBe(413);
      expect(res.body.error.code).toBe('image-too-large');
      expect(res.body.error.message).toContain(`${PHOTO_MAX_MEGAPIXELS} megapixels`);
    });
  }, 60_000);

  it('when a planner, a reliability engineer or a technician not on the visit sends a photo, then 403 and nothing is stored', async () => {
    const bytes = await phoneJpeg();
    await expectNothingStored(async () => {
      for (const caller of [planner, reliability, otherTechnician]) {
        const res = await upload(caller, bytes, { clientId: crypto.randomUUID() });
        expect([403, 404]).toContain(res.status);
        if (caller !== otherTechnician) expect(res.status).toBe(403);
      }
    });
    expect((await request(app).post(`/api/visits/${visitId}/photos`).attach('photo', bytes, 'a.jpg')).status).toBe(401);
  }, 30_000);

  it('when the fields are bad, then 400 naming the field and nothing is stored', async () => {
    const bytes = await phoneJpeg();
    await expectNothingStored(async () => {
      const noId = await upload(technician, bytes, {});
      expect(noId.status).toBe(400);
      expect(noId.body.error.issues[0].path).toBe('clientId');
      const otherBank = await upload(technician, bytes, { clientId: crypto.randomUUID(), bankId: crypto.randomUUID() });
      expect(otherBank.status).toBe(400);
      expect(otherBank.body.error.issues[0].path).toBe('bankId');
      const noFile = await request(app).post(`/api/visits/${visitId}/photos`).set('Authorization', technician.auth).field('clientId', crypto.randomUUID());
      expect(noFile.status).toBe(400);
      expect(noFile.body.error.issues[0].path).toBe('photo');
    });
  }, 30_000);
});

describe('GET /api/photos/:photoId and /thumbnail', () => {
  it('when read, then a JPEG shown inline under a generated name, nosniff, private; the thumbnail fits 320 px', async () => {
    const made = await upload(technician, await phoneJpeg(), { clientId: crypto.randomUUID() }, '../../etc/passwd.jpg');
    expect(made.status).toBe(201);
    for (const [url, suffix] of [
      [made.body.url, ''],
      [made.body.thumbnailUrl, '-thumbnail'],
    ] as const) {
      const res = await request(app).get(url).set('Authorization', planner.auth);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('image/jpeg');
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      expect(res.headers['cache-control']).toMatch(/^private/);
      expect(res.headers['content-disposition']).toMatch(new RegExp(`^inline; filename="ebbline-photo-\\d{8}-${made.body.id.slice(0, 8)}${suffix}\\.jpg"$`));
      expect(res.headers['content-disposition']).not.toContain('passwd');
      const meta = await sharp(res.body as Buffer).metadata();
      expect(Math.max(meta.width ?? 0, meta.height ?? 0)).toBeLessThanOrEqual(PHOTO_THUMBNAIL_EDGE_PX);
    }
  }, 30_000);

  it('when the visit\'s photos are listed, then newest first, for every role that reads the visit; unknown photo 404', async () => {
    const list = await request(app).get(`/api/visits/${visitId}/photos`).set('Authorization', reliability.auth);
    expect(list.status).toBe(200);
    expect(list.body.items.length).toBe(await countRows('photos'));
    const times = list.body.items.map((p: { createdAt: string }) => p.createdAt);
    expect([...times].sort().reverse()).toEqual(times);
    expect((await request(app).get(`/api/photos/${crypto.randomUUID()}`).set('Authorization', planner.auth)).status).toBe(404);
    // a technician neither on the visit nor at its site does not see it
    expect((await request(app).get(`/api/visits/${visitId}/photos`).set('Authorization', otherTechnician.auth)).status).toBe(404);
    const someone = list.body.items[0];
    expect((await request(app).get(someone.url).set('Authorization', otherTechnician.auth)).status).toBe(404);
  }, 30_000);
});

async function countAudit(photoId: string): Promise<number> {
  const { sequelize } = await import('../../../api/src/db/sequelize');
  const [rows] = (await sequelize.query("SELECT count(*)::int AS n FROM audit_entries WHERE entity_type = 'photo' AND entity_id = :photoId AND action = 'create'", {
    replacements: { photoId },
  })) as [Array<{ n: number }>, unknown];
  return rows[0]!.n;
}

