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
