/**
 * When a capacitor bank is due for its next inspection, and which bucket of the Due list that
 * puts it in. Pure: no clock (callers pass `todayOn`, the day in the site's time zone, or
 * `asOf` with the zone), no I/O.
 *
 * The rule: a bank is due at its design's inspection interval after it was last inspected,
 * earlier when the forecast recommends an earlier next visit, and at least yearly (common
 * practice; NFPA 70B (2023) sets intervals from the worst of condition, criticality and
 * environment, with at least yearly inspection):
 *
 *   dueOn = min(startOn + design.inspectionIntervalDays, startOn + 365, forecastNextVisitOn)
 *
 * where `startOn` is the local date (site's zone) of the latest logged or reviewed visit that
 * covered the bank, else the bank's install date, else the local date its baseline was set.
 */

import { dayNumberFromIsoDate, isoDateFromDayNumber } from './calendar-dates';

/** Longest interval between inspections, in days: at least yearly (common practice, NFPA 70B). */
export const LONGEST_INSPECTION_INTERVAL_DAYS = 365;

/** What a bank's due date counts from. */
export type DueStartKind = 'last-visit' | 'installed' | 'baseline';

/** Which term of the rule gave the due date. */
export type DueBasis = 'design-interval' | 'yearly' | 'forecast';

/** What the due rule needs to know about one bank. All dates are `YYYY-MM-DD` in the site's zone. */
export interface DueInputs {
  /** Local date of the latest logged or reviewed visit covering the bank; null when none. */
  lastInspectedOn: string | null;
  /** The bank's install date; null when not recorded. */
  installedOn: string | null;
  /** Local date the bank's baseline was set (always known). */
  baselineSetOn: string;
  /** The bank design's inspection interval, in days (≥ 1). */
  inspectionIntervalDays: number;
  /** The forecast's latest next visit (`nextVisitBy`), when there is a forecast. */
  forecastNextVisitOn?: string | null;
}

/** A bank's due date with where it came from. */
export interface DueDate {
  /** The day the bank is due, `YYYY-MM-DD`. */
  dueOn: string;
  /** The date the interval counts from. */
  startOn: string;
  /** What `startOn` is. */
  startKind: DueStartKind;
  /** Which term of the rule is the earliest (ties: design interval, then yearly, then forecast). */
  basis: DueBasis;
}

/**
 * The date a bank's inspection interval counts from: the latest logged or reviewed visit, else
 * the install date, else the day its baseline was set.
 *
 * @example
 * dueStartOf({ lastInspectedOn: null, installedOn: '2024-03-01', baselineSetOn: '2024-03-05' })
 * // { startOn: '2024-03-01', startKind: 'installed' }
 */
export function dueStartOf(
  inputs: Pick<DueInputs, 'lastInspectedOn' | 'installedOn' | 'baselineSetOn'>,
): { startOn: string; startKind: DueStartKind } {
  if (inputs.lastInspectedOn) return { startOn: inputs.lastInspectedOn, startKind: 'last-visit' };
  if (inputs.installedOn) return { startOn: inputs.installedOn, startKind: 'installed' };
  return { startOn: inputs.baselineSetOn, startKind: 'baseline' };
}

/**
 * A bank's due date and why (see the module comment for the rule).
 *
 * @param inputs - the bank's dates, its design's interval in days, and the forecast's next visit
 * @returns the due date, the date it counts from and which term of the rule gave it
 * @throws EngineInputError('invalid-date') when a date is not a calendar date
 * @example
 * dueDateOf({ lastInspectedOn: '2026-01-10', installedOn: '2020-05-01', baselineSetOn: '2020-05-02',
 *   inspectionIntervalDays: 182 })
 * // { dueOn: '2026-07-11', startOn: '2026-01-10', startKind: 'last-visit', basis: 'design-interval' }
 */
export function dueDateOf(inputs: DueInputs): DueDate {
  const { startOn, startKind } = dueStartOf(inputs);
  const start = dayNumberFromIsoDate(startOn, 'startOn');
  const intervalDays = Math.max(1, Math.round(inputs.inspectionIntervalDays));
  let due = start + intervalDays;
  let basis: DueBasis = 'design-interval';
  const yearly = start + LONGEST_INSPECTION_INTERVAL_DAYS;
  if (yearly < due) {
    due = yearly;
    basis = 'yearly';
  }
  if (inputs.forecastNextVisitOn) {
    const forecast = dayNumberFromIsoDate(inputs.forecastNextVisitOn, 'forecastNextVisitOn');
    if (forecast < due) {
      due = forecast;
      basis = 'forecast';
    }
  }
  return { dueOn: isoDateFromDayNumber(due), startOn, startKind, basis };
}

/**
 * The day a bank is due for inspection, `YYYY-MM-DD` (the date of {@link dueDateOf}).
 *
 * @example
 * dueOnOf({ lastInspectedOn: null, installedOn: null, baselineSetOn: '2025-06-30',
 *   inspectionIntervalDays: 730 })
 * // '2026-06-30' (at least yearly, though the design allows two years)
 * dueOnOf({ lastInspectedOn: '2026-01-10', installedOn: null, baselineSetOn: '2025-01-01',
 *   inspectionIntervalDays: 365, forecastNextVisitOn: '2026-04-01' })
 * // '2026-04-01' (the forecast asks for an earlier visit)
 */
export function dueOnOf(inputs: DueInputs): string {
  return dueDateOf(inputs).dueOn;
}

/** The Due list's buckets, most urgent first. */
export const DUE_BUCKETS = ['overdue', 'this-month', 'next-quarter', 'later'] as const;

/** One bucket of the Due list. */
export type DueBucket = (typeof DUE_BUCKETS)[number];

/** How each bucket is named on screen. */
export const DUE_BUCKET_LABELS: Record<DueBucket, string> = {
  overdue: 'Overdue',
  'this-month': 'Due this month',
  'next-quarter': 'Due in the next three months',
  later: 'Later',
};

/**
 * The last day of the month of `dateOn`.
 *
 * @example
 * endOfMonthOn('2024-02-10') // '2024-02-29'
 */
export function endOfMonthOn(dateOn: string): string {
  const [year, month] = dateOn.split('-').map(Number) as [number, number];
  return isoDateFromDayNumber(Math.round(Date.UTC(year, month, 0) / 86_400_000));
}

/**
 * `dateOn` plus whole calendar months; a day past the end of the target month becomes its last
 * day (as PostgreSQL's `date + interval 'n months'` and date-fns' `addMonths` do).
 *
 * @example
 * addMonthsOn('2026-11-30', 3) // '2027-02-28'
 */
export function addMonthsOn(dateOn: string, months: number): string {
  dayNumberFromIsoDate(dateOn, 'dateOn');
  const [year, month, day] = dateOn.split('-').map(Number) as [number, number, number];
  const monthIndex = year * 12 + (month - 1) + Math.round(months);
  const targetYear = Math.floor(monthIndex / 12);
  const targetMonth = monthIndex - targetYear * 12; // 0-based
  const lastDay = new Date(Date.UTC(targetYear, targetMonth + 1, 0)).getUTCDate();
  const ms = Date.UTC(targetYear, targetMonth, Math.min(day, lastDay));
  return isoDateFromDayNumber(Math.round(ms / 86_400_000));
}

/**
 * The last day of the "next three months" bucket: today plus three calendar months.
 *
 * @example
 * nextQuarterEndOn('2026-12-02') // '2027-03-02'
 */
export function nextQuarterEndOn(todayOn: string): string {
  return addMonthsOn(todayOn, 3);
}

/**
 * Which bucket of the Due list a due date falls in, seen on `todayOn` (the site's local day):
 * `overdue` before today; `this-month` from today to the end of today's month; `next-quarter`
 * after that up to today plus three months; `later` beyond.
 *
 * @example
 * dueBucketOf('2026-12-01', '2026-12-02') // 'overdue'
 * dueBucketOf('2026-12-02', '2026-12-02') // 'this-month' (due today is not yet overdue)
 * dueBucketOf('2026-12-31', '2026-12-02') // 'this-month'
 * dueBucketOf('2027-03-02', '2026-12-02') // 'next-quarter'
 * dueBucketOf('2027-03-03', '2026-12-02') // 'later'
 */
export function dueBucketOf(dueOn: string, todayOn: string): DueBucket {
  const due = dayNumberFromIsoDate(dueOn, 'dueOn');
  const today = dayNumberFromIsoDate(todayOn, 'todayOn');
  if (due < today) return 'overdue';
  if (due <= dayNumberFromIsoDate(endOfMonthOn(todayOn))) return 'this-month';
  if (due <= dayNumberFromIsoDate(nextQuarterEndOn(todayOn))) return 'next-quarter';
  return 'later';
}

/**
 * The calendar date of an instant in an IANA time zone (e.g. a visit's `loggedAt` on the
 * site's clock, or today at a site).
 *
 * @param at - an instant (a Date or a UTC ISO string)
 * @param timeZone - an IANA zone, e.g. 'Europe/Berlin'
 * @throws RangeError for an unknown time zone
 * @example
 * calendarDateInZone('2026-12-31T23:30:00Z', 'Europe/Berlin') // '2027-01-01'
 * calendarDateInZone('2026-12-31T23:30:00Z', 'America/Chicago') // '2026-12-31'
 */
export function calendarDateInZone(at: Date | string, timeZone: string): string {
  const instant = typeof at === 'string' ? new Date(at) : at;
  const parts = new Intl.DateTimeFormat('en-CA', {
    timeZone,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
  }).formatToParts(instant);
  const part = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
  return `${part('year')}-${part('month')}-${part('day')}`;
}

/**
 * A bank's due date and bucket seen at an instant at its site: {@link dueDateOf} with
 * {@link dueBucketOf} on the site's local day.
 *
 * @example
 * dueStatusOf({ lastInspectedOn: '2025-11-30', installedOn: null, baselineSetOn: '2025-01-01',
 *   inspectionIntervalDays: 365 }, '2026-11-30T23:30:00Z', 'Europe/Berlin')
 * // { dueOn: '2026-11-30', bucket: 'overdue', todayOn: '2026-12-01', ... }
 */
export function dueStatusOf(
  inputs: DueInputs,
  asOf: Date | string,
  timeZone: string,
): DueDate & { bucket: DueBucket; todayOn: string } {
  const todayOn = calendarDateInZone(asOf, timeZone);
  const due = dueDateOf(inputs);
  return { ...due, todayOn, bucket: dueBucketOf(due.dueOn, todayOn) };
}

/** Days from `todayOn` to `dueOn` (negative when overdue). */
export function daysUntilDue(dueOn: string, todayOn: string): number {
  return dayNumberFromIsoDate(dueOn) - dayNumberFromIsoDate(todayOn);
}
