/** The week view's arithmetic: the bar of hours, the week to show, the technicians after a reassignment. */
import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';
import { addDays } from '../../../../../shared/domain/calendar-dates';

/** How full a technician's week is. */
export interface LoadBar {
  /** Planned over available, 0–1 for the bar's width. */
  fraction: number;
  /** True when more is planned than available (or anything with none available). */
  over: boolean;
  /** "2.9 h of 30 h". */
  text: string;
}

/** Hours to one decimal place, without a trailing ".0". */
function hoursText(hours: number): string {
  return `${Number(hours.toFixed(1))} h`;
}

/**
 * The bar of a technician's week.
 * @example loadBar(2.9, 30) // { fraction: 0.0966…, over: false, text: '2.9 h of 30 h' }
 */
export function loadBar(plannedHours: number, availableHours: number): LoadBar {
  const over = plannedHours > availableHours;
  const fraction =
    availableHours > 0 ? Math.min(1, plannedHours / availableHours) : plannedHours > 0 ? 1 : 0;
  return { fraction, over, text: `${hoursText(plannedHours)} of ${hoursText(availableHours)}` };
}

/**
 * The day `weeks` weeks from `weekOn`.
 * @example shiftWeek('2027-01-09', -1) // '2027-01-02'
 */
export function shiftWeek(weekOn: string, weeks: number): string {
  return addDays(weekOn, weeks * 7);
}

/** Today on the clock of `timeZone` (the browser's when none), `YYYY-MM-DD`. */
export function todayOn(nowMs: number, timeZone?: string): string {
  return timeZone
    ? format(new TZDate(nowMs, timeZone), 'yyyy-MM-dd')
    : format(new Date(nowMs), 'yyyy-MM-dd');
}

/**
 * The visit's technicians with `fromId` replaced by `toId`, each once (a visit of two keeps the other).
 * @example reassignedTechnicians(['a', 'b'], 'a', 'c') // ['c', 'b']
 */
export function reassignedTechnicians(
  technicianIds: readonly string[],
  fromId: string,
  toId: string,
): string[] {
  return [...new Set(technicianIds.map((id) => (id === fromId ? toId : id)))];
}

/**
 * "Sat 9 Jan, 06:00–07:10 Europe/Berlin" on the visit's site clock.
 * @example visitTimesText('2027-01-09T05:00:00Z', '2027-01-09T06:10:00Z', 'Europe/Berlin') // 'Sat 9 Jan, 06:00–07:10 Europe/Berlin'
 */
export function visitTimesText(startsAt: string, endsAt: string, timeZone: string): string {
  const start = new TZDate(Date.parse(startsAt), timeZone);
  const end = new TZDate(Date.parse(endsAt), timeZone);
  const endText =
    format(start, 'yyyy-MM-dd') === format(end, 'yyyy-MM-dd')
      ? format(end, 'HH:mm')
      : format(end, 'EEE d MMM, HH:mm');
  return `${format(start, 'EEE d MMM, HH:mm')}–${endText} ${timeZone}`;
}

/**
 * "Mon 4 Jan – Sun 10 Jan 2027".
 * @example weekText('2027-01-04') // 'Mon 4 Jan – Sun 10 Jan 2027'
 */
export function weekText(weekStartOn: string): string {
  const [y, m, d] = weekStartOn.split('-').map(Number) as [number, number, number];
  const [y2, m2, d2] = addDays(weekStartOn, 6).split('-').map(Number) as [number, number, number];
  return `${format(new Date(y, m - 1, d), 'EEE d MMM')} – ${format(new Date(y2, m2 - 1, d2), 'EEE d MMM yyyy')}`;
}
