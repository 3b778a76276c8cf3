/**
 * A logger or oscilloscope file read for a decay run (`POST /api/logger-files/preview`, multipart:
 * `file`, optional `timeColumn` and `voltsColumn`): the fields sent beside the file, the preview
 * the API answers, and the columns offered when the file's names do not tell. Nothing is stored.
 */
import { z } from 'zod';
import { storableString } from './common';

/** Longest column choice accepted, characters (a header cell as written, or its number). */
export const COLUMN_CHOICE_MAX_CHARS = 200;

const columnChoice = (what: 'time' | 'voltage') =>
  z.preprocess(
    (value) => (typeof value === 'string' && value.trim() === '' ? undefined : value),
    storableString(`${what} column`, `Send the ${what} column as its header text or its number (1 for the first column).`)
      .max(COLUMN_CHOICE_MAX_CHARS, `The ${what} column is at most ${COLUMN_CHOICE_MAX_CHARS} characters.`)
      .optional(),
  );

/** The form fields of a logger-file preview; a blank choice counts as none. */
export const loggerFilePreviewFieldsSchema = z.object({
  /** The time column by its header text or 1-based number; found by its name when absent. */
  timeColumn: columnChoice('time'),
  /** The voltage column by its header text or 1-based number; found by its name when absent. */
  voltsColumn: columnChoice('voltage'),
});
export type LoggerFilePreviewFields = z.output<typeof loggerFilePreviewFieldsSchema>;

/** What was left out of the file's readings, each counted (the `warnings` say it in words). */
export interface LoggerFileLeftOut {
  /** Readings before the switch-off (a flat bus, or negative times), left out; t = 0 set at the switch-off. */
  preTrigger: { readings: number; found: 'flat-bus' | 'negative-times'; switchOffFileSeconds: number; levelVolts: number } | null;
  /** The tail at 0 V (within the noise band), left out. */
  zeroTail: { readings: number; bandVolts: number } | null;
  /** Rows merged into the row before because they repeated its time (averaged). */
  averagedRows: number;
  /** Readings left out to keep a run within its most samples: every `step`-th reading kept. */
  thinned: { readings: number; step: number } | null;
}

/** `POST /api/logger-files/preview`: the readings of a logger file, ready to judge and record. */
export interface LoggerFilePreview {
  /** The file's name as sent (for the run's `loggerFileName`). */
  fileName: string;
  /** The readings in seconds since the switch-off and volts, as a run sends them. */
  samples: Array<{ tSeconds: number; volts: number }>;
  /** The file's line number of each sample (same order), for messages. */
  rowNumbers: number[];
  /** The header cells read, as written. */
  timeColumn: string;
  voltsColumn: string;
  /** The file's line number of the header row. */
  headerRow: number;
  /** The header's cells (column 1 first) and the first rows under it, as written: to choose other columns. */
  header: { columns: string[]; rows: string[][] };
  /** Rows of readings read under the header, before anything was left out. */
  rowCount: number;
  leftOut: LoggerFileLeftOut;
  /** How the file was written: encoding, separator, decimal comma, how times are written. */
  format: {
    encoding: string;
    separator: 'comma' | 'semicolon' | 'tab';
    decimalComma: boolean;
    timeFormat: 'seconds' | 'clock' | 'timestamp';
  };
  /** What was read other than as written, or left out, one plain sentence each. */
  warnings: string[];
}

/**
 * The columns offered when the file's names do not tell which is the time or the voltage (the
 * 422 `columns-ambiguous` answer's `candidates`): the header cells and the first rows under it.
 */
export interface LoggerColumnCandidates {
  /** Which choice would settle it. */
  question: 'timeColumn' | 'voltsColumn';
  /** The file's line number of the header row. */
  headerRow: number;
  /** The header cells as written, in order (column 1 first). */
  columns: string[];
  /** The first rows under the header, cells as written. */
  rows: string[][];
}
