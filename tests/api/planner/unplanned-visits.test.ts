/**
 * Unplanned visits: a technician at a cabinet starts a visit there and then
 * (`POST /api/cabinets/:cabinetId/unplanned-visits`), and planners see it as unplanned.
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { sequelize } from '../../../api/src/db/sequelize';
import type { Visit } from '../../../shared/schemas/visit';
import { assertCorpusHolds } from '../../support/hostile-bodies';
import { createActor, makeCabinet } from '../../support/register';
import { makePlant, type Plant } from './visits-fixtures';

const app = createApp();
let plant: Plant;

beforeAll(async () => {
  plant = await makePlant();
}, 60_000);

const start = (auth: string, cabinetId: string, body: unknown = {}) =>
  request(app).post(`/api/cabinets/${cabinetId}/unplanned-visits`).set('Authorization', auth).send(body as object);

async function count(sql: string, bind: unknown[] = []): Promise<number> {
  const [rows] = await sequelize.query(sql, { bind });
  return (rows as Array<{ n: number }>)[0]!.n;
}

describe('unplanned visits', () => {
  it('when a technician of the site starts one, then it is under way, unplanned, theirs, of every bank in service, planned from now for its estimate, with its audit entry and outbox message; a planner sees it in the visit list', async () => {
    const before = Date.now();
    const res = await start(plant.ana.auth, plant.cabinet.id);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const visit = res.body as Visit;
    expect(visit).toMatchObject({ state: 'under-way', unplanned: true, cabinetId: plant.cabinet.id });
    expect(visit.technicians.map((t) => t.id)).toEqual([plant.ana.user.id]);
    expect(visit.banks.map((b) => b.id).sort()).toEqual([plant.bankA.id, plant.bankB.id].sort());
    expect(Date.parse(visit.startedAt!)).toBeGreaterThanOrEqual(before - 1000);
    expect(visit.plannedStartAt).toBe(visit.startedAt);
    expect(Date.parse(visit.plannedEndAt) - Date.parse(visit.plannedStartAt)).toBe(visit.estimatedMinutes * 60_000);

    expect(await count(`SELECT count(*)::int AS n FROM audit_entries WHERE entity_id = $1 AND action = 'create'`, [visit.id])).toBe(1);
    expect(await count(`SELECT count(*)::int AS n FROM outbox_messages WHERE topic = 'visit.unplanned' AND payload->>'visitId' = $1`, [visit.id])).toBe(1);

    const list = await request(app)
      .get(`/api/visits?cabinetId=${plant.cabinet.id}&state=under-way`)
      .set('Authorization', plant.planner.auth);
    expect(list.status).toBe(200);
    const listed = (list.body.items as Visit[]).find((v) => v.id === visit.id);
    expect(listed).toMatchObject({ unplanned: true, state: 'under-way' });

    // the same technician again at the same cabinet: the visit under way is theirs already
    const again = await start(plant.ana.auth, plant.cabinet.id);
    expect(again.status).toBe(409);
    // and they can log it as any visit
    const logged = await request(app)
      .post(`/api/visits/${visit.id}/transitions`)
      .set('Authorization', plant.ana.auth)
      .send({ action: 'log', version: visit.version });
    expect(logged.status, JSON.stringify(logged.body)).toBe(200);
  }, 30_000);

  it('when some banks are named, then the visit holds only those; a bank of another cabinet is refused naming bankIds and nothing is stored', async () => {
    const res = await start(plant.ben.auth, plant.cabinet.id, { bankIds: [plant.bankB.id] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect((res.body as Visit).banks.map((b) => b.id)).toEqual([plant.bankB.id]);

    const visitsBefore = await count('SELECT count(*)::int AS n FROM visits');
    const other = await createActor(['technician']);
    const bad = await start(other.auth, plant.cabinet.id, { bankIds: [plant.otherBank.id] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.issues[0].path).toBe('bankIds');
    const garbage = await start(other.auth, plant.cabinet.id, { bankIds: ['not-an-id'] });
    expect(garbage.status).toBe(400);
    expect(await count('SELECT count(*)::int AS n FROM visits')).toBe(visitsBefore);
  }, 30_000);

  it('when a planner or a reliability engineer asks, then 403; a technician of another site, 403; nothing stored', async () => {
    const visitsBefore = await count('SELECT count(*)::int AS n FROM visits');
    expect((await start(plant.planner.auth, plant.cabinet.id)).status).toBe(403);
    expect((await start(plant.reliability.auth, plant.cabinet.id)).status).toBe(403);
    expect((await start(plant.outsider.auth, plant.cabinet.id)).status).toBe(403);
    expect(await count('SELECT count(*)::int AS n FROM visits')).toBe(visitsBefore);
  }, 30_000);

  it('when the cabinet is unknown, then 404; when it is retired, then 409', async () => {
    expect((await start(plant.ana.auth, '00000000-0000-4000-8000-000000000000')).status).toBe(404);
    expect((await start(plant.ana.auth, 'nope')).status).toBe(404);
    const retired = await makeCabinet(plant.planner.actor, plant.area.id, { tag: 'HW-PRESS-VFD-099' });
    const gone = await request(app)
      .delete(`/api/cabinets/${retired.id}?version=${retired.version}`)
      .set('Authorization', plant.planner.auth);
    expect(gone.status, JSON.stringify(gone.body)).toBe(200);
    const res = await start(plant.ana.auth, retired.id);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('retired');
  }, 30_000);

  it('when an admin starts one, then it is theirs', async () => {
    const res = await start(plant.admin.auth, plant.otherCabinet.id);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect((res.body as Visit).technicians.map((t) => t.id)).toEqual([plant.admin.user.id]);
  }, 30_000);

  it('when hostile bodies are sent, then never a 5xx, and a refusal stores nothing', async () => {
    const tech = await createActor(['technician']);
    const tally = await assertCorpusHolds(
      app,
      { method: 'post', path: `/api/cabinets/${plant.cabinet.id}/unplanned-visits`, headers: { Authorization: tech.auth } },
      { bankIds: [plant.bankA.id] },
      300,
    );
    // one visit at most: after it, the caller's visit under way there refuses the next (409)
    expect(tally[201] ?? 0).toBeLessThanOrEqual(1);
  }, 300_000);
});
