/**
 * For the decay-run API tests: the planner tests' plant (a cabinet of two banks at Harbour
 * Works, Ana and Ben its technicians, a planner, a reliability engineer, an admin, a cabinet at
 * another site), visits stored in any state, and counts of what a run writes.
 */
import request from 'supertest';
import type { Express } from 'express';
import { sequelize } from '../../../api/src/db/sequelize';
import type { DecayRun } from '../../../shared/schemas/decay-run';
import { storeVisit } from '../../support/planner-visits';
import { makePlant, type Plant } from '../planner/visits-fixtures';

export { makePlant, type Plant };

/** A visit of the plant's cabinet with both banks, Ana assigned (and others named), in `state`. */
export async function visitOf(plant: Plant, state = 'planned', technicianIds: string[] = [plant.ana.user.id]) {
  return storeVisit({
    cabinetId: plant.cabinet.id,
    bankIds: [plant.bankA.id, plant.bankB.id],
    technicianIds,
    plannedStartAt: new Date('2030-01-12T07:00:00.000Z'),
    plannedEndAt: new Date('2030-01-12T09:00:00.000Z'),
    state,
  });
}

/** Rows of everything a run writes: runs, their audit entries, outbox messages, and the visits' audit entries. */
export async function runTables() {
  const [rows] = await sequelize.query(
    `SELECT (SELECT count(*)::int FROM decay_runs) AS runs,
            (SELECT count(*)::int FROM audit_entries WHERE entity_type = 'decay-run') AS "runAudits",
            (SELECT count(*)::int FROM outbox_messages) AS outbox,
            (SELECT count(*)::int FROM audit_entries) AS audits,
            (SELECT coalesce(string_agg(state || ':' || version, ',' ORDER BY id), '') FROM visits) AS visits`,
  );
  return rows[0] as { runs: number; runAudits: number; outbox: number; audits: number; visits: string };
}

/** Posts a run on a visit as `auth`. */
export function postRun(app: Express, visitId: string, auth: string, body: unknown) {
  return request(app).post(`/api/visits/${visitId}/decay-runs`).set('Authorization', auth).send(body as object);
}

/** Posts a run and fails the test unless it is stored (201). */
export async function recordRun(app: Express, visitId: string, auth: string, body: unknown): Promise<DecayRun> {
  const res = await postRun(app, visitId, auth, body);
  if (res.status !== 201) throw new Error(`run not recorded: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as DecayRun;
}
