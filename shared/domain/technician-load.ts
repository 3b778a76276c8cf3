/**
 * A technician's week: its bounds on a site's clock and the hours of visits inside it. Pure:
 * no clock, no I/O.
 */
import { TZDate } from '@date-fns/tz';
import { addDays, dayNumberFromIsoDate } from './calendar-dates';

const MS_PER_HOUR = 3_600_000;

/** A week: its Monday and its bounds as instants. */
export interface WeekBounds {
  /** The Monday, `YYYY-MM-DD`. */
  weekStartOn: string;
  /** Monday 00:00 in the zone, UTC ISO. */
  startsAt: string;
  /** The next Monday 00:00 in the zone, UTC ISO (a week with a clock change is 167 or 169 hours long). */
  endsAt: string;
}

/** Midnight at the start of `dateOn` in `timeZone`, as an instant in ms. */
function midnightMs(dateOn: string, timeZone: string): number {
  const [year, month, day] = dateOn.split('-').map(Number) as [number, number, number];
  return new TZDate(year, month - 1, day, timeZone).getTime();
}

/**
 * The week (Monday to Sunday) that holds `dateOn`, on the clock of `timeZone`.
 *
 * @param dateOn - any day of the week, `YYYY-MM-DD`
 * @param timeZone - an IANA zone, e.g. 'Europe/Berlin'
 * @throws EngineInputError('invalid-date') when `dateOn` is not a calendar date
 * @example
 * weekOf('2027-01-09', 'Europe/Berlin') // a Saturday
 * // { weekStartOn: '2027-01-04', startsAt: '2027-01-03T23:00:00.000Z', endsAt: '2027-01-10T23:00:00.000Z' }
 */
export function weekOf(dateOn: string, timeZone: string): WeekBounds {
  // day 0 (1970-01-01) was a Thursday: (day + 3) mod 7 counts from Monday
  const daysSinceMonday = (((dayNumberFromIsoDate(dateOn, 'weekOn') + 3) % 7) + 7) % 7;
  const weekStartOn = addDays(dateOn, -daysSinceMonday);
  return {
    weekStartOn,
    startsAt: new Date(midnightMs(weekStartOn, timeZone)).toISOString(),
    endsAt: new Date(midnightMs(addDays(weekStartOn, 7), timeZone)).toISOString(),
  };
}

/**
 * Hours of [startAt, endAt) that fall inside [fromAt, toAt); 0 when they do not meet.
 *
 * @example
 * hoursWithin('2027-01-10T22:00:00Z', '2027-01-11T02:00:00Z', '2027-01-04T00:00:00Z', '2027-01-11T00:00:00Z') // 2
 */
export function hoursWithin(startAt: string, endAt: string, fromAt: string, toAt: string): number {
  const from = Math.max(Date.parse(startAt), Date.parse(fromAt));
  const to = Math.min(Date.parse(endAt), Date.parse(toAt));
  return to > from ? (to - from) / MS_PER_HOUR : 0;
}

/**
 * Hours of visits inside a week, summed and rounded to a tenth of an hour (the precision the
 * hours available are kept in).
 *
 * @example
 * plannedHoursWithin([{ plannedStartAt: '2027-01-05T06:00:00Z', plannedEndAt: '2027-01-05T07:10:00Z' }],
 *   { startsAt: '2027-01-04T00:00:00Z', endsAt: '2027-01-11T00:00:00Z' }) // 1.2
 */
export function plannedHoursWithin(
  visits: ReadonlyArray<{ plannedStartAt: string; plannedEndAt: string }>,
  week: { startsAt: string; endsAt: string },
): number {
  const hours = visits.reduce(
    (sum, v) => sum + hoursWithin(v.plannedStartAt, v.plannedEndAt, week.startsAt, week.endsAt),
    0,
  );
  return Math.round(hours * 10) / 10;
}
