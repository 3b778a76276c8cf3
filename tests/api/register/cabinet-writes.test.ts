/**
 * Every write of the cabinet routes against careless and hostile input: a change changes only
 * what it names, a unique clash is a 409 naming the field, and a corpus of bodies never gets a
 * 5xx and stores nothing when refused.
 */
import fc from 'fast-check';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { CABINET_IMPORT_COLUMNS } from '../../../shared/schemas/cabinet-import';
import { createCaller } from '../../support/auth';
import { assertChangesOnlyWhatTheyName } from '../../support/change-property';
import {
  assertCorpusHolds,
  CURRENT_VERSION,
  hostileValue,
  storedState,
} from '../../support/hostile-bodies';
import {
  cabinetBody as cabinetBodyIn,
  designBody,
  nextSerial,
  postCreated,
  someText,
  somePastDate,
  targetAt,
  type Answered,
  expectOneWinnerRestDuplicate,
} from '../../support/register-http';

const app = createApp();
let admin: Record<string, string>;
let site: Answered;
let areaIds: string[];
let designId: string;

const created = (path: string, body: object) => postCreated(app, admin, path, body);
const cabinetBody = (overrides: object = {}) => cabinetBodyIn(areaIds[0]!, overrides);
const targetOf = (path: string) => targetAt(app, admin, path);

beforeAll(async () => {
  admin = { Authorization: (await createCaller(['admin'])).auth };
  site = await created('/api/sites', {
    name: 'Cabinet Writes Works',
    code: 'CW',
    timeZone: 'Europe/London',
  });
  areaIds = [];
  for (const name of ['Hall A', 'Hall B', 'Hall C'])
    areaIds.push((await created(`/api/sites/${site.id}/areas`, { name })).id);
  designId = (await created('/api/bank-designs', designBody())).id;
}, 30_000);

describe('PATCH /api/cabinets/:id changes only what it names', () => {
  it('when a change names any one field, then every other field stays as it was', async () => {
    const cabinet = await created('/api/cabinets', cabinetBody());
    await assertChangesOnlyWhatTheyName(app, {
      path: `/api/cabinets/${cabinet.id}`,
      headers: admin,
      fields: {
        areaId: fc.constantFrom(...areaIds),
        tag: fc.integer({ min: 1, max: 1_000_000 }).map((n) => `CW-MOVED-${n}-${nextSerial()}`),
        location: someText(200),
        driveMake: someText(80),
        driveModel: someText(80),
        // any supply and bus of these stay within 1.2–1.5 × (530/440 to 560/400): no question asked
        supplyVolts: fc.integer({ min: 400, max: 440 }),
        dcBusVolts: fc.integer({ min: 530, max: 560 }),
        ratedPowerKilowatts: fc.double({ min: 0.1, max: 5000, noNaN: true }),
        markedWaitMinutes: fc.integer({ min: 1, max: 240 }),
        criticality: fc.constantFrom('low', 'medium', 'high', 'critical'),
        environmentNotes: someText(1000),
        commissionedOn: somePastDate,
        status: fc.constantFrom('in-service', 'out-of-service'),
      },
      follows: { areaId: ['areaName'] },
    });
  }, 120_000);

  it('when a change names only the location, then the safety data stays (the marked wait, DC bus, commissioning, power, model, criticality)', async () => {
    const cabinet = await created('/api/cabinets', cabinetBody());
    const res = await request(app)
      .patch(`/api/cabinets/${cabinet.id}`)
      .set(admin)
      .send({ version: cabinet.version, location: 'Bay 9' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      location: 'Bay 9',
      markedWaitMinutes: 7,
      dcBusVolts: 540,
      commissionedOn: '2018-06-11',
      ratedPowerKilowatts: 90,
      driveModel: 'TW-90',
      criticality: 'high',
      status: 'out-of-service',
    });
  });
});

describe('unique clashes', () => {
  it('when 20 people add the same cabinet tag at once, then one gets 201 and nineteen get 409 naming tag', async () => {
    const body = cabinetBody({ tag: 'CW-RACE-0001' });
    const answers = await Promise.all(
      Array.from({ length: 20 }, () => request(app).post('/api/cabinets').set(admin).send(body)),
    );
    expectOneWinnerRestDuplicate(answers, 201, 'tag');
  }, 60_000);

  it('when 10 people rename cabinets to one tag at once, then one change is saved and the rest get 409 naming tag', async () => {
    const cabinets = await Promise.all(
      Array.from({ length: 10 }, () => created('/api/cabinets', cabinetBody())),
    );
    const answers = await Promise.all(
      cabinets.map((c) =>
        request(app)
          .patch(`/api/cabinets/${c.id}`)
          .set(admin)
          .send({ version: c.version, tag: 'CW-RACE-0002' }),
      ),
    );
    expectOneWinnerRestDuplicate(answers, 200, 'tag');
  }, 60_000);
});

describe('text and dates PostgreSQL cannot store', () => {
  it.each([
    ['a NUL in the location', { location: 'Bay\u00003' }, 'location'],
    ['a lone surrogate in the drive model', { driveModel: 'TW-\uD800' }, 'driveModel'],
    ['a lone low surrogate in the notes', { environmentNotes: '\uDC00 damp' }, 'environmentNotes'],
    ['the year 0000', { commissionedOn: '0000-01-01' }, 'commissionedOn'],
    ['the year 9999', { commissionedOn: '9999-12-31' }, 'commissionedOn'],
    ['a marked wait of 0 minutes', { markedWaitMinutes: 0 }, 'markedWaitMinutes'],
  ])(
    'when a new cabinet has %s, then 400 naming the field and nothing stored',
    async (_what, overrides, field) => {
      const before = await storedState();
      const res = await request(app).post('/api/cabinets').set(admin).send(cabinetBody(overrides));
      expect(res.status).toBe(400);
      expect(res.body.error.issues).toEqual([expect.objectContaining({ path: field })]);
      expect(await storedState()).toEqual(before);
    },
  );

  it('when the JSON text itself carries \\u0000 and \\ud800 escapes, then they reach the check: 400 naming each field', async () => {
    const text = JSON.stringify(cabinetBody())
      .replace('"Bay 3"', '"Bay\\u00003"')
      .replace('"TW-90"', '"TW\\ud800"');
    const res = await request(app)
      .post('/api/cabinets')
      .set(admin)
      .set('Content-Type', 'application/json')
      .send(text);
    expect(res.status).toBe(400);
    expect(res.body.error.issues.map((i: { path: string }) => i.path).sort()).toEqual([
      'driveModel',
      'location',
    ]);
  });

  it('when the marked wait is left empty, then it is saved as not marked', async () => {
    const res = await request(app)
      .post('/api/cabinets')
      .set(admin)
      .send(cabinetBody({ markedWaitMinutes: null }));
    expect(res.status).toBe(201);
    expect(res.body.markedWaitMinutes).toBeNull();
  });
});

describe('a corpus of hostile bodies never gets a 5xx and stores nothing when refused', () => {
  it('POST /api/cabinets', async () => {
    const tally = await assertCorpusHolds(
      app,
      { method: 'post', path: '/api/cabinets', headers: admin },
      cabinetBody(),
    );
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);

  it('PATCH /api/cabinets/:id', async () => {
    const cabinet = await created('/api/cabinets', cabinetBody());
    const path = `/api/cabinets/${cabinet.id}`;
    const tally = await assertCorpusHolds(
      app,
      { method: 'patch', path, headers: admin, target: targetOf(path) },
      {
        ...cabinetBody(),
        version: CURRENT_VERSION,
      },
    );
    expect(tally[200]).toBeGreaterThan(0);
  }, 300_000);

  it('POST /api/cabinets/:id/banks', async () => {
    const cabinet = await created('/api/cabinets', cabinetBody());
    const tally = await assertCorpusHolds(
      app,
      { method: 'post', path: `/api/cabinets/${cabinet.id}/banks`, headers: admin },
      {
        bankDesignId: designId,
        position: 'DC1',
        serialNumber: 'SN-1',
        installedOn: '2020-01-15',
        notes: '',
      },
    );
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);

  it('DELETE /api/cabinets/:id (the version in the query)', async () => {
    const cabinet = await created('/api/cabinets', cabinetBody());
    const path = `/api/cabinets/${cabinet.id}`;
    await assertCorpusHolds(
      app,
      {
        method: 'delete',
        path: (version) => `${path}?version=${version}`,
        headers: admin,
        target: targetOf(path),
      },
      {},
    );
  }, 300_000);

  describe('imports', () => {
    const header = CABINET_IMPORT_COLUMNS.map((c) => c.name);
    const cell = (value: unknown) => {
      const text = typeof value === 'string' ? value : (JSON.stringify(value) ?? '');
      return /[",\n\r]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
    };
    const validRow = (n: number): Record<string, unknown> => ({
      site_code: site.code,
      area: n % 3 === 0 ? `Imported hall ${n}` : 'Hall A',
      tag: `CW-IMP-${n}`,
      location: 'Bay 1',
      drive_make: 'Tarnwick',
      drive_model: 'TW-55',
      supply_volts: '400',
      dc_bus_volts: '540',
      rated_power_kw: '55',
      marked_wait_minutes: '5',
      criticality: 'medium',
      environment_notes: '',
      commissioned_on: '2019-04-01',
      status: 'in-service',
    });
    const row = (n: number) =>
      fc.record(
        Object.fromEntries(
          header.map((name) => [
            name,
            fc.oneof(
              { weight: 4, arbitrary: fc.constant(validRow(n)[name]) },
              { weight: 1, arbitrary: hostileValue },
            ),
          ]),
        ),
      );
    const file = fc.oneof(
      {
        weight: 8,
        arbitrary: fc
          .tuple(
            fc.shuffledSubarray(header, { minLength: 1 }),
            fc.array(fc.nat(), { minLength: 0, maxLength: 4 }),
          )
          .chain(([columns, ns]) =>
            fc
              .tuple(...ns.map((n) => row(n + nextSerial())))
              .map((rows) =>
                [
                  columns.join(','),
                  ...rows.map((r) => columns.map((c) => cell(r[c])).join(',')),
                ].join('\r\n'),
              ),
          ),
      },
      // a good file now and then, so that a commit goes through and later rows clash with it
      {
        weight: 1,
        arbitrary: fc
          .integer({ min: 1, max: 3 })
          .map((count) =>
            [
              header.join(','),
              ...Array.from({ length: count }, () => validRow(nextSerial())).map((r) =>
                header.map((c) => cell(r[c])).join(','),
              ),
            ].join('\r\n'),
          ),
      },
      { weight: 1, arbitrary: fc.string({ maxLength: 400 }) },
      {
        weight: 1,
        arbitrary: fc
          .uint8Array({ maxLength: 400 })
          .map((bytes) => Buffer.from(bytes).toString('latin1')),
      },
    );

    it.each(['/api/cabinets/import/preview', '/api/cabinets/import'])(
      'POST %s',
      async (path) => {
        const tally: Record<number, number> = {};
        await fc.assert(
          fc.asyncProperty(
            file,
            fc.constantFrom('register.csv', 'x.txt', '', '../../etc/passwd', 'a\u0000.csv'),
            async (csv, name) => {
              const before = await storedState();
              const res = await request(app)
                .post(path)
                .set(admin)
                .attach('file', Buffer.from(csv, 'utf8'), {
                  filename: name || 'f',
                  contentType: 'text/csv',
                });
              tally[res.status] = (tally[res.status] ?? 0) + 1;
              const what = `${path} ${JSON.stringify(csv).slice(0, 300)} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`;
              expect(res.status, what).toBeLessThan(500);
              if (res.status >= 400 || path.endsWith('preview'))
                expect(await storedState(), what).toEqual(before);
            },
          ),
          { numRuns: 1000, endOnFailure: true },
        );
        expect(Object.keys(tally).some((s) => Number(s) < 300)).toBe(true);
      },
      300_000,
    );
  });
});
