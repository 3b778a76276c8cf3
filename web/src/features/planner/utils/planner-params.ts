/** The Planner's place in the address bar, so a reload or a shared link opens the same view. */
import { format, isValid, parse } from 'date-fns';
import { PLANNER_VIEWS, type PlannerView } from './calendar-events';

export interface PlannerParams {
  siteId: string;
  areaId: string;
  view: PlannerView | null;
  /** A calendar date (YYYY-MM-DD) in the shown zone; null for today. */
  dateOn: string | null;
  showCancelled: boolean;
}

/** Reads the Planner's params; unknown values are ignored. */
export function readPlannerParams(search: URLSearchParams): PlannerParams {
  const view = search.get('view');
  const dateOn = search.get('date');
  return {
    siteId: search.get('siteId') ?? '',
    areaId: search.get('areaId') ?? '',
    view: PLANNER_VIEWS.includes(view as PlannerView) ? (view as PlannerView) : null,
    dateOn: dateOn && /^\d{4}-\d{2}-\d{2}$/.test(dateOn) && isValid(parse(dateOn, 'yyyy-MM-dd', new Date())) ? dateOn : null,
    showCancelled: search.get('cancelled') === 'shown',
  };
}

/** The search string of the Planner's params, leaving out what is at its default. */
export function writePlannerParams(params: PlannerParams): URLSearchParams {
  const search = new URLSearchParams();
  if (params.siteId) search.set('siteId', params.siteId);
  if (params.areaId) search.set('areaId', params.areaId);
  if (params.view) search.set('view', params.view);
  if (params.dateOn) search.set('date', params.dateOn);
  if (params.showCancelled) search.set('cancelled', 'shown');
  return search;
}

/** A calendar date of the param, as the calendar's local Date (midnight). */
export function calendarDateOf(dateOn: string): Date {
  return parse(dateOn, 'yyyy-MM-dd', new Date());
}

/** The param of a calendar date. */
export function dateOnOf(date: Date): string {
  return format(date, 'yyyy-MM-dd');
}

/** A visit asked for by another screen (the Due list's "Plan a visit"): a cabinet and some of its banks. */
export interface PlanRequest {
  cabinetId: string;
  bankIds: string[];
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * The visit asked for in the address (`?cabinetId=…&bankIds=a,b`), or null; ids that are not
 * record ids are dropped, so a mangled link opens the calendar rather than a broken form.
 */
export function readPlanRequest(search: URLSearchParams): PlanRequest | null {
  const cabinetId = search.get('cabinetId') ?? '';
  if (!UUID.test(cabinetId)) return null;
  const bankIds = (search.get('bankIds') ?? '').split(',').filter((id) => UUID.test(id));
  return { cabinetId, bankIds: [...new Set(bankIds)] };
}

/** The address without the request, once its form is closed. */
export function withoutPlanRequest(search: URLSearchParams): URLSearchParams {
  const next = new URLSearchParams(search);
  next.delete('cabinetId');
  next.delete('bankIds');
  return next;
}

/**
 * Times a requested visit starts with: the first shutdown-window occurrence of the cabinet's
 * area that has not ended yet (from its start, or from now when it is under way, for two hours
 * or to its end), else tomorrow 08:00–10:00 on the site's clock (`fallback`).
 */
export function requestedVisitTimes(
  occurrences: readonly { startsAt: string; endsAt: string }[],
  nowMs: number,
  fallback: { plannedStartAt: string; plannedEndAt: string },
): { plannedStartAt: string; plannedEndAt: string } {
  const next = occurrences
    .filter((o) => Date.parse(o.endsAt) > nowMs)
    .sort((a, b) => Date.parse(a.startsAt) - Date.parse(b.startsAt))[0];
  if (!next) return fallback;
  // whole minutes, so the form's time fields show what is stored
  const start = Math.max(Date.parse(next.startsAt), Math.ceil(nowMs / 60_000) * 60_000);
  const end = Math.min(start + 2 * 3600_000, Date.parse(next.endsAt));
  if (end <= start) return fallback;
  return { plannedStartAt: new Date(start).toISOString(), plannedEndAt: new Date(end).toISOString() };
}
