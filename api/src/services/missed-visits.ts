/**
 * Missed visits: a visit still `planned` MISSED_VISIT_AFTER_HOURS after its planned end
 * becomes `missed` (shared/domain/missed-visits.ts). The scheduled job (api/src/jobs/
 * missed-visits.ts) finds them here and marks each through the visits service's `miss` action
 * (`transitionVisit`, services/visits.ts) in a unit of work of its own, acting as Ebbline
 * (actor null), so one visit that cannot be marked never holds the others back.
 */
import { QueryTypes } from 'sequelize';
import { sequelize } from '../db/sequelize';

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
