/**
 * The rows of a window's proposal as the planner edits them: remove a row, give it to another
 * technician; the rows are then laid out again per technician (shared/domain/plan-window.ts)
 * so they never overlap, and a row that would end after the window is flagged.
 */
import type { PlanningOverride } from '../../../../../shared/schemas/visit';
import type {
  ProposedWindowVisit,
  WindowProposal,
} from '../../../../../shared/schemas/plan-window';
import { packProposalRows, type PackedRow } from '../../../../../shared/domain/plan-window';

/** A row of the proposal being edited. */
export interface ProposalRow {
  /** Stable key: the cabinet (one visit per cabinet). */
  key: string;
  visit: ProposedWindowVisit;
  technicianIds: string[];
  estimatedMinutes: number;
}

/** A row laid out: its times and whether it passes the window's end. */
export type LaidOutRow = PackedRow<ProposalRow>;

/** The rows of a fresh proposal, in its order (which reproduces its times). */
export function rowsFromProposal(proposal: WindowProposal): ProposalRow[] {
  return proposal.visits.map((visit) => ({
    key: visit.cabinetId,
    visit,
    technicianIds: [...visit.technicianIds],
    estimatedMinutes: visit.estimatedMinutes,
  }));
}

/** The rows without the one of `key`. */
export function removeRow(rows: readonly ProposalRow[], key: string): ProposalRow[] {
  return rows.filter((row) => row.key !== key);
}

/**
 * The rows with the row of `key` given to `technicianId` alone. It moves to the end of the
 * list, so it follows the rows that technician already has.
 */
export function reassignRow(
  rows: readonly ProposalRow[],
  key: string,
  technicianId: string,
): ProposalRow[] {
  const row = rows.find((r) => r.key === key);
  if (!row) return [...rows];
  return [...rows.filter((r) => r.key !== key), { ...row, technicianIds: [technicianId] }];
}

/**
 * The rows laid out from the occurrence's start, each technician's one after another and
 * around the visits they already have (`technicians[].busy` of the proposal).
 */
export function layOutRows(
  rows: readonly ProposalRow[],
  occurrence: { startsAt: string; endsAt: string },
  technicians: ReadonlyArray<{
    id: string;
    busy?: ReadonlyArray<{ startsAt: string; endsAt: string }>;
  }> = [],
): LaidOutRow[] {
  return packProposalRows(
    rows,
    occurrence,
    Object.fromEntries(technicians.map((t) => [t.id, t.busy ?? []])),
  );
}

/** One technician's part of the plan. */
export interface TechnicianRows {
  technicianId: string;
  name: string;
  rows: LaidOutRow[];
  /** Minutes of their rows. */
  plannedMinutes: number;
}

/**
 * The laid-out rows grouped by technician, in the order of `technicians` (a row of two
 * technicians shows under each); technicians with no row are left out.
 */
export function rowsByTechnician(
  rows: readonly LaidOutRow[],
  technicians: readonly { id: string; name: string }[],
): TechnicianRows[] {
  return technicians
    .map((technician) => {
      const own = rows
        .filter((row) => row.technicianIds.includes(technician.id))
        .sort((a, b) => Date.parse(a.plannedStartAt) - Date.parse(b.plannedStartAt));
      return {
        technicianId: technician.id,
        name: technician.name,
        rows: own,
        plannedMinutes: own.reduce((sum, row) => sum + row.estimatedMinutes, 0),
      };
    })
    .filter((group) => group.rows.length > 0);
}

/** True when the plan can be confirmed: at least one row, none past the window's end. */
export function canConfirm(rows: readonly LaidOutRow[]): boolean {
  return rows.length > 0 && rows.every((row) => !row.endsAfterWindow);
}

/**
 * The body of `POST /api/visits/batch` for the laid-out rows; `overrides` by row index accept
 * warnings the server raised (a 422 `override-needed`).
 */
export function batchBody(
  rows: readonly LaidOutRow[],
  overrides: ReadonlyMap<number, PlanningOverride[]> = new Map(),
): {
  visits: Array<{
    cabinetId: string;
    bankIds: string[];
    plannedStartAt: string;
    plannedEndAt: string;
    technicianIds: string[];
    notes: string;
    overrides: PlanningOverride[];
  }>;
} {
  return {
    visits: rows.map((row, index) => ({
      cabinetId: row.visit.cabinetId,
      bankIds: row.visit.bankIds,
      plannedStartAt: row.plannedStartAt,
      plannedEndAt: row.plannedEndAt,
      technicianIds: row.technicianIds,
      notes: row.visit.notes,
      overrides: overrides.get(index) ?? [],
    })),
  };
}

/** A warning of a 422 `override-needed` answer to a batch, tied to its row. */
export interface RowWarning {
  index: number;
  kind: string;
  message: string;
}

/**
 * The warnings of a batch's `override-needed` issues (`path: 'visits.3.overrides'`, `kind`,
 * `message`), by row index; issues of any other shape are left out.
 */
export function rowWarningsOf(
  issues: ReadonlyArray<{ path: string; message: string; kind?: string }>,
): RowWarning[] {
  return issues.flatMap((issue) => {
    const match = /^visits\.(\d+)\.overrides/.exec(issue.path);
    return match && issue.kind
      ? [{ index: Number(match[1]), kind: issue.kind, message: issue.message }]
      : [];
  });
}

/** Overrides, by row index, accepting every warning given with one reason. */
export function overridesForWarnings(
  warnings: readonly RowWarning[],
  reason: string,
): Map<number, PlanningOverride[]> {
  const out = new Map<number, PlanningOverride[]>();
  for (const warning of warnings) {
    const list = out.get(warning.index) ?? [];
    if (!list.some((o) => o.kind === warning.kind))
      list.push({ kind: warning.kind as PlanningOverride['kind'], reason: reason.trim() });
    out.set(warning.index, list);
  }
  return out;
}
