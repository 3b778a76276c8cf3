/**
 * What every CSV import of the register shares: reading the file in slices and checking each
 * row's cells, naming every problem by row and column, refusing a commit with problems or
 * unconfirmed unlikely values, the preview's counts, and writing in statements of a few hundred rows.
 */
import type { z } from 'zod';
import { IMPORT_MAX_ROWS, IMPORT_PROBLEMS_LISTED, IMPORT_ROWS_LISTED } from '../../../shared/constants/register';
import type { ImportOutcome, ImportProblem, ImportQuestion } from '../../../shared/schemas/cabinet-import';
import { AppError } from '../errors';
import { recordAuditBatch, type AuditRecordInput } from './audit';
import { readCsvInChunks, yieldToEventLoop } from './csv-in-chunks';
import type { UnitOfWork } from './unit-of-work';

/** An uploaded file: its name and bytes. */
export interface ImportFile {
  name: string;
  bytes: Buffer;
}

/** A column of an import's template. */
export interface ImportColumn {
  name: string;
  required: boolean;
}

/** What an import keeps of every row it read: its number, problems and questions. */
export interface ImportRowChecks {
  row: number;
  problems: ImportProblem[];
  questions: ImportQuestion[];
}

/** A file read: its rows and what it says of the file as a whole. */
export interface ImportRead<Row extends ImportRowChecks> {
  fileName: string;
  rows: Row[];
  fileProblems: ImportProblem[];
  ignoredColumns: string[];
}

// spreadsheet numbering: the header is row 1, the first data row is row 2
const FIRST_DATA_ROW = 2;

/** Rows checked between two turns of the event loop (a few milliseconds of schema checks). */
const ROWS_PER_TURN = 250;

/** Rows (and their audit entries) written in one statement of an import. */
const ROWS_PER_STATEMENT = 250;

/** "Drive Make", "drive-make" and "DRIVE_MAKE" all name the column drive_make. */
function columnName(header: string): string {
  return header.trim().toLowerCase().replace(/[\s-]+/g, '_');
}

/** The row limit, as the answer names it. */
function tooManyRows(): AppError {
  const limit = IMPORT_MAX_ROWS.toLocaleString('en-GB');
  const message = `The file has more than ${limit} rows; import at most ${limit} at a time. Split it and import the parts.`;
  return new AppError('file-too-large', message, [{ path: 'file', message }]);
}

/** How one import reads its file's rows. */
export interface ImportRowReading<Data, Row extends ImportRowChecks> {
  columns: readonly ImportColumn[];
  /** The text of the file's bytes. */
  decode: (bytes: Buffer) => string;
  /** One data row's cells, checked. */
  schema: z.ZodType<Data>;
  /** The reason given for a row with more cells than the header. */
  tooManyCellsReason: string;
  /** The row an import keeps, from its cells, their checked data (null when they failed) and problems so far. */
  toRow: (row: number, values: Record<string, string>, data: Data | null, problems: ImportProblem[]) => Row;
}

/**
 * Reads the file and checks every row's cells against the schema and the file itself (no database).
 * Parsing and checking go in slices that let other requests run between them.
 * @throws AppError `file-too-large` as soon as the file passes IMPORT_MAX_ROWS data rows
 */
export async function readImportRows<Data, Row extends ImportRowChecks>(
  file: ImportFile,
  reading: ImportRowReading<Data, Row>,
): Promise<ImportRead<Row>> {
  const knownColumns = new Set<string>(reading.columns.map((c) => c.name));
  const csv = await readCsvInChunks(reading.decode(file.bytes), { maxRows: IMPORT_MAX_ROWS, transformHeader: columnName });
  if (csv.overRowLimit) throw tooManyRows();
  const fields = csv.fields;
  const fileProblems: ImportProblem[] = [];
  for (const column of reading.columns.filter((c) => c.required).map((c) => c.name)) {
    if (!fields.includes(column)) fileProblems.push({ row: 1, column, reason: 'this column is missing from the header' });
  }
  if (csv.rows.length === 0) fileProblems.push({ row: 1, column: '', reason: 'the file has no data rows under the header' });
  const ignoredColumns = fields.filter((f) => f && !knownColumns.has(f));

  const rows: Row[] = [];
  for (let start = 0; start < csv.rows.length; start += ROWS_PER_TURN) {
    if (start > 0) await yieldToEventLoop();
    for (const [offset, raw] of csv.rows.slice(start, start + ROWS_PER_TURN).entries()) {
      const row = start + offset + FIRST_DATA_ROW;
      const values: Record<string, string> = {};
      for (const column of knownColumns) values[column] = (raw[column] ?? '').toString();
      const result = reading.schema.safeParse(values);
      const problems: ImportProblem[] = result.success
        ? []
        : result.error.issues.map((issue) => ({ row, column: String(issue.path[0] ?? ''), reason: issue.message }));
      rows.push(reading.toRow(row, values, result.success ? result.data : null, problems));
    }
  }
  for (const error of csv.errors) {
    const target = error.dataIndex !== undefined ? rows[error.dataIndex] : undefined;
    const problem = {
      row: (error.dataIndex ?? 0) + FIRST_DATA_ROW,
      column: '',
      reason:
        error.code === 'TooFewFields'
          ? 'the row has fewer cells than the header'
          : error.code === 'TooManyFields'
            ? reading.tooManyCellsReason
            : error.message,
    };
    if (target) target.problems.push(problem);
    else fileProblems.push(problem);
  }
  return { fileName: file.name, rows, fileProblems, ignoredColumns };
}

/** Puts every row's problems in the order of the template's columns (file-wide ones first). */
export function sortProblemsByColumn(rows: readonly ImportRowChecks[], columns: readonly ImportColumn[]): void {
  const order = (column: string) => columns.findIndex((c) => c.name === column);
  for (const r of rows) r.problems.sort((a, b) => order(a.column) - order(b.column));
}

/** Every problem of the file, in row order. */
function allProblems(read: ImportRead<ImportRowChecks>): ImportProblem[] {
  return [...read.fileProblems, ...read.rows.flatMap((r) => r.problems)];
}

/** Every question of the file, in row order. */
function allQuestions(read: ImportRead<ImportRowChecks>): ImportQuestion[] {
  return read.rows.flatMap((r) => r.questions);
}

/** The refusal of a commit: how many problems on how many rows, the first ones listed. */
function importRejected(problems: ImportProblem[]): AppError {
  const rowsWithProblems = new Set(problems.map((p) => p.row)).size;
  const listed = problems.slice(0, IMPORT_PROBLEMS_LISTED);
  const more = problems.length > listed.length ? ` The first ${listed.length} are listed; ${problems.length - listed.length} more are not.` : '';
  return new AppError(
    'import-rejected',
    `${problems.length} problem(s) on ${rowsWithProblems} row(s); nothing was imported. Fix the file and upload it again.${more}`,
    listed.map((p) => ({ path: `row ${p.row}${p.column ? `, column ${p.column}` : ''}`, message: p.reason })),
  );
}

/** The refusal of a commit whose unlikely values are not confirmed: the rows and columns, the first ones listed. */
function questionsUnconfirmed(questions: ImportQuestion[]): AppError {
  const rowsAsked = new Set(questions.map((q) => q.row)).size;
  const listed = questions.slice(0, IMPORT_PROBLEMS_LISTED);
  const more = questions.length > listed.length ? ` The first ${listed.length} are listed; ${questions.length - listed.length} more are not.` : '';
  return new AppError(
    'confirmation-needed',
    `Are you sure? ${questions.length} unlikely value(s) on ${rowsAsked} row(s); nothing was imported. Correct them in the file, or confirm them to import it as it is.${more}`,
    listed.map((q) => ({ path: `row ${q.row}, column ${q.column}`, message: q.message })),
  );
}

/**
 * Refuses a commit of a checked file with any problem, or with an unlikely value not confirmed.
 * @throws AppError `import-rejected` listing the first IMPORT_PROBLEMS_LISTED problems (path "row N, column C")
 * @throws AppError `confirmation-needed` listing the first IMPORT_PROBLEMS_LISTED questions, unless `confirmed`
 */
export function refuseUnlessImportable(read: ImportRead<ImportRowChecks>, confirmed: boolean): void {
  const problems = allProblems(read);
  if (problems.length > 0) throw importRejected(problems);
  const questions = allQuestions(read);
  if (questions.length > 0 && !confirmed) throw questionsUnconfirmed(questions);
}

/**
 * The preview: counts of everything, the first problems and rows one by one (the answer stays
 * small), and what only one import tells (`extra`, after the rows).
 */
export function importPreviewOf<Row extends ImportRowChecks, PreviewRow, Extra extends object>(
  read: ImportRead<Row>,
  outcome: { validCount: number; toPreviewRow: (row: Row) => PreviewRow; extra: Extra; committed: boolean; createdCount: number },
): ImportOutcome<PreviewRow> & Extra {
  const problems = allProblems(read);
  const questions = allQuestions(read);
  return {
    fileName: read.fileName,
    rowCount: read.rows.length,
    validCount: outcome.validCount,
    problemCount: problems.length,
    problems: problems.slice(0, IMPORT_PROBLEMS_LISTED),
    problemsNotListed: Math.max(0, problems.length - IMPORT_PROBLEMS_LISTED),
    questionCount: questions.length,
    questions: questions.slice(0, IMPORT_PROBLEMS_LISTED),
    questionsNotListed: Math.max(0, questions.length - IMPORT_PROBLEMS_LISTED),
    rows: read.rows.slice(0, IMPORT_ROWS_LISTED).map(outcome.toPreviewRow),
    ...outcome.extra,
    ignoredColumns: read.ignoredColumns,
    committed: outcome.committed,
    createdCount: outcome.createdCount,
  };
}

/** Writes `items` in statements of a few hundred: building one statement never holds other requests up for long. */
export async function writeInStatements<T, R>(items: readonly T[], write: (slice: T[]) => Promise<R[]>): Promise<R[]> {
  const written: R[] = [];
  for (let start = 0; start < items.length; start += ROWS_PER_STATEMENT) {
    written.push(...(await write(items.slice(start, start + ROWS_PER_STATEMENT))));
  }
  return written;
}

/** Records an import's audit entries in the same few hundreds: one statement's JSON never holds other requests up for long. */
export async function recordImportAudit(uow: UnitOfWork, audit: readonly AuditRecordInput[]): Promise<void> {
  for (let start = 0; start < audit.length; start += ROWS_PER_STATEMENT) {
    await recordAuditBatch(uow, audit.slice(start, start + ROWS_PER_STATEMENT));
  }
}
