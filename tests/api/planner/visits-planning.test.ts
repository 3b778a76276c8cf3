/**
 * Planning warnings over HTTP: a visit outside every shutdown window of its area, a technician
 * double-booked, a bank not yet due. Each refuses the save (422 override-needed, nothing stored)
 * unless overridden with a reason; POST /api/visits/check warns before saving; POST
 * /api/visits/batch saves all or none.
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { addWindow, at, makePlant, makeRecentBank, planVisit, visitBody, visitFootprint, visitTables, type Plant } from './visits-fixtures';

const app = createApp();
let plant: Plant;

beforeAll(async () => {
  plant = await makePlant();
});

const post = (path: string, body: unknown, auth = plant.planner.auth) => request(app).post(path).set('Authorization', auth).send(body as object);

describe('outside every shutdown window', () => {
  it('when a visit runs past the window’s end, then 422 override-needed naming overrides, and nothing is stored', async () => {
    const before = await visitTables();
    // the window is 06:00–14:00; 13:00–15:00 straddles its end
    const res = await post('/api/visits', visitBody(plant, { plannedStartAt: at('13:00'), plannedEndAt: at('15:00'), technicianIds: [plant.ben.user.id] }));
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('override-needed');
    expect(res.body.error.issues).toEqual([
      { path: 'overrides', kind: 'outside-window', message: 'The visit is not wholly inside one shutdown window of its area.' },
    ]);
    expect(await visitTables()).toEqual(before);
  });

  it('when the area has no window that day, then the message says the visit falls outside every window', async () => {
    const res = await post('/api/visits/check', visitBody(plant, { plannedStartAt: at('07:00', '2030-01-13'), plannedEndAt: at('08:00', '2030-01-13') }));
    expect(res.status).toBe(200);
    expect(res.body.warnings).toEqual([{ kind: 'outside-window', message: 'The visit falls outside every shutdown window of its area.' }]);
  });

  it('when overridden with a reason, then 201 and the override is kept on the visit and in its audit entry', async () => {
    const overrides = [{ kind: 'outside-window', reason: 'Drive stays isolated after the shutdown for a bearing change' }];
    const res = await post('/api/visits', visitBody(plant, { plannedStartAt: at('13:00'), plannedEndAt: at('15:00'), technicianIds: [plant.ben.user.id], overrides }));
    expect(res.status).toBe(201);
    expect(res.body.overrides).toEqual(overrides);
    const trail = await request(app).get(`/api/visits/${res.body.id}/audit`).set('Authorization', plant.planner.auth);
    expect(trail.body.items).toHaveLength(1);
    expect(trail.body.items[0]).toMatchObject({ action: 'create', actor: { id: plant.planner.user.id }, after: { overrides } });
  });

  it('when an override’s reason is under 3 characters or its kind unknown, then 400 naming it and nothing is stored', async () => {
    const before = await visitTables();
    const short = await post('/api/visits', visitBody(plant, { plannedStartAt: at('13:00'), plannedEndAt: at('15:00'), overrides: [{ kind: 'outside-window', reason: 'ok' }] }));
    expect(short.status).toBe(400);
    expect(short.body.error.issues[0].path).toBe('overrides.0.reason');
    const unknown = await post('/api/visits', visitBody(plant, { overrides: [{ kind: 'too-late', reason: 'whatever' }] }));
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.issues[0].path).toBe('overrides.0.kind');
    expect(await visitTables()).toEqual(before);
  });

  it('when the window repeats weekly across the change to summer time, then a visit inside a later occurrence is inside on the local clock', async () => {
    // Saturdays 06:00–12:00 Europe/London from 2030-03-16 (GMT). British Summer Time starts on the
    // last Sunday of March (2030-03-31, from memory of the EU/UK rule): on 2030-04-06 the window is
    // 06:00–12:00 BST = 05:00–11:00 UTC.
    await addWindow(plant.area.id, '2030-03-16T06:00:00.000Z', '2030-03-16T12:00:00.000Z', 'FREQ=WEEKLY;COUNT=6');
    const inside = await post('/api/visits/check', visitBody(plant, { plannedStartAt: at('05:00', '2030-04-06'), plannedEndAt: at('06:00', '2030-04-06') }));
    expect(inside.body.warnings).toEqual([]);
    const late = await post('/api/visits/check', visitBody(plant, { plannedStartAt: at('10:30', '2030-04-06'), plannedEndAt: at('11:30', '2030-04-06') }));
    expect(late.body.warnings.map((w: { kind: string }) => w.kind)).toEqual(['outside-window']);
    // the sixth and last occurrence is 2030-04-20; the week after has none
    const after = await post('/api/visits/check', visitBody(plant, { plannedStartAt: at('05:00', '2030-04-27'), plannedEndAt: at('06:00', '2030-04-27') }));
    expect(after.body.warnings.map((w: { kind: string }) => w.kind)).toEqual(['outside-window']);
  });
});

describe('a technician double-booked', () => {
  let anas: { id: string; version: number };

  beforeAll(async () => {
    anas = await planVisit(app, plant, { plannedStartAt: at('07:00', '2030-01-12'), plannedEndAt: at('09:00', '2030-01-12') });
  });

  it('when Ana already has a visit overlapping, then the check names her (and not Ben) and the save is refused', async () => {
    const body = visitBody(plant, { plannedStartAt: at('08:00'), plannedEndAt: at('10:00'), technicianIds: [plant.ana.user.id, plant.ben.user.id] });
    const check = await post('/api/visits/check', body);
    expect(check.body.warnings).toEqual([
      { kind: 'double-booked', technicianId: plant.ana.user.id, message: `${plant.ana.user.name} already has a visit to HW-PRESS-VFD-001 at that time.` },
    ]);
    const before = await visitTables();
    const res = await post('/api/visits', body);
    expect(res.status).toBe(422);
    expect(res.body.error.issues).toEqual([{ path: 'overrides', kind: 'double-booked', message: check.body.warnings[0].message }]);
    expect(await visitTables()).toEqual(before);
  });

  it('when the visits only touch (one ends as the other starts), then no warning', async () => {
    const check = await post('/api/visits/check', visitBody(plant, { plannedStartAt: at('09:00'), plannedEndAt: at('10:00') }));
    expect(check.body.warnings).toEqual([]);
  });

  it('when checking the visit against itself (visitId), then it does not clash with itself', async () => {
    const body = visitBody(plant, { plannedStartAt: at('07:30'), plannedEndAt: at('09:30') });
    expect((await post('/api/visits/check', body)).body.warnings.map((w: { kind: string }) => w.kind)).toEqual(['double-booked']);
    expect((await post('/api/visits/check', { ...body, visitId: anas.id })).body.warnings).toEqual([]);
  });

  it('when the other visit is cancelled, then it no longer counts', async () => {
    const other = await planVisit(app, plant, { technicianIds: [plant.ben.user.id], plannedStartAt: at('11:00'), plannedEndAt: at('12:00') });
    const body = visitBody(plant, { technicianIds: [plant.ben.user.id], plannedStartAt: at('11:30'), plannedEndAt: at('12:30') });
    expect((await post('/api/visits/check', body)).body.warnings.map((w: { kind: string }) => w.kind)).toEqual(['double-booked']);
    await post(`/api/visits/${other.id}/transitions`, { action: 'cancel', version: other.version, reason: 'Moved to next week' });
    expect((await post('/api/visits/check', body)).body.warnings).toEqual([]);
  });

  it('when overridden with a reason, then 201 with the override', async () => {
    const overrides = [{ kind: 'double-booked', reason: 'Ana does both cabinets side by side' }];
    const res = await post('/api/visits', visitBody(plant, { plannedStartAt: at('08:00'), plannedEndAt: at('09:00'), overrides }));
    expect(res.status).toBe(201);
    expect(res.body.overrides).toEqual(overrides);
  });

  it('when a replan moves a visit onto another of the same technician, then 422 and the visit stays as it was', async () => {
    const ben1 = await planVisit(app, plant, { technicianIds: [plant.ben.user.id], plannedStartAt: at('06:00'), plannedEndAt: at('07:00') });
    const before = await visitFootprint(ben1.id);
    // Ben's visit 11:00–12:00 above was cancelled; his 13:00–15:00 visit (outside-window test) stands
    const res = await request(app)
      .patch(`/api/visits/${ben1.id}`)
      .set('Authorization', plant.planner.auth)
      .send({ version: ben1.version, reason: 'Later in the shutdown', plannedStartAt: at('13:00'), plannedEndAt: at('14:00') });
    expect(res.status).toBe(422);
    expect(res.body.error.issues.map((i: { kind: string }) => i.kind)).toEqual(['double-booked']);
    expect(await visitFootprint(ben1.id)).toEqual(before);
  });

  it('when two planners book the same technician at the same time at once, then one is saved and the other warned', async () => {
    const body = visitBody(plant, { technicianIds: [plant.outsider.user.id], plannedStartAt: at('06:00', '2030-01-12'), plannedEndAt: at('07:00', '2030-01-12') });
    const [a, b] = await Promise.all([post('/api/visits', body), post('/api/visits', body, plant.admin.auth)]);
    expect([a.status, b.status].sort()).toEqual([201, 422]);
  });
});

describe('a bank not yet due', () => {
  it('when a bank was installed a month before the visit, then not-due names it, and an override saves it', async () => {
    // installed 2029-12-01: due at least yearly, so not before 2030-12-01 (DOMAIN.md: at least yearly)
    const young = await makeRecentBank(plant, '2029-12-01', 'DC9');
    // Ben is free 10:00–11:00 (his other visits: 06:00–07:00, 13:00–15:00)
    const body = visitBody(plant, { bankIds: [plant.bankA.id, young.id], technicianIds: [plant.ben.user.id], plannedStartAt: at('10:00'), plannedEndAt: at('11:00') });
    const check = await post('/api/visits/check', body);
    expect(check.body.warnings).toHaveLength(1);
    expect(check.body.warnings[0]).toMatchObject({ kind: 'not-due', bankId: young.id });
    expect(check.body.warnings[0].message).toMatch(/^Bank DC9 is not due until 20\d\d-\d\d-\d\d\.$/);
    expect(check.body.warnings[0].message > 'Bank DC9 is not due until 2030-01-12.').toBe(true);
    const refused = await post('/api/visits', body);
    expect(refused.status).toBe(422);
    expect(refused.body.error.issues[0]).toMatchObject({ path: 'overrides', kind: 'not-due' });
    const saved = await post('/api/visits', { ...body, overrides: [{ kind: 'not-due', reason: 'Same cabinet, while it is open' }] });
    expect(saved.status).toBe(201);
  });

  it('when several warnings come together, then each kind needs its own override', async () => {
    const young = await makeRecentBank(plant, '2029-12-20', 'DC10');
    const body = visitBody(plant, { bankIds: [young.id], technicianIds: [plant.ben.user.id], plannedStartAt: at('20:00'), plannedEndAt: at('21:00') });
    const one = await post('/api/visits', { ...body, overrides: [{ kind: 'not-due', reason: 'While it is open' }] });
    expect(one.status).toBe(422);
    expect(one.body.error.issues.map((i: { kind: string }) => i.kind)).toEqual(['outside-window']);
    const both = await post('/api/visits', {
      ...body,
      overrides: [
        { kind: 'not-due', reason: 'While it is open' },
        { kind: 'outside-window', reason: 'Night isolation agreed with production' },
      ],
    });
    expect(both.status).toBe(201);
  });
});

describe('POST /api/visits/check', () => {
  it('when a technician or reliability engineer asks, then 403', async () => {
    expect((await post('/api/visits/check', visitBody(plant), plant.ana.auth)).status).toBe(403);
    expect((await post('/api/visits/check', visitBody(plant), plant.reliability.auth)).status).toBe(403);
  });

  it('when the body is bad, then 400 naming the field', async () => {
    const res = await post('/api/visits/check', visitBody(plant, { bankIds: [] }));
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('bankIds');
  });
});

describe('POST /api/visits/batch: all or none', () => {
  const day = '2030-02-09';
  beforeAll(async () => {
    await addWindow(plant.area.id, `${day}T06:00:00.000Z`, `${day}T14:00:00.000Z`);
  });
  const row = (overrides: Record<string, unknown>) =>
    visitBody(plant, { plannedStartAt: at('06:00', day), plannedEndAt: at('07:00', day), ...overrides });

  it('when every visit is sound, then 201 with each, and one audit entry each', async () => {
    const before = await visitTables();
    const res = await post('/api/visits/batch', {
      visits: [
        row({ bankIds: [plant.bankA.id] }),
        row({ bankIds: [plant.bankB.id], technicianIds: [plant.ben.user.id] }),
        row({ bankIds: [plant.bankA.id], plannedStartAt: at('07:00', day), plannedEndAt: at('08:00', day) }),
      ],
    });
    expect(res.status).toBe(201);
    expect(res.body.total).toBe(3);
    expect(res.body.items.map((v: { state: string }) => v.state)).toEqual(['planned', 'planned', 'planned']);
    const after = await visitTables();
    expect(after).toEqual({ visits: before.visits + 3, banks: before.banks + 3, technicians: before.technicians + 3, audits: before.audits + 3 });
  });

  it('when one visit names a person who is not a technician, then 400 naming visits.1.technicianIds and none is stored', async () => {
    const before = await visitTables();
    const res = await post('/api/visits/batch', {
      visits: [row({ plannedStartAt: at('10:00', day), plannedEndAt: at('11:00', day) }), row({ technicianIds: [plant.planner.user.id], plannedStartAt: at('12:00', day), plannedEndAt: at('13:00', day) })],
    });
    expect(res.status).toBe(400);
    expect(res.body.error.issues).toEqual([{ path: 'visits.1.technicianIds', message: 'Choose active people who hold the technician role.' }]);
    expect(await visitTables()).toEqual(before);
  });

  it('when two visits of the batch double-book a technician, then 422 naming the later one and none is stored', async () => {
    const before = await visitTables();
    const res = await post('/api/visits/batch', {
      visits: [
        row({ technicianIds: [plant.outsider.user.id], plannedStartAt: at('10:00', day), plannedEndAt: at('11:00', day) }),
        row({ technicianIds: [plant.outsider.user.id], plannedStartAt: at('10:30', day), plannedEndAt: at('11:30', day) }),
      ],
    });
    expect(res.status).toBe(422);
    expect(res.body.error.issues).toEqual([expect.objectContaining({ path: 'visits.1.overrides', kind: 'double-booked' })]);
    expect(await visitTables()).toEqual(before);
  });

  it('when a row is malformed, then 400 naming visits.N.field', async () => {
    const res = await post('/api/visits/batch', { visits: [row({}), row({ plannedEndAt: at('05:00', day) })] });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('visits.1.plannedEndAt');
    const empty = await post('/api/visits/batch', { visits: [] });
    expect(empty.status).toBe(400);
    expect(empty.body.error.issues[0].path).toBe('visits');
  });

  it('when a technician sends a batch, then 403', async () => {
    expect((await post('/api/visits/batch', { visits: [row({})] }, plant.ana.auth)).status).toBe(403);
  });
});
