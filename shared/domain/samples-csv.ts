/**
 * Reads decay samples from a logger's or a person's CSV file, as loggers write them: papaparse
 * tokenizes, our rules do the rest.
 *
 * - **Bytes or text**: UTF-8 with or without a byte-order mark, UTF-16 LE/BE with one, Latin-1
 *   (./text-decoding); CRLF, LF and old Mac CR line ends.
 * - **The header** may sit anywhere in the first 100 lines, after any preamble (instrument
 *   settings, a title); it is the first row that names a time and a voltage column (./logger-columns:
 *   `t_s,v`, `Time (s)`, `Zeit (s);Spannung (V)`, `CH1 (V)`, `u_V` …) and is followed by readings.
 *   `timeColumn` / `voltsColumn` choose columns by header text or number when the names do not tell.
 *   A units row under the names (`s;V`, `[ms];[mV]`) gives the units.
 * - **Separators**: comma, semicolon or tab; decimal commas with semicolons or tabs.
 * - **Times** in seconds (or the header's unit: ms, min, h), clock times (hh:mm:ss.fff) or dates
 *   with times (ISO 8601 and the common local forms), the latter made relative to the run.
 * - **Volts** in V (or mV, kV).
 * - **Cleaned, with a note each** (./logger-readings): rows that repeat a time are averaged; the
 *   tail at 0 V and the noise around it is left out; pre-trigger readings (a flat bus before the
 *   switch-off, or negative times) are left out and t = 0 is set at the switch-off.
 * - A footer after the readings (a line with neither a time nor a voltage, and no time after it)
 *   is skipped with a note.
 *
 * Every refusal is an EngineInputError whose message names the row (the file's line number, so
 * an editor finds it; a line break inside a quoted cell, which loggers do not write, would shift
 * the numbers after it) and the column.
 */

import { EngineInputError } from './errors';
import {
  checkRowWidth,
  HEADER_SEARCH_LINES,
  normaliseLineEnds,
  parseNumberCell,
  separatorName,
  forEachCsvRow,
  tokenizeCsv,
  type CsvSeparator,
  type LineEnds,
} from './csv-text';
import { decodeTextBytes, type TextEncodingName } from './text-decoding';
import {
  isClockColumn,
  isClockFormatUnit,
  matchLoggerColumns,
  TIME_UNIT_SECONDS,
  VOLTAGE_UNIT_VOLTS,
  type LoggerColumn,
  type LoggerColumnOptions,
  type LoggerColumns,
  type LoggerHeaderProblem,
} from './logger-columns';
import { timeReaderFor, type TimeCellReader, type TimeFormat } from './logger-times';
import {
  averageRepeatedTimes,
  findSwitchOff,
  findZeroTail,
  requireIncreasingTimes,
  type ReadingArrays,
  type ReadingColumnNames,
} from './logger-readings';
import { validateDecaySamples, type DecaySample } from './decay-fit';
import { formatNumber } from './format';

/** Options of {@link parseDecaySamplesCsv}. */
export interface DecaySamplesCsvOptions extends LoggerColumnOptions {
  /**
   * Default true: clean the readings (repeated times, the tail at 0 V, pre-trigger readings) and
   * check them as a decay ({@link validateDecaySamples}), naming the file row in any message.
   * False returns the readings as written (units converted, clock times made relative), for a
   * table a person edits.
   */
  validate?: boolean;
}

/** What {@link parseDecaySamplesCsv} read. */
export interface DecaySamplesCsv {
  /** The samples in seconds and volts, t = 0 at the switch-off when pre-trigger readings were found. */
  samples: DecaySample[];
  /** File line number of each sample (same order; the first row of an averaged group), for messages. */
  rowNumbers: number[];
  /** The header cells used, as written. */
  timeColumn: string;
  voltageColumn: string;
  /** File line number of the header row. */
  headerRow: number;
  separator: CsvSeparator;
  /** True when decimal commas were accepted (semicolon or tab separated). */
  decimalComma: boolean;
  /** Encoding of the bytes (text passed as a string counts as UTF-8). */
  encoding: TextEncodingName;
  lineEnds: LineEnds;
  /** How the file writes its times. */
  timeFormat: TimeFormat;
  /** What was left out or changed, one plain-words sentence each (show them with the verdict). */
  notes: string[];
  /** Rows merged into the row before them because they repeated its time. */
  averagedRows: number;
  /** Pre-trigger readings left out, or null. `switchOffFileSeconds` is in the file's time (relative for clock times). */
  preTrigger: {
    found: 'flat-bus' | 'negative-times';
    readingsLeftOut: number;
    switchOffFileSeconds: number;
    levelVolts: number;
  } | null;
  /** The tail at 0 V left out, or null. */
  zeroTail: { readingsLeftOut: number; bandVolts: number } | null;
}

const SEPARATORS: CsvSeparator[] = ['\t', ';', ','];

/** Rows under the header that a {@link LoggerColumnsQuestion} carries. */
const QUESTION_ROWS = 5;

/**
 * The refusal of a file whose header row names its columns but leaves a question that only the
 * person can settle: two columns that could each be the voltage (or the time), a voltage or time
 * column not found by its name, or a chosen column that is not there. Beside the message it
 * carries the header's cells and the first rows under it, so a screen can offer the columns to
 * choose from (then read again with `timeColumn` / `voltsColumn`).
 *
 * @example
 * try { parseDecaySamplesCsv('Time (s);CH1 (V);CH2 (V)\n0;560;12\n') }
 * catch (error) { if (error instanceof LoggerColumnsQuestion) console.log(error.path, error.columns) }
 * // 'voltsColumn' ['Time (s)', 'CH1 (V)', 'CH2 (V)']
 */
export class LoggerColumnsQuestion extends EngineInputError {
  override name = 'LoggerColumnsQuestion';
  constructor(
    message: string,
    /** Which choice would settle it. */
    readonly path: 'timeColumn' | 'voltsColumn',
    /** The file's line number of the header row. */
    readonly headerRow: number,
    /** The header's cells as written (trimmed), column 1 first. */
    readonly columns: string[],
    /** Up to 5 non-blank rows under the header, cells as written (trimmed). */
    readonly rows: string[][],
  ) {
    super('invalid-csv', message, [{ path, message }]);
  }
}

interface HeaderFound {
  /** 0-based line index of the header. */
  line: number;
  /** 0-based line index of the last header line: a units row under the names ("s;V"), or `line`. */
  lastLine: number;
  separator: CsvSeparator;
  columns: LoggerColumns;
}

/**
 * Parses decay samples from a CSV file's bytes or text.
 *
 * @param input - the file's bytes (decoded here: UTF-8, UTF-16 with a byte-order mark, Latin-1) or
 *   its text
 * @param options - `timeColumn` / `voltsColumn` (header text or 1-based number) when the names do
 *   not tell; `validate` (default true) cleans and checks the readings as a decay
 * @returns the samples in seconds and volts with their row numbers, and notes on what was left out
 * @throws EngineInputError('invalid-csv') for a missing header, an unknown unit or a bad cell, and
 *   the checks' codes ('times-not-increasing', 'non-positive-voltage'), each naming row and column
 * @example
 * parseDecaySamplesCsv('Time (s);Voltage [V]\n0;560,0\n60;428,5\n').samples
 * // [{ tSeconds: 0, volts: 560 }, { tSeconds: 60, volts: 428.5 }]
 * parseDecaySamplesCsv(new TextEncoder().encode('Zeit;CH1 (V);CH2 (V)\n08:00:00,0;560;12\n08:01:00,0;428,5;12\n'),
 *   { voltsColumn: 'CH1 (V)' }).samples
 * // [{ tSeconds: 0, volts: 560 }, { tSeconds: 60, volts: 428.5 }]
 */
export function parseDecaySamplesCsv(
  input: string | Uint8Array,
  options: DecaySamplesCsvOptions = {},
): DecaySamplesCsv {
  const decoded =
    typeof input === 'string'
      ? {
          text: input.charCodeAt(0) === 0xfeff ? input.slice(1) : input,
          encoding: 'utf-8' as const,
        }
      : decodeTextBytes(input);
  const { text, lineEnds } = normaliseLineEnds(decoded.text);
  const header = findLoggerHeader(text, options);
  const { columns, separator } = header;
  const headerRow = header.line + 1;
  const decimalComma = separator !== ',';
  const names: ReadingColumnNames = {
    time: columns.time.header.original,
    voltage: columns.voltage.header.original,
  };
  const timeScale = unitScale(
    columns.time,
    TIME_UNIT_SECONDS,
    headerRow,
    'time',
    's, ms, min or h',
  );
  const voltageScale = unitScale(
    columns.voltage,
    VOLTAGE_UNIT_VOLTS,
    headerRow,
    'voltage',
    'V, mV or kV',
  );

  const read = readRows(text, header, decimalComma, timeScale, voltageScale, names);
  const notes: string[] = [];
  if (columns.otherVoltageColumns.length > 0) {
    notes.push(
      `The voltage was read from column "${names.voltage}"; ${quoteList(columns.otherVoltageColumns)} ${columns.otherVoltageColumns.length === 1 ? 'looks' : 'look'} like a voltage too (choose another voltage column if that was the bus).`,
    );
  }
  if (read.timeFormat !== 'seconds') {
    notes.push(
      `Times are ${read.timeFormat === 'clock' ? 'clock times' : 'dates with times'} (first ${read.firstTimeCell}), counted in seconds from the first reading.`,
    );
  }
  const result: DecaySamplesCsv = {
    samples: [],
    rowNumbers: [],
    timeColumn: names.time,
    voltageColumn: names.voltage,
    headerRow,
    separator,
    decimalComma,
    encoding: decoded.encoding,
    lineEnds,
    timeFormat: read.timeFormat,
    notes,
    averagedRows: 0,
    preTrigger: null,
    zeroTail: null,
  };
  if (read.footer) notes.push(read.footer);
  let readings = read.readings;
  if (options.validate ?? true) readings = cleanReadings(readings, names, result);
  const { t, v, rows } = readings;
  const samples: DecaySample[] = new Array(t.length);
  for (let i = 0; i < t.length; i++) samples[i] = { tSeconds: t[i]!, volts: v[i]! };
  result.samples = samples;
  result.rowNumbers = rows;
  if (options.validate ?? true) validateDecaySamples(samples, (index) => `Row ${rows[index]}`);
  return result;
}

/** Repeated times averaged, the 0 V tail and pre-trigger readings left out; notes and facts into `result`. */
function cleanReadings(
  input: ReadingArrays,
  names: ReadingColumnNames,
  result: DecaySamplesCsv,
): ReadingArrays {
  const { readings: averaged, merged } = averageRepeatedTimes(input, names);
  let readings = averaged;
  if (merged > 0) {
    result.averagedRows = merged;
    result.notes.push(
      `${merged === 1 ? 'One row repeated' : `${merged} rows repeated`} the time of the row before (a clock coarser than the sampling); readings of one time were averaged.`,
    );
  }
  requireIncreasingTimes(readings, names);

  const tail = findZeroTail(readings, names);
  if (tail !== null) {
    const left = readings.t.length - tail.from;
    if (tail.from < 3) {
      throw new EngineInputError(
        'non-positive-voltage',
        `Row ${readings.rows[tail.from]}: from this row on the readings are at or near 0 V (within ±${formatNumber(tail.bandVolts, 2)} V, column "${names.voltage}"), which leaves ${tail.from === 0 ? 'no reading' : tail.from === 1 ? 'one reading' : `${tail.from} readings`} of the decay before it; at least 3 are needed.`,
        [
          {
            path: `row ${readings.rows[tail.from]}, column ${names.voltage}`,
            message: 'too few readings above 0 V',
          },
        ],
      );
    }
    result.zeroTail = { readingsLeftOut: left, bandVolts: tail.bandVolts };
    result.notes.push(
      `The last ${left === 1 ? 'reading' : `${left} readings`} (from row ${readings.rows[tail.from]}, t = ${formatNumber(readings.t[tail.from]!, 4)} s) ${left === 1 ? 'was' : 'were'} at 0 V within the noise (±${formatNumber(tail.bandVolts, 2)} V) and ${left === 1 ? 'was' : 'were'} left out.`,
    );
    readings = slice(readings, 0, tail.from);
  }

  const switchOff = findSwitchOff(readings);
  let zero = 0;
  if (switchOff !== null) {
    const count = switchOff.firstKept;
    result.preTrigger = {
      found: switchOff.found,
      readingsLeftOut: count,
      switchOffFileSeconds: switchOff.atSeconds,
      levelVolts: switchOff.levelVolts,
    };
    const why =
      switchOff.found === 'flat-bus'
        ? `hold the bus flat at ${formatNumber(switchOff.levelVolts, 4)} V before the switch-off${readings.t[0]! < 0 ? ` (the file's times start at ${formatNumber(readings.t[0]!, 4)} s, before its trigger)` : ''}`
        : `were recorded before the trigger (negative times), the bus flat at ${formatNumber(switchOff.levelVolts, 4)} V`;
    result.notes.push(
      `The first ${count} readings (rows ${readings.rows[0]} to ${readings.rows[count - 1]}) ${why}; they were left out and t = 0 is set at the switch-off (${formatNumber(switchOff.atSeconds, 4)} s in the file's time).`,
    );
    zero = switchOff.atSeconds;
    readings = slice(readings, count, readings.t.length);
  } else if (readings.t.length > 0 && readings.t[0]! < 0) {
    zero = readings.t[0]!;
    result.notes.push(
      `Times start at ${formatNumber(zero, 4)} s and the readings before the trigger already fall, so the switch-off came before them; t = 0 is set at the first reading (τ does not depend on where t = 0 lies).`,
    );
  }
  if (zero !== 0) for (let i = 0; i < readings.t.length; i++) readings.t[i]! -= zero;
  return readings;
}

function slice(readings: ReadingArrays, from: number, to: number): ReadingArrays {
  return {
    t: readings.t.slice(from, to),
    v: readings.v.slice(from, to),
    rows: readings.rows.slice(from, to),
  };
}

function quoteList(cells: readonly string[]): string {
  return cells.map((cell) => `"${cell}"`).join(', ');
}

function unitScale(
  column: LoggerColumn,
  table: Readonly<Record<string, number>>,
  headerRow: number,
  what: 'time' | 'voltage',
  accepted: string,
): number {
  const unit = column.header.unit;
  if (Object.hasOwn(table, unit)) return table[unit]!;
  if (unit === '' && what === 'voltage') return 1;
  if (what === 'time' && isClockFormatUnit(unit)) return 1;
  throw new EngineInputError(
    'invalid-csv',
    `Row ${headerRow}, column "${column.header.original}": unknown ${what} unit "${unit}" (use ${accepted}).`,
    [
      {
        path: `row ${headerRow}, column ${column.header.original}`,
        message: `unknown ${what} unit`,
      },
    ],
  );
}

// ---------------------------------------------------------------------------------------------
// The header

/** Text of the first `count` lines (each without its line end). */
function firstLines(text: string, count: number): string[] {
  const lines: string[] = [];
  let at = 0;
  while (lines.length < count && at <= text.length) {
    const end = text.indexOf('\n', at);
    lines.push(text.slice(at, end < 0 ? text.length : end));
    if (end < 0) break;
    at = end + 1;
  }
  return lines;
}

function readableTime(cell: string | undefined, decimalComma: boolean): boolean {
  return cell !== undefined && cell.trim() !== '' && timeReaderFor(cell, decimalComma, 1) !== null;
}

function readableNumber(cell: string | undefined, decimalComma: boolean): boolean {
  return cell !== undefined && parseNumberCell(cell, decimalComma) !== null;
}

/** Cells of a row that read as numbers or times: a row of readings has at least two. */
function readingCells(cells: readonly string[], decimalComma: boolean): number {
  let count = 0;
  for (const cell of cells) if (readableTime(cell, decimalComma)) count++;
  return count;
}

/** Index of the next non-blank line after `line`, or -1. */
function nextFilled(lines: readonly string[], line: number): number {
  for (let j = line + 1; j < lines.length; j++) if (lines[j]!.trim() !== '') return j;
  return -1;
}

/**
 * The header row: the first of the first 100 lines, on the first separator it contains, that
 * names a time and a voltage column and is followed by a row of readings in them. A row that names
 * them but is followed by something else is kept as a last resort.
 */
function findLoggerHeader(text: string, options: LoggerColumnOptions): HeaderFound {
  const lines = firstLines(text, HEADER_SEARCH_LINES + 10);
  const head = lines.join('\n');
  const cellsBy = new Map<CsvSeparator, string[][]>();
  for (const separator of SEPARATORS) {
    if (head.includes(separator)) cellsBy.set(separator, tokenizeCsv(head, separator));
  }
  let fallback: HeaderFound | null = null;
  let problem: { line: number; separator: CsvSeparator; problem: LoggerHeaderProblem } | null =
    null;
  const searched = Math.min(lines.length, HEADER_SEARCH_LINES);
  for (let line = 0; line < searched; line++) {
    const text = lines[line]!;
    if (text.trim() === '') continue;
    for (const separator of SEPARATORS) {
      const rows = cellsBy.get(separator);
      if (rows === undefined || !text.includes(separator)) continue;
      const cells = rows[line] ?? [];
      const match = matchLoggerColumns(cells, options);
      if (match === null) continue;
      const decimalComma = separator !== ',';
      const next = nextFilled(lines, line);
      const nextCells = next >= 0 ? (rows[next] ?? []) : [];
      if ('path' in match) {
        const followedByReadings = next >= 0 && readingCells(nextCells, decimalComma) >= 2;
        if (followedByReadings && (problem === null || match.strength > problem.problem.strength))
          problem = { line, separator, problem: match };
        continue;
      }
      const found: HeaderFound = { line, lastLine: line, separator, columns: match };
      // A row whose own cells are readings is data, not a header (columns chosen by number).
      if (
        readableTime(cells[match.time.index], decimalComma) &&
        readableNumber(cells[match.voltage.index], decimalComma)
      )
        continue;
      const units = next >= 0 ? unitsRow(nextCells, match) : null;
      if (units !== null) {
        const after = nextFilled(lines, next);
        const afterCells = after >= 0 ? (rows[after] ?? []) : [];
        const withUnits: HeaderFound = { line, lastLine: next, separator, columns: units };
        if (
          after < 0 ||
          (readableTime(afterCells[match.time.index], decimalComma) &&
            readableNumber(afterCells[match.voltage.index], decimalComma))
        )
          return withUnits;
        fallback ??= withUnits;
        continue;
      }
      if (
        next < 0 ||
        (readableTime(nextCells[match.time.index], decimalComma) &&
          readableNumber(nextCells[match.voltage.index], decimalComma))
      )
        return found;
      fallback ??= found;
    }
  }
  if (fallback !== null) return fallback;
  return refuseWithoutHeader(lines, cellsBy, problem);
}

/**
 * A units row under the header names ("Time;CH1" then "s;V", or "[s];[V]"): the columns with the
 * units taken from it, or null when the row is something else.
 */
function unitsRow(cells: readonly string[], columns: LoggerColumns): LoggerColumns | null {
  const unitOf = (cell: string | undefined): string | null => {
    if (cell === undefined) return null;
    const unit = cell
      .trim()
      .replace(/^[([](.*)[)\]]$/, '$1')
      .trim()
      .toLowerCase();
    return unit === '' ? null : unit;
  };
  const timeUnit = unitOf(cells[columns.time.index]);
  const voltageUnit = unitOf(cells[columns.voltage.index]);
  if (
    timeUnit === null ||
    voltageUnit === null ||
    columns.time.header.unit !== '' ||
    columns.voltage.header.unit !== '' ||
    !(Object.hasOwn(TIME_UNIT_SECONDS, timeUnit) || isClockFormatUnit(timeUnit)) ||
    !Object.hasOwn(VOLTAGE_UNIT_VOLTS, voltageUnit)
  )
    return null;
  return {
    ...columns,
    time: { ...columns.time, header: { ...columns.time.header, unit: timeUnit } },
    voltage: { ...columns.voltage, header: { ...columns.voltage.header, unit: voltageUnit } },
  };
}

function refuseWithoutHeader(
  lines: readonly string[],
  cellsBy: ReadonlyMap<CsvSeparator, string[][]>,
  problem: { line: number; separator: CsvSeparator; problem: LoggerHeaderProblem } | null,
): never {
  if (problem !== null) {
    const row = problem.line + 1;
    const tokenized = cellsBy.get(problem.separator) ?? [];
    const trimmed = (cells: readonly string[] | undefined): string[] =>
      (cells ?? []).map((cell) => cell.trim());
    const below: string[][] = [];
    for (
      let line = nextFilled(lines, problem.line);
      line >= 0 && below.length < QUESTION_ROWS;
      line = nextFilled(lines, line)
    )
      below.push(trimmed(tokenized[line]));
    throw new LoggerColumnsQuestion(
      `Row ${row} (the header, ${separatorName(problem.separator)} separated): ${problem.problem.message}`,
      problem.problem.path,
      row,
      trimmed(tokenized[problem.line]),
      below,
    );
  }
  const first = lines.findIndex((line) => line.trim() !== '');
  if (first < 0) throw new EngineInputError('invalid-csv', 'The file is empty.');
  const searched = Math.min(lines.length, HEADER_SEARCH_LINES);
  let readingsAt = -1;
  for (let line = 0; line < lines.length && readingsAt < 0; line++) {
    for (const [separator, rows] of cellsBy) {
      if (
        lines[line]!.includes(separator) &&
        readingCells(rows[line] ?? [], separator !== ',') >= 2
      ) {
        readingsAt = line;
        break;
      }
    }
  }
  const example = 'such as "t_s,v" or "Time (s);Voltage (V)"';
  if (readingsAt === first) {
    throw new EngineInputError(
      'invalid-csv',
      `No header row found: row ${first + 1} ("${clip(lines[first]!)}") already holds readings. Add a header row naming the time and voltage columns, ${example}.`,
      [{ path: `row ${first + 1}`, message: 'no header row' }],
    );
  }
  if (readingsAt > 0) {
    const above = lines.slice(0, readingsAt).findLastIndex((line) => line.trim() !== '');
    if (above >= HEADER_SEARCH_LINES) {
      throw new EngineInputError(
        'invalid-csv',
        `No header row found in the first ${HEADER_SEARCH_LINES} lines: the readings start at row ${readingsAt + 1}, under row ${above + 1} ("${clip(lines[above]!)}"). Shorten the preamble so that the header is within the first ${HEADER_SEARCH_LINES} lines.`,
        [{ path: `row ${above + 1}`, message: 'header after the first lines' }],
      );
    }
    throw new EngineInputError(
      'invalid-csv',
      `No header row found: the readings start at row ${readingsAt + 1} ("${clip(lines[readingsAt]!)}"), and row ${above + 1} above them ("${clip(lines[above]!)}") names neither a time column nor a voltage column. Rename the columns, ${example}, or choose them by number.`,
      [{ path: `row ${above + 1}`, message: 'no time or voltage column named' }],
    );
  }
  const spaced = lines.findIndex(
    (line) => readingCells(line.trim().split(/ +/), false) >= 2 && /\d +[-+.\d]/.test(line.trim()),
  );
  if (spaced >= 0) {
    throw new EngineInputError(
      'invalid-csv',
      `Row ${spaced + 1} ("${clip(lines[spaced]!)}"): the columns are separated by spaces; the file must be comma, semicolon or tab separated. Export it as CSV, or replace the spaces between columns with semicolons.`,
      [{ path: `row ${spaced + 1}`, message: 'space separated' }],
    );
  }
  throw new EngineInputError(
    'invalid-csv',
    `No readings found: none of the first ${searched} lines holds a row of numbers (the file starts "${clip(lines[first]!)}"). Is it a logger's CSV export?`,
    [{ path: `row ${first + 1}`, message: 'no numeric rows' }],
  );
}

function clip(line: string): string {
  const trimmed = line.trim();
  return trimmed.length > 60 ? `${trimmed.slice(0, 57)}…` : trimmed;
}

// ---------------------------------------------------------------------------------------------
// The readings

interface ReadRows {
  readings: ReadingArrays;
  timeFormat: TimeFormat;
  firstTimeCell: string;
  /** A note when a footer after the readings was skipped. */
  footer: string | null;
}

function readRows(
  text: string,
  header: HeaderFound,
  decimalComma: boolean,
  timeScale: number,
  voltageScale: number,
  names: ReadingColumnNames,
): ReadRows {
  const { columns, separator } = header;
  let start = 0;
  for (let line = 0; line <= header.lastLine && start >= 0; line++) {
    start = text.indexOf('\n', start);
    if (start >= 0) start++;
  }
  const firstRow = header.lastLine + 2;
  const ti = columns.time.index;
  const vi = columns.voltage.index;
  const t: number[] = [];
  const v: number[] = [];
  const rowNumbers: number[] = [];
  let readTime: TimeCellReader | null = null;
  let timeFormat: TimeFormat = 'seconds';
  let firstTimeCell = '';
  let dayOffset = 0;
  let previous = -Infinity;
  // A row with neither a time nor a voltage may start a footer; it is refused only if a time
  // follows it (then it stood among the readings).
  let footerFirst = -1;
  let footerLast = -1;
  let refuseFooterStart: (() => never) | null = null;
  const where = (row: number, column: string): string => `Row ${row}, column "${column}"`;
  const anyTime =
    'a time: a number of seconds, a clock time such as 08:15:30.25 or a date and time such as 2024-06-11 08:15:30';

  const visit = (cells: string[], row: number): void => {
    if (refuseFooterStart !== null) {
      if (isBlankRow(cells)) return;
      if (readableTime(cells[ti], decimalComma)) refuseFooterStart();
      footerLast = row;
      return;
    }
    const timeCell = cells[ti];
    const voltCell = cells[vi];
    if (cells.length > columns.headerCells)
      checkRowWidth(trimAll(cells), columns.headerCells, row, separator);

    if (readTime === null) {
      if (isBlankRow(cells)) return;
      const reader =
        timeCell === undefined ? null : timeReaderFor(timeCell, decimalComma, timeScale);
      if (reader === null) {
        const refuse = (): never =>
          refuseCell(row, names.time, timeCell, anyTime, separator, decimalComma);
        if (readableNumber(voltCell, decimalComma)) refuse();
        refuseFooterStart = refuse;
        footerFirst = footerLast = row;
        return;
      }
      readTime = reader.read;
      timeFormat = reader.format;
      firstTimeCell = timeCell!.trim();
      if (
        timeFormat === 'seconds' &&
        columns.time.header.unit === '' &&
        isClockColumn(columns.time.header)
      ) {
        throw new EngineInputError(
          'invalid-csv',
          `${where(row, names.time)}: the column's name calls for dates and times, but it holds the number "${firstTimeCell}"; give its unit in the header (for example "${names.time} (ms)") or choose another time column.`,
          [
            {
              path: `row ${row}, column ${names.time}`,
              message: 'number without a unit in a timestamp column',
            },
          ],
        );
      }
    }
    const time = timeCell === undefined ? null : readTime(timeCell);
    const volts = voltCell === undefined ? null : parseNumberCell(voltCell, decimalComma);
    if (time === null || volts === null) {
      // Blank rows are looked for only here, where a reading failed: most rows are readings.
      if (isBlankRow(cells)) return;
      const expected =
        timeFormat === 'seconds' ? 'a number' : `a time like the first row's ${firstTimeCell}`;
      if (time === null && volts === null) {
        refuseFooterStart = (): never =>
          refuseCell(row, names.time, timeCell, expected, separator, decimalComma);
        footerFirst = footerLast = row;
        return;
      }
      if (time === null) refuseCell(row, names.time, timeCell, expected, separator, decimalComma);
      refuseCell(row, names.voltage, voltCell, 'a number', separator, decimalComma);
    }
    let seconds = time;
    if (timeFormat === 'clock') {
      // A clock that passes midnight starts again at 0:00.
      if (seconds + dayOffset < previous - 43_200) dayOffset += 86_400;
      seconds += dayOffset;
      previous = seconds;
    }
    t.push(seconds);
    v.push(volts * voltageScale);
    rowNumbers.push(row);
  };
  if (start >= 0)
    forEachCsvRow(text.slice(start), separator, (cells, k) => visit(cells, firstRow + k));

  if (t.length === 0) {
    throw new EngineInputError(
      'invalid-csv',
      `Row ${header.line + 1} (the header) is followed by no readings: the file has no rows of numbers under "${names.time}" and "${names.voltage}".`,
      [{ path: `row ${header.line + 1}`, message: 'no readings' }],
    );
  }
  if (timeFormat !== 'seconds') {
    const origin = t[0]!;
    for (let i = 0; i < t.length; i++) t[i]! -= origin;
  }
  const footer =
    footerFirst < 0
      ? null
      : `Rows ${footerFirst} to ${footerLast} after the readings hold no times (a footer) and were not read.`;
  return { readings: { t, v, rows: rowNumbers }, timeFormat, firstTimeCell, footer };
}

function isBlankRow(cells: readonly string[]): boolean {
  return cells.every((cell) => cell.trim() === '');
}

function trimAll(cells: readonly string[]): string[] {
  return cells.map((cell) => cell.trim());
}

function refuseCell(
  row: number,
  column: string,
  cell: string | undefined,
  expected: string,
  separator: CsvSeparator,
  decimalComma: boolean,
): never {
  const where = `Row ${row}, column "${column}"`;
  const path = `row ${row}, column ${column}`;
  if (cell === undefined || cell.trim() === '') {
    throw new EngineInputError(
      'invalid-csv',
      `${where}: the cell is ${cell === undefined ? 'missing (the row is shorter than the header)' : 'empty'}.`,
      [{ path, message: 'empty cell' }],
    );
  }
  const value = cell.trim();
  const hint =
    !decimalComma && /^[+-]?\d+,\d+$/.test(value)
      ? ` (a ${separatorName(separator)}-separated file needs a decimal point)`
      : '';
  throw new EngineInputError('invalid-csv', `${where}: "${value}" is not ${expected}${hint}.`, [
    { path, message: `"${value}" is not ${expected}` },
  ]);
}
