/**
 * The planning check of a visit: gathers what the warnings need (the shutdown windows of the
 * cabinet's area, the technicians' other visits, the banks' due dates) and applies the pure
 * rules of shared/domain/planning-warnings.ts. Used before saving (`POST /api/visits/check`)
 * and by every create and replan, which refuse warnings not overridden with a reason.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import type { PlanningOverride } from '../../../shared/schemas/visit';
import { dueOnOf } from '../../../shared/domain/due';
import { planningWarnings, unacceptedKinds, type PlanningWarningFinding } from '../../../shared/domain/planning-warnings';
import { windowOccurrences } from '../../../shared/domain/shutdown-windows';
import { sequelize } from '../db/sequelize';
import { AppError, type FieldIssue } from '../errors';

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

interface BankDueRow {
  id: string;
  position: string;
  installed_on: string | null;
  baseline_set_on: string;
  inspection_interval_days: number;
  last_inspected_on: string | null;
}

/**
 * The warnings of a planned visit (outside every window, double-booked, not due).
 *
 * @param exceptVisitId - the visit being replanned, left out of the double-booking check
 */
export async function planningWarningsOf(
  visit: PlannedVisit,
  exceptVisitId: string | null,
  transaction?: Transaction,
): Promise<PlanningWarningFinding[]> {
  const [windows, others, banks, names] = await Promise.all([
    sequelize.query<WindowRow>(
      `SELECT starts_at, ends_at, recurrence FROM shutdown_windows
        WHERE area_id = :areaId AND retired_at IS NULL AND starts_at < :endAt`,
      { replacements: { areaId: visit.areaId, endAt: visit.plannedEndAt }, type: QueryTypes.SELECT, transaction },
    ),
    sequelize.query<OtherVisitRow>(
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
    ),
    bankDueFacts(visit.bankIds, exceptVisitId, transaction),
    sequelize.query<{ id: string; name: string }>('SELECT id, name FROM users WHERE id IN (:ids)', {
      replacements: { ids: [...visit.technicianIds] },
      type: QueryTypes.SELECT,
      transaction,
    }),
  ]);

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
    banks: banks.map((b) => ({
      id: b.id,
      position: b.position,
      dueOn: dueOnOf({
        lastInspectedOn: b.last_inspected_on,
        installedOn: b.installed_on,
        baselineSetOn: b.baseline_set_on,
        inspectionIntervalDays: b.inspection_interval_days,
      }),
    })),
  });
}

/**
 * What the due rule needs of each bank: install date, the local date its baseline was set, its
 * design's inspection interval, and the local date of the latest logged or reviewed visit that
 * covered it (dates in the site's zone; the visit being replanned left out).
 */
async function bankDueFacts(
  bankIds: readonly string[],
  exceptVisitId: string | null,
  transaction?: Transaction,
): Promise<BankDueRow[]> {
  return sequelize.query<BankDueRow>(
    `SELECT b.id, b.position, b.installed_on,
            to_char(b.baseline_set_at AT TIME ZONE s.time_zone, 'YYYY-MM-DD') AS baseline_set_on,
            dv.inspection_interval_days,
            (SELECT to_char(max(v.logged_at) AT TIME ZONE s.time_zone, 'YYYY-MM-DD')
               FROM visit_banks vb JOIN visits v ON v.id = vb.visit_id
              WHERE vb.bank_id = b.id AND v.state IN ('logged', 'reviewed') AND v.logged_at IS NOT NULL
                AND (CAST(:exceptId AS uuid) IS NULL OR v.id <> CAST(:exceptId AS uuid))) AS last_inspected_on
       FROM banks b
       JOIN cabinets c ON c.id = b.cabinet_id
       JOIN areas a ON a.id = c.area_id
       JOIN sites s ON s.id = a.site_id
       JOIN bank_designs d ON d.id = b.bank_design_id
       JOIN bank_design_versions dv ON dv.id = d.current_version_id
      WHERE b.id IN (:bankIds)`,
    { replacements: { bankIds: [...bankIds], exceptId: exceptVisitId }, type: QueryTypes.SELECT, transaction },
  );
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
