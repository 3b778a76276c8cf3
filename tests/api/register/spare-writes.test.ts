/**
 * Every write of the spare routes against careless and hostile input: a change changes only
 * what it names ("Reformed today" keeps the design), and a corpus of bodies never gets a 5xx
 * and stores nothing when refused.
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
  siteBody,
  someText,
  spareBody,
  targetAt,
  type Answered,
} from '../../support/register-http';

const app = createApp();
let admin: Record<string, string>;
let sites: Answered[];
let designId: string;

const created = (path: string, body: object) => postCreated(app, admin, path, body);
const dateIn = (from: string, days: number) =>
  fc
    .integer({ min: 0, max: days })
    .map((d) => new Date(Date.parse(from) + d * 86_400_000).toISOString().slice(0, 10));

beforeAll(async () => {
  admin = { Authorization: (await createCaller(['admin'])).auth };
  sites = [await created('/api/sites', siteBody()), await created('/api/sites', siteBody())];
  designId = (await created('/api/bank-designs', designBody())).id;
}, 30_000);

describe('a change changes only what it names', () => {
  it('when a spare change names any one field, then every other field stays as it was', async () => {
    const spare = await created('/api/spares', spareBody(sites[0]!.id, { bankDesignId: designId }));
    const due = ['reformingDueOn', 'reformingOverdue'];
    await assertChangesOnlyWhatTheyName(app, {
      path: `/api/spares/${spare.id}`,
      headers: admin,
      fields: {
        code: fc.integer({ min: 1, max: 99_999 }).map((n) => `WSX-${n}-${nextSerial()}`),
        kind: fc.constantFrom('bank', 'drive'),
        description: someText(200),
        siteId: fc.constantFrom(...sites.map((s) => s.id)),
        bankDesignId: fc.constantFrom(designId, null),
        storageLocation: someText(200),
        // into store always before the last reforming, so the pair stays in order
        storageStartedOn: dateIn('2015-01-01', 3000),
        lastReformedOn: dateIn('2024-06-01', 500),
        reformingIntervalDays: fc.integer({ min: 1, max: 3650 }),
        status: fc.constantFrom('in-store', 'issued'),
        notes: someText(2000),
      },
      follows: {
        siteId: ['siteName'],
        bankDesignId: ['bankDesignCode'],
        storageStartedOn: due,
        lastReformedOn: due,
        reformingIntervalDays: due,
      },
    });
  }, 120_000);

  it('when "Reformed today" sends the version and the date alone, then the design, interval and notes stay', async () => {
    const spare = await created('/api/spares', spareBody(sites[0]!.id, { bankDesignId: designId }));
    const today = new Date().toISOString().slice(0, 10);
    const res = await request(app)
      .patch(`/api/spares/${spare.id}`)
      .set(admin)
      .send({ version: spare.version, lastReformedOn: today });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      lastReformedOn: today,
      bankDesignId: designId,
      reformingIntervalDays: 200,
      status: 'in-store',
      storageLocation: 'Store A',
      notes: 'Shelf 2',
    });
  });
});

describe('a corpus of hostile bodies never gets a 5xx and stores nothing when refused', () => {
  it('POST /api/spares', async () => {
    const tally = await assertCorpusHolds(
      app,
      { method: 'post', path: '/api/spares', headers: admin },
      spareBody(sites[0]!.id, { bankDesignId: designId }),
    );
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);

  it('PATCH /api/spares/:id', async () => {
    const path = `/api/spares/${(await created('/api/spares', spareBody(sites[0]!.id))).id}`;
    const tally = await assertCorpusHolds(
      app,
      { method: 'patch', path, headers: admin, target: targetAt(app, admin, path) },
      {
        ...spareBody(sites[1]!.id, { bankDesignId: designId }),
        version: CURRENT_VERSION,
      },
    );
    expect(tally[200]).toBeGreaterThan(0);
  }, 300_000);

  it('DELETE /api/spares/:id (the version in the query)', async () => {
    const path = `/api/spares/${(await created('/api/spares', spareBody(sites[0]!.id))).id}`;
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
