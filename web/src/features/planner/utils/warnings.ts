/**
 * Planning warnings before a save: grouped by kind (an override is given per kind), each kind
 * needing a reason before the save may go.
 */
import { PLANNING_REASON_MIN_CHARS, PLANNING_WARNING_KINDS } from '../../../../../shared/constants/planning';
import type { PlanningWarning, PlanningWarningKind, VisitOverride } from '../api/shapes';

/** The shortest reason the API accepts, in characters. */
export const MIN_REASON_LENGTH = PLANNING_REASON_MIN_CHARS;

/** How each kind of warning is headed. */
export const WARNING_KIND_LABELS: Record<PlanningWarningKind, string> = {
  'outside-window': 'Outside every shutdown window',
  'double-booked': 'Technician double-booked',
  'not-due': 'Bank not yet due',
};

export interface WarningGroup {
  kind: PlanningWarningKind;
  label: string;
  messages: string[];
}

/** The warnings grouped by kind, in the order they first appear. */
export function groupWarnings(warnings: readonly PlanningWarning[]): WarningGroup[] {
  const groups = new Map<PlanningWarningKind, WarningGroup>();
  for (const warning of warnings) {
    const group = groups.get(warning.kind) ?? { kind: warning.kind, label: WARNING_KIND_LABELS[warning.kind] ?? warning.kind, messages: [] };
    if (!group.messages.includes(warning.message)) group.messages.push(warning.message);
    groups.set(warning.kind, group);
  }
  return [...groups.values()];
}

/** True when a reason is long enough for the API (spaces around it do not count). */
export function isReasonGiven(reason: string | undefined): boolean {
  return (reason ?? '').trim().length >= MIN_REASON_LENGTH;
}

/**
 * The overrides to send: one per kind of warning shown, with its reason. Reasons typed for kinds
 * no longer warned about are left out.
 */
export function overridesFor(warnings: readonly PlanningWarning[], reasons: Partial<Record<PlanningWarningKind, string>>): VisitOverride[] {
  return groupWarnings(warnings).map((group) => ({ kind: group.kind, reason: (reasons[group.kind] ?? '').trim() }));
}

/** The kinds still waiting for a reason; the save stays disabled until this is empty. */
export function kindsMissingReason(
  warnings: readonly PlanningWarning[],
  reasons: Partial<Record<PlanningWarningKind, string>>,
): PlanningWarningKind[] {
  return groupWarnings(warnings)
    .filter((group) => !isReasonGiven(reasons[group.kind]))
    .map((group) => group.kind);
}

/**
 * The warnings of a 422 `override-needed` answer (issues `{path:['overrides'], kind, message}`),
 * so the form can show what the server found since the last check.
 */
export function warningsFromIssues(issues: readonly { path: unknown; message: string; kind?: unknown }[]): PlanningWarning[] {
  return issues
    .filter((issue): issue is { path: unknown; message: string; kind: PlanningWarningKind } =>
      typeof issue.kind === 'string' && (PLANNING_WARNING_KINDS as readonly string[]).includes(issue.kind),
    )
    .map((issue) => ({ kind: issue.kind, message: issue.message }));
}
