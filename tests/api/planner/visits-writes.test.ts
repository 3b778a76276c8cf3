/**
 * Visit writes: a change names only what it changes, bad input is a 400 naming the field with
 * nothing stored, and every write route holds against a corpus of hostile bodies.
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { assertCorpusHolds, CURRENT_VERSION } from '../../support/hostile-bodies';
import { at, makePlant, planVisit, visitBody, visitFootprint, visitTables, type Plant } from './visits-fixtures';

const app = createApp();
let plant: Plant;

beforeAll(async () => {
  plant = await makePlant();
});

// every kind overridden, so a body near the valid one may be saved again and again
const ALL_OVERRIDES = [
  { kind: 'outside-window', reason: 'corpus' },
  { kind: 'double-booked', reason: 'corpus' },
  { kind: 'not-due', reason: 'corpus' },
];

const read = async (id: string) => (await request(app).get(`/api/visits/${id}`).set('Authorization', plant.planner.auth)).body as Record<string, unknown>;

// what a change may move besides the fields it names
const BOOKKEEPING = ['version', 'updatedAt'];
function without(record: Record<string, unknown>, keys: string[]) {
  return Object.fromEntries(Object.entries(record).filter(([key]) => !keys.includes(key)));
}

describe('PATCH /api/visits/:visitId changes only what it names', () => {
  const cases: Array<{ field: string; value: () => unknown; alsoMoves?: string[]; replan: boolean }> = [
    { field: 'notes', value: () => 'Bring the long probes.', replan: false },
    { field: 'plannedStartAt', value: () => at('06:30'), replan: true, alsoMoves: ['stateReason', 'estimatedMinutes'] },
    { field: 'plannedEndAt', value: () => at('10:00'), replan: true, alsoMoves: ['stateReason'] },
    // Ben is not double-booked: the override of Ana's double-booking no longer applies and goes
    { field: 'technicianIds', value: () => [plant.ben.user.id], replan: true, alsoMoves: ['stateReason', 'technicians', 'overrides'] },
    { field: 'bankIds', value: () => [plant.bankB.id], replan: true, alsoMoves: ['stateReason', 'banks', 'estimatedMinutes'] },
    { field: 'overrides', value: () => [{ kind: 'not-due', reason: 'Checked with reliability' }], replan: false },
  ];

  for (const { field, value, alsoMoves = [], replan } of cases) {
    it(`when a PATCH names only ${field}, then only ${field} changes (and an audit entry says so)`, async () => {
      const visit = await planVisit(app, plant, { technicianIds: [plant.outsider.user.id], overrides: [{ kind: 'double-booked', reason: 'test' }] });
      const before = await read(visit.id);
      const sent = value();
      const res = await request(app)
        .patch(`/api/visits/${visit.id}`)
        .set('Authorization', plant.planner.auth)
        .send({ version: visit.version, ...(replan ? { reason: 'Moved for the crane lift' } : {}), [field]: sent });
      expect(res.status).toBe(200);
      const after = await read(visit.id);
      const moved = [field, ...alsoMoves, ...BOOKKEEPING, field === 'technicianIds' ? 'technicians' : '', field === 'bankIds' ? 'banks' : ''];
      expect(without(after, moved)).toEqual(without(before, moved));
      expect(after.version).toBe(visit.version + 1);
      if (field === 'technicianIds') expect((after.technicians as { id: string }[]).map((t) => t.id)).toEqual(sent);
      else if (field === 'bankIds') expect((after.banks as { id: string }[]).map((b) => b.id)).toEqual(sent);
      else expect(after[field]).toEqual(sent);
      if (replan) expect(after.stateReason).toBe('Moved for the crane lift');
      const trail = await request(app).get(`/api/visits/${visit.id}/audit`).set('Authorization', plant.planner.auth);
      expect(trail.body.items).toHaveLength(2);
      expect(trail.body.items[0].action).toBe(replan ? 'replan' : 'update');
      const changed = (trail.body.items[0].changes as { field: string }[]).map((c) => c.field);
      expect(changed).toContain(field);
    });
  }

  it('when a PATCH repeats what is stored, then nothing changes and no audit entry is added', async () => {
    const visit = await planVisit(app, plant, { technicianIds: [plant.outsider.user.id], overrides: [{ kind: 'double-booked', reason: 'test' }] });
    const before = await visitFootprint(visit.id);
    const res = await request(app)
      .patch(`/api/visits/${visit.id}`)
      .set('Authorization', plant.planner.auth)
      .send({ version: visit.version, notes: 'Bring the 1000 V meter.' });
    expect(res.status).toBe(200);
    expect(await visitFootprint(visit.id)).toEqual(before);
  });
});

describe('bad input names the field and stores nothing', () => {
  const badCreates: Array<[string, Record<string, unknown>, string]> = [
    ['no banks', { bankIds: [] }, 'bankIds'],
    ['a bank named twice', { bankIds: ['00000000-0000-4000-8000-000000000001', '00000000-0000-4000-8000-000000000001'] }, 'bankIds'],
    ['a bank that is not an id', { bankIds: ['DC1'] }, 'bankIds.0'],
    ['no technicians', { technicianIds: [] }, 'technicianIds'],
    ['no cabinet', { cabinetId: undefined }, 'cabinetId'],
    ['a start without a zone', { plannedStartAt: '2030-01-12T07:00:00' }, 'plannedStartAt'],
    ['a start that is no time', { plannedStartAt: 'Saturday morning' }, 'plannedStartAt'],
    ['an end before the start', { plannedEndAt: at('06:59') }, 'plannedEndAt'],
    ['an end equal to the start', { plannedEndAt: at('07:00') }, 'plannedEndAt'],
    ['a year out of range', { plannedStartAt: '2301-01-12T07:00:00Z', plannedEndAt: '2301-01-12T08:00:00Z' }, 'plannedStartAt'],
    ['notes holding a NUL', { notes: 'a\u0000b' }, 'notes'],
    ['notes too long', { notes: 'x'.repeat(2001) }, 'notes'],
    ['overrides not a list', { overrides: 'outside-window' }, 'overrides'],
    ['the same override twice', { overrides: [{ kind: 'not-due', reason: 'one' }, { kind: 'not-due', reason: 'two' }] }, 'overrides'],
  ];
  for (const [what, change, path] of badCreates) {
    it(`when a new visit has ${what}, then 400 naming ${path}`, async () => {
      const before = await visitTables();
      const res = await request(app).post('/api/visits').set('Authorization', plant.planner.auth).send(visitBody(plant, change));
      expect(res.status).toBe(400);
      expect(res.body.error.issues[0].path).toBe(path);
      expect(await visitTables()).toEqual(before);
    });
  }

  const badReferences: Array<[string, () => Record<string, unknown>, string]> = [
    ['an unknown cabinet', () => ({ cabinetId: '00000000-0000-4000-8000-000000000000' }), 'cabinetId'],
    ['a bank of another cabinet', () => ({ bankIds: [plant.bankA.id, plant.otherBank.id] }), 'bankIds'],
    ['a planner as technician', () => ({ technicianIds: [plant.planner.user.id] }), 'technicianIds'],
    ['an unknown technician', () => ({ technicianIds: ['00000000-0000-4000-8000-000000000000'] }), 'technicianIds'],
  ];
  for (const [what, change, path] of badReferences) {
    it(`when a new visit names ${what}, then 400 naming ${path}`, async () => {
      const before = await visitTables();
      const res = await request(app).post('/api/visits').set('Authorization', plant.planner.auth).send(visitBody(plant, change()));
      expect(res.status).toBe(400);
      expect(res.body.error.issues.map((i: { path: string }) => i.path)).toEqual([path]);
      expect(await visitTables()).toEqual(before);
    });
  }

  it('when a retired cabinet or a replaced bank is named, then 400 naming it', async () => {
    const { sequelize } = await import('../../../api/src/db/sequelize');
    const visit = visitBody(plant);
    await sequelize.query(`UPDATE banks SET status = 'replaced' WHERE id = $1`, { bind: [plant.bankB.id] });
    try {
      const res = await request(app).post('/api/visits').set('Authorization', plant.planner.auth).send(visit);
      expect(res.status).toBe(400);
      expect(res.body.error.issues[0].path).toBe('bankIds');
    } finally {
      await sequelize.query(`UPDATE banks SET status = 'in-service' WHERE id = $1`, { bind: [plant.bankB.id] });
    }
  });

  const badChanges: Array<[string, () => Record<string, unknown>, number, string]> = [
    ['new times without a reason', () => ({ plannedStartAt: at('08:00') }), 400, 'reason'],
    ['a reason of two letters', () => ({ reason: 'ok', plannedStartAt: at('08:00') }), 400, 'reason'],
    ['an end before the stored start', () => ({ reason: 'Earlier', plannedEndAt: at('06:00') }), 400, 'plannedEndAt'],
    ['a start after the stored end', () => ({ reason: 'Later', plannedStartAt: at('10:00') }), 400, 'plannedStartAt'],
    ['a bank of another cabinet', () => ({ reason: 'Other bank', bankIds: [plant.otherBank.id] }), 400, 'bankIds'],
    ['a reliability engineer as technician', () => ({ reason: 'Swap', technicianIds: [plant.reliability.user.id] }), 400, 'technicianIds'],
    ['no technicians', () => ({ reason: 'Swap', technicianIds: [] }), 400, 'technicianIds'],
    ['no version', () => ({ version: undefined, notes: 'x' }), 400, 'version'],
  ];
  for (const [what, change, status, path] of badChanges) {
    it(`when a PATCH sends ${what}, then ${status} naming ${path}`, async () => {
      const visit = await planVisit(app, plant, { technicianIds: [plant.outsider.user.id], overrides: [{ kind: 'double-booked', reason: 'test' }] });
      const before = await visitFootprint(visit.id);
      const res = await request(app)
        .patch(`/api/visits/${visit.id}`)
        .set('Authorization', plant.planner.auth)
        .send({ version: visit.version, ...change() });
      expect(res.status).toBe(status);
      expect(res.body.error.issues[0].path).toBe(path);
      expect(await visitFootprint(visit.id)).toEqual(before);
    });
  }

  it('when a PATCH names an old version, then 409 stale-version and nothing changes', async () => {
    const visit = await planVisit(app, plant, { technicianIds: [plant.outsider.user.id], overrides: [{ kind: 'double-booked', reason: 'test' }] });
    await request(app).patch(`/api/visits/${visit.id}`).set('Authorization', plant.planner.auth).send({ version: visit.version, notes: 'First edit' });
    const before = await visitFootprint(visit.id);
    const res = await request(app).patch(`/api/visits/${visit.id}`).set('Authorization', plant.planner.auth).send({ version: visit.version, notes: 'Second edit' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('stale-version');
    expect(await visitFootprint(visit.id)).toEqual(before);
  });
});

describe('hostile bodies: never a 5xx, a refusal stores nothing', () => {
  const planner = () => ({ Authorization: plant.planner.auth });

  it('POST /api/visits', async () => {
    const tally = await assertCorpusHolds(app, { method: 'post', path: '/api/visits', headers: planner() }, visitBody(plant, { overrides: ALL_OVERRIDES }), 300);
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);

  it('POST /api/visits/batch', async () => {
    const tally = await assertCorpusHolds(
      app,
      { method: 'post', path: '/api/visits/batch', headers: planner() },
      { visits: [visitBody(plant, { overrides: ALL_OVERRIDES }), visitBody(plant, { overrides: ALL_OVERRIDES, technicianIds: [plant.ben.user.id] })] },
      200,
    );
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);

  it('POST /api/visits/check', async () => {
    const tally = await assertCorpusHolds(app, { method: 'post', path: '/api/visits/check', headers: planner() }, visitBody(plant), 200);
    expect(tally[200]).toBeGreaterThan(0);
  }, 300_000);

  it('PATCH /api/visits/:visitId', async () => {
    const visit = await planVisit(app, plant, { overrides: ALL_OVERRIDES });
    const path = `/api/visits/${visit.id}`;
    const target = async () => ({ version: (await read(visit.id)).version as number, id: visit.id });
    const tally = await assertCorpusHolds(
      app,
      { method: 'patch', path, headers: planner(), target },
      { version: CURRENT_VERSION, reason: 'Moved for the crane lift', plannedStartAt: at('08:00'), plannedEndAt: at('09:30'), notes: 'Long probes', overrides: ALL_OVERRIDES },
      300,
    );
    expect(tally[200]).toBeGreaterThan(0);
  }, 300_000);

  it('POST /api/visits/:visitId/transitions', async () => {
    const visit = await planVisit(app, plant, { overrides: ALL_OVERRIDES });
    const target = async () => ({ version: (await read(visit.id)).version as number, id: visit.id });
    const tally = await assertCorpusHolds(
      app,
      { method: 'post', path: `/api/visits/${visit.id}/transitions`, headers: { Authorization: plant.ana.auth }, target },
      { action: 'start', version: CURRENT_VERSION },
      200,
    );
    expect(tally[200]).toBe(1);
  }, 300_000);
});
