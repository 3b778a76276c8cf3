/**
 * Which columns of a logger's header row hold the time and the bus voltage. Loggers, scopes and
 * spreadsheets name them many ways: `t`, `t_s`, `time_s`, `Time (s)`, `Zeit [ms]`, `Timestamp`,
 * `Date/Time`; `v`, `U`, `u_V`, `Voltage [V]`, `Spannung (V)`, `CH1 (V)`, `DC bus voltage`. A unit
 * may follow in brackets, parentheses, after a slash or after an underscore.
 *
 * Each column gets a rank for each role (1 a known name, 2 a name that contains one, 3 only its
 * unit says so, 4 a bare channel name such as `CH1`); the best rank wins, and two columns with the
 * same best rank are a question for the person (`timeColumn` / `voltsColumn`), never a guess.
 */

import { parseHeaderName, type HeaderName } from './csv-text';

/** A column chosen by its header text (case does not matter) or its 1-based number. */
export type ColumnSelector = string | number;

/** Options of {@link matchLoggerColumns}. */
export interface LoggerColumnOptions {
  /** The time column, by header text or 1-based number; found by name when absent. */
  timeColumn?: ColumnSelector;
  /** The voltage column, by header text or 1-based number; found by name when absent. */
  voltsColumn?: ColumnSelector;
}

/** One chosen column. */
export interface LoggerColumn {
  /** 0-based position in the row. */
  index: number;
  /** The header cell taken apart (a unit after an underscore is split off: `u_V` → u, v). */
  header: HeaderName;
}

/** The columns {@link matchLoggerColumns} chose. */
export interface LoggerColumns {
  time: LoggerColumn;
  voltage: LoggerColumn;
  /** Other columns that look like voltages too (as written), left unread. */
  otherVoltageColumns: string[];
  /** Cells in the header row. */
  headerCells: number;
}

/** Why a row is not a usable header although it looks like one (see {@link matchLoggerColumns}). */
export interface LoggerHeaderProblem {
  /** Which option would settle it. */
  path: 'timeColumn' | 'voltsColumn';
  /** How header-like the row is: 2 one of the two columns found, 3 both found but a question left. */
  strength: 2 | 3;
  /** The problem in words, without the row (the caller says where). */
  message: string;
}

/** Time units: seconds per unit; 0 for a unit that names a clock or date format (hh:mm:ss). */
export const TIME_UNIT_SECONDS: Readonly<Record<string, number>> = {
  '': 1,
  s: 1,
  sec: 1,
  secs: 1,
  second: 1,
  seconds: 1,
  sek: 1,
  sekunden: 1,
  ms: 1e-3,
  msec: 1e-3,
  millisecond: 1e-3,
  milliseconds: 1e-3,
  us: 1e-6,
  µs: 1e-6,
  min: 60,
  mins: 60,
  minute: 60,
  minutes: 60,
  h: 3600,
  hr: 3600,
  hour: 3600,
  hours: 3600,
};

/** Voltage units: volts per unit. */
export const VOLTAGE_UNIT_VOLTS: Readonly<Record<string, number>> = {
  v: 1,
  volt: 1,
  volts: 1,
  vdc: 1,
  'v dc': 1,
  mv: 1e-3,
  kv: 1e3,
};

const TIME_NAMES = new Set([
  't',
  'time',
  'seconds',
  'second',
  's',
  'sec',
  'secs',
  'elapsed',
  'elapsed time',
  'time elapsed',
  'time since isolation',
  'relative time',
  'rel time',
  'rel. time',
  'sample time',
  'zeit',
  'messzeit',
  'relative zeit',
  'temps',
  'tempo',
  'tiempo',
  'tijd',
]);
const CLOCK_NAMES = new Set([
  'timestamp',
  'time stamp',
  'date time',
  'datetime',
  'date/time',
  'date & time',
  'date and time',
  'clock',
  'clock time',
  'time of day',
  'real time',
  'zeitstempel',
  'datum/uhrzeit',
  'datum uhrzeit',
  'uhrzeit',
  'horodatage',
  'heure',
]);
const VOLTAGE_NAMES = new Set([
  'v',
  'u',
  'volt',
  'volts',
  'voltage',
  'vdc',
  'udc',
  'v dc',
  'u dc',
  'bus',
  'vbus',
  'v bus',
  'dc bus',
  'dc link',
  'bus voltage',
  'dc bus voltage',
  'dc link voltage',
  'spannung',
  'uzk',
  'u zk',
  'zk spannung',
  'zwischenkreis',
  'zwischenkreisspannung',
  'tension',
  'tensione',
  'tensión',
  'voltaje',
  'spanning',
]);
const LOOSE_VOLTAGE = /volt|spannung|tension|tensión/;
const LOOSE_TIME = /^(time|elapsed|zeit)\b|\b(time|zeit)$/;
const CHANNEL = /^(ch|chan|channel|kanal|canal|ai|ain|input|eingang)\s*\d+$/;

function hasKey(table: Readonly<Record<string, number>>, key: string): boolean {
  return Object.hasOwn(table, key);
}

/** The header cell as one lower-case name: spaces, underscores and dashes collapsed. */
function rawName(original: string): string {
  return original
    .toLowerCase()
    .replace(/[\s_-]+/g, ' ')
    .trim();
}

/**
 * Takes a logger's header cell apart: {@link parseHeaderName}, and a unit after an underscore or a
 * space (`u_V`, `t_s`, `time ms`) when it is a known time or voltage unit.
 *
 * @example
 * loggerHeaderName('time_s') // { original: 'time_s', name: 'time', unit: 's' }
 * loggerHeaderName('CH1 (V)') // { original: 'CH1 (V)', name: 'ch1', unit: 'v' }
 */
export function loggerHeaderName(cell: string): HeaderName {
  const header = parseHeaderName(cell);
  const raw = rawName(header.original);
  // "Date/Time" is one name, not "date" in the unit "time".
  if (CLOCK_NAMES.has(raw) || TIME_NAMES.has(raw) || VOLTAGE_NAMES.has(raw)) {
    return { original: header.original, name: raw, unit: '' };
  }
  if (header.unit !== '') return header;
  // A column named only by a millisecond unit ("ms") is a time column in milliseconds.
  if (/^(ms|msec|milliseconds?)$/.test(raw))
    return { original: header.original, name: 'time', unit: raw };
  const split = /^(.+?)\s+(\S+)$/.exec(header.name);
  if (split && (hasKey(TIME_UNIT_SECONDS, split[2]!) || hasKey(VOLTAGE_UNIT_VOLTS, split[2]!))) {
    return { original: header.original, name: split[1]!, unit: split[2]! };
  }
  return header;
}

/** True when the unit names a clock or date format rather than a scale ("hh:mm:ss", "UTC"). */
export function isClockFormatUnit(unit: string): boolean {
  return /:|^(hh|yyyy|dd|utc|local|iso|datum|date)/.test(unit);
}

function timeRank(header: HeaderName): number {
  if (TIME_NAMES.has(header.name)) return 1;
  if (CLOCK_NAMES.has(header.name) || LOOSE_TIME.test(header.name)) return 2;
  if (
    header.unit !== '' &&
    (hasKey(TIME_UNIT_SECONDS, header.unit) || isClockFormatUnit(header.unit))
  )
    return 3;
  if (header.name === 'date' || header.name === 'datum') return 4;
  return 0;
}

function voltageRank(header: HeaderName): number {
  const unitIsVolts = hasKey(VOLTAGE_UNIT_VOLTS, header.unit);
  if (header.unit !== '' && !unitIsVolts) return 0; // "CH2 (A)", "Temp (°C)"
  if (VOLTAGE_NAMES.has(header.name)) return 1;
  if (LOOSE_VOLTAGE.test(header.name)) return 2;
  if (unitIsVolts) return 3;
  if (CHANNEL.test(header.name)) return 4;
  return 0;
}

/** True when the header names a time column of clock times or timestamps (Timestamp, Uhrzeit). */
export function isClockColumn(header: HeaderName): boolean {
  return CLOCK_NAMES.has(header.name) || isClockFormatUnit(header.unit);
}

function listColumns(cells: readonly string[]): string {
  return cells.map((cell, i) => `"${cell.trim()}" (${i + 1})`).join(', ');
}

function select(cells: readonly string[], selector: ColumnSelector): number | null {
  if (typeof selector === 'number') {
    return Number.isInteger(selector) && selector >= 1 && selector <= cells.length
      ? selector - 1
      : null;
  }
  const wanted = selector.trim().toLowerCase();
  const byName = cells.findIndex((cell) => cell.trim().toLowerCase() === wanted);
  if (byName >= 0) return byName;
  return /^\d+$/.test(wanted) ? select(cells, Number(wanted)) : null;
}

/** Best-ranked column for a role, or every tied column when the best rank is shared. */
function best(ranks: readonly number[], skip: number): number[] {
  let top = 0;
  for (let i = 0; i < ranks.length; i++) {
    if (i !== skip && ranks[i]! > 0 && (top === 0 || ranks[i]! < top)) top = ranks[i]!;
  }
  if (top === 0) return [];
  return ranks.flatMap((rank, i) => (i !== skip && rank === top ? [i] : []));
}

/**
 * Chooses the time and voltage columns of one candidate header row.
 *
 * @param cells - the row's cells as written
 * @param options - columns chosen by the person, by header text or 1-based number
 * @returns the columns; a {@link LoggerHeaderProblem} when the row looks like a header but leaves
 *   a question (a column missing, two candidates, a chosen column not there); null when the row
 *   does not look like a header at all
 * @example
 * matchLoggerColumns(['Time (s)', 'CH1 (V)', 'CH2 (V)'], { voltsColumn: 'CH2 (V)' })
 * // { time: { index: 0, ... }, voltage: { index: 2, ... }, otherVoltageColumns: ['CH1 (V)'], headerCells: 3 }
 * matchLoggerColumns(['Time (s)', 'CH1 (V)', 'CH2 (V)'], {})
 * // { path: 'voltsColumn', strength: 3, message: '2 columns could be the voltage: "CH1 (V)" (column 2) and ...' }
 */
export function matchLoggerColumns(
  cells: readonly string[],
  options: LoggerColumnOptions = {},
): LoggerColumns | LoggerHeaderProblem | null {
  if (cells.length < 2) return null;
  const headers = cells.map(loggerHeaderName);
  const timeRanks = headers.map(timeRank);
  const voltageRanks = headers.map(voltageRank);

  let time: number[];
  if (options.timeColumn !== undefined) {
    const at = select(cells, options.timeColumn);
    if (at === null) return notThere(cells, 'timeColumn', options.timeColumn, voltageRanks);
    time = [at];
  } else {
    time = best(timeRanks, -1);
  }
  let voltage: number[];
  if (options.voltsColumn !== undefined) {
    const at = select(cells, options.voltsColumn);
    if (at === null) return notThere(cells, 'voltsColumn', options.voltsColumn, timeRanks);
    voltage = [at];
  } else {
    voltage = best(voltageRanks, time.length === 1 ? time[0]! : -1);
  }
  if (time.length === 0 && voltage.length === 0) return null;
  if (voltage.length === 0) {
    return {
      path: 'voltsColumn',
      strength: 2,
      message: `names a time column ("${cells[time[0]!]!.trim()}") but no voltage column; its columns are ${listColumns(cells)}. Choose the voltage column by its name or number (a name such as V, U, Voltage, CH1 (V) or Spannung (V) is found by itself).`,
    };
  }
  if (time.length === 0) {
    return {
      path: 'timeColumn',
      strength: 2,
      message: `names a voltage column ("${cells[voltage[0]!]!.trim()}") but no time column; its columns are ${listColumns(cells)}. Choose the time column by its name or number (a name such as t, t_s, Time (s), Zeit (s) or Timestamp is found by itself).`,
    };
  }
  if (time.length > 1) return tied(cells, 'timeColumn', 'time', time);
  if (voltage.length > 1) return tied(cells, 'voltsColumn', 'voltage', voltage);
  if (time[0] === voltage[0]) {
    return {
      path: options.voltsColumn !== undefined ? 'voltsColumn' : 'timeColumn',
      strength: 3,
      message: `the time and the voltage would both be read from column ${time[0]! + 1} ("${cells[time[0]!]!.trim()}"); choose two different columns.`,
    };
  }
  const t = time[0]!;
  const v = voltage[0]!;
  return {
    time: { index: t, header: headers[t]! },
    voltage: { index: v, header: headers[v]! },
    otherVoltageColumns: voltageRanks.flatMap((rank, i) =>
      rank > 0 && i !== v && i !== t ? [cells[i]!.trim()] : [],
    ),
    headerCells: cells.length,
  };
}

function tied(
  cells: readonly string[],
  path: LoggerHeaderProblem['path'],
  role: string,
  columns: number[],
): LoggerHeaderProblem {
  const named = columns.map((i) => `"${cells[i]!.trim()}" (column ${i + 1})`);
  return {
    path,
    strength: 3,
    message: `${columns.length} columns could be the ${role}: ${named.slice(0, -1).join(', ')} and ${named[named.length - 1]}. Choose one by its name or number.`,
  };
}

function notThere(
  cells: readonly string[],
  path: LoggerHeaderProblem['path'],
  selector: ColumnSelector,
  otherRanks: readonly number[],
): LoggerHeaderProblem | null {
  // Only a row that holds the other column is a header worth naming in the refusal.
  if (!otherRanks.some((rank) => rank > 0)) return null;
  return {
    path,
    strength: 3,
    message: `there is no column ${typeof selector === 'number' ? `number ${selector}` : `"${selector}"`}; the columns are ${listColumns(cells)}.`,
  };
}
