/**
 * Every write of the site and area routes against careless and hostile input: a change
 * changes only what it names, a unique clash is a 409 naming the field, and a corpus of bodies
 * never gets a 5xx and stores nothing when refused.
 */
import fc from 'fast-check';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { createCaller } from '../../support/auth';
import { assertChangesOnlyWhatTheyName } from '../../support/change-property';
import { assertCorpusHolds, CURRENT_VERSION } from '../../support/hostile-bodies';
import {
  nextSerial,
  postCreated,
  siteBody,
  someText,
  targetAt,
  type Answered,
  expectOneWinnerRestDuplicate,
} from '../../support/register-http';

const app = createApp();
let admin: Record<string, string>;
let site: Answered;

const created = (path: string, body: object) => postCreated(app, admin, path, body);

beforeAll(async () => {
  admin = { Authorization: (await createCaller(['admin'])).auth };
  site = await created('/api/sites', siteBody());
}, 30_000);

describe('a change changes only what it names', () => {
  it('when a site change names any one field, then every other field stays as it was', async () => {
    const changed = await created('/api/sites', siteBody());
    await assertChangesOnlyWhatTheyName(app, {
      path: `/api/sites/${changed.id}`,
      headers: admin,
      fields: {
        name: someText(100).map((s) => `${s} ${nextSerial()}`),
        code: fc.integer({ min: 1, max: 99_999 }).map((n) => `Q${n}`),
        address: someText(500),
        timeZone: fc.constantFrom(
          'Europe/London',
          'Europe/Berlin',
          'America/Chicago',
          'Asia/Kolkata',
          'UTC',
        ),
      },
    });
  }, 120_000);

  it('when an area change names any one field, then every other field stays as it was', async () => {
    const area = await created(`/api/sites/${site.id}/areas`, {
      name: 'Changing hall',
      description: 'North end',
    });
    await assertChangesOnlyWhatTheyName(app, {
      path: `/api/areas/${area.id}`,
      headers: admin,
      fields: {
        name: someText(100).map((s) => `${s} ${nextSerial()}`),
        description: someText(1000),
      },
    });
  }, 120_000);
});

describe('unique clashes', () => {
  it('when 10 people add sites with one code at once, then one 201 and nine 409 naming code', async () => {
    const body = siteBody({ code: 'RACE1' });
    const answers = await Promise.all(
      Array.from({ length: 10 }, (_, i) =>
        request(app)
          .post('/api/sites')
          .set(admin)
          .send({ ...body, name: `Race works ${i}` }),
      ),
    );
    expectOneWinnerRestDuplicate(answers, 201, 'code');
  }, 60_000);

  it('when 10 people add one area name to a site at once, then one 201 and nine 409 naming name', async () => {
    const answers = await Promise.all(
      Array.from({ length: 10 }, () =>
        request(app).post(`/api/sites/${site.id}/areas`).set(admin).send({ name: 'Race hall' }),
      ),
    );
    expectOneWinnerRestDuplicate(answers, 201, 'name');
  }, 60_000);
});

describe('a corpus of hostile bodies never gets a 5xx and stores nothing when refused', () => {
  it('POST /api/sites', async () => {
    const tally = await assertCorpusHolds(
      app,
      { method: 'post', path: '/api/sites', headers: admin },
      siteBody(),
    );
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);

  it('PATCH /api/sites/:id', async () => {
    const path = `/api/sites/${(await created('/api/sites', siteBody())).id}`;
    const tally = await assertCorpusHolds(
      app,
      { method: 'patch', path, headers: admin, target: targetAt(app, admin, path) },
      { ...siteBody(), version: CURRENT_VERSION },
    );
    expect(tally[200]).toBeGreaterThan(0);
  }, 300_000);

  it('DELETE /api/sites/:id (the version in the query)', async () => {
    const path = `/api/sites/${(await created('/api/sites', siteBody())).id}`;
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

  it('POST /api/sites/:id/areas', async () => {
    const tally = await assertCorpusHolds(
      app,
      { method: 'post', path: `/api/sites/${site.id}/areas`, headers: admin },
      { name: 'Corpus hall', description: 'West' },
    );
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);

  it('POST /api/areas', async () => {
    const tally = await assertCorpusHolds(
      app,
      { method: 'post', path: '/api/areas', headers: admin },
      { siteId: site.id, name: 'Corpus hall 2', description: '' },
    );
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);

  it('PATCH /api/areas/:id', async () => {
    const path = `/api/areas/${(await created(`/api/sites/${site.id}/areas`, { name: 'Corpus hall 3' })).id}`;
    const tally = await assertCorpusHolds(
      app,
      { method: 'patch', path, headers: admin, target: targetAt(app, admin, path) },
      {
        name: 'Corpus hall 4',
        description: 'East',
        version: CURRENT_VERSION,
      },
    );
    expect(tally[200]).toBeGreaterThan(0);
  }, 300_000);

  it('DELETE /api/areas/:id (the version in the query)', async () => {
    const path = `/api/areas/${(await created(`/api/sites/${site.id}/areas`, { name: 'Corpus hall 5' })).id}`;
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
