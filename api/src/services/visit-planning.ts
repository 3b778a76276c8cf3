/**
 * The planning check of a visit: gathers what the warnings need (the shutdown windows of the
 * cabinet's area, the technicians' other visits, the banks' due dates) and applies the pure
 * rules of shared/domain/planning-warnings.ts. Used before saving (`POST /api/visits/check`)
 * and by every create and replan, which refuse warnings not overridden with a reason.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import type { PlanningOverride } from '../../../shared/schemas/visit';
import { planningWarnings, unacceptedKinds, type PlanningWarningFinding } from '../../../shared/domain/planning-warnings';
import { windowOccurrences } from '../../../shared/domain/shutdown-windows';
import { sequelize } from '../db/sequelize';
import { AppError, type FieldIssue } from '../errors';
import { dueDatesOfBanks } from './due';

/** A visit as it would be saved, for the check. */
export interface PlannedVisit {
  cabinetId: string;
  areaId: string;
  timeZone: string;
  plannedStartAt: string;
  plannedEndAt: string;
  technicianIds: readonly string[];
  bankIds: readonly string[];
}

interface WindowRow {
  starts_at: Date;
  ends_at: Date;
  recurrence: string | null;
}

interface OtherVisitRow {
  id: string;
  planned_start_at: Date;
  planned_end_at: Date;
  cabinet_tag: string;
  technician_ids: string[];
}

/**
 * The warnings of a planned visit (outside every window, double-booked, not due).
 *
 * @param exceptVisitId - the visit being replanned, left out of the double-booking check
 * @param asOf - the instant the due dates are judged at (the unit of work's `now`)
 */
export async function planningWarningsOf(
  visit: PlannedVisit,
  exceptVisitId: string | null,
  asOf: Date,
  transaction?: Transaction,
): Promise<PlanningWarningFinding[]> {
  // one after another: the queries may share the transaction's one connection
  const windows = await sequelize.query<WindowRow>(
    `SELECT starts_at, ends_at, recurrence FROM shutdown_windows
      WHERE area_id = :areaId AND retired_at IS NULL AND starts_at < :endAt`,
    { replacements: { areaId: visit.areaId, endAt: visit.plannedEndAt }, type: QueryTypes.SELECT, transaction },
  );
  const others = await sequelize.query<OtherVisitRow>(
    `SELECT v.id, v.planned_start_at, v.planned_end_at, c.tag AS cabinet_tag,
            array_agg(vt.user_id::text) AS technician_ids
       FROM visits v
       JOIN cabinets c ON c.id = v.cabinet_id
       JOIN visit_technicians vt ON vt.visit_id = v.id
      WHERE v.state IN ('planned', 'under-way')
        AND v.planned_start_at < :endAt AND v.planned_end_at > :startAt
        AND vt.user_id IN (:technicianIds)
        AND (CAST(:exceptId AS uuid) IS NULL OR v.id <> CAST(:exceptId AS uuid))
      GROUP BY v.id, c.tag`,
    {
      replacements: {
        startAt: visit.plannedStartAt,
        endAt: visit.plannedEndAt,
        technicianIds: [...visit.technicianIds],
        exceptId: exceptVisitId,
      },
      type: QueryTypes.SELECT,
      transaction,
    },
  );
  // the due rule of the Due list (services/due.ts), so the warning and the list agree
  const dueDates = await dueDatesOfBanks(visit.bankIds, asOf, transaction);
  const banks = await sequelize.query<{ id: string; position: string }>('SELECT id, position FROM banks WHERE id IN (:ids)', {
    replacements: { ids: [...visit.bankIds] },
    type: QueryTypes.SELECT,
    transaction,
  });
  const names = await sequelize.query<{ id: string; name: string }>('SELECT id, name FROM users WHERE id IN (:ids)', {
    replacements: { ids: [...visit.technicianIds] },
    type: QueryTypes.SELECT,
    transaction,
  });

  const occurrences = windows.flatMap((w) =>
    windowOccurrences(
      { startsAt: w.starts_at.toISOString(), endsAt: w.ends_at.toISOString(), recurrence: w.recurrence },
      visit.timeZone,
      visit.plannedStartAt,
      visit.plannedEndAt,
    ),
  );
  return planningWarnings({
    visit: {
      startAt: visit.plannedStartAt,
      endAt: visit.plannedEndAt,
      technicianIds: visit.technicianIds,
      bankIds: visit.bankIds,
    },
    timeZone: visit.timeZone,
    windowOccurrences: occurrences,
    otherVisits: others.map((o) => ({
      id: o.id,
      startAt: o.planned_start_at.toISOString(),
      endAt: o.planned_end_at.toISOString(),
      cabinetTag: o.cabinet_tag,
      technicianIds: o.technician_ids,
    })),
    technicianNames: Object.fromEntries(names.map((n) => [n.id, n.name])),
    banks: banks.flatMap((b) => {
      const due = dueDates.get(b.id);
      return due ? [{ id: b.id, position: b.position, dueOn: due.dueOn }] : [];
    }),
  });
}

/**
 * The overrides to store: those of `overrides` that accept a warning present. Throws when a
 * warning is not accepted.
 *
 * @param pathPrefix - put before `overrides` in the issues (`visits.3.` in a batch)
 * @throws AppError `override-needed` with one issue per warning not overridden
 */
export function acceptedOverrides(
  warnings: readonly PlanningWarningFinding[],
  overrides: readonly PlanningOverride[],
  pathPrefix = '',
): PlanningOverride[] {
  const issues = overrideIssues(warnings, overrides, pathPrefix);
  if (issues.length > 0) throw overrideNeeded(issues);
  const present = new Set(warnings.map((w) => w.kind));
  return overrides.filter((o) => present.has(o.kind));
}

/** One issue per warning whose kind no override accepts. */
export function overrideIssues(
  warnings: readonly PlanningWarningFinding[],
  overrides: readonly PlanningOverride[],
  pathPrefix = '',
): FieldIssue[] {
  const open = new Set(unacceptedKinds(warnings, overrides));
  return warnings
    .filter((w) => open.has(w.kind))
    .map((w) => ({ path: `${pathPrefix}overrides`, kind: w.kind, message: w.message }));
}

/** `override-needed`: the visit has warnings; save it again with an override and a reason for each kind. */
export function overrideNeeded(issues: FieldIssue[]): AppError {
  const first = issues[0]?.message ?? '';
  const more = issues.length > 1 ? ` (and ${issues.length - 1} more)` : '';
  return new AppError(
    'override-needed',
    `${first}${more} Change the plan, or override each warning with a reason.`,
    issues,
  );
}
