/**
 * Shutdown windows as a CSV file: its columns, one row's cells, and the preview and result
 * the import returns. The same rules as the cabinet import: rows numbered as a spreadsheet
 * shows them (header = row 1), every problem named by row and column, all rows or none.
 */
import { z } from 'zod';
import { isStorableText } from './common';
import type { ImportOutcome, ImportProblem, ImportQuestion } from './cabinet-import';

export type { ImportProblem, ImportQuestion } from './cabinet-import';

/** Columns of the template, in order, with what each holds. */
export const SHUTDOWN_WINDOW_IMPORT_COLUMNS = [
  { name: 'site', required: true, hint: 'code or name of an existing site, e.g. M' },
  { name: 'area', required: true, hint: 'name of an existing area of that site' },
  { name: 'title', required: true, hint: 'what the shutdown is, e.g. Weekend stop' },
  { name: 'start', required: true, hint: "local time at the site, YYYY-MM-DD HH:MM" },
  { name: 'end', required: true, hint: "local time at the site, YYYY-MM-DD HH:MM" },
  { name: 'recurrence', required: false, hint: 'blank for once, or an RRULE: FREQ=WEEKLY;BYDAY=SA;COUNT=8' },
  { name: 'notes', required: false, hint: 'free text' },
] as const;

export type ShutdownWindowImportColumn = (typeof SHUTDOWN_WINDOW_IMPORT_COLUMNS)[number]['name'];

const cell = (what: string, max: number, required: boolean) =>
  z.preprocess(
    (v) => (typeof v === 'string' ? v.trim() : ''),
    z
      .string()
      .refine(isStorableText, `${what} holds a character that cannot be stored (a NUL)`)
      .refine((s) => !required || s.length > 0, `${what} is missing`)
      .refine((s) => s.length <= max, `${what} is longer than ${max} characters`),
  );

/** One data row's cells, trimmed and checked for what needs no site (times are read in the site's zone later). */
export const shutdownWindowImportRowSchema = z.object({
  site: cell('site', 120, true),
  area: cell('area', 120, true),
  title: cell('title', 120, true),
  start: cell('start', 40, true),
  end: cell('end', 40, true),
  recurrence: cell('recurrence', 500, false),
  notes: cell('notes', 2000, false),
});
export type ShutdownWindowImportRow = z.output<typeof shutdownWindowImportRowSchema>;

/** One row of the preview, as read and as it would be stored. */
export interface ShutdownWindowImportPreviewRow {
  row: number;
  site: string;
  area: string;
  title: string;
  /** The site's time zone the times were read in; '' when the site is unknown. */
  timeZone: string;
  /** The instants of the first occurrence, UTC ISO; null when the cell could not be read. */
  startsAt: string | null;
  endsAt: string | null;
  recurrence: string | null;
  /** The recurrence in words, e.g. "every week on Saturday for 8 times"; "once" for none. */
  recurrenceText: string;
  values: Record<string, string>;
  problems: ImportProblem[];
  questions: ImportQuestion[];
}

/**
 * What the import found in a file; `committed` is true once it stored the rows. Its questions
 * are unlikely values (a start in the past, a window longer than a week), to confirm before importing.
 */
export type ShutdownWindowImportPreview = ImportOutcome<ShutdownWindowImportPreviewRow>;
