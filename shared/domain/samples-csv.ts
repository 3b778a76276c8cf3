/**
 * Reads decay samples from CSV text as loggers and people write it (see ./csv-text for the
 * separators, decimal commas and quoting accepted). The header row needs a time column
 * (t, time, seconds, s, sec, elapsed ...) and a voltage column (v, volt, volts, voltage, u, vdc ...);
 * a unit in brackets, parentheses or after a slash is honoured: s, ms, min, h; V, mV, kV. Other
 * columns are ignored.
 */

import { EngineInputError } from './errors';
import {
  checkRowWidth,
  findHeader,
  isEmptyRow,
  parseHeaderName,
  parseNumberCell,
  separatorName,
  splitCells,
  splitLines,
  type CsvSeparator,
  type HeaderName,
} from './csv-text';
import { validateDecaySamples, type DecaySample } from './decay-fit';

/** What {@link parseDecaySamplesCsv} read. */
export interface DecaySamplesCsv {
  samples: DecaySample[];
  /** File line number of each sample (same order), for messages. */
  rowNumbers: number[];
  /** The header cells used, as written. */
  timeColumn: string;
  voltageColumn: string;
  separator: CsvSeparator;
  /** True when decimal commas were accepted (semicolon or tab separated). */
  decimalComma: boolean;
}

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
  'time since isolation',
  'time elapsed',
]);
const VOLTAGE_NAMES = new Set([
  'v',
  'volt',
  'volts',
  'voltage',
  'u',
  'vdc',
  'udc',
  'v dc',
  'u dc',
  'dc bus',
  'dc link',
  'bus',
  'bus voltage',
  'dc link voltage',
  'dc bus voltage',
]);
const TIME_UNITS: Record<string, number> = {
  '': 1,
  s: 1,
  sec: 1,
  secs: 1,
  second: 1,
  seconds: 1,
  ms: 1e-3,
  min: 60,
  mins: 60,
  minute: 60,
  minutes: 60,
  h: 3600,
  hr: 3600,
  hour: 3600,
  hours: 3600,
};
const VOLTAGE_UNITS: Record<string, number> = {
  '': 1,
  v: 1,
  volt: 1,
  volts: 1,
  vdc: 1,
  'v dc': 1,
  mv: 1e-3,
  kv: 1e3,
};

interface Columns {
  time: number;
  voltage: number;
  timeHeader: HeaderName;
  voltageHeader: HeaderName;
  headerCells: number;
}

/** Index of the best-matching header: an exact name first, then a loose one. */
function pick(headers: HeaderName[], exact: Set<string>, loose: RegExp): number {
  const exactAt = headers.findIndex((h) => exact.has(h.name));
  return exactAt >= 0 ? exactAt : headers.findIndex((h) => loose.test(h.name));
}

function matchColumns(cells: string[]): Columns | null {
  const headers = cells.map(parseHeaderName);
  const time = pick(headers, TIME_NAMES, /^(time|elapsed)\b/);
  const voltage = pick(headers, VOLTAGE_NAMES, /volt/);
  if (time < 0 || voltage < 0 || time === voltage) return null;
  return {
    time,
    voltage,
    timeHeader: headers[time]!,
    voltageHeader: headers[voltage]!,
    headerCells: cells.length,
  };
}

/**
 * Parses decay samples from CSV text.
 *
 * @param text - the file's content
 * @param options - `validate` (default true) also checks the samples as a decay
 *   ({@link validateDecaySamples}) and names the file row in any message
 * @returns the samples in seconds and volts, with their row numbers
 * @throws EngineInputError('invalid-csv') for a missing header, an unknown unit or a bad cell
 *   (the message names row and column); the validation's errors otherwise
 * @example
 * parseDecaySamplesCsv('Time (s);Voltage [V]\n0;560,0\n60;428,5\n').samples
 * // [{ tSeconds: 0, volts: 560 }, { tSeconds: 60, volts: 428.5 }]
 */
export function parseDecaySamplesCsv(
  text: string,
  options: { validate?: boolean } = {},
): DecaySamplesCsv {
  const lines = splitLines(text);
  const { separator, headerAt, found } = findHeader(
    lines,
    matchColumns,
    'the first row must name a time column (t, time, seconds or s) and a voltage column (v, volt, volts or voltage).',
  );
  const timeScale = TIME_UNITS[found.timeHeader.unit];
  const voltageScale = VOLTAGE_UNITS[found.voltageHeader.unit];
  const headerRow = lines[headerAt]!.rowNumber;
  if (timeScale === undefined) {
    throw new EngineInputError(
      'invalid-csv',
      `Row ${headerRow}, column "${found.timeHeader.original}": unknown time unit "${found.timeHeader.unit}" (use s, ms, min or h).`,
    );
  }
  if (voltageScale === undefined) {
    throw new EngineInputError(
      'invalid-csv',
      `Row ${headerRow}, column "${found.voltageHeader.original}": unknown voltage unit "${found.voltageHeader.unit}" (use V, mV or kV).`,
    );
  }
  const decimalComma = separator !== ',';
  const samples: DecaySample[] = [];
  const rowNumbers: number[] = [];
  for (let at = headerAt + 1; at < lines.length; at++) {
    const line = lines[at]!;
    const cells = splitCells(line.text, separator);
    if (isEmptyRow(cells)) continue;
    checkRowWidth(cells, found.headerCells, line.rowNumber, separator);
    const tSeconds =
      readCell(cells, found.time, found.timeHeader, line.rowNumber, separator, decimalComma) *
      timeScale;
    const volts =
      readCell(cells, found.voltage, found.voltageHeader, line.rowNumber, separator, decimalComma) *
      voltageScale;
    samples.push({ tSeconds, volts });
    rowNumbers.push(line.rowNumber);
  }
  if (options.validate ?? true)
    validateDecaySamples(samples, (index) => `Row ${rowNumbers[index]}`);
  return {
    samples,
    rowNumbers,
    timeColumn: found.timeHeader.original,
    voltageColumn: found.voltageHeader.original,
    separator,
    decimalComma,
  };
}

function readCell(
  cells: string[],
  column: number,
  header: HeaderName,
  rowNumber: number,
  separator: CsvSeparator,
  decimalComma: boolean,
): number {
  const where = `Row ${rowNumber}, column "${header.original}"`;
  const cell = cells[column];
  if (cell === undefined || cell === '') {
    throw new EngineInputError('invalid-csv', `${where}: the cell is empty.`, [
      { path: `row ${rowNumber}, column ${header.original}`, message: 'empty cell' },
    ]);
  }
  const value = parseNumberCell(cell, decimalComma);
  if (value === null) {
    const hint =
      !decimalComma && /^\d+,\d+$/.test(cell)
        ? ` (a ${separatorName(separator)}-separated file needs a decimal point)`
        : '';
    throw new EngineInputError('invalid-csv', `${where}: "${cell}" is not a number${hint}.`, [
      { path: `row ${rowNumber}, column ${header.original}`, message: `"${cell}" is not a number` },
    ]);
  }
  return value;
}
