import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { countRows, createActor, makeSite, makeSpare, spareData } from '../../support/register';

const app = createApp();
let planner: Awaited<ReturnType<typeof createActor>>;
let technician: Awaited<ReturnType<typeof createActor>>;
let siteId: string;

beforeAll(async () => {
  planner = await createActor(['planner']);
  technician = await createActor(['technician']);
  siteId = (await makeSite(planner.actor)).id;
});

describe('POST /api/spares', () => {
  it('when never reformed, then due one interval after it went into store', async () => {
    const res = await request(app)
      .post('/api/spares')
      .set('Authorization', planner.auth)
      .send(spareData(siteId, { storageStartedOn: '2024-03-01', reformingIntervalDays: 365 }));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ reformingDueOn: '2025-03-01', reformingOverdue: true, siteId });
  });

  it('when reformed, then due one interval after the reforming', async () => {
    const res = await request(app)
      .post('/api/spares')
      .set('Authorization', planner.auth)
      // a reforming date years ahead is unlikely: confirmed, as the form's "Save anyway" sends it
      .send({ ...spareData(siteId, { storageStartedOn: '2024-03-01', lastReformedOn: '2099-01-01', reformingIntervalDays: 30 }), confirmed: true });
    expect(res.body).toMatchObject({ reformingDueOn: '2099-01-31', reformingOverdue: false });
  });

  it('when the reforming is before the storage start, then 400 naming lastReformedOn and nothing is stored', async () => {
    const before = await countRows('spares');
    const res = await request(app)
      .post('/api/spares')
      .set('Authorization', planner.auth)
      .send(spareData(siteId, { storageStartedOn: '2024-03-01', lastReformedOn: '2023-01-01' }));
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('lastReformedOn');
    expect(await countRows('spares')).toBe(before);
  });

  it('when the kind is unknown, then 400 naming kind; the code taken, 409; technician, 403; no header, 401', async () => {
    const bad = await request(app).post('/api/spares').set('Authorization', planner.auth).send({ ...spareData(siteId), kind: 'motor' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.issues[0].path).toBe('kind');
    const first = await makeSpare(planner.actor, siteId);
    const dup = await request(app).post('/api/spares').set('Authorization', planner.auth).send(spareData(siteId, { code: first.code }));
    expect(dup.status).toBe(409);
    expect(dup.body.error.issues[0].path).toBe('code');
    expect((await request(app).post('/api/spares').set('Authorization', technician.auth).send(spareData(siteId))).status).toBe(403);
    expect((await request(app).post('/api/spares').send(spareData(siteId))).status).toBe(401);
  });
});

describe('GET /api/spares', () => {
  it('when asking for overdue spares, then only those, soonest due first', async () => {
    const site = await makeSite(planner.actor);
    await makeSpare(planner.actor, site.id, { storageStartedOn: '2020-05-01' });
    await makeSpare(planner.actor, site.id, { storageStartedOn: '2021-05-01' });
    await makeSpare(planner.actor, site.id, { storageStartedOn: '2020-05-01', lastReformedOn: '2099-01-01', confirmed: true });
    const res = await request(app).get(`/api/spares?siteId=${site.id}&overdue=true`).set('Authorization', technician.auth);
    expect(res.status).toBe(200);
    expect(res.body.items.map((s: { reformingDueOn: string }) => s.reformingDueOn)).toEqual(['2021-05-01', '2022-05-01']);
    const all = await request(app).get(`/api/spares?siteId=${site.id}`).set('Authorization', technician.auth);
    expect(all.body.total).toBe(3);
    expect((await request(app).get('/api/spares?overdue=maybe').set('Authorization', technician.auth)).status).toBe(400);
    expect((await request(app).get('/api/spares')).status).toBe(401);
  });
});

describe('/api/spares/:spareId', () => {
  it('when a reforming is recorded, then the due date moves on, the version too, and it is audited', async () => {
    const spare = await makeSpare(planner.actor, siteId, { storageStartedOn: '2023-01-01', reformingIntervalDays: 365 });
    const res = await request(app).patch(`/api/spares/${spare.id}`).set('Authorization', planner.auth).send({ version: 1, lastReformedOn: '2024-06-15' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ lastReformedOn: '2024-06-15', reformingDueOn: '2025-06-15', version: 2 });
    const audit = await request(app).get(`/api/spares/${spare.id}/audit`).set('Authorization', technician.auth);
    expect(audit.body.items[0].changes).toEqual(
      expect.arrayContaining([
        { field: 'lastReformedOn', before: null, after: '2024-06-15' },
        { field: 'reformingDueOn', before: '2024-01-01', after: '2025-06-15' },
      ]),
    );
  });

  it('when stale, 409; invalid, 400; unknown, 404; technician, 403; no header, 401', async () => {
    const spare = await makeSpare(planner.actor, siteId);
    expect((await request(app).patch(`/api/spares/${spare.id}`).set('Authorization', planner.auth).send({ version: 2, notes: 'x' })).status).toBe(409);
    const bad = await request(app).patch(`/api/spares/${spare.id}`).set('Authorization', planner.auth).send({ version: 1, reformingIntervalDays: 0 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.issues[0].path).toBe('reformingIntervalDays');
    expect((await request(app).patch('/api/spares/00000000-0000-4000-8000-000000000000').set('Authorization', planner.auth).send({ version: 1 })).status).toBe(404);
    expect((await request(app).patch(`/api/spares/${spare.id}`).set('Authorization', technician.auth).send({ version: 1 })).status).toBe(403);
    expect((await request(app).patch(`/api/spares/${spare.id}`).send({ version: 1 })).status).toBe(401);
    expect((await request(app).get(`/api/spares/${spare.id}`).set('Authorization', technician.auth)).status).toBe(200);
    expect((await request(app).get('/api/spares/00000000-0000-4000-8000-000000000000').set('Authorization', technician.auth)).status).toBe(404);
    expect((await request(app).get(`/api/spares/${spare.id}`)).status).toBe(401);
  });

  it('when retired, then it leaves the list but stays in history; stale, 409; technician, 403; no header, 401; unknown, 404', async () => {
    const spare = await makeSpare(planner.actor, siteId, { code: 'SCRAP-1' });
    expect((await request(app).delete(`/api/spares/${spare.id}?version=3`).set('Authorization', planner.auth)).status).toBe(409);
    expect((await request(app).delete(`/api/spares/${spare.id}?version=1`).set('Authorization', technician.auth)).status).toBe(403);
    expect((await request(app).delete(`/api/spares/${spare.id}?version=1`)).status).toBe(401);
    expect((await request(app).delete('/api/spares/00000000-0000-4000-8000-000000000000?version=1').set('Authorization', planner.auth)).status).toBe(404);
    expect((await request(app).delete(`/api/spares/${spare.id}?version=1`).set('Authorization', planner.auth)).status).toBe(200);
    expect((await request(app).get('/api/spares?q=SCRAP-1').set('Authorization', planner.auth)).body.total).toBe(0);
    expect((await request(app).get('/api/spares?q=SCRAP-1&includeRetired=true').set('Authorization', planner.auth)).body.total).toBe(1);
    const audit = await request(app).get(`/api/spares/${spare.id}/audit`).set('Authorization', planner.auth);
    expect(audit.body.items.map((e: { action: string }) => e.action)).toEqual(['retire', 'create']);
    expect((await request(app).get('/api/spares/00000000-0000-4000-8000-000000000000/audit').set('Authorization', planner.auth)).status).toBe(404);
    expect((await request(app).get(`/api/spares/${spare.id}/audit`)).status).toBe(401);
  });
});
