/**
 * What the calendar draws: visits as events coloured by state, and shutdown-window occurrences
 * as background events (week and day) or as their own events (month and agenda, which draw no
 * background), all placed on the shown zone's clock.
 */
import { addDays, endOfMonth, endOfWeek, format, startOfDay, startOfMonth, startOfWeek } from 'date-fns';
import type { ShutdownWindow, Visit, VisitState } from '../api/shapes';
import { VISIT_STATE_LABELS } from '../api/shapes';
import { fromCalendarDate, toCalendarDate } from './zoned-time';

export type PlannerView = 'month' | 'week' | 'day' | 'agenda';
export const PLANNER_VIEWS: readonly PlannerView[] = ['month', 'week', 'day', 'agenda'];

/** How long the agenda runs from its date, in days: a month on a wide screen, a week on a phone. */
export function agendaLengthDays(widthPx: number): number {
  return widthPx < 640 ? 7 : 30;
}

/** Weeks start on Monday, as in most of the plants Ebbline serves. */
export const WEEK_STARTS_ON = 1 as const;

export interface VisitEvent {
  kind: 'visit';
  id: string;
  title: string;
  start: Date;
  end: Date;
  visit: Visit;
  /** Shown at a proposed place while its move waits for a reason. */
  pending: boolean;
}

export interface WindowEvent {
  kind: 'window';
  id: string;
  title: string;
  start: Date;
  end: Date;
  window: ShutdownWindow;
  occurrence: { startsAt: string; endsAt: string };
}

export type PlannerEvent = VisitEvent | WindowEvent;

/** The colours of each state (theme colours of web/src/styles.css) and the legend's word. */
export const VISIT_STATE_STYLES: Record<VisitState, { background: string; border: string; text: string; label: string }> = {
  planned: { background: '#2f7f86', border: '#17434d', text: '#ffffff', label: VISIT_STATE_LABELS.planned },
  'under-way': { background: '#f2b544', border: '#c9861a', text: '#0a1c22', label: VISIT_STATE_LABELS['under-way'] },
  logged: { background: '#2e7d4f', border: '#1f5a38', text: '#ffffff', label: VISIT_STATE_LABELS.logged },
  reviewed: { background: '#17434d', border: '#0a1c22', text: '#ffffff', label: VISIT_STATE_LABELS.reviewed },
  missed: { background: '#b4362f', border: '#7f231e', text: '#ffffff', label: VISIT_STATE_LABELS.missed },
  cancelled: { background: '#eef6f6', border: '#a9d2d2', text: '#2f7f86', label: VISIT_STATE_LABELS.cancelled },
};

/** The shutdown windows' colour (a pale tide wash with a dashed edge). */
export const WINDOW_STYLE = { background: '#d3e8e8', border: '#5fb3b3', text: '#17434d', label: 'shutdown window' };

/** A visit's title on the calendar: its cabinet and who goes, and "unplanned" for one started at the cabinet. */
export function visitTitle(visit: Visit): string {
  const people = visit.technicians.map((t) => t.name).join(', ');
  const title = people ? `${visit.cabinetTag} · ${people}` : visit.cabinetTag;
  return visit.unplanned ? `${title} · unplanned` : title;
}

/** A visit as a calendar event on the clock of `timeZone`; `moved` places it where a move proposes. */
export function visitEvent(visit: Visit, timeZone: string, moved?: { plannedStartAt: string; plannedEndAt: string }): VisitEvent {
  return {
    kind: 'visit',
    id: visit.id,
    title: visitTitle(visit),
    start: toCalendarDate(moved?.plannedStartAt ?? visit.plannedStartAt, timeZone),
    end: toCalendarDate(moved?.plannedEndAt ?? visit.plannedEndAt, timeZone),
    visit,
    pending: moved !== undefined,
  };
}

/** Every occurrence of the windows as events on the clock of `timeZone`. */
export function windowEvents(windows: readonly ShutdownWindow[], timeZone: string): WindowEvent[] {
  return windows.flatMap((window) =>
    (window.occurrences ?? [{ startsAt: window.startsAt, endsAt: window.endsAt }]).map((occurrence) => ({
      kind: 'window' as const,
      id: `${window.id}@${occurrence.startsAt}`,
      title: `${window.title} · ${window.areaName}`,
      start: toCalendarDate(occurrence.startsAt, timeZone),
      end: toCalendarDate(occurrence.endsAt, timeZone),
      window,
      occurrence,
    })),
  );
}

/** Only planned and missed visits move (a replan); the others have happened or are closed. */
export function isMovable(visit: Visit, canPlan: boolean): boolean {
  return canPlan && (visit.state === 'planned' || visit.state === 'missed');
}

/**
 * The calendar's events and background events for a view: week and day draw windows behind the
 * visits; the agenda lists them among the visits; the month tints their days instead (as events
 * they would push the visits into "+n more").
 */
export function calendarLayers(
  view: PlannerView,
  visits: readonly VisitEvent[],
  windows: readonly WindowEvent[],
): { events: PlannerEvent[]; backgroundEvents: WindowEvent[] } {
  switch (view) {
    case 'week':
    case 'day':
      return { events: [...visits], backgroundEvents: [...windows] };
    case 'agenda':
      return { events: [...windows, ...visits].sort((a, b) => a.start.getTime() - b.start.getTime()), backgroundEvents: [] };
    case 'month':
      return { events: [...visits], backgroundEvents: [] };
  }
}

/**
 * The titles of the windows open on each calendar day (key "yyyy-MM-dd" of the shown clock), for
 * the month's tinted days; a window over midnight tints every day it touches.
 */
export function windowTitlesByDay(windows: readonly WindowEvent[]): Map<string, string[]> {
  const days = new Map<string, string[]>();
  for (const window of windows) {
    const last = new Date(window.end.getTime() - 1);
    for (let day = startOfDay(window.start); day <= last; day = addDays(day, 1)) {
      const key = format(day, 'yyyy-MM-dd');
      const titles = days.get(key) ?? [];
      if (!titles.includes(window.title)) titles.push(window.title);
      days.set(key, titles);
    }
  }
  return days;
}

/**
 * The instants a view shows (for the API's from/to), read in `timeZone`, with a day's margin
 * either side so nothing at an edge is missed.
 */
export function viewRange(view: PlannerView, date: Date, timeZone: string, agendaDays = 30): { from: string; to: string } {
  let start: Date;
  let end: Date;
  switch (view) {
    case 'month':
      start = startOfWeek(startOfMonth(date), { weekStartsOn: WEEK_STARTS_ON });
      end = addDays(endOfWeek(endOfMonth(date), { weekStartsOn: WEEK_STARTS_ON }), 1);
      break;
    case 'week':
      start = startOfWeek(date, { weekStartsOn: WEEK_STARTS_ON });
      end = addDays(start, 7);
      break;
    case 'day':
      start = startOfDay(date);
      end = addDays(start, 1);
      break;
    case 'agenda':
      start = startOfDay(date);
      end = addDays(start, agendaDays + 1);
      break;
  }
  return { from: fromCalendarDate(addDays(startOfDay(start), -1), timeZone), to: fromCalendarDate(addDays(startOfDay(end), 1), timeZone) };
}

/** Narrow screens (a phone, under 640 px) open on the agenda; wider ones on the week. */
export function defaultView(widthPx: number): PlannerView {
  return widthPx < 640 ? 'agenda' : 'week';
}

