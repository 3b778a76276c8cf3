/**
 * Visits: the state machine over HTTP (every action in every state for every role), who may
 * read which visit, and the audit trail each change leaves.
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { withUnitOfWork } from '../../../api/src/services/unit-of-work';
import { createVisit, transitionVisit } from '../../../api/src/services/visits';
import { nextVisitState, VISIT_STATES, type VisitState } from '../../../shared/domain/visit-states';
import { visitInputSchema } from '../../../shared/schemas/visit';
import { createActor } from '../../support/register';
import { at, makePlant, planVisit, visitBody, visitFootprint, type Actor, type Plant } from './visits-fixtures';

const app = createApp();
let plant: Plant;

beforeAll(async () => {
  plant = await makePlant();
});

/**
 * A visit of Ana's at the plant's cabinet brought into `state` through the services, as the
 * people who may do so would (Ana starts and logs, the reliability engineer reviews, the planner
 * cancels, Ebbline marks missed). Double-booking is overridden: every such visit is Ana's.
 */
async function visitIn(state: VisitState) {
  const input = visitInputSchema.parse(visitBody(plant, { overrides: [{ kind: 'double-booked', reason: 'state matrix' }] }));
  let visit = await withUnitOfWork(plant.planner.actor, (uow) => createVisit(uow, input));
  const step = async (by: Actor['actor'] | null, action: 'start' | 'log' | 'review' | 'cancel' | 'miss', reason?: string) => {
    const version = visit.version;
    visit = await withUnitOfWork(by, (uow) => transitionVisit(uow, visit.id, { action, version, reason }));
  };
  if (state === 'under-way' || state === 'logged' || state === 'reviewed') await step(plant.ana.actor, 'start');
  if (state === 'logged' || state === 'reviewed') await step(plant.ana.actor, 'log');
  if (state === 'reviewed') await step(plant.reliability.actor, 'review');
  if (state === 'missed') await step(null, 'miss');
  if (state === 'cancelled') await step(plant.planner.actor, 'cancel', 'Drive replaced');
  expect(visit.state).toBe(state);
  return visit;
}

type Who = 'assigned technician' | 'site technician' | 'planner' | 'admin' | 'reliability';
const WHO: Who[] = ['assigned technician', 'site technician', 'planner', 'admin', 'reliability'];
const callerOf = (who: Who): Actor =>
  ({
    'assigned technician': plant.ana,
    'site technician': plant.ben,
    planner: plant.planner,
    admin: plant.admin,
    reliability: plant.reliability,
  })[who];

/** Who may take each action (DOMAIN.md "Who does what"; the contract's state rules). */
const MAY: Record<'start' | 'log' | 'review' | 'cancel', Who[]> = {
  start: ['assigned technician'],
  log: ['assigned technician'],
  review: ['admin', 'reliability'],
  cancel: ['planner', 'admin'],
};

describe('POST /api/visits/:visitId/transitions: every action in every state for every role', () => {
  for (const action of ['start', 'log', 'review', 'cancel'] as const) {
    for (const who of WHO) {
      it(`when ${who} tries to ${action} a visit in each state, then it moves only where the rules allow`, async () => {
        const caller = callerOf(who);
        for (const state of VISIT_STATES) {
          const visit = await visitIn(state);
          const before = await visitFootprint(visit.id);
          const res = await request(app)
            .post(`/api/visits/${visit.id}/transitions`)
            .set('Authorization', caller.auth)
            .send({ action, version: visit.version, ...(action === 'cancel' ? { reason: 'Shutdown moved' } : {}) });
          const to = nextVisitState(state, action);
          const allowed = MAY[action].includes(who);
          const expected = !allowed ? 403 : to === null ? 409 : 200;
          expect({ state, status: res.status }).toEqual({ state, status: expected });
          if (expected === 200) {
            expect(res.body).toMatchObject({ id: visit.id, state: to, version: visit.version + 1 });
            const after = await visitFootprint(visit.id);
            expect(after).toMatchObject({ state: to, version: visit.version + 1, audits: (before!.audits as number) + 1 });
            const trail = await request(app).get(`/api/visits/${visit.id}/audit`).set('Authorization', plant.planner.auth);
            expect(trail.body.items[0]).toMatchObject({
              action,
              actor: { id: caller.user.id },
              before: { state },
              after: { state: to },
            });
          } else {
            expect(res.body.error.code).toBe(expected === 403 ? 'forbidden' : 'visit-state');
            expect(await visitFootprint(visit.id)).toEqual(before);
          }
        }
      });
    }
  }

  it('when a technician of another site acts on a visit, then 404 as if it did not exist', async () => {
    const visit = await visitIn('planned');
    const res = await request(app)
      .post(`/api/visits/${visit.id}/transitions`)
      .set('Authorization', plant.outsider.auth)
      .send({ action: 'start', version: visit.version });
    expect(res.status).toBe(404);
    expect((await visitFootprint(visit.id))!.state).toBe('planned');
  });

  it('when a logged visit is started, then 409 visit-state says so in plain words', async () => {
    const visit = await visitIn('logged');
    const res = await request(app)
      .post(`/api/visits/${visit.id}/transitions`)
      .set('Authorization', plant.ana.auth)
      .send({ action: 'start', version: visit.version });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'visit-state', message: "A logged visit can't be started." });
  });

  it('when a transition names an old version, then 409 stale-version and nothing changes', async () => {
    const visit = await visitIn('planned');
    const before = await visitFootprint(visit.id);
    const res = await request(app)
      .post(`/api/visits/${visit.id}/transitions`)
      .set('Authorization', plant.ana.auth)
      .send({ action: 'start', version: visit.version - 1 });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('stale-version');
    expect(await visitFootprint(visit.id)).toEqual(before);
  });

  it('when a cancel carries no reason, then 400 naming reason and nothing changes', async () => {
    const visit = await visitIn('planned');
    const before = await visitFootprint(visit.id);
    const res = await request(app)
      .post(`/api/visits/${visit.id}/transitions`)
      .set('Authorization', plant.planner.auth)
      .send({ action: 'cancel', version: visit.version });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('reason');
    expect(await visitFootprint(visit.id)).toEqual(before);
  });

  it('when a cancel carries a reason, then the visit keeps it and the time it was cancelled', async () => {
    const visit = await visitIn('missed');
    const res = await request(app)
      .post(`/api/visits/${visit.id}/transitions`)
      .set('Authorization', plant.admin.auth)
      .send({ action: 'cancel', version: visit.version, reason: 'Cabinet to be replaced in March' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ state: 'cancelled', stateReason: 'Cabinet to be replaced in March' });
    expect(Date.parse(res.body.cancelledAt)).not.toBeNaN();
  });

  it('when a person sends the action miss or an unknown action, then 400 naming action', async () => {
    const visit = await visitIn('planned');
    for (const action of ['miss', 'replan', 'finish']) {
      const res = await request(app)
        .post(`/api/visits/${visit.id}/transitions`)
        .set('Authorization', plant.admin.auth)
        .send({ action, version: visit.version });
      expect(res.status).toBe(400);
      expect(res.body.error.issues[0].path).toBe('action');
    }
    expect((await visitFootprint(visit.id))!.state).toBe('planned');
  });
});

describe('miss: only Ebbline itself', () => {
  it('when Ebbline marks each state missed, then only a planned visit becomes missed, with its audit entry naming no one', async () => {
    for (const state of VISIT_STATES) {
      const visit = await visitIn(state);
      const before = await visitFootprint(visit.id);
      const attempt = withUnitOfWork(null, (uow) => transitionVisit(uow, visit.id, { action: 'miss', version: visit.version }));
      if (state === 'planned') {
        const missed = await attempt;
        expect(missed).toMatchObject({ state: 'missed' });
        expect(missed.missedAt).toBeInstanceOf(Date);
        const trail = await request(app).get(`/api/visits/${visit.id}/audit`).set('Authorization', plant.planner.auth);
        expect(trail.body.items[0]).toMatchObject({ action: 'miss', actor: null, after: { state: 'missed' } });
      } else {
        await expect(attempt).rejects.toMatchObject({ code: 'visit-state' });
        expect(await visitFootprint(visit.id)).toEqual(before);
      }
    }
  });

  it('when a person (even an admin) marks a visit missed through the service, then forbidden', async () => {
    const visit = await visitIn('planned');
    await expect(
      withUnitOfWork(plant.admin.actor, (uow) => transitionVisit(uow, visit.id, { action: 'miss', version: visit.version })),
    ).rejects.toMatchObject({ code: 'forbidden' });
  });
});

describe('PATCH /api/visits/:visitId: replan by state and role', () => {
  it('when a planner replans a visit in each state, then only planned and missed visits move (back to planned)', async () => {
    for (const state of VISIT_STATES) {
      const visit = await visitIn(state);
      const before = await visitFootprint(visit.id);
      const res = await request(app)
        .patch(`/api/visits/${visit.id}`)
        .set('Authorization', plant.planner.auth)
        .send({ version: visit.version, reason: 'Shutdown starts an hour later', plannedStartAt: at('10:00'), plannedEndAt: at('12:00') });
      if (nextVisitState(state, 'replan') === null) {
        expect({ state, status: res.status, code: res.body.error?.code }).toEqual({ state, status: 409, code: 'visit-state' });
        expect(await visitFootprint(visit.id)).toEqual(before);
      } else {
        expect({ state, status: res.status }).toEqual({ state, status: 200 });
        expect(res.body).toMatchObject({
          state: 'planned',
          plannedStartAt: at('10:00'),
          plannedEndAt: at('12:00'),
          stateReason: 'Shutdown starts an hour later',
          missedAt: null,
        });
        const trail = await request(app).get(`/api/visits/${visit.id}/audit`).set('Authorization', plant.planner.auth);
        expect(trail.body.items[0]).toMatchObject({
          action: 'replan',
          actor: { id: plant.planner.user.id },
          before: { state, plannedStartAt: at('07:00') },
          after: { state: 'planned', plannedStartAt: at('10:00') },
        });
      }
    }
  });

  it('when a technician or a reliability engineer replans, then 403 and nothing changes', async () => {
    const visit = await visitIn('planned');
    const before = await visitFootprint(visit.id);
    for (const caller of [plant.ana, plant.reliability]) {
      const res = await request(app)
        .patch(`/api/visits/${visit.id}`)
        .set('Authorization', caller.auth)
        .send({ version: visit.version, reason: 'Moving it', plannedStartAt: at('10:00'), plannedEndAt: at('12:00') });
      expect(res.status).toBe(403);
    }
    expect(await visitFootprint(visit.id)).toEqual(before);
  });
});

describe('who reads which visit', () => {
  let anas: { id: string };
  let bens: { id: string };
  let elsewhere: { id: string };

  beforeAll(async () => {
    anas = await planVisit(app, plant, { plannedStartAt: at('07:00', '2030-01-19'), plannedEndAt: at('08:00', '2030-01-19'), overrides: [{ kind: 'outside-window', reason: 'reading test' }] });
    bens = await planVisit(app, plant, {
      technicianIds: [plant.ben.user.id],
      plannedStartAt: at('09:00', '2030-01-19'),
      plannedEndAt: at('10:00', '2030-01-19'),
      overrides: [{ kind: 'outside-window', reason: 'reading test' }],
    });
    elsewhere = await planVisit(app, plant, {
      cabinetId: plant.otherCabinet.id,
      bankIds: [plant.otherBank.id],
      technicianIds: [plant.outsider.user.id],
      plannedStartAt: at('07:00', '2030-01-19'),
      plannedEndAt: at('08:00', '2030-01-19'),
      overrides: [{ kind: 'outside-window', reason: 'reading test' }],
    });
  });

  const week = `from=${encodeURIComponent('2030-01-19T00:00:00Z')}&to=${encodeURIComponent('2030-01-20T00:00:00Z')}`;
  const idsOf = (body: { items: { id: string }[] }) => body.items.map((v) => v.id).sort();

  it('when a technician reads a visit assigned to them or at their site, then 200; another site’s, then 404', async () => {
    expect((await request(app).get(`/api/visits/${anas.id}`).set('Authorization', plant.ana.auth)).status).toBe(200);
    expect((await request(app).get(`/api/visits/${bens.id}`).set('Authorization', plant.ana.auth)).status).toBe(200);
    const hidden = await request(app).get(`/api/visits/${elsewhere.id}`).set('Authorization', plant.ana.auth);
    expect(hidden.status).toBe(404);
    expect(hidden.body.error.code).toBe('not-found');
    expect((await request(app).get(`/api/visits/${elsewhere.id}/audit`).set('Authorization', plant.ana.auth)).status).toBe(404);
    expect((await request(app).get(`/api/visits/${anas.id}`).set('Authorization', plant.outsider.auth)).status).toBe(404);
    expect((await request(app).get(`/api/visits/${elsewhere.id}`).set('Authorization', plant.outsider.auth)).status).toBe(200);
  });

  it('when a technician lists visits, then their own and their sites’ only; mine=true their own only', async () => {
    const all = await request(app).get(`/api/visits?${week}`).set('Authorization', plant.ana.auth);
    expect(all.status).toBe(200);
    expect(idsOf(all.body)).toEqual([anas.id, bens.id].sort());
    expect(all.body.total).toBe(2);
    const mine = await request(app).get(`/api/visits?${week}&mine=true`).set('Authorization', plant.ana.auth);
    expect(idsOf(mine.body)).toEqual([anas.id]);
    const outsider = await request(app).get(`/api/visits?${week}`).set('Authorization', plant.outsider.auth);
    expect(idsOf(outsider.body)).toEqual([elsewhere.id]);
  });

  it('when a technician has no sites, then only the visits assigned to them', async () => {
    const loner = await createActor(['technician']);
    const own = await planVisit(app, plant, {
      technicianIds: [loner.user.id],
      plannedStartAt: at('11:00', '2030-01-26'),
      plannedEndAt: at('12:00', '2030-01-26'),
      overrides: [{ kind: 'outside-window', reason: 'reading test' }],
    });
    const list = await request(app).get('/api/visits').set('Authorization', loner.auth);
    expect(idsOf(list.body)).toEqual([own.id]);
    expect((await request(app).get(`/api/visits/${anas.id}`).set('Authorization', loner.auth)).status).toBe(404);
  });

  it('when a planner, reliability engineer or admin lists, then every visit; filters narrow it', async () => {
    for (const caller of [plant.planner, plant.reliability, plant.admin]) {
      const res = await request(app).get(`/api/visits?${week}`).set('Authorization', caller.auth);
      expect(idsOf(res.body)).toEqual([anas.id, bens.id, elsewhere.id].sort());
    }
    const bySite = await request(app).get(`/api/visits?${week}&siteId=${plant.otherSite.id}`).set('Authorization', plant.planner.auth);
    expect(idsOf(bySite.body)).toEqual([elsewhere.id]);
    const byArea = await request(app).get(`/api/visits?${week}&areaId=${plant.area.id}`).set('Authorization', plant.planner.auth);
    expect(idsOf(byArea.body)).toEqual([anas.id, bens.id].sort());
    const byTechnician = await request(app).get(`/api/visits?${week}&technicianId=${plant.ben.user.id}`).set('Authorization', plant.planner.auth);
    expect(idsOf(byTechnician.body)).toEqual([bens.id]);
    const byCabinet = await request(app).get(`/api/visits?${week}&cabinetId=${plant.otherCabinet.id}`).set('Authorization', plant.planner.auth);
    expect(idsOf(byCabinet.body)).toEqual([elsewhere.id]);
    const byState = await request(app).get(`/api/visits?${week}&state=under-way,logged`).set('Authorization', plant.planner.auth);
    expect(byState.body.items).toEqual([]);
  });

  it('when listing a range, then visits overlapping it in planned start order, paged', async () => {
    // 07:30–09:30 overlaps Ana's (07:00–08:00), the outsider's (07:00–08:00) and Ben's (09:00–10:00)
    const range = `from=${encodeURIComponent('2030-01-19T07:30:00Z')}&to=${encodeURIComponent('2030-01-19T09:30:00Z')}`;
    const res = await request(app).get(`/api/visits?${range}&pageSize=2`).set('Authorization', plant.planner.auth);
    expect(res.body.total).toBe(3);
    expect(res.body.items).toHaveLength(2);
    expect(res.body.items.map((v: { plannedStartAt: string }) => v.plannedStartAt)).toEqual([at('07:00', '2030-01-19'), at('07:00', '2030-01-19')]);
    const second = await request(app).get(`/api/visits?${range}&pageSize=2&page=2`).set('Authorization', plant.planner.auth);
    expect(second.body.items.map((v: { id: string }) => v.id)).toEqual([bens.id]);
    // touching ends do not overlap: 08:00–09:00 holds none of them
    const gap = `from=${encodeURIComponent('2030-01-19T08:00:00Z')}&to=${encodeURIComponent('2030-01-19T09:00:00Z')}`;
    expect((await request(app).get(`/api/visits?${gap}`).set('Authorization', plant.planner.auth)).body.total).toBe(0);
  });

  it('when the list query is bad, then 400 naming the parameter', async () => {
    for (const [query, path] of [
      ['state=planned,finished', 'state'],
      ['pageSize=201', 'pageSize'],
      ['from=yesterday', 'from'],
      ['technicianId=ana', 'technicianId'],
      [`from=${encodeURIComponent('2030-01-20T00:00:00Z')}&to=${encodeURIComponent('2030-01-19T00:00:00Z')}`, 'to'],
    ] as const) {
      const res = await request(app).get(`/api/visits?${query}`).set('Authorization', plant.planner.auth);
      expect({ query, status: res.status, path: res.body.error?.issues?.[0]?.path }).toEqual({ query, status: 400, path });
    }
  });

  it('when a visit is read, then it carries its cabinet, site zone, banks, technicians and estimate', async () => {
    const res = await request(app).get(`/api/visits/${anas.id}`).set('Authorization', plant.ana.auth);
    expect(res.body).toMatchObject({
      cabinetId: plant.cabinet.id,
      cabinetTag: 'HW-PRESS-VFD-001',
      siteId: plant.site.id,
      siteName: 'Harbour Works',
      timeZone: 'Europe/London',
      areaId: plant.area.id,
      areaName: 'Press hall',
      state: 'planned',
      unplanned: false,
      notes: 'Bring the 1000 V meter.',
      overrides: [{ kind: 'outside-window', reason: 'reading test' }],
      technicians: [{ id: plant.ana.user.id, name: plant.ana.user.name }],
      cabinetMarkedWaitMinutes: 5,
      version: 1,
    });
    expect(res.body.banks.map((b: { position: string }) => b.position)).toEqual(['DC1', 'DC2']);
    expect(res.body.banks[0]).toMatchObject({ id: plant.bankA.id, bankDesignCode: plant.design.code });
    // per bank: 15 min setup + 5 τ + 5 min marked wait (shared/domain/visit-duration.ts)
    const tau = res.body.banks[0].baselineTauSeconds as number;
    expect(res.body.estimatedMinutes).toBe(Math.ceil(2 * (15 + (5 * tau) / 60 + 5) - 1e-9));
  });

  it('when the id is not a visit, then 404', async () => {
    expect((await request(app).get('/api/visits/not-an-id').set('Authorization', plant.planner.auth)).status).toBe(404);
    expect((await request(app).get('/api/visits/00000000-0000-4000-8000-000000000000').set('Authorization', plant.planner.auth)).status).toBe(404);
  });
});
