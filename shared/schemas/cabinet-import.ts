/**
 * The cabinet register as a CSV file: its columns, one row's schema, and the preview and
 * result the import returns. Rows are numbered as a spreadsheet shows them (header = row 1).
 */
import { z } from 'zod';
import { CRITICALITIES, EDITABLE_CABINET_STATUSES } from '../constants/register';
import { cabinetTagSchema } from './cabinet';
import { DATE_YEARS, isInDateYears, isStorableText } from './common';

/** Columns of the template, in order, with what each holds. */
export const CABINET_IMPORT_COLUMNS = [
  { name: 'site_code', required: true, hint: 'code of an existing site, e.g. M' },
  { name: 'area', required: true, hint: 'area name; a new name creates the area' },
  { name: 'tag', required: true, hint: 'cabinet tag, unique in the register' },
  { name: 'location', required: false, hint: 'where the cabinet stands' },
  { name: 'drive_make', required: false, hint: 'drive maker, free text' },
  { name: 'drive_model', required: false, hint: 'drive model, free text' },
  { name: 'supply_volts', required: true, hint: 'AC line voltage, V' },
  { name: 'dc_bus_volts', required: false, hint: 'nominal DC-bus voltage, V' },
  { name: 'rated_power_kw', required: false, hint: 'rated power, kW' },
  { name: 'marked_wait_minutes', required: false, hint: "maker's marked wait time, min" },
  { name: 'criticality', required: false, hint: CRITICALITIES.join(' / ') },
  { name: 'environment_notes', required: false, hint: 'dust, heat, damp…' },
  { name: 'commissioned_on', required: false, hint: 'YYYY-MM-DD' },
  { name: 'status', required: false, hint: EDITABLE_CABINET_STATUSES.join(' / ') },
] as const;

export type CabinetImportColumn = (typeof CABINET_IMPORT_COLUMNS)[number]['name'];

const blankToUndefined = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);

/** A number cell: blank is empty, a decimal comma is accepted (European spreadsheets). */
function numberCell(what: string, max: number, unit: string): z.ZodType<number>;
function numberCell(what: string, max: number, unit: string, optional: true): z.ZodType<number | undefined>;
function numberCell(what: string, max: number, unit: string, optional = false): z.ZodType<number | undefined> {
  const n = z
    .number({ error: optional ? `${what} must be a number` : `${what} is missing or not a number` })
    .positive(`${what} must be greater than zero`)
    .max(max, `${what} above ${max.toLocaleString('en-GB')} ${unit}`);
  return z.preprocess((v) => {
    const s = blankToUndefined(v);
    if (typeof s !== 'string') return s;
    const parsed = Number(s.trim().replace(/\s/g, '').replace(',', '.'));
    return Number.isFinite(parsed) ? parsed : s;
  }, optional ? n.optional() : n);
}

/** A cell's text as PostgreSQL can store it (a NUL byte in the file cannot be). */
const storableCell = (what: string) =>
  z.string({ error: `${what} is missing` }).refine(isStorableText, `${what} holds a character that cannot be stored (a NUL)`);

const textCell = (max: number) =>
  z.preprocess((v) => (typeof v === 'string' ? v.trim() : ''), storableCell('the cell').max(max, `longer than ${max} characters`));

/** One data row of the CSV, cells as strings, validated and converted. */
export const cabinetImportRowSchema = z.object({
  site_code: z.preprocess(
    (v) => (typeof v === 'string' ? v.trim().toUpperCase() : v),
    storableCell('site code').min(1, 'site code is missing'),
  ),
  area: z.preprocess(
    (v) => (typeof v === 'string' ? v.trim() : v),
    storableCell('area').min(1, 'area is missing').max(120, 'longer than 120 characters'),
  ),
  tag: z.preprocess((v) => (v === undefined ? '' : v), cabinetTagSchema),
  location: textCell(200),
  drive_make: textCell(80),
  drive_model: textCell(80),
  supply_volts: numberCell('supply voltage', 15_000, 'V'),
  dc_bus_volts: numberCell('DC-bus voltage', 20_000, 'V', true),
  rated_power_kw: numberCell('rated power', 100_000, 'kW', true),
  marked_wait_minutes: z.preprocess(
    (v) => {
      const s = blankToUndefined(v);
      return typeof s === 'string' && /^\s*\d+\s*$/.test(s) ? Number(s) : s;
    },
    z
      .number({ error: 'marked wait time must be whole minutes' })
      .int()
      .min(1, 'marked wait time must be at least 1 min (leave it blank when not marked)')
      .max(240, 'marked wait time above 240 min')
      .optional(),
  ),
  criticality: z.preprocess(
    (v) => (typeof blankToUndefined(v) === 'string' ? (v as string).trim().toLowerCase() : undefined),
    z.enum(CRITICALITIES, { error: `criticality must be one of ${CRITICALITIES.join(', ')}` }).default('medium'),
  ),
  environment_notes: textCell(1000),
  commissioned_on: z.preprocess(
    (v) => (typeof blankToUndefined(v) === 'string' ? (v as string).trim() : undefined),
    z.iso
      .date({ error: 'commissioning date must be YYYY-MM-DD' })
      .refine(isInDateYears, `commissioning date must be between ${DATE_YEARS.min} and ${DATE_YEARS.max}`)
      .optional(),
  ),
  status: z.preprocess(
    (v) =>
      typeof blankToUndefined(v) === 'string' ? (v as string).trim().toLowerCase().replace(/\s+/g, '-') : undefined,
    z.enum(EDITABLE_CABINET_STATUSES, { error: 'status must be in-service or out-of-service' }).default('in-service'),
  ),
});
export type CabinetImportRow = z.output<typeof cabinetImportRowSchema>;

/** One problem of one row: row number as the spreadsheet shows it, column, reason. */
export interface ImportProblem {
  row: number;
  column: string;
  reason: string;
}

/**
 * One question about one row: a value that may be right but is unlikely (a DC bus far from the
 * supply's rectifier arithmetic, a date more than a year ahead), in the words the register's
 * forms use. The import stores such a row only once the person confirms it.
 */
export interface ImportQuestion {
  row: number;
  column: string;
  message: string;
}

/** One row of the preview, as read, with its problems. */
export interface ImportPreviewRow {
  row: number;
  tag: string;
  siteCode: string;
  area: string;
  /** True when the row's area does not exist yet and the import would create it. */
  newArea: boolean;
  values: Record<string, string>;
  problems: ImportProblem[];
  /** Unlikely values of the row, to confirm before it is imported. */
  questions: ImportQuestion[];
}

/**
 * What an import found in a file, whatever it imports: counts, the first problems and questions,
 * and the first rows; `committed` is true once it stored the rows.
 */
export interface ImportOutcome<Row> {
  fileName: string;
  /** Data rows in the file. */
  rowCount: number;
  validCount: number;
  /** Problems found in the whole file. */
  problemCount: number;
  /** The first problems in row order (at most IMPORT_PROBLEMS_LISTED). */
  problems: ImportProblem[];
  /** Problems found but not listed in `problems`: problemCount − problems.length. */
  problemsNotListed: number;
  /** Unlikely values found in the whole file, each to confirm before the import stores it. */
  questionCount: number;
  /** The first questions in row order (at most IMPORT_PROBLEMS_LISTED). */
  questions: ImportQuestion[];
  /** Questions found but not listed in `questions`: questionCount − questions.length. */
  questionsNotListed: number;
  /** The first rows of the file (at most IMPORT_ROWS_LISTED), each with its own problems. */
  rows: Row[];
  /** Columns of the file that the import does not know and leaves out. */
  ignoredColumns: string[];
  committed: boolean;
  createdCount: number;
}

/** What the cabinet import found in a file; `committed` is true once it stored the rows. */
export interface ImportPreview extends ImportOutcome<ImportPreviewRow> {
  /** New areas the import would create, as "site code / area". */
  newAreas: string[];
}
