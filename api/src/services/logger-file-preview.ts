/**
 * Reading a logger's or an oscilloscope's file as the readings of a decay run, for a preview
 * before the run is recorded. The engine reads the file (shared/domain/samples-csv.ts: encodings,
 * preamble, header names and units, clock times, repeated times, the 0 V tail, pre-trigger
 * readings); this service refuses what is not text, keeps the reading within its limits, and
 * turns the engine's refusals into the API's. Nothing is stored.
 */
import { DECAY_RUN_MAX_SAMPLES, DECAY_RUN_TEXT_LIMITS } from '../../../shared/constants/decay-runs';
import { LOGGER_FILE_CANDIDATE_ROWS, LOGGER_FILE_MAX_LINES } from '../../../shared/constants/logger-files';
import { normaliseLineEnds, tokenizeCsv, type CsvSeparator } from '../../../shared/domain/csv-text';
import { EngineInputError } from '../../../shared/domain/errors';
import { formatNumber } from '../../../shared/domain/format';
import { LoggerColumnsQuestion, parseDecaySamplesCsv, type DecaySamplesCsv } from '../../../shared/domain/samples-csv';
import { decodeTextBytes } from '../../../shared/domain/text-decoding';
import { SAMPLE_MAX_SECONDS, SAMPLE_VOLTS } from '../../../shared/schemas/decay-run';
import type { LoggerColumnCandidates, LoggerFilePreview, LoggerFilePreviewFields } from '../../../shared/schemas/logger-file';
import { AppError } from '../errors';
import { yieldToEventLoop } from './csv-in-chunks';

/** A logger file as it arrived. */
export interface LoggerFileUpload {
  /** The file's name as sent. */
  name: string;
  bytes: Uint8Array;
}

/**
 * File kinds people pick by mistake, told by their first bytes (their "magic numbers"), whatever
 * their name: images, archives (a spreadsheet workbook is a zip), PDFs, old Office files.
 */
const BINARY_SIGNATURES: ReadonlyArray<{ kind: string; at?: number; bytes: readonly number[] }> = [
  { kind: 'a PNG image', bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a] },
  { kind: 'a JPEG image', bytes: [0xff, 0xd8, 0xff] },
  { kind: 'a GIF image', bytes: [0x47, 0x49, 0x46, 0x38] },
  { kind: 'a WebP image', at: 8, bytes: [0x57, 0x45, 0x42, 0x50] },
  { kind: 'a HEIF or MP4 file', at: 4, bytes: [0x66, 0x74, 0x79, 0x70] },
  { kind: 'a TIFF image', bytes: [0x49, 0x49, 0x2a, 0x00] },
  { kind: 'a TIFF image', bytes: [0x4d, 0x4d, 0x00, 0x2a] },
  { kind: 'a PDF document', bytes: [0x25, 0x50, 0x44, 0x46, 0x2d] },
  { kind: 'a zip archive (an .xlsx workbook is one)', bytes: [0x50, 0x4b, 0x03, 0x04] },
  { kind: 'a zip archive (an .xlsx workbook is one)', bytes: [0x50, 0x4b, 0x05, 0x06] },
  { kind: 'an old Office file (an .xls workbook?)', bytes: [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1] },
  { kind: 'a gzip archive', bytes: [0x1f, 0x8b] },
  { kind: 'a 7-Zip archive', bytes: [0x37, 0x7a, 0xbc, 0xaf, 0x27, 0x1c] },
  { kind: 'a RAR archive', bytes: [0x52, 0x61, 0x72, 0x21, 0x1a, 0x07] },
  { kind: 'a program', bytes: [0x7f, 0x45, 0x4c, 0x46] },
];

/** Characters of the text's start looked at for control characters. */
const SNIFF_CHARACTERS = 8192;
/** Share of control characters (other than tab, line ends and form feed) above which text is binary. */
const CONTROL_SHARE = 0.01;
/** Characters of the text counted for lines before the reader lets other work run. */
const LINE_COUNT_SLICE = 1024 * 1024;

function notText(message: string): AppError {
  return new AppError('not-a-text-file', message, [{ path: 'file', message }]);
}

const EXPORT_ADVICE = "Export the logger's or scope's readings as CSV (or text) and upload that file.";

/** Refuses bytes whose start says they are an image, an archive, a PDF or a program. */
function refuseKnownBinary(bytes: Uint8Array, name: string): void {
  for (const { kind, at = 0, bytes: signature } of BINARY_SIGNATURES) {
    if (bytes.length >= at + signature.length && signature.every((b, i) => bytes[at + i] === b)) {
      throw notText(`"${name}" is ${kind}, not a text file. ${EXPORT_ADVICE}`);
    }
  }
}

/** Refuses decoded text that holds many control characters: binary bytes read as Latin-1. */
function refuseControlCharacters(text: string, name: string): void {
  const length = Math.min(text.length, SNIFF_CHARACTERS);
  let controls = 0;
  for (let i = 0; i < length; i++) {
    const c = text.charCodeAt(i);
    // tab, LF, VT, FF, CR are text; 0x1A ends old DOS files
    if ((c < 0x20 && c !== 9 && c !== 10 && c !== 11 && c !== 12 && c !== 13 && c !== 0x1a) || c === 0x7f) controls++;
  }
  if (length > 0 && controls / length > CONTROL_SHARE) {
    throw notText(`"${name}" holds control characters that no text file has (a logger's binary format?). ${EXPORT_ADVICE}`);
  }
}

/**
 * Counts the text's lines in slices that give the event loop back between them; refuses
 * (413) as soon as there are more than {@link LOGGER_FILE_MAX_LINES}, before any reading.
 */
async function refuseTooManyLines(text: string): Promise<void> {
  const lineEnd = text.includes('\n') ? 10 : 13; // old Mac files end lines with CR alone
  const mark = String.fromCharCode(lineEnd);
  let lines = 1;
  for (let from = 0; from < text.length; from += LINE_COUNT_SLICE) {
    const to = Math.min(text.length, from + LINE_COUNT_SLICE);
    for (let at = text.indexOf(mark, from); at >= 0 && at < to; at = text.indexOf(mark, at + 1)) lines++;
    if (lines > LOGGER_FILE_MAX_LINES) {
      throw new AppError(
        'file-too-large',
        `The file has more than ${LOGGER_FILE_MAX_LINES.toLocaleString('en')} lines; a decay run needs a few hundred readings. Export the readings at a coarser sampling interval (every 10th or 100th) and upload that.`,
      );
    }
    await yieldToEventLoop();
  }
}

/** The 422 that offers the columns to choose from. */
function columnsAmbiguous(question: LoggerColumnsQuestion): AppError {
  const candidates: LoggerColumnCandidates = {
    question: question.path,
    headerRow: question.headerRow,
    columns: question.columns,
    rows: question.rows,
  };
  return new AppError('columns-ambiguous', question.message, [{ path: question.path, message: question.message }], { candidates });
}

/** Refuses the first reading a run cannot hold (SAMPLE_VOLTS, SAMPLE_MAX_SECONDS), naming its row. */
function refuseOutOfRange(read: DecaySamplesCsv): void {
  for (let i = 0; i < read.samples.length; i++) {
    const { tSeconds, volts } = read.samples[i]!;
    const row = read.rowNumbers[i];
    if (volts > SAMPLE_VOLTS.max || volts < SAMPLE_VOLTS.min) {
      const message = `Row ${row}, column "${read.voltageColumn}": ${formatNumber(volts, 4)} V is ${volts > 0 ? `above the ${SAMPLE_VOLTS.max} V` : `below the ${SAMPLE_VOLTS.min} V`} a decay run may hold. Is the column's unit right (V, mV or kV in its header)?`;
      throw new AppError('unreadable-file', message, [{ path: `row ${row}, column ${read.voltageColumn}`, message }]);
    }
    if (tSeconds > SAMPLE_MAX_SECONDS) {
      const message = `Row ${row}, column "${read.timeColumn}": ${formatNumber(tSeconds, 4)} s after the switch-off is beyond the ${SAMPLE_MAX_SECONDS.toLocaleString('en')} s a decay run may hold. Is the column's unit right (s, ms, min or h in its header)?`;
      throw new AppError('unreadable-file', message, [{ path: `row ${row}, column ${read.timeColumn}`, message }]);
    }
  }
}

/** The readings kept within a run's most samples: every `step`-th, from the first. */
function thin(read: DecaySamplesCsv): { samples: DecaySamplesCsv['samples']; rowNumbers: number[]; step: number } {
  const count = read.samples.length;
  if (count <= DECAY_RUN_MAX_SAMPLES) return { samples: read.samples, rowNumbers: read.rowNumbers, step: 1 };
  const step = Math.ceil(count / DECAY_RUN_MAX_SAMPLES);
  const samples: DecaySamplesCsv['samples'] = [];
  const rowNumbers: number[] = [];
  for (let i = 0; i < count; i += step) {
    samples.push(read.samples[i]!);
    rowNumbers.push(read.rowNumbers[i]!);
  }
  return { samples, rowNumbers, step };
}

/** Characters of the text's start in which the header and the rows under it are looked up (the header is within its first 100 lines). */
const HEADER_CHARACTERS = 256 * 1024;

/** The header row's cells and the first rows under it, as written, for choosing other columns. */
function headerOf(text: string, headerRow: number, separator: CsvSeparator): LoggerFilePreview['header'] {
  const lines = normaliseLineEnds(text.slice(0, HEADER_CHARACTERS)).text.split('\n');
  const below = lines.slice(headerRow, headerRow + 4 * LOGGER_FILE_CANDIDATE_ROWS).filter((line) => line.trim() !== '');
  const [columns = [], ...rows] = tokenizeCsv([lines[headerRow - 1] ?? '', ...below.slice(0, LOGGER_FILE_CANDIDATE_ROWS)].join('\n'), separator);
  return { columns: columns.map((cell) => cell.trim()), rows: rows.map((cells) => cells.map((cell) => cell.trim())) };
}

/** The file's name as a run keeps it: no folders, no control characters, within its length. */
function cleanFileName(name: string): string {
  // eslint-disable-next-line no-control-regex -- control characters are what is taken out
  const base = (name.split(/[\\/]/).pop() ?? '').replace(/[\u0000-\u001f\u007f]/g, '').trim();
  return (base || 'logger file').slice(0, DECAY_RUN_TEXT_LIMITS.loggerFileName);
}

const SEPARATOR_NAMES = { ',': 'comma', ';': 'semicolon', '\t': 'tab' } as const;

/**
 * Reads a logger or oscilloscope file as the readings of a decay run, for a preview; nothing is
 * stored. The bytes are decoded by the engine's text decoding and read by its decay reader
 * ({@link parseDecaySamplesCsv}); its notes become the warnings.
 *
 * Costs what its limits say: the size is bounded by the upload (LOGGER_FILE_MAX_BYTES), the lines
 * are counted in slices that give the event loop back, and a file past
 * {@link LOGGER_FILE_MAX_LINES} is refused before it is read; the engine then reads at most that
 * many lines in one step that does not yield (about 40 ms at the limit on this two-core machine
 * at rest, up to 0.2 s while it runs other work). A file of more readings than a run holds (DECAY_RUN_MAX_SAMPLES) keeps every n-th,
 * with a warning.
 *
 * @param file - the file's name and bytes
 * @param columns - the time and voltage columns chosen by the person (header text or 1-based number)
 * @returns the preview: samples in seconds since the switch-off and volts, their file rows, the
 *   columns read, what was left out, warnings
 * @throws AppError 'not-a-text-file' (an image, an archive, a PDF, a zero byte; whatever the
 *   name), 'file-too-large' (past the line limit), 'columns-ambiguous' (the names leave the time or
 *   the voltage open; `details.candidates` holds the header and the first rows),
 *   'unreadable-file' (the reader's reason, naming row and column)
 */
export async function previewLoggerFile(file: LoggerFileUpload, columns: LoggerFilePreviewFields): Promise<LoggerFilePreview> {
  const fileName = cleanFileName(file.name);
  refuseKnownBinary(file.bytes, fileName);
  let decoded: ReturnType<typeof decodeTextBytes>;
  try {
    decoded = decodeTextBytes(file.bytes);
  } catch (error) {
    // the decoding refuses only zero bytes that no text encoding explains
    if (error instanceof EngineInputError) throw notText(`"${fileName}" is not a text file: ${error.message}`);
    throw error;
  }
  refuseControlCharacters(decoded.text, fileName);
  await refuseTooManyLines(decoded.text);
  // what waited while the lines were counted goes first: the reading below does not yield
  await yieldToEventLoop();

  let read: DecaySamplesCsv;
  try {
    read = parseDecaySamplesCsv(decoded.text, {
      ...(columns.timeColumn !== undefined ? { timeColumn: columns.timeColumn } : {}),
      ...(columns.voltsColumn !== undefined ? { voltsColumn: columns.voltsColumn } : {}),
    });
  } catch (error) {
    if (error instanceof LoggerColumnsQuestion) throw columnsAmbiguous(error);
    if (error instanceof EngineInputError) throw new AppError('unreadable-file', error.message, [...error.issues]);
    throw error;
  }
  refuseOutOfRange(read);

  const preTrigger = read.preTrigger
    ? {
        readings: read.preTrigger.readingsLeftOut,
        found: read.preTrigger.found,
        switchOffFileSeconds: read.preTrigger.switchOffFileSeconds,
        levelVolts: read.preTrigger.levelVolts,
      }
    : null;
  const zeroTail = read.zeroTail ? { readings: read.zeroTail.readingsLeftOut, bandVolts: read.zeroTail.bandVolts } : null;
  const rowCount = read.samples.length + read.averagedRows + (preTrigger?.readings ?? 0) + (zeroTail?.readings ?? 0);
  const kept = thin(read);
  const warnings = [...read.notes];
  const thinned = kept.step > 1 ? { readings: read.samples.length - kept.samples.length, step: kept.step } : null;
  if (thinned) {
    warnings.push(
      `The file holds ${read.samples.length.toLocaleString('en')} readings; every ${kept.step === 2 ? 'second' : `${kept.step}th`} was kept (${kept.samples.length.toLocaleString('en')}), as a decay run holds at most ${DECAY_RUN_MAX_SAMPLES.toLocaleString('en')}.`,
    );
  }
  return {
    fileName,
    samples: kept.samples.map(({ tSeconds, volts }) => ({ tSeconds, volts })),
    rowNumbers: kept.rowNumbers,
    timeColumn: read.timeColumn,
    voltsColumn: read.voltageColumn,
    headerRow: read.headerRow,
    header: headerOf(decoded.text, read.headerRow, read.separator),
    rowCount,
    leftOut: { preTrigger, zeroTail, averagedRows: read.averagedRows, thinned },
    format: {
      encoding: decoded.encoding,
      separator: SEPARATOR_NAMES[read.separator],
      decimalComma: read.decimalComma,
      timeFormat: read.timeFormat,
    },
    warnings,
  };
}
