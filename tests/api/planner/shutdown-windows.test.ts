import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { createSite } from '../../../api/src/services/sites';
import { withUnitOfWork } from '../../../api/src/services/unit-of-work';
import { countRows, createActor, makeArea } from '../../support/register';

const app = createApp();
let planner: Awaited<ReturnType<typeof createActor>>;
let technician: Awaited<ReturnType<typeof createActor>>;
let reliability: Awaited<ReturnType<typeof createActor>>;
let areaId: string;
let otherAreaId: string;
let siteId: string;
let n = 0;

beforeAll(async () => {
  planner = await createActor(['planner']);
  technician = await createActor(['technician']);
  reliability = await createActor(['reliability']);
  const site = await withUnitOfWork(planner.actor, (uow) =>
    createSite(uow, { name: 'Windows Works', code: 'WW1', address: '', timeZone: 'Europe/Berlin' }),
  );
  siteId = site.id;
  areaId = (await makeArea(planner.actor, site.id, 'Press line')).id;
  otherAreaId = (await makeArea(planner.actor, site.id, 'Boiler house')).id;
});

// Saturday 21 March 2026, 06:00–14:00 Berlin (CET, UTC+1): 05:00Z–13:00Z. Summer time begins
// 29 March 2026 (EU Directive 2000/84/EC: last Sunday of March), after which 06:00 is 04:00Z.
const weekly = () => ({
  areaId,
  title: `Weekend stop ${++n}`,
  startsAt: '2026-03-21T06:00:00+01:00',
  endsAt: '2026-03-21T14:00:00+01:00',
  recurrence: 'FREQ=WEEKLY;BYDAY=SA;COUNT=4',
  notes: 'Press line isolated by the shift electrician.',
});

const post = (body: object, auth = planner.auth) => request(app).post('/api/shutdown-windows').set('Authorization', auth).send(body);

async function auditRows(windowId: string): Promise<Array<{ action: string }>> {
  const res = await request(app).get(`/api/shutdown-windows/${windowId}/audit`).set('Authorization', planner.auth);
  return res.body.items;
}

describe('POST /api/shutdown-windows', () => {
  it('when a planner adds a weekly window, then 201 with its area, site, zone and the recurrence in words, and a create entry', async () => {
    const res = await post(weekly());
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      areaId,
      areaName: 'Press line',
      siteId,
      siteName: 'Windows Works',
      timeZone: 'Europe/Berlin',
      startsAt: '2026-03-21T05:00:00.000Z',
      endsAt: '2026-03-21T13:00:00.000Z',
      recurrence: 'FREQ=WEEKLY;BYDAY=SA;COUNT=4',
      recurrenceText: 'every week on Saturday for 4 times',
      version: 1,
      retiredAt: null,
    });
    expect((await auditRows(res.body.id)).map((e) => e.action)).toEqual(['create']);
  });

  it.each([
    ['end before start', { endsAt: '2026-03-21T05:00:00+01:00' }, 'endsAt'],
    ['a bad recurrence', { recurrence: 'FREQ=HOURLY' }, 'recurrence'],
    ['a start the rule does not name (a Friday for Saturdays)', { startsAt: '2026-03-20T06:00:00+01:00' }, 'recurrence'],
    ['a date without offset', { startsAt: '2026-03-21 06:00' }, 'startsAt'],
    ['an unknown area', { areaId: '00000000-0000-4000-8000-000000000000' }, 'areaId'],
    ['no title', { title: '  ' }, 'title'],
  ])('when the window has %s, then 400 naming the field and nothing is stored', async (_what, change, path) => {
    const [rows, audits] = [await countRows('shutdown_windows'), await countRows('audit_entries')];
    const res = await post({ ...weekly(), ...change });
    expect(res.status).toBe(400);
    expect(res.body.error.issues.map((i: { path: string[] | string }) => [i.path].flat()[0])).toContain(path);
    expect(await countRows('shutdown_windows')).toBe(rows);
    expect(await countRows('audit_entries')).toBe(audits);
  });

  it('when a technician or reliability engineer tries, then 403; without a header, 401', async () => {
    expect((await post(weekly(), technician.auth)).status).toBe(403);
    expect((await post(weekly(), reliability.auth)).status).toBe(403);
    expect((await request(app).post('/api/shutdown-windows').send(weekly())).status).toBe(401);
  });
});

describe('GET /api/shutdown-windows', () => {
  it('when asked for a range across the change to summer time, then each window with its occurrences there at 06:00 Berlin', async () => {
    const created = (await post(weekly())).body;
    const res = await request(app)
      .get(`/api/shutdown-windows?areaId=${areaId}&from=2026-03-27T00:00:00Z&to=2026-04-05T00:00:00Z`)
      .set('Authorization', technician.auth);
    expect(res.status).toBe(200);
    const found = res.body.items.find((w: { id: string }) => w.id === created.id);
    expect(found.occurrences).toEqual([
      { startsAt: '2026-03-28T05:00:00.000Z', endsAt: '2026-03-28T13:00:00.000Z' },
      { startsAt: '2026-04-04T04:00:00.000Z', endsAt: '2026-04-04T12:00:00.000Z' },
    ]);
  });

  it('when a range holds none of a window’s occurrences, then the window is not listed; other areas and sites are filtered out', async () => {
    const once = (
      await post({ areaId: otherAreaId, title: 'Boiler inspection', startsAt: '2026-06-06T07:00:00+02:00', endsAt: '2026-06-06T15:00:00+02:00', recurrence: null })
    ).body;
    const inRange = await request(app)
      .get(`/api/shutdown-windows?siteId=${siteId}&from=2026-06-01T00:00:00Z&to=2026-06-08T00:00:00Z`)
      .set('Authorization', planner.auth);
    expect(inRange.body.items.map((w: { id: string }) => w.id)).toEqual([once.id]);
    expect(inRange.body.total).toBe(1);
    const later = await request(app)
      .get(`/api/shutdown-windows?areaId=${otherAreaId}&from=2026-06-07T00:00:00Z&to=2026-07-01T00:00:00Z`)
      .set('Authorization', planner.auth);
    expect(later.body).toMatchObject({ items: [], total: 0 });
    const press = await request(app).get(`/api/shutdown-windows?areaId=${areaId}`).set('Authorization', planner.auth);
    expect(press.body.items.every((w: { areaId: string; occurrences?: unknown }) => w.areaId === areaId && w.occurrences === undefined)).toBe(true);
  });

  it('when from comes without to, or the range is backwards, then 400 naming the field', async () => {
    const onlyFrom = await request(app).get('/api/shutdown-windows?from=2026-06-01T00:00:00Z').set('Authorization', planner.auth);
    expect(onlyFrom.status).toBe(400);
    expect(onlyFrom.body.error.issues[0].path).toBe('to');
    const backwards = await request(app)
      .get('/api/shutdown-windows?from=2026-06-01T00:00:00Z&to=2026-05-01T00:00:00Z')
      .set('Authorization', planner.auth);
    expect(backwards.status).toBe(400);
  });

  it('when reading one window, then it; unknown, 404; no header, 401', async () => {
    const created = (await post(weekly())).body;
    expect((await request(app).get(`/api/shutdown-windows/${created.id}`).set('Authorization', technician.auth)).body.id).toBe(created.id);
    expect((await request(app).get('/api/shutdown-windows/00000000-0000-4000-8000-000000000000').set('Authorization', planner.auth)).status).toBe(404);
    expect((await request(app).get(`/api/shutdown-windows/${created.id}`)).status).toBe(401);
  });
});

describe('PATCH and DELETE /api/shutdown-windows/:windowId', () => {
  it('when the title alone is changed, then only it moves, the version goes up and an update entry is kept', async () => {
    const created = (await post(weekly())).body;
    const res = await request(app)
      .patch(`/api/shutdown-windows/${created.id}`)
      .set('Authorization', planner.auth)
      .send({ version: 1, title: 'Easter stop' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ ...created, title: 'Easter stop', version: 2, updatedAt: res.body.updatedAt });
    expect((await auditRows(created.id)).map((e) => e.action).sort()).toEqual(['create', 'update']);
  });

  it('when the recurrence is cleared, then the window is a one-off', async () => {
    const created = (await post(weekly())).body;
    const res = await request(app).patch(`/api/shutdown-windows/${created.id}`).set('Authorization', planner.auth).send({ version: 1, recurrence: null });
    expect(res.body).toMatchObject({ recurrence: null, recurrenceText: 'once', version: 2 });
  });

  it('when the new end is before the stored start, then 400 naming endsAt and nothing moves', async () => {
    const created = (await post(weekly())).body;
    const res = await request(app)
      .patch(`/api/shutdown-windows/${created.id}`)
      .set('Authorization', planner.auth)
      .send({ version: 1, endsAt: '2026-03-21T04:00:00Z' });
    expect(res.status).toBe(400);
    expect([res.body.error.issues[0].path].flat()).toContain('endsAt');
    const after = await request(app).get(`/api/shutdown-windows/${created.id}`).set('Authorization', planner.auth);
    expect(after.body).toEqual(created);
  });

  it('when the version is stale, then 409 stale-version', async () => {
    const created = (await post(weekly())).body;
    const res = await request(app).patch(`/api/shutdown-windows/${created.id}`).set('Authorization', planner.auth).send({ version: 7, title: 'x' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('stale-version');
  });

  it('when retired, then it is gone from the lists, kept with retiredAt, and a retire entry is kept; a second retire is refused', async () => {
    const created = (await post(weekly())).body;
    const res = await request(app).delete(`/api/shutdown-windows/${created.id}?version=1`).set('Authorization', planner.auth);
    expect(res.status).toBe(200);
    expect(res.body.retiredAt).not.toBeNull();
    const list = await request(app)
      .get(`/api/shutdown-windows?areaId=${areaId}&from=2026-03-01T00:00:00Z&to=2026-05-01T00:00:00Z`)
      .set('Authorization', planner.auth);
    expect(list.body.items.map((w: { id: string }) => w.id)).not.toContain(created.id);
    expect((await auditRows(created.id)).map((e) => e.action).sort()).toEqual(['create', 'retire']);
    expect((await request(app).delete(`/api/shutdown-windows/${created.id}?version=2`).set('Authorization', planner.auth)).status).toBe(409);
  });

  it('when a technician tries to change or retire, then 403', async () => {
    const created = (await post(weekly())).body;
    expect((await request(app).patch(`/api/shutdown-windows/${created.id}`).set('Authorization', technician.auth).send({ version: 1, title: 'x' })).status).toBe(403);
    expect((await request(app).delete(`/api/shutdown-windows/${created.id}?version=1`).set('Authorization', technician.auth)).status).toBe(403);
  });
});
