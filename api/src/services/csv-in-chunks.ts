/**
 * Reading a CSV text in slices that give the event loop back between them, and that stop as
 * soon as a row limit is passed: a large upload costs what its limits say and never holds up
 * other requests for long.
 */
import Papa from 'papaparse';

/**
 * Characters parsed before the reader lets other work run. 8 Ki keeps the costliest slice (4 Ki
 * rows of one character, each a cell-count error) to a few milliseconds; a slice costs by rows.
 */
export const CSV_SLICE_CHARACTERS = 8 * 1024;

/** Characters of the file's start from which the delimiter is guessed. */
const DELIMITER_SAMPLE_CHARACTERS = 16 * 1024;

/** Resolves once the event loop has served the I/O waiting now (setImmediate, not a timer). */
export function yieldToEventLoop(): Promise<void> {
  return new Promise((resolve) => setImmediate(resolve));
}

/** One cell-count problem of a data row, numbered from 0 among the data rows. */
export interface CsvRowError {
  /** Index of the data row (0 = the first row under the header); undefined for the whole file. */
  dataIndex: number | undefined;
  code: string;
  message: string;
}

/** What the reader found: the header, the data rows (each cell a string) and their errors. */
export interface CsvRead {
  fields: string[];
  rows: Array<Record<string, string>>;
  errors: CsvRowError[];
  /** True when the file has more data rows than `maxRows`; reading stopped there. */
  overRowLimit: boolean;
}

export interface CsvReadOptions {
  /** Most data rows to read; one more stops the reading with `overRowLimit`. */
  maxRows: number;
  /** How a header cell becomes a column name. */
  transformHeader?: (header: string) => string;
  /** Characters per slice; the default suits a server that must stay responsive. */
  sliceCharacters?: number;
}

/**
 * Parses `text` (header row first) with papaparse's chunked reader, pausing after every slice
 * until the event loop has served what is waiting, and aborting once more than `maxRows` data
 * rows are seen. Blank lines are skipped.
 * @returns the header, at most `maxRows` rows, their errors, and whether the limit was passed
 */
export function readCsvInChunks(text: string, options: CsvReadOptions): Promise<CsvRead> {
  const { maxRows, transformHeader, sliceCharacters = CSV_SLICE_CHARACTERS } = options;
  // the delimiter is guessed once from the start of the file, as a whole-file parse would, not from a small first slice
  const guess = Papa.parse(text.slice(0, DELIMITER_SAMPLE_CHARACTERS), { preview: 10 });
  return new Promise((resolve, reject) => {
    const read: CsvRead = { fields: [], rows: [], errors: [], overRowLimit: false };
    for (const error of guess.errors) {
      if (error.code === 'UndetectableDelimiter') read.errors.push({ dataIndex: undefined, code: error.code, message: error.message });
    }
    let settled = false;
    const settle = () => {
      if (settled) return;
      settled = true;
      resolve(read);
    };
    Papa.parse<Record<string, string>>(text, {
      header: true,
      skipEmptyLines: 'greedy',
      delimiter: guess.meta.delimiter,
      transformHeader,
      chunkSize: sliceCharacters,
      // papaparse reads a string in chunks too (its typings speak only of files)
      chunk(results: Papa.ParseResult<Record<string, string>>, parser: Papa.Parser) {
        if (settled) return;
        if (read.fields.length === 0 && results.meta.fields) read.fields = results.meta.fields;
        const firstIndex = read.rows.length;
        const room = maxRows - firstIndex;
        read.rows.push(...results.data.slice(0, Math.max(0, room)));
        for (const error of results.errors) {
          // papaparse numbers a chunked read's errors from the first data row of the file
          if (error.row === undefined || error.row < maxRows) {
            read.errors.push({ dataIndex: error.row, code: error.code, message: error.message });
          }
        }
        if (results.data.length > room) {
          read.overRowLimit = true;
          parser.abort();
          settle();
          return;
        }
        parser.pause();
        yieldToEventLoop().then(() => parser.resume(), reject);
      },
      complete: settle,
    });
  });
}
