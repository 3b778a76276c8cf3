import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { countRows, createActor, makeArea, makeBank, makeCabinet, makeDesign, makeSite } from '../../support/register';

const app = createApp();
let planner: Awaited<ReturnType<typeof createActor>>;
let reliability: Awaited<ReturnType<typeof createActor>>;
let technician: Awaited<ReturnType<typeof createActor>>;
let cabinetId: string;
let designId: string;
let filmDesignId: string;

beforeAll(async () => {
  planner = await createActor(['planner']);
  reliability = await createActor(['reliability']);
  technician = await createActor(['technician']);
  const site = await makeSite(planner.actor);
  const area = await makeArea(planner.actor, site.id);
  cabinetId = (await makeCabinet(planner.actor, area.id)).id;
  designId = (await makeDesign(reliability.actor)).id;
  filmDesignId = (
    // a single 900 V film unit: rated above the 540 V bus of the test cabinets
    await makeDesign(reliability.actor, { technology: 'film', unitCapacitanceMicrofarads: 1000, unitRatedVolts: 900, seriesCount: 1, parallelCount: 1, bleederOhms: 100_000 })
  ).id;
});

describe('POST /api/banks', () => {
  it('when a planner adds a bank, then its baseline is the nameplate: C = p × C / s, τ = R × C, who and when', async () => {
    const res = await request(app)
      .post('/api/banks')
      .set('Authorization', planner.auth)
      .send({ cabinetId, bankDesignId: designId, position: 'Inverter A', serialNumber: 'SN-1', installedOn: '2022-03-04' });
    expect(res.status).toBe(201);
    expect(res.body.baseline).toMatchObject({
      source: 'nameplate',
      capacitanceMicrofarads: 7050,
      setBy: { id: planner.user.id, name: planner.user.name },
      designRevision: 1,
    });
    expect(res.body.baseline.tauSeconds).toBeCloseTo(331.35, 2);
    expect(res.body).toMatchObject({ status: 'in-service', lineage: [{ id: res.body.id }], latestVerdict: null });
  });

  it('when the design is unknown, then 400 naming bankDesignId and nothing is stored', async () => {
    const before = await countRows('banks');
    const res = await request(app)
      .post('/api/banks')
      .set('Authorization', planner.auth)
      .send({ cabinetId, bankDesignId: '00000000-0000-4000-8000-000000000000', position: 'X' });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('bankDesignId');
    expect(await countRows('banks')).toBe(before);
  });

  it('when the install date is not a date, then 400 naming installedOn', async () => {
    const res = await request(app).post('/api/banks').set('Authorization', planner.auth).send({ cabinetId, bankDesignId: designId, position: 'Y', installedOn: 'soon' });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('installedOn');
  });

  it('when the position already has a bank in service, then 409 naming position', async () => {
    await makeBank(planner.actor, cabinetId, designId, 'Rectifier');
    const res = await request(app).post('/api/banks').set('Authorization', planner.auth).send({ cabinetId, bankDesignId: designId, position: 'rectifier' });
    expect(res.status).toBe(409);
    expect(res.body.error.issues[0].path).toBe('position');
  });

  it('when a technician or reliability engineer tries, then 403; without a header, 401', async () => {
    const body = { cabinetId, bankDesignId: designId, position: 'Z' };
    expect((await request(app).post('/api/banks').set('Authorization', technician.auth).send(body)).status).toBe(403);
    expect((await request(app).post('/api/banks').set('Authorization', reliability.auth).send(body)).status).toBe(403);
    expect((await request(app).post('/api/banks').send(body)).status).toBe(401);
  });
});

describe('GET /api/banks', () => {
  it('when filtering by cabinet, then its banks in service with cabinet and design; search by tag works', async () => {
    const site = await makeSite(planner.actor);
    const area = await makeArea(planner.actor, site.id);
    const cabinet = await makeCabinet(planner.actor, area.id, { tag: 'BNK-LIST-01' });
    await makeBank(planner.actor, cabinet.id, designId, 'DC1');
    await makeBank(planner.actor, cabinet.id, filmDesignId, 'DC2');
    const res = await request(app).get(`/api/banks?cabinetId=${cabinet.id}&sort=position`).set('Authorization', technician.auth);
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(2);
    expect(res.body.items.map((b: { position: string; technology: string }) => [b.position, b.technology])).toEqual([
      ['DC1', 'electrolytic'],
      ['DC2', 'film'],
    ]);
    const bySearch = await request(app).get('/api/banks?q=bnk-list').set('Authorization', technician.auth);
    expect(bySearch.body.total).toBe(2);
    const bySite = await request(app).get(`/api/banks?siteId=${site.id}`).set('Authorization', technician.auth);
    expect(bySite.body.total).toBe(2);
    expect((await request(app).get('/api/banks?sort=health').set('Authorization', technician.auth)).status).toBe(400);
    expect((await request(app).get('/api/banks')).status).toBe(401);
  });
});

describe('GET /api/banks/:bankId', () => {
  it('when the bank exists, then 200; unknown, 404; no header, 401', async () => {
    const bank = await makeBank(planner.actor, cabinetId, designId);
    expect((await request(app).get(`/api/banks/${bank.id}`).set('Authorization', technician.auth)).body.id).toBe(bank.id);
    expect((await request(app).get('/api/banks/00000000-0000-4000-8000-000000000000').set('Authorization', technician.auth)).status).toBe(404);
    expect((await request(app).get(`/api/banks/${bank.id}`)).status).toBe(401);
  });

  it('when a bank is read, then it carries what a decay check needs: its design revision figures and its cabinet bus voltage and wait', async () => {
    const bank = await makeBank(planner.actor, cabinetId, designId);
    const res = await request(app).get(`/api/banks/${bank.id}`).set('Authorization', technician.auth);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      technology: 'electrolytic',
      designFigures: {
        unitCapacitanceMicrofarads: 4700,
        seriesCount: 2,
        parallelCount: 3,
        bleederOhms: 47_000,
        tempCoefficientPercentPerKelvin: 0.25,
        watchRatio: 0.9,
        endOfLifeRatio: 0.8,
      },
      cabinetDcBusVolts: 540,
      cabinetMarkedWaitMinutes: 5,
    });
  });
});

describe('PATCH /api/banks/:bankId', () => {
  it('when the design is corrected, then a nameplate baseline follows the new design', async () => {
    const bank = await makeBank(planner.actor, cabinetId, designId);
    const res = await request(app).patch(`/api/banks/${bank.id}`).set('Authorization', planner.auth).send({ version: 1, bankDesignId: filmDesignId });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ bankDesignId: filmDesignId, version: 2, baseline: { source: 'nameplate', capacitanceMicrofarads: 1000, tauSeconds: 100 } });
  });

  it('when stale, 409; invalid, 400 naming the field; unknown, 404; technician, 403; no header, 401', async () => {
    const bank = await makeBank(planner.actor, cabinetId, designId);
    await request(app).patch(`/api/banks/${bank.id}`).set('Authorization', planner.auth).send({ version: 1, notes: 'one' });
    expect((await request(app).patch(`/api/banks/${bank.id}`).set('Authorization', planner.auth).send({ version: 1, notes: 'two' })).status).toBe(409);
    const bad = await request(app).patch(`/api/banks/${bank.id}`).set('Authorization', planner.auth).send({ version: 2, position: '' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.issues[0].path).toBe('position');
    expect((await request(app).patch('/api/banks/00000000-0000-4000-8000-000000000000').set('Authorization', planner.auth).send({ version: 1 })).status).toBe(404);
    expect((await request(app).patch(`/api/banks/${bank.id}`).set('Authorization', technician.auth).send({ version: 2 })).status).toBe(403);
    expect((await request(app).patch(`/api/banks/${bank.id}`).send({ version: 2 })).status).toBe(401);
  });
});

describe('PUT /api/banks/:bankId/baseline', () => {
  it('when a reliability engineer enters a baseline, then it is kept with who, when and the note, and audited', async () => {
    const bank = await makeBank(planner.actor, cabinetId, designId);
    const res = await request(app)
      .put(`/api/banks/${bank.id}/baseline`)
      .set('Authorization', reliability.auth)
      .send({ version: 1, source: 'manual', tauSeconds: 318.2, capacitanceMicrofarads: 6770, note: 'commissioning measurement' });
    expect(res.status).toBe(200);
    expect(res.body.baseline).toMatchObject({
      source: 'manual',
      tauSeconds: 318.2,
      capacitanceMicrofarads: 6770,
      setBy: { id: reliability.user.id },
      note: 'commissioning measurement',
      designRevision: null,
    });
    const audit = await request(app).get(`/api/banks/${bank.id}/audit`).set('Authorization', technician.auth);
    expect(audit.body.items[0]).toMatchObject({ action: 'baseline' });
    expect(audit.body.items[0].changes).toEqual(expect.arrayContaining([{ field: 'baselineTauSeconds', before: expect.any(Number), after: 318.2 }]));

    const reset = await request(app).put(`/api/banks/${bank.id}/baseline`).set('Authorization', reliability.auth).send({ version: 2, source: 'nameplate' });
    expect(reset.body.baseline).toMatchObject({ source: 'nameplate', capacitanceMicrofarads: 7050, designRevision: 1 });
  });

  it('when a manual baseline lacks τ, then 400 naming tauSeconds', async () => {
    const bank = await makeBank(planner.actor, cabinetId, designId);
    const res = await request(app).put(`/api/banks/${bank.id}/baseline`).set('Authorization', reliability.auth).send({ version: 1, source: 'manual', capacitanceMicrofarads: 10 });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('tauSeconds');
  });

  it('when a planner or technician tries, then 403; stale, 409; unknown, 404; no header, 401', async () => {
    const bank = await makeBank(planner.actor, cabinetId, designId);
    const body = { version: 1, source: 'nameplate' };
    expect((await request(app).put(`/api/banks/${bank.id}/baseline`).set('Authorization', planner.auth).send(body)).status).toBe(403);
    expect((await request(app).put(`/api/banks/${bank.id}/baseline`).set('Authorization', technician.auth).send(body)).status).toBe(403);
    expect((await request(app).put(`/api/banks/${bank.id}/baseline`).set('Authorization', reliability.auth).send({ ...body, version: 5 })).status).toBe(409);
    expect((await request(app).put('/api/banks/00000000-0000-4000-8000-000000000000/baseline').set('Authorization', reliability.auth).send(body)).status).toBe(404);
    expect((await request(app).put(`/api/banks/${bank.id}/baseline`).send(body)).status).toBe(401);
  });
});

describe('POST /api/banks/:bankId/replacement', () => {
  it('when a bank is replaced, then the old one keeps its record and baseline, and the new one starts a new baseline in the same place', async () => {
    const old = await makeBank(planner.actor, cabinetId, designId, 'Drive 7');
    await request(app)
      .put(`/api/banks/${old.id}/baseline`)
      .set('Authorization', reliability.auth)
      .send({ version: 1, source: 'manual', tauSeconds: 300, capacitanceMicrofarads: 6400 });
    const res = await request(app)
      .post(`/api/banks/${old.id}/replacement`)
      .set('Authorization', planner.auth)
      .send({ version: 2, installedOn: '2024-09-12', serialNumber: 'NEW-77', note: 'bulged cans' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      position: 'Drive 7',
      cabinetId,
      replacesBankId: old.id,
      status: 'in-service',
      installedOn: '2024-09-12',
      baseline: { source: 'nameplate', capacitanceMicrofarads: 7050 },
    });
    expect(res.body.lineage.map((l: { id: string }) => l.id)).toEqual([old.id, res.body.id]);
    const oldNow = await request(app).get(`/api/banks/${old.id}`).set('Authorization', technician.auth);
    expect(oldNow.body).toMatchObject({
      status: 'replaced',
      replacedByBankId: res.body.id,
      replacedOn: '2024-09-12',
      baseline: { source: 'manual', tauSeconds: 300 },
    });
    const inService = await request(app).get(`/api/banks?cabinetId=${cabinetId}&q=Drive 7`).set('Authorization', technician.auth);
    expect(inService.body.items.map((b: { id: string }) => b.id)).toEqual([res.body.id]);
    const history = await request(app).get(`/api/banks?cabinetId=${cabinetId}&q=Drive 7&includeRetired=true`).set('Authorization', technician.auth);
    expect(history.body.total).toBe(2);
    const again = await request(app).patch(`/api/banks/${old.id}`).set('Authorization', planner.auth).send({ version: 3, notes: 'late note' });
    expect(again.status).toBe(409);
    const audit = await request(app).get(`/api/banks/${old.id}/audit`).set('Authorization', technician.auth);
    expect(audit.body.items[0]).toMatchObject({ action: 'replace', summary: expect.stringContaining('bulged cans') });
  });

  it('when the install date is missing, then 400 naming installedOn and nothing is stored', async () => {
    const bank = await makeBank(planner.actor, cabinetId, designId);
    const before = await countRows('banks');
    const res = await request(app).post(`/api/banks/${bank.id}/replacement`).set('Authorization', planner.auth).send({ version: 1 });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('installedOn');
    expect(await countRows('banks')).toBe(before);
  });

  it('when stale, 409; unknown, 404; technician, 403; no header, 401', async () => {
    const bank = await makeBank(planner.actor, cabinetId, designId);
    const body = { version: 1, installedOn: '2025-01-01' };
    expect((await request(app).post(`/api/banks/${bank.id}/replacement`).set('Authorization', planner.auth).send({ ...body, version: 2 })).status).toBe(409);
    expect((await request(app).post('/api/banks/00000000-0000-4000-8000-000000000000/replacement').set('Authorization', planner.auth).send(body)).status).toBe(404);
    expect((await request(app).post(`/api/banks/${bank.id}/replacement`).set('Authorization', technician.auth).send(body)).status).toBe(403);
    expect((await request(app).post(`/api/banks/${bank.id}/replacement`).send(body)).status).toBe(401);
  });
});

describe('DELETE /api/banks/:bankId', () => {
  it('when removed, then status removed and its position is free; stale, 409; unknown, 404; technician, 403; no header, 401', async () => {
    const bank = await makeBank(planner.actor, cabinetId, designId, 'Spare slot');
    expect((await request(app).delete(`/api/banks/${bank.id}?version=2`).set('Authorization', planner.auth)).status).toBe(409);
    expect((await request(app).delete(`/api/banks/${bank.id}?version=1`).set('Authorization', technician.auth)).status).toBe(403);
    expect((await request(app).delete(`/api/banks/${bank.id}?version=1`)).status).toBe(401);
    expect((await request(app).delete('/api/banks/00000000-0000-4000-8000-000000000000?version=1').set('Authorization', planner.auth)).status).toBe(404);
    const res = await request(app).delete(`/api/banks/${bank.id}?version=1`).set('Authorization', planner.auth);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'removed' });
    expect(res.body.retiredAt).not.toBeNull();
    await makeBank(planner.actor, cabinetId, designId, 'Spare slot');
  });

  it('when the audit of an unknown bank is asked, then 404; no header, 401', async () => {
    const bank = await makeBank(planner.actor, cabinetId, designId);
    expect((await request(app).get('/api/banks/00000000-0000-4000-8000-000000000000/audit').set('Authorization', planner.auth)).status).toBe(404);
    expect((await request(app).get(`/api/banks/${bank.id}/audit`)).status).toBe(401);
  });
});
