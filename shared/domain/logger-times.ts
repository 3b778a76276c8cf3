/**
 * Reading a logger's time cells: numbers (seconds, or the header's unit), clock times
 * (hh:mm:ss.fff, as a logger's real-time clock writes them) and dates with times (ISO 8601
 * `2024-06-11T08:15:30.25Z`, `2024-06-11 08:15:30`, `11.06.2024 08:15:30,25`, `06/11/2024 8:15:30 PM`).
 * The caller makes them relative to the run; only differences matter, so a timestamp without a
 * zone is read as UTC (a daylight-saving change within a run is not undone).
 */

import { parseNumberCell } from './csv-text';

/** How a file writes its times. */
export type TimeFormat = 'seconds' | 'clock' | 'timestamp';

/** Reads one time cell to seconds in the file's own frame (epoch or day), or null if unreadable. */
export type TimeCellReader = (cell: string) => number | null;

const CLOCK = /^\s*(\d{1,2}):(\d{2}):(\d{2})(?:[.,](\d+))?\s*([AaPp][Mm])?\s*$/;
const ISO_DATE_TIME =
  /^\s*(\d{4})-(\d{1,2})-(\d{1,2})(?:T|\s+)(\d{1,2}):(\d{2}):(\d{2})(?:[.,](\d+))?\s*(Z|[+-]\d{2}(?::?\d{2})?)?\s*$/;
const YEAR_FIRST_DATE_TIME =
  /^\s*(\d{4})\/(\d{1,2})\/(\d{1,2})\s+(\d{1,2}):(\d{2}):(\d{2})(?:[.,](\d+))?\s*$/;
const DOTTED_DATE_TIME =
  /^\s*(\d{1,2})\.(\d{1,2})\.(\d{4}),?\s+(\d{1,2}):(\d{2}):(\d{2})(?:[.,](\d+))?\s*$/;
const SLASHED_DATE_TIME =
  /^\s*(\d{1,2})\/(\d{1,2})\/(\d{4}),?\s+(\d{1,2}):(\d{2}):(\d{2})(?:[.,](\d+))?\s*([AaPp][Mm])?\s*$/;

function fraction(digits: string | undefined): number {
  return digits === undefined ? 0 : Number(`0.${digits}`);
}

function hours(h: string, ampm: string | undefined): number {
  const value = Number(h);
  if (ampm === undefined) return value;
  const pm = ampm.toLowerCase() === 'pm';
  return (value % 12) + (pm ? 12 : 0);
}

/** Seconds since 1970-01-01 of a civil date and time, or null when the date does not exist. */
function civilSeconds(
  year: number,
  month: number,
  day: number,
  hour: number,
  minute: number,
  second: number,
): number | null {
  if (month < 1 || month > 12 || day < 1 || day > 31 || hour > 23 || minute > 59 || second >= 61)
    return null;
  const ms = Date.UTC(year, month - 1, day);
  if (new Date(ms).getUTCDate() !== day) return null; // 31 June
  return ms / 1000 + hour * 3600 + minute * 60 + second;
}

/**
 * Reads a clock time `hh:mm:ss[.fff]` (a decimal comma is accepted; AM/PM too) as seconds since
 * midnight.
 *
 * @returns seconds, or null when the cell is not a clock time
 * @example
 * readClockSeconds('08:15:30.25') // 29730.25
 */
export function readClockSeconds(cell: string): number | null {
  const m = CLOCK.exec(cell);
  if (!m) return null;
  const h = hours(m[1]!, m[5]);
  const minute = Number(m[2]);
  const second = Number(m[3]);
  if (h > 23 || minute > 59 || second > 60) return null;
  return h * 3600 + minute * 60 + second + fraction(m[4]);
}

/**
 * Reads a date and time as seconds since 1970-01-01 (UTC, or the offset written after it).
 *
 * @param dayFirst - for `nn/nn/yyyy` dates: true reads 11/06/2024 as 11 June, false as 6 November
 * @returns seconds, or null when the cell is not a date and time
 * @example
 * readTimestampSeconds('2024-06-11T08:15:30.5Z', false) // 1718093730.5
 * readTimestampSeconds('11.06.2024 08:15:30,5', false) // 1718093730.5
 */
export function readTimestampSeconds(cell: string, dayFirst: boolean): number | null {
  let m = ISO_DATE_TIME.exec(cell) ?? YEAR_FIRST_DATE_TIME.exec(cell);
  if (m) {
    const base = civilSeconds(+m[1]!, +m[2]!, +m[3]!, +m[4]!, +m[5]!, +m[6]!);
    if (base === null) return null;
    return base + fraction(m[7]) - zoneSeconds(m[8]);
  }
  m = DOTTED_DATE_TIME.exec(cell);
  if (m) {
    const base = civilSeconds(+m[3]!, +m[2]!, +m[1]!, +m[4]!, +m[5]!, +m[6]!);
    return base === null ? null : base + fraction(m[7]);
  }
  m = SLASHED_DATE_TIME.exec(cell);
  if (m) {
    const [first, second] = [+m[1]!, +m[2]!];
    const [day, month] = dayFirst ? [first, second] : [second, first];
    const base = civilSeconds(+m[3]!, month, day, hours(m[4]!, m[8]), +m[5]!, +m[6]!);
    return base === null ? null : base + fraction(m[7]);
  }
  return null;
}

function zoneSeconds(zone: string | undefined): number {
  if (zone === undefined || zone === 'Z') return 0;
  const sign = zone[0] === '-' ? -1 : 1;
  const digits = zone.slice(1).replace(':', '');
  return sign * (Number(digits.slice(0, 2)) * 3600 + Number(digits.slice(2) || '0') * 60);
}

/**
 * Picks the reader for a file's time column from its first time cell: a number (scaled by
 * `secondsPerUnit`), a clock time, or a date and time.
 *
 * @param firstCell - the first data row's time cell
 * @param decimalComma - whether numbers may use a decimal comma
 * @param secondsPerUnit - the header's unit (1 for s, 0.001 for ms)
 * @returns the format and its reader, or null when the cell is none of them
 * @example
 * const { format, read } = timeReaderFor('08:15:30,5', true, 1)!; // format 'clock'
 * read('08:15:31,0') // 29731
 */
export function timeReaderFor(
  firstCell: string,
  decimalComma: boolean,
  secondsPerUnit: number,
): { format: TimeFormat; read: TimeCellReader } | null {
  if (parseNumberCell(firstCell, decimalComma) !== null) {
    return {
      format: 'seconds',
      read: (cell) => {
        const value = parseNumberCell(cell, decimalComma);
        return value === null ? null : value * secondsPerUnit;
      },
    };
  }
  if (readClockSeconds(firstCell) !== null) return { format: 'clock', read: readClockSeconds };
  const slashed = SLASHED_DATE_TIME.exec(firstCell);
  const dayFirst = slashed !== null && Number(slashed[1]) > 12;
  if (readTimestampSeconds(firstCell, dayFirst) !== null) {
    return { format: 'timestamp', read: (cell) => readTimestampSeconds(cell, dayFirst) };
  }
  return null;
}
