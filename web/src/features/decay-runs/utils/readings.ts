import {
  EngineInputError,
  parseDecaySamplesCsv,
  validateDecaySamples,
  type DecaySample,
  type RunConditions,
} from '../../../../../shared/domain';

/** One row of the readings table, as typed. */
export interface ReadingRow {
  /** Time since isolation: seconds, or m:ss. */
  time: string;
  /** DC-bus voltage, volts. */
  volts: string;
}

/** An empty row of the readings table. */
export const EMPTY_READING_ROW: ReadingRow = { time: '', volts: '' };

/** The rows with one cell changed; typing into the last row opens a new empty one below it. */
export function withCell(rows: readonly ReadingRow[], index: number, field: keyof ReadingRow, value: string): ReadingRow[] {
  const next = rows.map((row, i) => (i === index ? { ...row, [field]: value } : row));
  if (index === next.length - 1 && value.trim() !== '') next.push(EMPTY_READING_ROW);
  return next;
}

/** The rows without one of them; the table keeps one empty row when the last is removed. */
export function withoutRow(rows: readonly ReadingRow[], index: number): ReadingRow[] {
  return rows.length <= 1 ? [EMPTY_READING_ROW] : rows.filter((_, i) => i !== index);
}

/** A problem with one cell of the readings table. */
export interface ReadingIssue {
  /** Row number on screen, from 1. */
  row: number;
  field: 'time' | 'volts';
  /** Names the row, e.g. "Row 4: the voltage "5x0" is not a number." */
  message: string;
}

/** The readings that can go to the engine, and the rows that cannot. */
export interface ReadRows {
  samples: DecaySample[];
  /** Screen row number of each sample (same order). */
  rowNumbers: number[];
  /** Problems, one per cell; rows with a problem are not in `samples`. */
  issues: ReadingIssue[];
}

/**
 * A decimal number as people type it: a point or a single decimal comma ("412,5"), spaces around.
 *
 * @returns the number, or null when `text` is not one
 * @example
 * readDecimal(' 412,5 ') // 412.5
 * readDecimal('4l2') // null
 */
export function readDecimal(text: string): number | null {
  let cell = text.trim().replace(/\s+/g, '');
  if (!cell.includes('.') && /^[+-]?\d*,\d+$/.test(cell)) cell = cell.replace(',', '.');
  if (!/^[+-]?(\d+(\.\d*)?|\.\d+)(e[+-]?\d+)?$/i.test(cell)) return null;
  const value = Number(cell);
  return Number.isFinite(value) ? value : null;
}

/**
 * A time since isolation in seconds: "90", "90,5", or minutes and seconds "1:30" (h:mm:ss too).
 *
 * @returns seconds, or null when `text` is not a time
 * @example
 * readSeconds('2:05') // 125
 */
export function readSeconds(text: string): number | null {
  const cell = text.trim();
  if (!cell.includes(':')) return readDecimal(cell);
  const parts = cell.split(':');
  if (parts.length > 3 || parts.some((p) => p.trim() === '')) return null;
  const numbers = parts.map((p, i) => (i === parts.length - 1 ? readDecimal(p) : /^\s*\d+\s*$/.test(p) ? Number(p) : null));
  if (numbers.some((n) => n === null || n < 0)) return null;
  // every part after the first counts below 60
  if (numbers.slice(1).some((n) => n! >= 60)) return null;
  return numbers.reduce<number>((total, n) => total * 60 + n!, 0);
}

/**
 * Reads the readings table: blank rows are skipped, a half-filled or mistyped row is named, and
 * the rest is checked as a decay (positive volts, times increasing) with the engine's own rules.
 * A row that breaks a rule is left out and named, so the check can go on with the others.
 *
 * @param rows - the table as typed, top to bottom
 * @example
 * readReadingRows([{ time: '0', volts: '560' }, { time: '60', volts: '5x0' }])
 * // { samples: [{ tSeconds: 0, volts: 560 }], rowNumbers: [1],
 * //   issues: [{ row: 2, field: 'volts', message: 'Row 2: the voltage "5x0" is not a number.' }] }
 */
export function readReadingRows(rows: readonly ReadingRow[]): ReadRows {
  const issues: ReadingIssue[] = [];
  let samples: DecaySample[] = [];
  let rowNumbers: number[] = [];
  rows.forEach((row, i) => {
    const n = i + 1;
    const time = row.time.trim();
    const volts = row.volts.trim();
    if (time === '' && volts === '') return;
    if (time === '') return void issues.push({ row: n, field: 'time', message: `Row ${n}: enter the time since isolation too.` });
    if (volts === '') return void issues.push({ row: n, field: 'volts', message: `Row ${n}: enter the voltage too.` });
    const tSeconds = readSeconds(time);
    const v = readDecimal(volts);
    if (tSeconds === null) issues.push({ row: n, field: 'time', message: `Row ${n}: the time "${time}" is not a number of seconds (or m:ss).` });
    if (v === null) issues.push({ row: n, field: 'volts', message: `Row ${n}: the voltage "${volts}" is not a number.` });
    if (tSeconds === null || v === null) return;
    samples.push({ tSeconds, volts: v });
    rowNumbers.push(n);
  });
  // the engine's own checks; a row it names is left out and the rest checked again
  for (let pass = 0; pass < rows.length; pass++) {
    const named = engineIssues(samples, rowNumbers);
    if (named.length === 0) break;
    issues.push(...named.map((issue) => ({ row: rowNumbers[issue.index]!, field: issue.field, message: issue.message })));
    const leftOut = new Set(named.map((issue) => issue.index));
    samples = samples.filter((_, i) => !leftOut.has(i));
    rowNumbers = rowNumbers.filter((_, i) => !leftOut.has(i));
  }
  issues.sort((a, b) => a.row - b.row);
  return { samples, rowNumbers, issues };
}

function engineIssues(samples: DecaySample[], rowNumbers: number[]): { index: number; field: 'time' | 'volts'; message: string }[] {
  try {
    validateDecaySamples(samples, (index) => `Row ${rowNumbers[index]}`);
    return [];
  } catch (error) {
    if (!(error instanceof EngineInputError)) throw error;
    return error.issues.flatMap((issue) => {
      const match = /^samples\.(\d+)\.(tSeconds|volts)$/.exec(issue.path);
      return match ? [{ index: Number(match[1]), field: match[2] === 'volts' ? ('volts' as const) : ('time' as const), message: issue.message }] : [];
    });
  }
}

/** The optional conditions of a check, as typed. */
export interface ConditionInputs {
  /** Bank temperature, °C; blank when not measured. */
  bankTempC: string;
  /** Meter input resistance, MΩ; blank for the usual 10 MΩ, 0 for none. */
  meterInputMegohms: string;
  /** Bleeder resistance measured with the bus discharged, kΩ; blank when not measured. */
  measuredBleederKilohms: string;
}

/** A problem with one condition field. */
export interface ConditionIssue {
  field: keyof ConditionInputs;
  message: string;
}

/**
 * Reads the conditions of a check into the engine's {@link RunConditions}; a bad field is named
 * and left out (the check goes on as if it were blank).
 *
 * @example
 * readConditions({ bankTempC: '31', meterInputMegohms: '', measuredBleederKilohms: '47' })
 * // { conditions: { bankTempC: 31, measuredBleederOhms: 47000 }, issues: [] }
 */
export function readConditions(inputs: ConditionInputs): { conditions: RunConditions; issues: ConditionIssue[] } {
  const conditions: RunConditions = {};
  const issues: ConditionIssue[] = [];
  const temp = inputs.bankTempC.trim();
  if (temp !== '') {
    const value = readDecimal(temp);
    if (value === null || value < -40 || value > 150) issues.push({ field: 'bankTempC', message: 'Enter the bank temperature in °C, between −40 and 150.' });
    else conditions.bankTempC = value;
  }
  const meter = inputs.meterInputMegohms.trim();
  if (meter !== '') {
    const value = readDecimal(meter);
    if (value === null || value < 0) issues.push({ field: 'meterInputMegohms', message: "Enter the meter's input resistance in MΩ (0 for none)." });
    else conditions.meterInputOhms = value === 0 ? null : value * 1e6;
  }
  const bleeder = inputs.measuredBleederKilohms.trim();
  if (bleeder !== '') {
    const value = readDecimal(bleeder);
    if (value === null || !(value > 0)) issues.push({ field: 'measuredBleederKilohms', message: 'Enter the measured bleeder resistance in kΩ, above 0.' });
    else conditions.measuredBleederOhms = value * 1e3;
  }
  return { conditions, issues };
}

/**
 * Pasted readings (a logger's CSV with a header, or two columns copied from a sheet or a note)
 * as table rows. With a header the engine's CSV reader converts units (ms, min, mV ...); without
 * one each line gives the first two cells, split on a tab, a semicolon, spaces or a comma.
 *
 * @returns the rows, or a message saying what could not be read
 * @example
 * readPastedReadings('0\t560\n60\t428,5') // { rows: [{ time: '0', volts: '560' }, { time: '60', volts: '428,5' }] }
 */
export function readPastedReadings(text: string): { rows: ReadingRow[] } | { problem: string } {
  const lines = text.split(/\r\n|\r|\n/).filter((line) => line.trim() !== '');
  if (lines.length === 0) return { problem: 'Nothing to read: paste two columns, time (s) and voltage (V).' };
  if (/[a-df-z]/i.test(lines[0]!)) {
    try {
      const csv = parseDecaySamplesCsv(text, { validate: false });
      return { rows: csv.samples.map((s) => ({ time: String(s.tSeconds), volts: String(s.volts) })) };
    } catch (error) {
      if (error instanceof EngineInputError) return { problem: error.message };
      throw error;
    }
  }
  return {
    rows: lines.map((line) => {
      const cells = splitPastedLine(line.trim());
      return { time: cells[0] ?? '', volts: cells[1] ?? '' };
    }),
  };
}

function splitPastedLine(line: string): string[] {
  if (line.includes('\t')) return line.split('\t').map((c) => c.trim());
  if (line.includes(';')) return line.split(';').map((c) => c.trim());
  if (/\s/.test(line)) return line.split(/\s+/);
  return line.split(',').map((c) => c.trim());
}
