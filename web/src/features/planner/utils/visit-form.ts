/** The new-visit form's rules, apart from the screen. */
import { format, startOfWeek } from 'date-fns';
import type { VisitInput } from '../api/shapes';
import { WEEK_STARTS_ON } from './calendar-events';
import { toCalendarDate } from './zoned-time';

export interface VisitDraft {
  siteId: string;
  areaId: string;
  cabinetId: string;
  bankIds: string[];
  technicianIds: string[];
  /** UTC ISO instants; shown and typed in the site's zone. */
  plannedStartAt: string;
  plannedEndAt: string;
  notes: string;
}

/** What is still missing before a draft can be checked or saved, in the form's words (by field). */
export function draftProblems(draft: VisitDraft): Partial<Record<keyof VisitDraft, string>> {
  const problems: Partial<Record<keyof VisitDraft, string>> = {};
  if (!draft.siteId) problems.siteId = 'Choose a site.';
  if (!draft.areaId) problems.areaId = 'Choose an area.';
  if (!draft.cabinetId) problems.cabinetId = 'Choose a cabinet.';
  if (draft.bankIds.length === 0) problems.bankIds = 'Tick at least one bank.';
  if (draft.technicianIds.length === 0) problems.technicianIds = 'Tick at least one technician.';
  if (!draft.plannedStartAt) problems.plannedStartAt = 'Enter the start.';
  if (!draft.plannedEndAt) problems.plannedEndAt = 'Enter the end.';
  else if (draft.plannedStartAt && Date.parse(draft.plannedEndAt) <= Date.parse(draft.plannedStartAt))
    problems.plannedEndAt = 'The end comes after the start.';
  return problems;
}

/** The body for the check and the save, or null while the draft is incomplete. */
export function draftInput(draft: VisitDraft): VisitInput | null {
  if (Object.keys(draftProblems(draft)).length > 0) return null;
  const input: VisitInput = {
    cabinetId: draft.cabinetId,
    bankIds: [...draft.bankIds].sort(),
    technicianIds: [...draft.technicianIds].sort(),
    plannedStartAt: draft.plannedStartAt,
    plannedEndAt: draft.plannedEndAt,
  };
  if (draft.notes.trim()) input.notes = draft.notes.trim();
  return input;
}

/** The Monday (YYYY-MM-DD) of the week an instant falls in, in the site's zone: the load's week. */
export function weekOnOf(instant: string, timeZone: string): string {
  return format(startOfWeek(toCalendarDate(instant, timeZone), { weekStartsOn: WEEK_STARTS_ON }), 'yyyy-MM-dd');
}

/**
 * A slot picked on the calendar as a visit's times: a click on a month day (a whole day) becomes
 * 08:00–10:00 that day; a slot of the time grid keeps its times.
 */
export function slotTimes(start: Date, end: Date, isWholeDays: boolean): { start: Date; end: Date } {
  if (!isWholeDays) return { start, end };
  const from = new Date(start.getFullYear(), start.getMonth(), start.getDate(), 8, 0);
  return { start: from, end: new Date(from.getTime() + 2 * 3600_000) };
}

/** The API's field issues by the form's field (the first issue of each). */
export function fieldErrors(issues: readonly { path: unknown; message: string }[]): Record<string, string> {
  const errors: Record<string, string> = {};
  for (const issue of issues) {
    const path = Array.isArray(issue.path) ? issue.path.join('.') : String(issue.path ?? '');
    const field = path.split('.')[0] ?? '';
    if (field && !(field in errors)) errors[field] = issue.message;
  }
  return errors;
}
