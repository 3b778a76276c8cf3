/**
 * Every write of the bank design routes against careless and hostile input: a change changes
 * only what it names, a code clash is a 409 naming code, and a corpus of bodies never gets a
 * 5xx and stores nothing when refused.
 */
import fc from 'fast-check';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { createCaller } from '../../support/auth';
import { assertChangesOnlyWhatTheyName } from '../../support/change-property';
import { assertCorpusHolds, CURRENT_VERSION } from '../../support/hostile-bodies';
import {
  designBody,
  nextSerial,
  postCreated,
  someText,
  targetAt,
  expectOneWinnerRestDuplicate,
} from '../../support/register-http';

const app = createApp();
let admin: Record<string, string>;

const created = (path: string, body: object) => postCreated(app, admin, path, body);

beforeAll(async () => {
  admin = { Authorization: (await createCaller(['admin'])).auth };
}, 30_000);

/** What a new revision brings besides the field changed. */
const REVISION = [
  'revision',
  'revisionId',
  'nominalCapacitanceMicrofarads',
  'nominalTauSeconds',
  'bankRatedVolts',
];

describe('a change changes only what it names', () => {
  it('when a design change names any one field, then every other field stays as it was', async () => {
    const design = await created('/api/bank-designs', designBody());
    const technical = {
      technology: fc.constantFrom('electrolytic', 'film'),
      unitCapacitanceMicrofarads: fc.integer({ min: 10, max: 20_000 }),
      unitRatedVolts: fc.integer({ min: 200, max: 1200 }),
      seriesCount: fc.integer({ min: 1, max: 12 }),
      parallelCount: fc.integer({ min: 1, max: 100 }),
      bleederOhms: fc.integer({ min: 1000, max: 1_000_000 }),
      capacitanceTolerancePercent: fc.integer({ min: 1, max: 50 }),
      tempCoefficientPercentPerKelvin: fc.double({ min: -5, max: 5, noNaN: true }),
      ratedLifeHours: fc.integer({ min: 1, max: 1_000_000 }),
      ratedLifeCelsius: fc.integer({ min: 20, max: 150 }),
      // always above any end-of-life limit sent, and the other way round
      watchRatio: fc.double({ min: 0.9, max: 1, noNaN: true }),
      endOfLifeRatio: fc.double({ min: 0.3, max: 0.85, noNaN: true }),
      inspectionIntervalDays: fc.integer({ min: 1, max: 3650 }),
    };
    await assertChangesOnlyWhatTheyName(app, {
      path: `/api/bank-designs/${design.id}`,
      headers: admin,
      fields: {
        code: fc.integer({ min: 1, max: 99_999 }).map((n) => `WDX-${n}-${nextSerial()}`),
        name: someText(160),
        notes: someText(2000),
        ...technical,
      },
      follows: Object.fromEntries(Object.keys(technical).map((field) => [field, REVISION])),
    });
  }, 120_000);
});

describe('unique clashes', () => {
  it('when 10 people add designs with one code at once, then one 201 and nine 409 naming code', async () => {
    const body = designBody({ code: 'RACE-DESIGN' });
    const answers = await Promise.all(
      Array.from({ length: 10 }, () =>
        request(app).post('/api/bank-designs').set(admin).send(body),
      ),
    );
    expectOneWinnerRestDuplicate(answers, 201, 'code');
  }, 60_000);
});

describe('a corpus of hostile bodies never gets a 5xx and stores nothing when refused', () => {
  it('POST /api/bank-designs', async () => {
    const tally = await assertCorpusHolds(
      app,
      { method: 'post', path: '/api/bank-designs', headers: admin },
      designBody(),
    );
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);

  it('PATCH /api/bank-designs/:id', async () => {
    const path = `/api/bank-designs/${(await created('/api/bank-designs', designBody())).id}`;
    const tally = await assertCorpusHolds(
      app,
      { method: 'patch', path, headers: admin, target: targetAt(app, admin, path) },
      {
        ...designBody({ watchRatio: 0.92, endOfLifeRatio: 0.82, inspectionIntervalDays: 180 }),
        changeNote: 'Maker’s new sheet',
        version: CURRENT_VERSION,
      },
    );
    expect(tally[200]).toBeGreaterThan(0);
  }, 300_000);

  it('DELETE /api/bank-designs/:id (the version in the query)', async () => {
    const path = `/api/bank-designs/${(await created('/api/bank-designs', designBody())).id}`;
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
