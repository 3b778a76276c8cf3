/**
 * Reads a bank's history of capacitance ratios from CSV text: rows of `date,ratio` with an
 * optional third column, the ratio's standard error. The header row is optional; when present it
 * names the columns loosely (date / on / measured on; ratio / c/c0 / capacitance ratio; std error /
 * sigma / uncertainty). Separators, decimal commas and quoting as in ./csv-text.
 */

import { EngineInputError } from './errors';
import {
  checkRowWidth,
  findHeader,
  isEmptyRow,
  parseHeaderName,
  parseNumberCell,
  splitCells,
  splitLines,
  type CsvSeparator,
} from './csv-text';
import { dayNumberFromIsoDate } from './calendar-dates';
import type { RatioHistoryPoint } from './trend-forecast';

const DATE_NAMES = new Set([
  'date',
  'on',
  'day',
  'measured on',
  'measuredon',
  'run date',
  'date on',
  'dateon',
]);
const RATIO_NAMES = new Set([
  'ratio',
  'c/c0',
  'capacitance ratio',
  'ratio to baseline',
  'ratiotobaseline',
  'capacitanceratio',
]);
const ERROR_NAMES = new Set([
  'std error',
  'stderr',
  'standard error',
  'se',
  'sigma',
  'uncertainty',
  'u',
  'ratio std error',
  'ratiostderror',
]);

interface Layout {
  date: number;
  ratio: number;
  stdError: number; // −1 when absent
  headerCells: number;
  hasHeader: boolean;
}

function matchHeader(cells: string[]): Layout | null {
  // "c/c0" would be read as name "c", unit "c0"; compare the raw lower-case cell too.
  const names = cells.map((cell) => {
    const raw = cell
      .trim()
      .toLowerCase()
      .replace(/[\s_]+/g, ' ');
    return RATIO_NAMES.has(raw) || DATE_NAMES.has(raw) || ERROR_NAMES.has(raw)
      ? raw
      : parseHeaderName(cell).name;
  });
  const date = names.findIndex((name) => DATE_NAMES.has(name));
  const ratio = names.findIndex((name) => RATIO_NAMES.has(name));
  if (date < 0 || ratio < 0) return null;
  return {
    date,
    ratio,
    stdError: names.findIndex((name) => ERROR_NAMES.has(name)),
    headerCells: cells.length,
    hasHeader: true,
  };
}

function matchHeaderless(cells: string[]): Layout | null {
  if (cells.length < 2 || !/^\d{4}-\d{2}-\d{2}/.test(cells[0]!)) return null;
  return { date: 0, ratio: 1, stdError: 2, headerCells: 3, hasHeader: false };
}

/** What {@link parseRatioHistoryCsv} read. */
export interface RatioHistoryCsv {
  history: RatioHistoryPoint[];
  /** File line number of each point (same order). */
  rowNumbers: number[];
  separator: CsvSeparator;
}

/**
 * Parses a ratio history.
 *
 * @param text - the file's content
 * @returns the points in file order, with their row numbers
 * @throws EngineInputError('invalid-csv' | 'invalid-date' | 'invalid-ratio'), naming row and column
 * @example
 * parseRatioHistoryCsv('date,ratio\n2020-03-01,1.00\n2021-03-01,0.97\n').history
 * // [{ measuredOn: '2020-03-01', ratio: 1 }, { measuredOn: '2021-03-01', ratio: 0.97 }]
 */
export function parseRatioHistoryCsv(text: string): RatioHistoryCsv {
  const lines = splitLines(text);
  const { separator, headerAt, found } = findHeader(
    lines,
    (cells) => matchHeader(cells) ?? matchHeaderless(cells),
    'each row needs a date (YYYY-MM-DD) and a ratio, with an optional header row "date,ratio".',
  );
  const decimalComma = separator !== ',';
  const history: RatioHistoryPoint[] = [];
  const rowNumbers: number[] = [];
  const first = found.hasHeader ? headerAt + 1 : headerAt;
  for (let at = first; at < lines.length; at++) {
    const line = lines[at]!;
    const cells = splitCells(line.text, separator);
    if (isEmptyRow(cells)) continue;
    checkRowWidth(cells, found.headerCells, line.rowNumber, separator);
    const where = (column: string): string => `Row ${line.rowNumber}, column ${column}`;
    const dateCell = cells[found.date] ?? '';
    dayNumberFromIsoDate(dateCell, where('date'));
    const measuredOn = dateCell.slice(0, 10);
    const ratio = parseNumberCell(cells[found.ratio] ?? '', decimalComma);
    if (ratio === null || !(ratio > 0) || ratio > 5) {
      throw new EngineInputError(
        'invalid-ratio',
        `${where('ratio')}: "${cells[found.ratio] ?? ''}" is not a capacitance ratio (a number such as 0.93).`,
        [{ path: `row ${line.rowNumber}, column ratio`, message: 'not a ratio' }],
      );
    }
    const point: RatioHistoryPoint = { measuredOn, ratio };
    if (found.stdError >= 0 && (cells[found.stdError] ?? '') !== '') {
      const stdError = parseNumberCell(cells[found.stdError]!, decimalComma);
      if (stdError === null || !(stdError > 0)) {
        throw new EngineInputError(
          'invalid-ratio',
          `${where('std error')}: "${cells[found.stdError]!}" is not a standard error (a positive number such as 0.01).`,
          [{ path: `row ${line.rowNumber}, column std error`, message: 'not a positive number' }],
        );
      }
      point.ratioStdError = stdError;
    }
    history.push(point);
    rowNumbers.push(line.rowNumber);
  }
  return { history, rowNumbers, separator };
}
