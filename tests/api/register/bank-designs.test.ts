import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { DEFAULT_HEALTH_LIMITS } from '../../../shared/constants/health';
import { countRows, createActor, designData, makeArea, makeBank, makeCabinet, makeDesign, makeSite } from '../../support/register';

const app = createApp();
let reliability: Awaited<ReturnType<typeof createActor>>;
let planner: Awaited<ReturnType<typeof createActor>>;
let technician: Awaited<ReturnType<typeof createActor>>;

beforeAll(async () => {
  reliability = await createActor(['reliability']);
  planner = await createActor(['planner']);
  technician = await createActor(['technician']);
});

describe('POST /api/bank-designs', () => {
  it('when a reliability engineer adds an electrolytic design without limits, then the electrolytic defaults and the nominal bank values', async () => {
    const res = await request(app).post('/api/bank-designs').set('Authorization', reliability.auth).send(designData({ code: 'el-2s3p' }));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      code: 'EL-2S3P',
      revision: 1,
      watchRatio: DEFAULT_HEALTH_LIMITS.electrolytic.watchRatio,
      endOfLifeRatio: DEFAULT_HEALTH_LIMITS.electrolytic.endOfLifeRatio,
      inspectionIntervalDays: 365,
      // 3 strings of 2 × 4700 µF: 3 × 4700 / 2
      nominalCapacitanceMicrofarads: 7050,
      bankRatedVolts: 900,
    });
    expect(res.body.nominalTauSeconds).toBeCloseTo(47_000 * 7050e-6, 6);
  });

  it('when the design is film, then the film defaults', async () => {
    const res = await request(app)
      .post('/api/bank-designs')
      .set('Authorization', reliability.auth)
      .send(designData({ technology: 'film', seriesCount: 1, parallelCount: 2, unitCapacitanceMicrofarads: 820, unitRatedVolts: 1100 }));
    expect(res.body).toMatchObject({ technology: 'film', ...DEFAULT_HEALTH_LIMITS.film });
  });

  it('when the end-of-life limit is not below the watch limit, then 400 naming endOfLifeRatio and nothing is stored', async () => {
    const before = await countRows('bank_designs');
    const res = await request(app)
      .post('/api/bank-designs')
      .set('Authorization', reliability.auth)
      .send(designData({ watchRatio: 0.8, endOfLifeRatio: 0.9 }));
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('endOfLifeRatio');
    expect(await countRows('bank_designs')).toBe(before);
    expect(await countRows('bank_design_versions')).toBeGreaterThanOrEqual(0);
  });

  it('when the series count is zero, then 400 naming seriesCount', async () => {
    const res = await request(app).post('/api/bank-designs').set('Authorization', reliability.auth).send(designData({ seriesCount: 0 }));
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('seriesCount');
  });

  it('when the code is taken, then 409 naming code', async () => {
    await makeDesign(reliability.actor, { code: 'TAKEN-1' });
    const res = await request(app).post('/api/bank-designs').set('Authorization', reliability.auth).send(designData({ code: 'taken-1' }));
    expect(res.status).toBe(409);
    expect(res.body.error.issues[0].path).toBe('code');
  });

  it('when a planner or technician tries, then 403; without a header, 401', async () => {
    expect((await request(app).post('/api/bank-designs').set('Authorization', planner.auth).send(designData())).status).toBe(403);
    expect((await request(app).post('/api/bank-designs').set('Authorization', technician.auth).send(designData())).status).toBe(403);
    expect((await request(app).post('/api/bank-designs').send(designData())).status).toBe(401);
  });
});

describe('GET /api/bank-designs', () => {
  it('when filtering by technology, then only those; everyone reads', async () => {
    await makeDesign(reliability.actor, { technology: 'film', code: 'FILM-LIST' });
    const res = await request(app).get('/api/bank-designs?technology=film&q=film-list').set('Authorization', technician.auth);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ total: 1, items: [{ code: 'FILM-LIST', technology: 'film' }] });
    expect((await request(app).get('/api/bank-designs?technology=paper').set('Authorization', technician.auth)).status).toBe(400);
    expect((await request(app).get('/api/bank-designs')).status).toBe(401);
  });
});

describe('PATCH /api/bank-designs/:designId', () => {
  it('when a limit changes, then a new revision is current and the old revision keeps its limit', async () => {
    const design = await makeDesign(reliability.actor);
    const res = await request(app)
      .patch(`/api/bank-designs/${design.id}`)
      .set('Authorization', reliability.auth)
      .send({ version: 1, watchRatio: 0.92, changeNote: 'tighter watch after fleet review' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ revision: 2, watchRatio: 0.92, version: 2 });
    expect(res.body.revisionId).not.toBe(design.currentVersionId);
    const revisions = await request(app).get(`/api/bank-designs/${design.id}/versions`).set('Authorization', technician.auth);
    expect(revisions.status).toBe(200);
    expect(revisions.body.items.map((r: { revision: number; watchRatio: number }) => [r.revision, r.watchRatio])).toEqual([
      [2, 0.92],
      [1, 0.9],
    ]);
    expect(revisions.body.items[0]).toMatchObject({ changeNote: 'tighter watch after fleet review', createdBy: { id: reliability.user.id } });
  });

  it('when only the name changes, then no new revision', async () => {
    const design = await makeDesign(reliability.actor);
    const res = await request(app).patch(`/api/bank-designs/${design.id}`).set('Authorization', reliability.auth).send({ version: 1, name: 'Renamed' });
    expect(res.body).toMatchObject({ name: 'Renamed', revision: 1, version: 2 });
  });

  it('when the version is stale, then 409 and no revision is added', async () => {
    const design = await makeDesign(reliability.actor);
    await request(app).patch(`/api/bank-designs/${design.id}`).set('Authorization', reliability.auth).send({ version: 1, notes: 'x' });
    const res = await request(app).patch(`/api/bank-designs/${design.id}`).set('Authorization', reliability.auth).send({ version: 1, bleederOhms: 1 });
    expect(res.status).toBe(409);
    const revisions = await request(app).get(`/api/bank-designs/${design.id}/versions`).set('Authorization', reliability.auth);
    expect(revisions.body.items).toHaveLength(1);
  });

  it('when a change would put end of life above watch, then 400 naming endOfLifeRatio', async () => {
    const design = await makeDesign(reliability.actor);
    const res = await request(app).patch(`/api/bank-designs/${design.id}`).set('Authorization', reliability.auth).send({ version: 1, endOfLifeRatio: 0.95 });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('endOfLifeRatio');
  });

  it('when the design is unknown, 404; a planner, 403; no header, 401', async () => {
    const design = await makeDesign(reliability.actor);
    expect((await request(app).patch('/api/bank-designs/00000000-0000-4000-8000-000000000000').set('Authorization', reliability.auth).send({ version: 1 })).status).toBe(404);
    expect((await request(app).patch(`/api/bank-designs/${design.id}`).set('Authorization', planner.auth).send({ version: 1, name: 'P' })).status).toBe(403);
    expect((await request(app).patch(`/api/bank-designs/${design.id}`).send({ version: 1 })).status).toBe(401);
  });
});

describe('GET /api/bank-designs/:designId (+ versions, audit)', () => {
  it('when the design exists, then 200 with its bank count; unknown, 404; no header, 401', async () => {
    const design = await makeDesign(reliability.actor);
    const site = await makeSite(planner.actor);
    const area = await makeArea(planner.actor, site.id);
    const cabinet = await makeCabinet(planner.actor, area.id);
    await makeBank(planner.actor, cabinet.id, design.id);
    const res = await request(app).get(`/api/bank-designs/${design.id}`).set('Authorization', technician.auth);
    expect(res.body).toMatchObject({ id: design.id, bankCount: 1 });
    for (const path of ['', '/versions', '/audit']) {
      expect((await request(app).get(`/api/bank-designs/00000000-0000-4000-8000-000000000000${path}`).set('Authorization', technician.auth)).status).toBe(404);
      expect((await request(app).get(`/api/bank-designs/${design.id}${path}`)).status).toBe(401);
    }
    const audit = await request(app).get(`/api/bank-designs/${design.id}/audit`).set('Authorization', technician.auth);
    expect(audit.body.items[0]).toMatchObject({ action: 'create', after: expect.objectContaining({ revision: 1, seriesCount: 2 }) });
  });
});

describe('DELETE /api/bank-designs/:designId', () => {
  it('when banks in service use it, then 409 in-use; when none, retired', async () => {
    const used = await makeDesign(reliability.actor);
    const site = await makeSite(planner.actor);
    const area = await makeArea(planner.actor, site.id);
    const cabinet = await makeCabinet(planner.actor, area.id);
    await makeBank(planner.actor, cabinet.id, used.id);
    const refused = await request(app).delete(`/api/bank-designs/${used.id}?version=1`).set('Authorization', reliability.auth);
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('in-use');
    const unused = await makeDesign(reliability.actor);
    const ok = await request(app).delete(`/api/bank-designs/${unused.id}?version=1`).set('Authorization', reliability.auth);
    expect(ok.status).toBe(200);
    expect(ok.body.retiredAt).not.toBeNull();
  });

  it('when stale, 409; unknown, 404; planner, 403; no header, 401', async () => {
    const design = await makeDesign(reliability.actor);
    expect((await request(app).delete(`/api/bank-designs/${design.id}?version=4`).set('Authorization', reliability.auth)).status).toBe(409);
    expect((await request(app).delete('/api/bank-designs/00000000-0000-4000-8000-000000000000?version=1').set('Authorization', reliability.auth)).status).toBe(404);
    expect((await request(app).delete(`/api/bank-designs/${design.id}?version=1`).set('Authorization', planner.auth)).status).toBe(403);
    expect((await request(app).delete(`/api/bank-designs/${design.id}?version=1`)).status).toBe(401);
  });
});
