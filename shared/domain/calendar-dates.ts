/**
 * Calendar dates as whole UTC day numbers (days since 1970-01-01), for trends and due dates.
 * Pure arithmetic: no clock, no time zone. Dates are ISO strings "YYYY-MM-DD".
 */

import { EngineInputError } from './errors';

const MS_PER_DAY = 86_400_000;
const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})(?:[T ].*)?$/;

/**
 * Day number of an ISO calendar date (a full ISO timestamp is cut to its date).
 *
 * @param dateOn - e.g. "2024-02-29"
 * @param path - where the date came from, for the error ("history.3.measuredOn", "row 5")
 * @throws EngineInputError('invalid-date') for anything that is not a real calendar date
 * @example
 * dayNumberFromIsoDate('1970-01-02') // 1
 */
export function dayNumberFromIsoDate(dateOn: string, path = 'date'): number {
  const match = typeof dateOn === 'string' ? ISO_DATE.exec(dateOn.trim()) : null;
  if (match) {
    const year = Number(match[1]);
    const month = Number(match[2]);
    const day = Number(match[3]);
    const ms = Date.UTC(year, month - 1, day);
    const check = new Date(ms);
    if (
      check.getUTCFullYear() === year &&
      check.getUTCMonth() === month - 1 &&
      check.getUTCDate() === day
    ) {
      return Math.round(ms / MS_PER_DAY);
    }
  }
  throw new EngineInputError(
    'invalid-date',
    `${path}: "${String(dateOn)}" is not a calendar date (use YYYY-MM-DD).`,
    [{ path, message: 'not a calendar date (YYYY-MM-DD)' }],
  );
}

/**
 * ISO calendar date of a day number.
 *
 * @example
 * isoDateFromDayNumber(19782) // '2024-02-29'
 */
export function isoDateFromDayNumber(dayNumber: number): string {
  return new Date(Math.round(dayNumber) * MS_PER_DAY).toISOString().slice(0, 10);
}

/**
 * `dateOn` plus `days` (may be negative).
 *
 * @example
 * addDays('2024-02-28', 1) // '2024-02-29'
 */
export function addDays(dateOn: string, days: number): string {
  return isoDateFromDayNumber(dayNumberFromIsoDate(dateOn) + days);
}

/**
 * Whole days from `fromOn` to `toOn` (negative when `toOn` is earlier).
 *
 * @example
 * daysBetween('2024-01-01', '2025-01-01') // 366
 */
export function daysBetween(fromOn: string, toOn: string): number {
  return dayNumberFromIsoDate(toOn) - dayNumberFromIsoDate(fromOn);
}

/** Mean length of a year in days (Gregorian), for converting rates per day to per year. */
export const DAYS_PER_YEAR = 365.2425;
