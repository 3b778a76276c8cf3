import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { countRows, createActor, makeArea, makeSite } from '../../support/register';

const app = createApp();
let planner: Awaited<ReturnType<typeof createActor>>;
let technician: Awaited<ReturnType<typeof createActor>>;

beforeAll(async () => {
  planner = await createActor(['planner']);
  technician = await createActor(['technician']);
});

const validSite = { name: 'Harrowfield Works', code: 'hf', address: '1 Quay Lane', timeZone: 'Europe/London' };

describe('POST /api/sites', () => {
  it('when a planner sends a valid site, then 201 with the site, its code in capitals and version 1', async () => {
    const res = await request(app).post('/api/sites').set('Authorization', planner.auth).send(validSite);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'Harrowfield Works', code: 'HF', version: 1, retiredAt: null, areaCount: 0 });
  });

  it('when the time zone is unknown, then 400 naming timeZone and nothing is stored', async () => {
    const before = await countRows('sites');
    const res = await request(app)
      .post('/api/sites')
      .set('Authorization', planner.auth)
      .send({ ...validSite, name: 'Other', code: 'OT', timeZone: 'Mars/Olympus' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation-failed');
    expect(res.body.error.issues).toEqual([expect.objectContaining({ path: 'timeZone' })]);
    expect(await countRows('sites')).toBe(before);
  });

  it('when the name is missing, then 400 naming name', async () => {
    const res = await request(app).post('/api/sites').set('Authorization', planner.auth).send({ code: 'NN', timeZone: 'UTC' });
    expect(res.status).toBe(400);
    expect(res.body.error.issues.map((i: { path: string }) => i.path)).toContain('name');
  });

  it('when the code is already used by a site in use, then 409 duplicate naming code', async () => {
    await makeSite(planner.actor, { code: 'DUP' });
    const res = await request(app).post('/api/sites').set('Authorization', planner.auth).send({ ...validSite, name: 'Another', code: 'dup' });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'duplicate', issues: [{ path: 'code' }] });
  });

  it('when there is no Authorization header, then 401', async () => {
    const res = await request(app).post('/api/sites').send(validSite);
    expect(res.status).toBe(401);
  });

  it('when a technician tries, then 403 and nothing is stored', async () => {
    const before = await countRows('sites');
    const res = await request(app).post('/api/sites').set('Authorization', technician.auth).send({ ...validSite, code: 'TQ', name: 'Tech' });
    expect(res.status).toBe(403);
    expect(await countRows('sites')).toBe(before);
  });
});

describe('GET /api/sites', () => {
  it('when listing, then a page of sites in use with the total, searchable and sortable', async () => {
    await makeSite(planner.actor, { name: 'Zeta Quay', code: 'ZQ' });
    await makeSite(planner.actor, { name: 'Alder Fen', code: 'AF' });
    const res = await request(app).get('/api/sites?sort=-name&pageSize=2').set('Authorization', technician.auth);
    expect(res.status).toBe(200);
    expect(res.body.items).toHaveLength(2);
    expect(res.body.total).toBeGreaterThanOrEqual(3);
    expect(res.body.items[0].name).toBe('Zeta Quay');
    const found = await request(app).get('/api/sites?q=alder').set('Authorization', technician.auth);
    expect(found.body.items.map((s: { code: string }) => s.code)).toEqual(['AF']);
  });

  it('when the sort field is unknown, then 400 naming sort', async () => {
    const res = await request(app).get('/api/sites?sort=colour').set('Authorization', technician.auth);
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('sort');
  });

  it('when there is no Authorization header, then 401', async () => {
    expect((await request(app).get('/api/sites')).status).toBe(401);
  });

  it('when the user holds no role, then 403', async () => {
    const nobody = await createActor([]);
    expect((await request(app).get('/api/sites').set('Authorization', nobody.auth)).status).toBe(403);
  });
});

describe('GET /api/sites/:siteId', () => {
  it('when the site exists, then 200 with its counts', async () => {
    const site = await makeSite(planner.actor);
    await makeArea(planner.actor, site.id);
    const res = await request(app).get(`/api/sites/${site.id}`).set('Authorization', technician.auth);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: site.id, areaCount: 1, cabinetCount: 0 });
  });

  it('when the id is unknown or not an id, then 404', async () => {
    const unknown = await request(app).get('/api/sites/00000000-0000-4000-8000-000000000000').set('Authorization', technician.auth);
    expect(unknown.status).toBe(404);
    const garbage = await request(app).get('/api/sites/not-an-id').set('Authorization', technician.auth);
    expect(garbage.status).toBe(404);
  });

  it('when there is no Authorization header, then 401', async () => {
    const site = await makeSite(planner.actor);
    expect((await request(app).get(`/api/sites/${site.id}`)).status).toBe(401);
  });
});

describe('PATCH /api/sites/:siteId', () => {
  it('when the version is current, then 200, the version moves on and the audit trail has before and after', async () => {
    const site = await makeSite(planner.actor, { name: 'Old Name' });
    const res = await request(app)
      .patch(`/api/sites/${site.id}`)
      .set('Authorization', planner.auth)
      .send({ version: 1, name: 'New Name' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ name: 'New Name', version: 2 });
    const audit = await request(app).get(`/api/sites/${site.id}/audit`).set('Authorization', technician.auth);
    expect(audit.status).toBe(200);
    expect(audit.body.items.map((e: { action: string }) => e.action)).toEqual(['update', 'create']);
    expect(audit.body.items[0]).toMatchObject({
      actor: { id: planner.user.id, name: planner.user.name },
      changes: [{ field: 'name', before: 'Old Name', after: 'New Name' }],
    });
  });

  it('when the version is stale, then 409 stale-version with a clear message and nothing changes', async () => {
    const site = await makeSite(planner.actor, { name: 'Kept' });
    await request(app).patch(`/api/sites/${site.id}`).set('Authorization', planner.auth).send({ version: 1, address: 'first' });
    const res = await request(app).patch(`/api/sites/${site.id}`).set('Authorization', planner.auth).send({ version: 1, name: 'Lost' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('stale-version');
    expect(res.body.error.message).toMatch(/Someone else saved this site/);
    const now = await request(app).get(`/api/sites/${site.id}`).set('Authorization', planner.auth);
    expect(now.body).toMatchObject({ name: 'Kept', version: 2 });
  });

  it('when the version is missing, then 400 naming version', async () => {
    const site = await makeSite(planner.actor);
    const res = await request(app).patch(`/api/sites/${site.id}`).set('Authorization', planner.auth).send({ name: 'X' });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('version');
  });

  it('when a value is invalid, then 400 naming it and nothing changes', async () => {
    const site = await makeSite(planner.actor);
    const res = await request(app).patch(`/api/sites/${site.id}`).set('Authorization', planner.auth).send({ version: 1, code: 'way too long code' });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('code');
    const now = await request(app).get(`/api/sites/${site.id}`).set('Authorization', planner.auth);
    expect(now.body.version).toBe(1);
  });

  it('when the site is unknown, then 404', async () => {
    const res = await request(app).patch('/api/sites/00000000-0000-4000-8000-000000000000').set('Authorization', planner.auth).send({ version: 1 });
    expect(res.status).toBe(404);
  });

  it('when a technician tries, then 403; without a header, 401', async () => {
    const site = await makeSite(planner.actor);
    expect((await request(app).patch(`/api/sites/${site.id}`).set('Authorization', technician.auth).send({ version: 1, name: 'T' })).status).toBe(403);
    expect((await request(app).patch(`/api/sites/${site.id}`).send({ version: 1, name: 'T' })).status).toBe(401);
  });
});

describe('DELETE /api/sites/:siteId', () => {
  it('when the site has no areas in use, then it is retired, stays readable and lists show it only when asked', async () => {
    const site = await makeSite(planner.actor, { name: 'Closing Works', code: 'CW' });
    const res = await request(app).delete(`/api/sites/${site.id}?version=1`).set('Authorization', planner.auth);
    expect(res.status).toBe(200);
    expect(res.body.retiredAt).not.toBeNull();
    const list = await request(app).get('/api/sites?q=Closing').set('Authorization', planner.auth);
    expect(list.body.total).toBe(0);
    const all = await request(app).get('/api/sites?q=Closing&includeRetired=true').set('Authorization', planner.auth);
    expect(all.body.total).toBe(1);
    const audit = await request(app).get(`/api/sites/${site.id}/audit`).set('Authorization', planner.auth);
    expect(audit.body.items[0]).toMatchObject({ action: 'retire' });
    const again = await request(app).patch(`/api/sites/${site.id}`).set('Authorization', planner.auth).send({ version: 2, name: 'Zombie' });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('retired');
  });

  it('when the site still has areas in use, then 409 in-use', async () => {
    const site = await makeSite(planner.actor);
    await makeArea(planner.actor, site.id);
    const res = await request(app).delete(`/api/sites/${site.id}?version=1`).set('Authorization', planner.auth);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('in-use');
  });

  it('when the version is stale, then 409; when it is missing, then 400', async () => {
    const site = await makeSite(planner.actor);
    expect((await request(app).delete(`/api/sites/${site.id}?version=7`).set('Authorization', planner.auth)).status).toBe(409);
    expect((await request(app).delete(`/api/sites/${site.id}`).set('Authorization', planner.auth)).status).toBe(400);
  });

  it('when a technician tries, then 403; without a header, 401; unknown, 404', async () => {
    const site = await makeSite(planner.actor);
    expect((await request(app).delete(`/api/sites/${site.id}?version=1`).set('Authorization', technician.auth)).status).toBe(403);
    expect((await request(app).delete(`/api/sites/${site.id}?version=1`)).status).toBe(401);
    expect((await request(app).delete('/api/sites/00000000-0000-4000-8000-000000000000?version=1').set('Authorization', planner.auth)).status).toBe(404);
  });
});

describe('GET /api/sites/:siteId/audit', () => {
  it('when the site is unknown, then 404; without a header, 401', async () => {
    expect((await request(app).get('/api/sites/00000000-0000-4000-8000-000000000000/audit').set('Authorization', planner.auth)).status).toBe(404);
    const site = await makeSite(planner.actor);
    expect((await request(app).get(`/api/sites/${site.id}/audit`)).status).toBe(401);
  });
});

describe('/api/sites/:siteId/areas', () => {
  it('when a planner adds an area to a site, then 201 and the site lists it', async () => {
    const site = await makeSite(planner.actor);
    const created = await request(app).post(`/api/sites/${site.id}/areas`).set('Authorization', planner.auth).send({ name: 'Line 4' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ siteId: site.id, name: 'Line 4', siteCode: site.code });
    const list = await request(app).get(`/api/sites/${site.id}/areas`).set('Authorization', technician.auth);
    expect(list.status).toBe(200);
    expect(list.body).toMatchObject({ total: 1, items: [{ name: 'Line 4' }] });
  });

  it('when the site is unknown, then 404; a technician adding, 403; no header, 401; no name, 400', async () => {
    const site = await makeSite(planner.actor);
    expect((await request(app).get('/api/sites/00000000-0000-4000-8000-000000000000/areas').set('Authorization', planner.auth)).status).toBe(404);
    expect((await request(app).post(`/api/sites/${site.id}/areas`).set('Authorization', technician.auth).send({ name: 'X' })).status).toBe(403);
    expect((await request(app).get(`/api/sites/${site.id}/areas`)).status).toBe(401);
    const bad = await request(app).post(`/api/sites/${site.id}/areas`).set('Authorization', planner.auth).send({ name: '' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.issues[0].path).toBe('name');
  });
});
