/**
 * The missed-visit check against a fake clock: the job's handler is called with the instant it
 * acts at, so each case states exactly how long after a visit's planned end it runs.
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { createCaller } from '../../support/auth';
import { runMissedVisitCheck } from '../../../api/src/jobs/missed-visits';
import { AppError } from '../../../api/src/errors';
import { transitionVisit } from '../../../api/src/services/visits';
import { withUnitOfWork } from '../../../api/src/services/unit-of-work';
import type { AuthUser } from '../../../api/src/types/express';
import { createActor } from '../../support/register';
import {
  makePlace,
  storeVisit,
  storedVisit,
  visitAuditEntries,
} from '../../support/planner-visits';

const HOUR_MS = 3_600_000;
const at = (iso: string, plusHours = 0) => new Date(new Date(iso).getTime() + plusHours * HOUR_MS);

let planner: AuthUser;
let technicianId: string;
let place: Awaited<ReturnType<typeof makePlace>>;

beforeAll(async () => {
  planner = (await createActor(['planner'])).actor;
  technicianId = (await createActor(['technician'])).user.id;
  place = await makePlace(planner);
});

/** A visit of 2 h ending at `endIso`, in `state`. */
function visitEndingAt(endIso: string, state = 'planned') {
  return storeVisit({
    cabinetId: place.cabinet.id,
    bankIds: place.banks.map((b) => b.id),
    technicianIds: [technicianId],
    plannedStartAt: at(endIso, -2),
    plannedEndAt: new Date(endIso),
    state,
  });
}

describe('the missed-visit check', () => {
  it('when it runs exactly 12 h after a planned visit’s end, then the visit is still planned; a second later it is missed', async () => {
    const end = '2031-03-10T14:00:00.000Z';
    const visit = await visitEndingAt(end);

    const onTheDot = await runMissedVisitCheck(at(end, 12), 12);
    expect(onTheDot.marked).not.toContain(visit.id);
    expect((await storedVisit(visit.id)).state).toBe('planned');

    const now = new Date(at(end, 12).getTime() + 1000);
    const run = await runMissedVisitCheck(now, 12);
    expect(run.marked).toContain(visit.id);
    expect(run.cutoffAt).toBe('2031-03-10T14:00:01.000Z');
    const stored = await storedVisit(visit.id);
    expect(stored.state).toBe('missed');
    expect(stored.missed_at?.toISOString()).toBe(now.toISOString());
    expect(stored.version).toBe(visit.version + 1);
  });

  it('when a visit is marked missed, then its audit entry names Ebbline (no person), the action and the states before and after', async () => {
    const end = '2031-04-01T09:00:00.000Z';
    const visit = await visitEndingAt(end);
    const now = at(end, 13);
    await runMissedVisitCheck(now, 12);
    const entries = await visitAuditEntries(visit.id);
    expect(entries).toHaveLength(1);
    expect(entries[0]).toMatchObject({
      action: 'miss',
      actor_id: null,
      actor_name: null,
      before: expect.objectContaining({ state: 'planned' }),
      after: expect.objectContaining({ state: 'missed', missedAt: now.toISOString() }),
    });
    expect(entries[0]!.at.toISOString()).toBe(now.toISOString());
  });

  it('when it runs again, later or at once, then nothing more happens: no second change, no second audit entry', async () => {
    const end = '2031-05-01T09:00:00.000Z';
    const visit = await visitEndingAt(end);
    const first = await runMissedVisitCheck(at(end, 20), 12);
    expect(first.marked).toContain(visit.id);
    const again = await runMissedVisitCheck(at(end, 20), 12);
    const later = await runMissedVisitCheck(at(end, 24 * 30), 12);
    expect([...again.marked, ...later.marked]).not.toContain(visit.id);
    expect(await visitAuditEntries(visit.id)).toHaveLength(1);
    expect((await storedVisit(visit.id)).version).toBe(visit.version + 1);
  });

  it('when a visit long past its end is under way, logged, reviewed or cancelled, then the check leaves it as it is', async () => {
    const end = '2031-06-01T09:00:00.000Z';
    const others = await Promise.all(
      ['under-way', 'logged', 'reviewed', 'cancelled'].map((state) => visitEndingAt(end, state)),
    );
    const run = await runMissedVisitCheck(at(end, 24 * 7), 12);
    for (const [i, state] of ['under-way', 'logged', 'reviewed', 'cancelled'].entries()) {
      expect(run.marked).not.toContain(others[i]!.id);
      expect((await storedVisit(others[i]!.id)).state).toBe(state);
      expect(await visitAuditEntries(others[i]!.id)).toHaveLength(0);
    }
  });

  it('when the while is set shorter (MISSED_VISIT_AFTER_HOURS=2), then a visit is missed 2 h after its end', async () => {
    const end = '2031-07-01T09:00:00.000Z';
    const visit = await visitEndingAt(end);
    expect((await runMissedVisitCheck(at(end, 1.5), 2)).marked).not.toContain(visit.id);
    expect((await runMissedVisitCheck(at(end, 2.5), 2)).marked).toContain(visit.id);
  });

  it('when a visit’s planned end is still ahead, then however the clock stands before it, it stays planned', async () => {
    const end = '2031-08-01T09:00:00.000Z';
    const visit = await visitEndingAt(end);
    await runMissedVisitCheck(at(end, -1), 0);
    expect((await storedVisit(visit.id)).state).toBe('planned');
  });
});

describe('a missed visit through the API', () => {
  it('when the check has marked a visit missed, then the visits API shows it missed, with the time and the audit entry', async () => {
    const app = createApp();
    const caller = await createCaller(['planner']);
    const end = '2031-10-01T09:00:00.000Z';
    const visit = await visitEndingAt(end);
    const now = at(end, 12.25);
    await runMissedVisitCheck(now, 12);
    const res = await request(app).get(`/api/visits/${visit.id}`).set('Authorization', caller.auth);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      state: 'missed',
      missedAt: now.toISOString(),
      version: visit.version + 1,
    });
    const missedList = await request(app)
      .get('/api/visits?state=missed&from=2031-10-01T00:00:00.000Z&to=2031-10-02T00:00:00.000Z')
      .set('Authorization', caller.auth);
    expect(missedList.status).toBe(200);
    expect(missedList.body.items.map((v: { id: string }) => v.id)).toEqual([visit.id]);
    const audit = await request(app)
      .get(`/api/visits/${visit.id}/audit`)
      .set('Authorization', caller.auth);
    expect(audit.status).toBe(200);
    expect(JSON.stringify(audit.body)).toContain('miss');
  });
});

describe('marking one visit missed', () => {
  it('when the visit changed since it was read (another version), then it is refused as stale and stays planned', async () => {
    const visit = await visitEndingAt('2031-09-01T09:00:00.000Z');
    const refused = withUnitOfWork(
      null,
      (uow) => transitionVisit(uow, visit.id, { action: 'miss', version: visit.version + 1 }),
      {
        now: at('2031-09-02T09:00:00.000Z'),
      },
    );
    await expect(refused).rejects.toMatchObject({ code: 'stale-version' });
    expect((await storedVisit(visit.id)).state).toBe('planned');
  });

  it('when the visit was started meanwhile, then it is refused (visit-state) and nothing is written', async () => {
    const visit = await visitEndingAt('2031-09-03T09:00:00.000Z', 'under-way');
    const refused = withUnitOfWork(
      null,
      (uow) => transitionVisit(uow, visit.id, { action: 'miss', version: visit.version }),
      {
        now: at('2031-09-04T09:00:00.000Z'),
      },
    );
    await expect(refused).rejects.toBeInstanceOf(AppError);
    await expect(refused).rejects.toMatchObject({ code: 'visit-state' });
    expect(await visitAuditEntries(visit.id)).toHaveLength(0);
  });

  it('when a person (not Ebbline) tries the miss action, then it is refused: only the scheduled check marks visits missed', async () => {
    const visit = await visitEndingAt('2031-09-05T09:00:00.000Z');
    const admin = (await createActor(['admin'])).actor;
    const refused = withUnitOfWork(
      admin,
      (uow) => transitionVisit(uow, visit.id, { action: 'miss', version: visit.version }),
      {
        now: at('2031-09-06T09:00:00.000Z'),
      },
    );
    await expect(refused).rejects.toMatchObject({ code: 'forbidden' });
    expect((await storedVisit(visit.id)).state).toBe('planned');
  });
});
