/**
 * Every write of the bank routes against careless and hostile input: a change changes only
 * what it names, two banks cannot take one position at once, and a corpus of bodies never gets
 * a 5xx and stores nothing when refused.
 */
import fc from 'fast-check';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { createCaller } from '../../support/auth';
import { assertChangesOnlyWhatTheyName } from '../../support/change-property';
import {
  assertCorpusHolds,
  CURRENT_VERSION,
  type CorpusTarget,
} from '../../support/hostile-bodies';
import {
  bankBody,
  cabinetBody,
  designBody,
  nextSerial,
  postCreated,
  siteBody,
  someText,
  somePastDate,
  targetAt,
  type Answered,
  expectOneWinnerRestDuplicate,
} from '../../support/register-http';

const app = createApp();
let admin: Record<string, string>;
let cabinet: Answered;
let designIds: string[];

const created = (path: string, body: object) => postCreated(app, admin, path, body);

beforeAll(async () => {
  admin = { Authorization: (await createCaller(['admin'])).auth };
  const site = await created('/api/sites', siteBody());
  const area = await created(`/api/sites/${site.id}/areas`, { name: 'Bank hall' });
  cabinet = await created('/api/cabinets', cabinetBody(area.id));
  designIds = [];
  for (const overrides of [
    {},
    { unitCapacitanceMicrofarads: 3300, parallelCount: 4, bleederOhms: 68_000 },
    { technology: 'film', unitRatedVolts: 1100, seriesCount: 1 },
  ]) {
    designIds.push((await created('/api/bank-designs', designBody(overrides))).id);
  }
}, 30_000);

/** The bank in service at `position` of the test cabinet (a replacement puts a new one there). */
function bankInServiceAt(position: string) {
  return async (): Promise<CorpusTarget> => {
    const res = await request(app).get(`/api/cabinets/${cabinet.id}/banks`).set(admin);
    const bank = (
      res.body.items as Array<{ id: string; version: number; position: string; status: string }>
    ).find((b) => b.position === position && b.status === 'in-service')!;
    return { id: bank.id, version: bank.version };
  };
}

describe('a change changes only what it names', () => {
  it('when a bank change names any one field, then every other field stays as it was', async () => {
    const bank = await created(`/api/cabinets/${cabinet.id}/banks`, bankBody(designIds[0]!));
    await assertChangesOnlyWhatTheyName(app, {
      path: `/api/banks/${bank.id}`,
      headers: admin,
      fields: {
        bankDesignId: fc.constantFrom(...designIds),
        position: someText(40).map((s) => `${s} ${nextSerial()}`),
        serialNumber: someText(80),
        installedOn: somePastDate,
        notes: someText(2000),
      },
      // a corrected design brings its own figures and (for a nameplate baseline) its baseline
      follows: {
        bankDesignId: [
          'bankDesignCode',
          'bankDesignName',
          'technology',
          'designRevision',
          'nominalCapacitanceMicrofarads',
          'designFigures',
          'baseline',
          'lineage',
        ],
        position: ['lineage'],
        serialNumber: ['lineage'],
        installedOn: ['lineage'],
      },
    });
  }, 120_000);
});

describe('unique clashes', () => {
  it('when 10 people add a bank at one position of a cabinet at once, then one 201 and nine 409 naming position', async () => {
    const body = bankBody(designIds[0]!, { position: 'RACE-DC' });
    const answers = await Promise.all(
      Array.from({ length: 10 }, () =>
        request(app).post(`/api/cabinets/${cabinet.id}/banks`).set(admin).send(body),
      ),
    );
    expectOneWinnerRestDuplicate(answers, 201, 'position');
  }, 60_000);
});

describe('a corpus of hostile bodies never gets a 5xx and stores nothing when refused', () => {
  it('POST /api/banks', async () => {
    const tally = await assertCorpusHolds(
      app,
      { method: 'post', path: '/api/banks', headers: admin },
      { ...bankBody(designIds[0]!), cabinetId: cabinet.id },
    );
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);

  it('PATCH /api/banks/:id', async () => {
    const path = `/api/banks/${(await created(`/api/cabinets/${cabinet.id}/banks`, bankBody(designIds[0]!))).id}`;
    const tally = await assertCorpusHolds(
      app,
      { method: 'patch', path, headers: admin, target: targetAt(app, admin, path) },
      {
        ...bankBody(designIds[1]!),
        version: CURRENT_VERSION,
      },
    );
    expect(tally[200]).toBeGreaterThan(0);
  }, 300_000);

  it('PUT /api/banks/:id/baseline', async () => {
    const path = `/api/banks/${(await created(`/api/cabinets/${cabinet.id}/banks`, bankBody(designIds[0]!))).id}`;
    const tally = await assertCorpusHolds(
      app,
      {
        method: 'put',
        path: `${path}/baseline`,
        headers: admin,
        target: targetAt(app, admin, path),
      },
      {
        version: CURRENT_VERSION,
        source: 'manual',
        // 47 kΩ × 94 µF = 4.42 s: τ within 30 % of R × C
        tauSeconds: 4.3,
        capacitanceMicrofarads: 94,
        note: 'Commissioning measurement',
      },
    );
    expect(tally[200]).toBeGreaterThan(0);
  }, 300_000);

  it('POST /api/banks/:id/replacement', async () => {
    const position = `REPL-${nextSerial()}`;
    await created(`/api/cabinets/${cabinet.id}/banks`, bankBody(designIds[0]!, { position }));
    const tally = await assertCorpusHolds(
      app,
      {
        method: 'post',
        path: (_q, target) => `/api/banks/${target.id}/replacement`,
        headers: admin,
        target: bankInServiceAt(position),
      },
      {
        version: CURRENT_VERSION,
        bankDesignId: designIds[1],
        serialNumber: 'SN-NEW',
        installedOn: '2024-05-02',
        note: 'Bulged cans',
      },
    );
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);

  it('DELETE /api/banks/:id (the version in the query)', async () => {
    const path = `/api/banks/${(await created(`/api/cabinets/${cabinet.id}/banks`, bankBody(designIds[0]!))).id}`;
    await assertCorpusHolds(
      app,
      {
        method: 'delete',
        path: (q) => `${path}?version=${q}`,
        headers: admin,
        target: targetAt(app, admin, path),
      },
      {},
    );
  }, 300_000);
});
