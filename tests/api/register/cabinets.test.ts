import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { countRows, cabinetData, createActor, makeArea, makeBank, makeCabinet, makeDesign, makeSite } from '../../support/register';

const app = createApp();
let planner: Awaited<ReturnType<typeof createActor>>;
let technician: Awaited<ReturnType<typeof createActor>>;
let admin: Awaited<ReturnType<typeof createActor>>;
let area: Awaited<ReturnType<typeof makeArea>>;

beforeAll(async () => {
  planner = await createActor(['planner']);
  technician = await createActor(['technician']);
  admin = await createActor(['admin']);
  const site = await makeSite(planner.actor);
  area = await makeArea(planner.actor, site.id);
});

describe('POST /api/cabinets', () => {
  it('when a planner sends a valid cabinet, then 201 with its area, site and tag in capitals', async () => {
    const res = await request(app)
      .post('/api/cabinets')
      .set('Authorization', planner.auth)
      .send({ ...cabinetData(area.id), tag: 'brk-t1-vfd-001' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ tag: 'BRK-T1-VFD-001', areaId: area.id, areaName: area.name, status: 'in-service', bankCount: 0, version: 1 });
  });

  it('when an admin adds one, then 201 too', async () => {
    const res = await request(app).post('/api/cabinets').set('Authorization', admin.auth).send(cabinetData(area.id));
    expect(res.status).toBe(201);
  });

  it('when the supply voltage is not a number, then 400 naming supplyVolts and nothing is stored', async () => {
    const before = await countRows('cabinets');
    const res = await request(app)
      .post('/api/cabinets')
      .set('Authorization', planner.auth)
      .send({ ...cabinetData(area.id), supplyVolts: 'four hundred' });
    expect(res.status).toBe(400);
    expect(res.body.error.issues).toEqual([expect.objectContaining({ path: 'supplyVolts' })]);
    expect(await countRows('cabinets')).toBe(before);
  });

  it('when the tag has spaces or the criticality is unknown, then 400 naming each', async () => {
    const res = await request(app)
      .post('/api/cabinets')
      .set('Authorization', planner.auth)
      .send({ ...cabinetData(area.id), tag: 'BRK M2', criticality: 'vital' });
    expect(res.status).toBe(400);
    expect(res.body.error.issues.map((i: { path: string }) => i.path).sort()).toEqual(['criticality', 'tag']);
  });

  it('when the tag is in use, then 409 duplicate naming tag', async () => {
    const first = await makeCabinet(planner.actor, area.id);
    const res = await request(app).post('/api/cabinets').set('Authorization', planner.auth).send({ ...cabinetData(area.id), tag: first.tag.toLowerCase() });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'duplicate', issues: [{ path: 'tag' }] });
  });

  it('when the area is unknown, then 400 naming areaId', async () => {
    const res = await request(app)
      .post('/api/cabinets')
      .set('Authorization', planner.auth)
      .send(cabinetData('00000000-0000-4000-8000-000000000000'));
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('areaId');
  });

  it('when a technician tries, then 403; without a header, 401', async () => {
    expect((await request(app).post('/api/cabinets').set('Authorization', technician.auth).send(cabinetData(area.id))).status).toBe(403);
    expect((await request(app).post('/api/cabinets').send(cabinetData(area.id))).status).toBe(401);
  });
});

describe('GET /api/cabinets', () => {
  it('when searching part of a tag, then matching cabinets with the total', async () => {
    const site = await makeSite(planner.actor);
    const hall = await makeArea(planner.actor, site.id, 'Search hall');
    await makeCabinet(planner.actor, hall.id, { tag: 'SRCH-PUMP-001' });
    await makeCabinet(planner.actor, hall.id, { tag: 'SRCH-PUMP-002' });
    await makeCabinet(planner.actor, hall.id, { tag: 'SRCH-FAN-001', criticality: 'critical' });
    const res = await request(app).get('/api/cabinets?q=pump&sort=-tag').set('Authorization', technician.auth);
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(2);
    expect(res.body.items.map((c: { tag: string }) => c.tag)).toEqual(['SRCH-PUMP-002', 'SRCH-PUMP-001']);
    const bySite = await request(app).get(`/api/cabinets?siteId=${site.id}&criticality=critical`).set('Authorization', technician.auth);
    expect(bySite.body).toMatchObject({ total: 1, items: [{ tag: 'SRCH-FAN-001', siteName: site.name }] });
  });

  it('when a search holds LIKE wildcards, then they match literally', async () => {
    const res = await request(app).get('/api/cabinets?q=%25').set('Authorization', technician.auth);
    expect(res.body.total).toBe(0);
  });

  it('when paging, then pages do not overlap and the total stays', async () => {
    const site = await makeSite(planner.actor);
    const hall = await makeArea(planner.actor, site.id);
    for (let i = 0; i < 5; i += 1) await makeCabinet(planner.actor, hall.id);
    const one = await request(app).get(`/api/cabinets?areaId=${hall.id}&page=1&pageSize=2`).set('Authorization', technician.auth);
    const two = await request(app).get(`/api/cabinets?areaId=${hall.id}&page=2&pageSize=2`).set('Authorization', technician.auth);
    expect(one.body.total).toBe(5);
    expect(two.body.page).toBe(2);
    const ids = [...one.body.items, ...two.body.items].map((c: { id: string }) => c.id);
    expect(new Set(ids).size).toBe(4);
  });

  it('when the page size is too large or a filter is invalid, then 400 naming it', async () => {
    const big = await request(app).get('/api/cabinets?pageSize=1000').set('Authorization', technician.auth);
    expect(big.status).toBe(400);
    expect(big.body.error.issues[0].path).toBe('pageSize');
    const status = await request(app).get('/api/cabinets?status=broken').set('Authorization', technician.auth);
    expect(status.body.error.issues[0].path).toBe('status');
  });

  it('when there is no header, then 401; no role, 403', async () => {
    expect((await request(app).get('/api/cabinets')).status).toBe(401);
    const nobody = await createActor([]);
    expect((await request(app).get('/api/cabinets').set('Authorization', nobody.auth)).status).toBe(403);
  });
});

describe('GET /api/cabinets/:cabinetId', () => {
  it('when the cabinet exists, then 200; unknown, 404; no header, 401', async () => {
    const cabinet = await makeCabinet(planner.actor, area.id);
    expect((await request(app).get(`/api/cabinets/${cabinet.id}`).set('Authorization', technician.auth)).body.tag).toBe(cabinet.tag);
    expect((await request(app).get('/api/cabinets/00000000-0000-4000-8000-000000000000').set('Authorization', technician.auth)).status).toBe(404);
    expect((await request(app).get(`/api/cabinets/${cabinet.id}`)).status).toBe(401);
  });
});

describe('PATCH /api/cabinets/:cabinetId', () => {
  it('when the version is current, then 200 and the audit entry has before and after', async () => {
    const cabinet = await makeCabinet(planner.actor, area.id, { markedWaitMinutes: 5 });
    const res = await request(app)
      .patch(`/api/cabinets/${cabinet.id}`)
      .set('Authorization', planner.auth)
      .send({ version: 1, markedWaitMinutes: 15, status: 'out-of-service' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ markedWaitMinutes: 15, status: 'out-of-service', version: 2 });
    const audit = await request(app).get(`/api/cabinets/${cabinet.id}/audit`).set('Authorization', technician.auth);
    expect(audit.body.items[0].changes).toEqual(
      expect.arrayContaining([
        { field: 'markedWaitMinutes', before: 5, after: 15 },
        { field: 'status', before: 'in-service', after: 'out-of-service' },
      ]),
    );
  });

  it('when two people edit the same version, then the second gets 409 stale-version', async () => {
    const cabinet = await makeCabinet(planner.actor, area.id);
    const first = await request(app).patch(`/api/cabinets/${cabinet.id}`).set('Authorization', planner.auth).send({ version: 1, location: 'A' });
    const second = await request(app).patch(`/api/cabinets/${cabinet.id}`).set('Authorization', admin.auth).send({ version: 1, location: 'B' });
    expect(first.status).toBe(200);
    expect(second.status).toBe(409);
    expect(second.body.error.message).toMatch(/you edited version 1, it is now version 2/);
  });

  it('when a value is invalid, then 400 naming it; unknown, 404; technician, 403; no header, 401', async () => {
    const cabinet = await makeCabinet(planner.actor, area.id);
    const bad = await request(app).patch(`/api/cabinets/${cabinet.id}`).set('Authorization', planner.auth).send({ version: 1, commissionedOn: '31/12/2020' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.issues[0].path).toBe('commissionedOn');
    expect((await request(app).patch('/api/cabinets/00000000-0000-4000-8000-000000000000').set('Authorization', planner.auth).send({ version: 1 })).status).toBe(404);
    expect((await request(app).patch(`/api/cabinets/${cabinet.id}`).set('Authorization', technician.auth).send({ version: 1 })).status).toBe(403);
    expect((await request(app).patch(`/api/cabinets/${cabinet.id}`).send({ version: 1 })).status).toBe(401);
  });
});

describe('DELETE /api/cabinets/:cabinetId', () => {
  it('when retired, then its banks are removed with it, its tag is free again, and lists show it only when asked', async () => {
    const design = await makeDesign(admin.actor);
    const cabinet = await makeCabinet(planner.actor, area.id, { tag: 'RET-VFD-001' });
    const bank = await makeBank(planner.actor, cabinet.id, design.id);
    const res = await request(app).delete(`/api/cabinets/${cabinet.id}?version=1`).set('Authorization', planner.auth);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'retired', bankCount: 0 });
    const bankNow = await request(app).get(`/api/banks/${bank.id}`).set('Authorization', planner.auth);
    expect(bankNow.body.status).toBe('removed');
    expect((await request(app).get('/api/cabinets?q=RET-VFD-001').set('Authorization', planner.auth)).body.total).toBe(0);
    expect((await request(app).get('/api/cabinets?q=RET-VFD-001&includeRetired=true').set('Authorization', planner.auth)).body.total).toBe(1);
    const reuse = await request(app).post('/api/cabinets').set('Authorization', planner.auth).send({ ...cabinetData(area.id), tag: 'RET-VFD-001' });
    expect(reuse.status).toBe(201);
    const audit = await request(app).get(`/api/cabinets/${cabinet.id}/audit`).set('Authorization', planner.auth);
    expect(audit.body.items[0]).toMatchObject({ action: 'retire', summary: expect.stringContaining('1 bank') });
  });

  it('when stale, 409; no version, 400; unknown, 404; technician, 403; no header, 401', async () => {
    const cabinet = await makeCabinet(planner.actor, area.id);
    expect((await request(app).delete(`/api/cabinets/${cabinet.id}?version=3`).set('Authorization', planner.auth)).status).toBe(409);
    expect((await request(app).delete(`/api/cabinets/${cabinet.id}`).set('Authorization', planner.auth)).status).toBe(400);
    expect((await request(app).delete('/api/cabinets/00000000-0000-4000-8000-000000000000?version=1').set('Authorization', planner.auth)).status).toBe(404);
    expect((await request(app).delete(`/api/cabinets/${cabinet.id}?version=1`).set('Authorization', technician.auth)).status).toBe(403);
    expect((await request(app).delete(`/api/cabinets/${cabinet.id}?version=1`)).status).toBe(401);
  });
});

describe('/api/cabinets/:cabinetId/banks', () => {
  it('when a planner adds a bank to the cabinet, then 201 with a nameplate baseline, and the cabinet lists it', async () => {
    const design = await makeDesign(admin.actor);
    const cabinet = await makeCabinet(planner.actor, area.id);
    const res = await request(app)
      .post(`/api/cabinets/${cabinet.id}/banks`)
      .set('Authorization', planner.auth)
      .send({ bankDesignId: design.id, position: 'Drive 1 DC link', installedOn: '2021-06-01' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ cabinetId: cabinet.id, position: 'Drive 1 DC link', baseline: { source: 'nameplate' } });
    const list = await request(app).get(`/api/cabinets/${cabinet.id}/banks`).set('Authorization', technician.auth);
    expect(list.status).toBe(200);
    expect(list.body).toMatchObject({ total: 1, items: [{ position: 'Drive 1 DC link', latestVerdict: null }] });
  });

  it('when the position is missing, then 400 naming position; unknown cabinet, 404; technician, 403; no header, 401', async () => {
    const design = await makeDesign(admin.actor);
    const cabinet = await makeCabinet(planner.actor, area.id);
    const bad = await request(app).post(`/api/cabinets/${cabinet.id}/banks`).set('Authorization', planner.auth).send({ bankDesignId: design.id });
    expect(bad.status).toBe(400);
    expect(bad.body.error.issues[0].path).toBe('position');
    expect((await request(app).get('/api/cabinets/00000000-0000-4000-8000-000000000000/banks').set('Authorization', planner.auth)).status).toBe(404);
    expect((await request(app).post(`/api/cabinets/${cabinet.id}/banks`).set('Authorization', technician.auth).send({ bankDesignId: design.id, position: 'X' })).status).toBe(403);
    expect((await request(app).get(`/api/cabinets/${cabinet.id}/banks`)).status).toBe(401);
  });
});

describe('GET /api/cabinets/:cabinetId/label', () => {
  it('when asked, then the page address from APP_URL and its QR code as SVG', async () => {
    const cabinet = await makeCabinet(planner.actor, area.id);
    const res = await request(app).get(`/api/cabinets/${cabinet.id}/label`).set('Authorization', technician.auth);
    expect(res.status).toBe(200);
    expect(res.body.url).toMatch(new RegExp(`^https?://[^/]+/register/cabinets/${cabinet.id}$`));
    expect(res.body.qrSvg).toMatch(/^<svg[^>]*xmlns="http:\/\/www.w3.org\/2000\/svg"/);
    expect((await request(app).get('/api/cabinets/00000000-0000-4000-8000-000000000000/label').set('Authorization', technician.auth)).status).toBe(404);
    expect((await request(app).get(`/api/cabinets/${cabinet.id}/label`)).status).toBe(401);
  });
});

describe('GET /api/cabinets/:cabinetId/audit', () => {
  it('when the cabinet is unknown, then 404; no header, 401', async () => {
    const cabinet = await makeCabinet(planner.actor, area.id);
    expect((await request(app).get('/api/cabinets/00000000-0000-4000-8000-000000000000/audit').set('Authorization', planner.auth)).status).toBe(404);
    expect((await request(app).get(`/api/cabinets/${cabinet.id}/audit`)).status).toBe(401);
    const audit = await request(app).get(`/api/cabinets/${cabinet.id}/audit`).set('Authorization', technician.auth);
    expect(audit.body.items).toEqual([expect.objectContaining({ action: 'create', before: null, actor: { id: planner.user.id, name: planner.user.name } })]);
  });
});
