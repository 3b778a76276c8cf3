/**
 * Loose CSV reading shared by the decay-sample and history readers: the files loggers write and
 * people type. Pure text in, cells out; no I/O.
 *
 * - Comma, semicolon or tab separated; the separator is found from the header row.
 * - Decimal commas are accepted when the separator is a semicolon or a tab.
 * - Blank lines and trailing spaces are ignored; double-quoted cells may contain the separator.
 * - Windows (CRLF), Unix (LF) and old Mac (CR) line ends.
 * - Row numbers in messages are the file's line numbers (1-based), so an editor finds them.
 */

import Papa from 'papaparse';
import { EngineInputError } from './errors';

/** The separators a file may use. */
export type CsvSeparator = ',' | ';' | '\t';

/** One non-blank line of a CSV file, split into cells (trimmed, quotes removed). */
export interface CsvRow {
  /** 1-based line number in the file. */
  rowNumber: number;
  cells: string[];
}

/**
 * Human name of a separator, for messages.
 *
 * @example
 * separatorName(';') // 'semicolon'
 */
export function separatorName(separator: CsvSeparator): string {
  return separator === ',' ? 'comma' : separator === ';' ? 'semicolon' : 'tab';
}

/**
 * Splits text into non-blank lines with their 1-based line numbers (a UTF-8 byte-order mark and
 * Windows and old Mac line ends are handled).
 *
 * @example
 * splitLines('t;v\r\n\r\n0;5\n') // [{ rowNumber: 1, text: 't;v' }, { rowNumber: 3, text: '0;5' }]
 */
export function splitLines(text: string): { rowNumber: number; text: string }[] {
  const source = normaliseLineEnds(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text).text;
  const lines = source.split('\n');
  const out: { rowNumber: number; text: string }[] = [];
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i]!.trim();
    if (line !== '') out.push({ rowNumber: i + 1, text: line });
  }
  return out;
}

/** The line ends a file used. */
export type LineEnds = 'LF' | 'CRLF' | 'CR';

/**
 * Turns Windows (CRLF) and old Mac (CR) line ends into LF, so that line k of the result is line k
 * of the file whatever wrote it.
 *
 * @returns the text with LF line ends, and the line ends the file used (the first one found)
 * @example
 * normaliseLineEnds('t,v\r0,5\r') // { text: 't,v\n0,5\n', lineEnds: 'CR' }
 */
export function normaliseLineEnds(text: string): { text: string; lineEnds: LineEnds } {
  const cr = text.indexOf('\r');
  if (cr < 0) return { text, lineEnds: 'LF' };
  const lineEnds: LineEnds = text.charCodeAt(cr + 1) === 10 ? 'CRLF' : 'CR';
  return { text: text.replace(/\r\n?/g, '\n'), lineEnds };
}

/**
 * Tokenizes CSV text with papaparse: one array of cells per line (blank lines give `['']`, so
 * row k of the result is line k of the text as long as no quoted cell holds a line break).
 * Quotes are honoured ("" inside quotes is a quote); cells are not trimmed.
 *
 * @param text - text with LF line ends (see {@link normaliseLineEnds})
 * @param separator - the cell separator
 * @example
 * tokenizeCsv('t;v\n0;"5,5"', ';') // [['t', 'v'], ['0', '5,5']]
 */
export function tokenizeCsv(text: string, separator: CsvSeparator): string[][] {
  return Papa.parse<string[]>(text, { delimiter: separator, newline: '\n', quoteChar: '"' }).data;
}

/**
 * Tokenizes CSV text with papaparse row by row, calling `visit` with each row's cells and its
 * 0-based line index (blank lines give `['']`). Each row is dropped once visited, which spares a
 * large logger file the memory of all its rows at once (about half the time of
 * {@link tokenizeCsv} on 100,000 rows). An exception thrown by `visit` ends the reading.
 *
 * @param text - text with LF line ends (see {@link normaliseLineEnds})
 * @example
 * forEachCsvRow('0;5\n1;4', ';', (cells, index) => console.log(index, cells)) // 0 ['0', '5'], 1 ['1', '4']
 */
export function forEachCsvRow(
  text: string,
  separator: CsvSeparator,
  visit: (cells: string[], index: number) => void,
): void {
  let index = 0;
  Papa.parse<string[]>(text, {
    delimiter: separator,
    newline: '\n',
    quoteChar: '"',
    step: (result) => visit(result.data, index++),
  });
}

/**
 * Splits one line into cells on `separator`, honouring double quotes ("" inside quotes is a quote).
 * Cells are trimmed.
 *
 * @example
 * splitCells('0;"5,5" ;x', ';') // ['0', '5,5', 'x']
 */
export function splitCells(line: string, separator: CsvSeparator): string[] {
  if (!line.includes('"')) {
    const parts = line.split(separator);
    for (let i = 0; i < parts.length; i++) parts[i] = parts[i]!.trim();
    return parts;
  }
  const cells: string[] = [];
  let current = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i]!;
    if (quoted) {
      if (c === '"' && line[i + 1] === '"') {
        current += '"';
        i++;
      } else if (c === '"') {
        quoted = false;
      } else {
        current += c;
      }
    } else if (c === '"') {
      quoted = true;
    } else if (c === separator) {
      cells.push(current.trim());
      current = '';
    } else {
      current += c;
    }
  }
  cells.push(current.trim());
  return cells;
}

/**
 * True when `cells` is an empty row (only separators).
 *
 * @example
 * isEmptyRow(['', '', '']) // true
 */
export function isEmptyRow(cells: readonly string[]): boolean {
  return cells.every((cell) => cell === '');
}

const POINT_NUMBER = /^\s*[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?\s*$/;
const COMMA_NUMBER = /^\s*[+-]?(?:\d+,?\d*|,\d+)(?:[eE][+-]?\d+)?\s*$/;

/**
 * Reads a number cell (spaces around it allowed). With `decimalComma`, "12,5" and "12.5" both
 * read 12.5. Thousands separators, units and words are refused.
 *
 * @returns the number, or null when the cell is not a plain number
 * @example
 * parseNumberCell('12,5', true) // 12.5
 * parseNumberCell('12,5', false) // null
 */
export function parseNumberCell(cell: string, decimalComma: boolean): number | null {
  const plain = plainDecimal(cell, decimalComma);
  if (plain !== undefined) return plain;
  if (POINT_NUMBER.test(cell)) return Number(cell);
  if (decimalComma && COMMA_NUMBER.test(cell)) return Number(cell.replace(',', '.'));
  return null;
}

const DIGIT_0 = 48;
const MAX_EXACT = 2 ** 53;
const POWERS_OF_TEN = Array.from({ length: 23 }, (_, k) => 10 ** k);

/**
 * The common cell of a logger file ("565,11", "-0.03", "1500") read without a regular expression
 * or a new string: a logger file has hundreds of thousands of them. The value is the integer of
 * all digits divided by a power of ten: both exact, so the one division rounds correctly and the
 * result equals Number() of the same text. Anything else (exponents, spaces inside, too many
 * digits) returns undefined for the general path.
 */
function plainDecimal(cell: string, decimalComma: boolean): number | null | undefined {
  let i = 0;
  let end = cell.length;
  while (i < end && cell.charCodeAt(i) === 32) i++;
  while (end > i && cell.charCodeAt(end - 1) === 32) end--;
  if (i === end) return null;
  let negative = false;
  const sign = cell.charCodeAt(i);
  if (sign === 45 || sign === 43) {
    negative = sign === 45;
    i++;
  }
  let digits = 0;
  let whole = 0;
  let decimals = -1;
  for (; i < end; i++) {
    const c = cell.charCodeAt(i);
    const digit = c - DIGIT_0;
    if (digit >= 0 && digit <= 9) {
      whole = whole * 10 + digit;
      digits++;
      if (decimals >= 0) decimals++;
    } else if (decimals < 0 && (c === 46 || (c === 44 && decimalComma))) {
      decimals = 0;
    } else {
      return undefined;
    }
  }
  if (digits === 0 || whole >= MAX_EXACT || decimals > 22) return undefined;
  const value = decimals > 0 ? whole / POWERS_OF_TEN[decimals]! : whole;
  return negative ? -value : value;
}

/** A header cell taken apart: lower-case name and the unit in brackets, parentheses or after a slash. */
export interface HeaderName {
  /** As written, trimmed. */
  original: string;
  /** Lower case, unit removed, spaces and underscores collapsed to one space. */
  name: string;
  /** Lower-case unit, '' when none is given. */
  unit: string;
}

/**
 * Takes a header cell apart: "Voltage [V]" → name "voltage", unit "v"; "t (ms)" → "t", "ms";
 * "U/V" → "u", "v".
 *
 * @example
 * parseHeaderName(' Time (s) ') // { original: 'Time (s)', name: 'time', unit: 's' }
 */
export function parseHeaderName(cell: string): HeaderName {
  const original = cell.trim();
  let name = original.toLowerCase();
  let unit = '';
  const bracketed = /^(.*?)\s*[([]\s*([^)\]]*?)\s*[)\]]\s*$/.exec(name);
  const slashed = /^(.*?)\s*\/\s*([a-zµ]+)$/.exec(name);
  if (bracketed) {
    name = bracketed[1]!;
    unit = bracketed[2]!;
  } else if (slashed && slashed[1] !== '') {
    name = slashed[1]!;
    unit = slashed[2]!;
  }
  return { original, name: name.replace(/[\s_]+/g, ' ').trim(), unit };
}

/** How many lines from the top of a file the header may be: loggers write long preambles. */
export const HEADER_SEARCH_LINES = 100;

/**
 * Finds the header row among the first 100 lines: the first line that, split on one of
 * the separators, satisfies `accept`. Lines before it (a logger's preamble) are skipped.
 *
 * @returns the separator, the header's position in `lines` and what `accept` returned
 * @throws EngineInputError('invalid-csv') when no line is accepted
 * @example
 * findHeader(splitLines('Logger 7\nt;v\n0;5'), (cells) => (cells.includes('t') ? cells : null), 'a t column')
 * // { separator: ';', headerAt: 1, found: ['t', 'v'] }
 */
export function findHeader<T>(
  lines: readonly { rowNumber: number; text: string }[],
  accept: (cells: string[]) => T | null,
  whatIsMissing: string,
): { separator: CsvSeparator; headerAt: number; found: T } {
  const separators: CsvSeparator[] = ['\t', ';', ','];
  for (let at = 0; at < lines.length && lines[at]!.rowNumber <= HEADER_SEARCH_LINES; at++) {
    const text = lines[at]!.text;
    for (const separator of separators) {
      if (separator !== ',' && !text.includes(separator)) continue;
      const found = accept(splitCells(text, separator));
      if (found !== null) return { separator, headerAt: at, found };
    }
  }
  if (lines.length === 0) throw new EngineInputError('invalid-csv', 'The file is empty.');
  throw new EngineInputError('invalid-csv', `No header row found: ${whatIsMissing}`, [
    { path: `row ${lines[0]!.rowNumber}`, message: whatIsMissing },
  ]);
}

/**
 * Refuses a row with more filled cells than the header has columns: in a comma-separated file
 * "0,560,5" is a decimal comma splitting a number, and reading it as 560 would be a silent guess.
 *
 * @throws EngineInputError('invalid-csv')
 * @example
 * checkRowWidth(['0', '560', '5'], 2, 7, ',') // throws: 'Row 7, column 3: "5" stands beyond the header's 2 columns (the row has 3 cells). ...'
 */
export function checkRowWidth(
  cells: readonly string[],
  headerCells: number,
  rowNumber: number,
  separator: CsvSeparator,
): void {
  for (let i = headerCells; i < cells.length; i++) {
    if (cells[i] !== '') {
      const hint = separator === ',' ? ' Decimal commas need a semicolon-separated file.' : '';
      throw new EngineInputError(
        'invalid-csv',
        `Row ${rowNumber}, column ${i + 1}: "${cells[i]}" stands beyond the header's ${headerCells} columns (the row has ${cells.length} cells).${hint}`,
        [{ path: `row ${rowNumber}, column ${i + 1}`, message: 'more cells than the header' }],
      );
    }
  }
}
