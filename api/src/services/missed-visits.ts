/**
 * Missed visits: a visit still `planned` MISSED_VISIT_AFTER_HOURS after its planned end
 * becomes `missed` (shared/domain/missed-visits.ts). The scheduled job (api/src/jobs/
 * missed-visits.ts) finds them here and marks each in a unit of work of its own, acting as
 * Ebbline (actor null), so one visit that cannot be marked never holds the others back.
 */
import { QueryTypes } from 'sequelize';
import {
  mayTakeVisitAction,
  nextVisitState,
  VISIT_STATE_LABELS,
  type VisitState,
} from '../../../shared/domain/visit-states';
import { sequelize } from '../db/sequelize';
import { AppError } from '../errors';
import { Visit } from '../models/visit';
import { recordAudit } from './audit';
import { staleVersion } from './register-records';
import type { Actor, UnitOfWork } from './unit-of-work';

/** A visit to mark missed: its id and the version it was read at. */
export interface VisitToMarkMissed {
  id: string;
  version: number;
  plannedEndAt: Date;
}

/**
 * Planned visits whose planned end lies strictly before `cutoff`, oldest end first.
 * @param cutoff - `missedVisitCutoff(now, afterHours)`
 * @param limit - most returned (the job asks again until fewer come back)
 */
export async function listVisitsToMarkMissed(
  cutoff: Date,
  limit = 500,
): Promise<VisitToMarkMissed[]> {
  const rows = await sequelize.query<{ id: string; version: number; planned_end_at: Date }>(
    `SELECT id, version, planned_end_at FROM visits
      WHERE state = 'planned' AND planned_end_at < :cutoff
      ORDER BY planned_end_at, id LIMIT :limit`,
    { replacements: { cutoff: cutoff.toISOString(), limit }, type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({
    id: r.id,
    version: r.version,
    plannedEndAt: new Date(r.planned_end_at),
  }));
}

/**
 * Marks one visit missed at the unit of work's instant, acting as Ebbline: the `miss` action
 * of shared/domain/visit-states.ts (planned → missed), with the visit's row locked, its
 * version checked and bumped, and its audit entry.
 *
 * @param version - the version the visit was read at
 * @throws AppError `not-found`, `stale-version` (changed since it was read) or `visit-state`
 *   (no longer planned)
 */
export async function markVisitMissed(
  uow: UnitOfWork<Actor>,
  visitId: string,
  version: number,
): Promise<Visit> {
  const { now, transaction } = uow;
  const visit = await Visit.findByPk(visitId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!visit) throw AppError.notFound('The visit');
  if (visit.version !== version) throw staleVersion('visit', version, visit.version);
  if (!mayTakeVisitAction({ action: 'miss', roles: uow.actor?.roles ?? null, isAssigned: false })) {
    throw AppError.forbidden('Only Ebbline marks a visit missed, by its scheduled check.');
  }
  const next = nextVisitState(visit.state as VisitState, 'miss');
  if (next === null) {
    throw new AppError(
      'visit-state',
      `A ${VISIT_STATE_LABELS[visit.state as VisitState]} visit can't be marked missed.`,
    );
  }
  const before = { state: visit.state, missedAt: null, version: visit.version };
  await visit.update(
    { state: next, missedAt: now, version: visit.version + 1, updatedAt: now },
    { transaction },
  );
  await recordAudit(uow, {
    entityType: 'visit',
    entityId: visit.id,
    action: 'miss',
    summary: `Marked missed: still planned after its planned end (${visit.plannedEndAt.toISOString()})`,
    before,
    after: { state: next, missedAt: now.toISOString(), version: visit.version },
  });
  return visit;
}
