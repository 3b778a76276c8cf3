import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { countRows, createActor, makeArea, makeCabinet, makeSite } from '../../support/register';

const app = createApp();
let planner: Awaited<ReturnType<typeof createActor>>;
let reliability: Awaited<ReturnType<typeof createActor>>;
let site: Awaited<ReturnType<typeof makeSite>>;

beforeAll(async () => {
  planner = await createActor(['planner']);
  reliability = await createActor(['reliability']);
  site = await makeSite(planner.actor);
});

describe('POST /api/areas', () => {
  it('when a planner sends a valid area, then 201 with its site', async () => {
    const res = await request(app).post('/api/areas').set('Authorization', planner.auth).send({ siteId: site.id, name: 'Packing hall' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'Packing hall', siteId: site.id, siteName: site.name, cabinetCount: 0, version: 1 });
  });

  it('when the site id is missing or unknown, then 400 naming siteId and nothing is stored', async () => {
    const before = await countRows('areas');
    const missing = await request(app).post('/api/areas').set('Authorization', planner.auth).send({ name: 'Nowhere' });
    expect(missing.status).toBe(400);
    expect(missing.body.error.issues[0].path).toBe('siteId');
    const unknown = await request(app)
      .post('/api/areas')
      .set('Authorization', planner.auth)
      .send({ siteId: '00000000-0000-4000-8000-000000000000', name: 'Nowhere' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.issues[0].path).toBe('siteId');
    expect(await countRows('areas')).toBe(before);
  });

  it('when the site already has an area of that name, then 409 naming name', async () => {
    await makeArea(planner.actor, site.id, 'Boiler house');
    const res = await request(app).post('/api/areas').set('Authorization', planner.auth).send({ siteId: site.id, name: 'boiler HOUSE' });
    expect(res.status).toBe(409);
    expect(res.body.error.issues[0].path).toBe('name');
  });

  it('when a reliability engineer tries, then 403; without a header, 401', async () => {
    expect((await request(app).post('/api/areas').set('Authorization', reliability.auth).send({ siteId: site.id, name: 'R' })).status).toBe(403);
    expect((await request(app).post('/api/areas').send({ siteId: site.id, name: 'R' })).status).toBe(401);
  });
});

describe('GET /api/areas and /api/areas/:areaId', () => {
  it('when filtering by site and sorting by name, then only that site’s areas in order', async () => {
    const other = await makeSite(planner.actor);
    await makeArea(planner.actor, other.id, 'B line');
    await makeArea(planner.actor, other.id, 'A line');
    const res = await request(app).get(`/api/areas?siteId=${other.id}&sort=name`).set('Authorization', reliability.auth);
    expect(res.status).toBe(200);
    expect(res.body.items.map((a: { name: string }) => a.name)).toEqual(['A line', 'B line']);
    expect(res.body.total).toBe(2);
  });

  it('when reading one area, then its cabinet count; unknown, 404; no header, 401', async () => {
    const area = await makeArea(planner.actor, site.id);
    await makeCabinet(planner.actor, area.id);
    const res = await request(app).get(`/api/areas/${area.id}`).set('Authorization', reliability.auth);
    expect(res.body).toMatchObject({ id: area.id, cabinetCount: 1 });
    expect((await request(app).get('/api/areas/00000000-0000-4000-8000-000000000000').set('Authorization', reliability.auth)).status).toBe(404);
    expect((await request(app).get(`/api/areas/${area.id}`)).status).toBe(401);
    expect((await request(app).get('/api/areas')).status).toBe(401);
  });

  it('when listing an area’s cabinets, then its cabinets only', async () => {
    const area = await makeArea(planner.actor, site.id);
    const cabinet = await makeCabinet(planner.actor, area.id);
    const res = await request(app).get(`/api/areas/${area.id}/cabinets`).set('Authorization', reliability.auth);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ total: 1, items: [{ id: cabinet.id, areaId: area.id }] });
    expect((await request(app).get('/api/areas/00000000-0000-4000-8000-000000000000/cabinets').set('Authorization', reliability.auth)).status).toBe(404);
    expect((await request(app).get(`/api/areas/${area.id}/cabinets`)).status).toBe(401);
  });
});

describe('PATCH /api/areas/:areaId', () => {
  it('when the version is current, then 200 and audited; when stale, then 409', async () => {
    const area = await makeArea(planner.actor, site.id, 'Dye house');
    const ok = await request(app).patch(`/api/areas/${area.id}`).set('Authorization', planner.auth).send({ version: 1, description: 'north end' });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ description: 'north end', version: 2 });
    const stale = await request(app).patch(`/api/areas/${area.id}`).set('Authorization', planner.auth).send({ version: 1, name: 'X' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale-version');
    const audit = await request(app).get(`/api/areas/${area.id}/audit`).set('Authorization', reliability.auth);
    expect(audit.body.items[0]).toMatchObject({ action: 'update', changes: [{ field: 'description', before: '', after: 'north end' }] });
  });

  it('when the name is too long, then 400 naming name; unknown, 404; reliability, 403; no header, 401', async () => {
    const area = await makeArea(planner.actor, site.id);
    const bad = await request(app).patch(`/api/areas/${area.id}`).set('Authorization', planner.auth).send({ version: 1, name: 'x'.repeat(200) });
    expect(bad.status).toBe(400);
    expect(bad.body.error.issues[0].path).toBe('name');
    expect((await request(app).patch('/api/areas/00000000-0000-4000-8000-000000000000').set('Authorization', planner.auth).send({ version: 1 })).status).toBe(404);
    expect((await request(app).patch(`/api/areas/${area.id}`).set('Authorization', reliability.auth).send({ version: 1 })).status).toBe(403);
    expect((await request(app).patch(`/api/areas/${area.id}`).send({ version: 1 })).status).toBe(401);
  });
});

describe('DELETE /api/areas/:areaId', () => {
  it('when the area has cabinets in use, then 409 in-use; once empty, it is retired', async () => {
    const area = await makeArea(planner.actor, site.id);
    await makeCabinet(planner.actor, area.id);
    const refused = await request(app).delete(`/api/areas/${area.id}?version=1`).set('Authorization', planner.auth);
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('in-use');
    const empty = await makeArea(planner.actor, site.id);
    const ok = await request(app).delete(`/api/areas/${empty.id}?version=1`).set('Authorization', planner.auth);
    expect(ok.status).toBe(200);
    expect(ok.body.retiredAt).not.toBeNull();
  });

  it('when stale, 409; unknown, 404; reliability, 403; no header, 401; audit unknown, 404', async () => {
    const area = await makeArea(planner.actor, site.id);
    expect((await request(app).delete(`/api/areas/${area.id}?version=9`).set('Authorization', planner.auth)).status).toBe(409);
    expect((await request(app).delete('/api/areas/00000000-0000-4000-8000-000000000000?version=1').set('Authorization', planner.auth)).status).toBe(404);
    expect((await request(app).delete(`/api/areas/${area.id}?version=1`).set('Authorization', reliability.auth)).status).toBe(403);
    expect((await request(app).delete(`/api/areas/${area.id}?version=1`)).status).toBe(401);
    expect((await request(app).get('/api/areas/00000000-0000-4000-8000-000000000000/audit').set('Authorization', planner.auth)).status).toBe(404);
    expect((await request(app).get(`/api/areas/${area.id}/audit`)).status).toBe(401);
  });
});
