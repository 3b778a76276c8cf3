/**
 * Importing a cabinet register from CSV (as typed, or exported from a spreadsheet): read the
 * file, name every row's problems (row, column, reason), and commit all rows or none.
 */
import Papa from 'papaparse';
import { Op, type Transaction } from 'sequelize';
import { IMPORT_MAX_ROWS, IMPORT_PROBLEMS_LISTED, IMPORT_ROWS_LISTED } from '../../../shared/constants/register';
import {
  CABINET_IMPORT_COLUMNS,
  cabinetImportRowSchema,
  type CabinetImportRow,
  type ImportPreview,
  type ImportPreviewRow,
  type ImportProblem,
  type ImportQuestion,
} from '../../../shared/schemas/cabinet-import';
import { sequelize } from '../db/sequelize';
import { AppError } from '../errors';
import { Area } from '../models/area';
import { Cabinet } from '../models/cabinet';
import { Site } from '../models/site';
import { recordAuditBatch, type AuditRecordInput } from './audit';
import { readCsvInChunks, yieldToEventLoop } from './csv-in-chunks';
import { AREA_AUDITED, CABINET_AUDITED } from './audited-fields';
import { cabinetQuestions, dateOn } from './register-checks';
import { snapshotOf } from './register-records';
import type { UnitOfWork } from './unit-of-work';

/** An uploaded file: its name and bytes. */
export interface ImportFile {
  name: string;
  bytes: Buffer;
}

const KNOWN_COLUMNS = new Set<string>(CABINET_IMPORT_COLUMNS.map((c) => c.name));
const REQUIRED_COLUMNS = CABINET_IMPORT_COLUMNS.filter((c) => c.required).map((c) => c.name);
// spreadsheet numbering: the header is row 1, the first data row is row 2
const FIRST_DATA_ROW = 2;

/** The template: the header and two example rows. */
export function cabinetImportTemplate(): string {
  const header = CABINET_IMPORT_COLUMNS.map((c) => c.name);
  const examples = [
    ['M', 'Line 2', 'BRK-M2-VFD-101', 'Line 2 mezzanine, bay 4', 'Tarnwick Drives', 'TW-55', '400', '540', '55', '5', 'high', 'warm, dusty', '2019-04-01', 'in-service'],
    ['M', 'Line 2', 'BRK-M2-VFD-102', 'Line 2 mezzanine, bay 5', 'Quellbrook Motion', 'QM-200', '400', '', '22', '', 'medium', '', '', 'in-service'],
  ];
  return Papa.unparse({ fields: header, data: examples }, { newline: '\r\n' }) + '\r\n';
}

/** Text of the file: UTF-8 (with or without BOM), else Windows-1252 as older spreadsheets save it. */
function decode(bytes: Buffer): string {
  try {
    return new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes);
  } catch {
    return new TextDecoder('windows-1252').decode(bytes);
  }
}

/** "Drive Make", "drive-make" and "DRIVE_MAKE" all name the column drive_make. */
function columnName(header: string): string {
  return header.trim().toLowerCase().replace(/[\s-]+/g, '_');
}

interface ReadRow {
  row: number;
  values: Record<string, string>;
  data: CabinetImportRow | null;
  problems: ImportProblem[];
  questions: ImportQuestion[];
  areaId: string | null;
  siteId: string | null;
  newArea: boolean;
}

interface ReadFile {
  fileName: string;
  rows: ReadRow[];
  fileProblems: ImportProblem[];
  ignoredColumns: string[];
  newAreas: Map<string, { siteId: string; name: string }>;
}

/** The file's column of each cabinet field the register's plausibility checks question. */
const COLUMN_OF_FIELD: Record<string, string> = { dcBusVolts: 'dc_bus_volts', commissionedOn: 'commissioned_on' };

/** The questions the cabinet form would ask about a row's values (the same rules, the same words). */
function rowQuestions(row: number, data: CabinetImportRow, asOfOn: string): ImportQuestion[] {
  const figures = { supplyVolts: data.supply_volts, dcBusVolts: data.dc_bus_volts ?? null, commissionedOn: data.commissioned_on ?? null };
  return cabinetQuestions(figures, 'all', asOfOn).map((issue) => ({ row, column: COLUMN_OF_FIELD[issue.path] ?? issue.path, message: issue.message }));
}

/** Rows checked between two turns of the event loop (a few milliseconds of schema checks). */
const ROWS_PER_TURN = 250;

/** The row limit, as the answer names it. */
function tooManyRows(): AppError {
  const limit = IMPORT_MAX_ROWS.toLocaleString('en-GB');
  const message = `The file has more than ${limit} rows; import at most ${limit} at a time. Split it and import the parts.`;
  return new AppError('file-too-large', message, [{ path: 'file', message }]);
}

/**
 * Reads the file and checks every row against the schema and the file itself (no database).
 * Parsing and checking go in slices that let other requests run between them.
 * @throws AppError `file-too-large` as soon as the file passes IMPORT_MAX_ROWS data rows
 */
async function readRows(file: ImportFile, asOfOn: string): Promise<ReadFile> {
  const csv = await readCsvInChunks(decode(file.bytes), { maxRows: IMPORT_MAX_ROWS, transformHeader: columnName });
  if (csv.overRowLimit) throw tooManyRows();
  const fields = csv.fields;
  const fileProblems: ImportProblem[] = [];
  for (const column of REQUIRED_COLUMNS) {
    if (!fields.includes(column)) fileProblems.push({ row: 1, column, reason: 'this column is missing from the header' });
  }
  if (csv.rows.length === 0) fileProblems.push({ row: 1, column: '', reason: 'the file has no data rows under the header' });
  const ignoredColumns = fields.filter((f) => f && !KNOWN_COLUMNS.has(f));

  const rows: ReadRow[] = [];
  for (let start = 0; start < csv.rows.length; start += ROWS_PER_TURN) {
    if (start > 0) await yieldToEventLoop();
    for (const [offset, raw] of csv.rows.slice(start, start + ROWS_PER_TURN).entries()) {
      const row = start + offset + FIRST_DATA_ROW;
      const values: Record<string, string> = {};
      for (const column of KNOWN_COLUMNS) values[column] = (raw[column] ?? '').toString();
      const result = cabinetImportRowSchema.safeParse(values);
      const problems: ImportProblem[] = result.success
        ? []
        : result.error.issues.map((issue) => ({ row, column: String(issue.path[0] ?? ''), reason: issue.message }));
      const questions = result.success ? rowQuestions(row, result.data, asOfOn) : [];
      rows.push({ row, values, data: result.success ? result.data : null, problems, questions, areaId: null, siteId: null, newArea: false });
    }
  }
  for (const error of csv.errors) {
    const target = error.dataIndex !== undefined ? rows[error.dataIndex] : undefined;
    const problem = {
      row: (error.dataIndex ?? 0) + FIRST_DATA_ROW,
      column: '',
      reason: error.code === 'TooFewFields' ? 'the row has fewer cells than the header' : error.code === 'TooManyFields' ? 'the row has more cells than the header' : error.message,
    };
    if (target) target.problems.push(problem);
    else fileProblems.push(problem);
  }

  // a tag twice in the file
  const firstRowOfTag = new Map<string, number>();
  for (const r of rows) {
    if (!r.data) continue;
    const key = r.data.tag.toLowerCase();
    const first = firstRowOfTag.get(key);
    if (first !== undefined) r.problems.push({ row: r.row, column: 'tag', reason: `${r.data.tag} is also on row ${first}` });
    else firstRowOfTag.set(key, r.row);
  }
  return { fileName: file.name, rows, fileProblems, ignoredColumns, newAreas: new Map() };
}

/** Checks the rows read against the register: sites by code, areas by name, tags in use. */
async function checkAgainstRegister(read: ReadFile, transaction?: Transaction): Promise<ReadFile> {
  const { rows } = read;
  const valid = rows.filter((r) => r.data);
  const codes = [...new Set(valid.map((r) => r.data!.site_code.toLowerCase()))];
  const sites = codes.length
    ? await Site.findAll({ where: { retiredAt: null, [Op.and]: [sequelize.where(sequelize.fn('lower', sequelize.col('code')), { [Op.in]: codes })] }, transaction })
    : [];
  const siteByCode = new Map(sites.map((s) => [s.code.toLowerCase(), s]));
  const areas = sites.length ? await Area.findAll({ where: { retiredAt: null, siteId: sites.map((s) => s.id) }, transaction }) : [];
  const areaByKey = new Map(areas.map((a) => [`${a.siteId}|${a.name.toLowerCase()}`, a]));
  const tags = [...new Set(valid.map((r) => r.data!.tag.toLowerCase()))];
  const taken = new Set<string>();
  for (let i = 0; i < tags.length; i += 1000) {
    const chunk = tags.slice(i, i + 1000);
    const found = await Cabinet.findAll({
      attributes: ['tag'],
      where: { retiredAt: null, [Op.and]: [sequelize.where(sequelize.fn('lower', sequelize.col('tag')), { [Op.in]: chunk })] },
      transaction,
    });
    for (const c of found) taken.add(c.tag.toLowerCase());
  }

  const newAreas = new Map<string, { siteId: string; name: string }>();
  for (const r of valid) {
    const data = r.data!;
    if (taken.has(data.tag.toLowerCase())) r.problems.push({ row: r.row, column: 'tag', reason: `${data.tag} is already in the register` });
    const site = siteByCode.get(data.site_code.toLowerCase());
    if (!site) {
      r.problems.push({ row: r.row, column: 'site_code', reason: `no site in use has the code ${data.site_code}` });
      continue;
    }
    r.siteId = site.id;
    const key = `${site.id}|${data.area.toLowerCase()}`;
    const area = areaByKey.get(key);
    if (area) r.areaId = area.id;
    else {
      r.newArea = true;
      if (!newAreas.has(key)) newAreas.set(key, { siteId: site.id, name: data.area });
    }
  }
  for (const r of rows) r.problems.sort((a, b) => order(a.column) - order(b.column));
  return { ...read, newAreas };
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

function order(column: string): number {
  const i = CABINET_IMPORT_COLUMNS.findIndex((c) => c.name === column);
  return i < 0 ? -1 : i;
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

/** Every question of the file, in row order. */
function allQuestions(read: ReadFile): ImportQuestion[] {
  return read.rows.flatMap((r) => r.questions);
}

/** Every problem of the file, in row order. */
function allProblems(read: ReadFile): ImportProblem[] {
  return [...read.fileProblems, ...read.rows.flatMap((r) => r.problems)];
}

/** The preview: counts of everything, the first problems and rows one by one (the answer stays small). */
function toPreview(read: ReadFile, committed: boolean, createdCount: number): ImportPreview {
  const problems = allProblems(read);
  const questions = allQuestions(read);
  const siteCodeOf = new Map(read.rows.filter((r) => r.siteId).map((r) => [r.siteId!, r.data!.site_code]));
  const rows: ImportPreviewRow[] = read.rows.slice(0, IMPORT_ROWS_LISTED).map((r) => ({
    row: r.row,
    tag: r.data?.tag ?? r.values.tag ?? '',
    siteCode: r.data?.site_code ?? r.values.site_code ?? '',
    area: r.data?.area ?? r.values.area ?? '',
    newArea: r.newArea,
    values: r.values,
    problems: r.problems,
    questions: r.questions,
  }));
  return {
    fileName: read.fileName,
    rowCount: read.rows.length,
    validCount: read.rows.filter((r) => r.problems.length === 0 && r.data).length,
    problemCount: problems.length,
    problems: problems.slice(0, IMPORT_PROBLEMS_LISTED),
    problemsNotListed: Math.max(0, problems.length - IMPORT_PROBLEMS_LISTED),
    questionCount: questions.length,
    questions: questions.slice(0, IMPORT_PROBLEMS_LISTED),
    questionsNotListed: Math.max(0, questions.length - IMPORT_PROBLEMS_LISTED),
    rows,
    newAreas: [...read.newAreas.values()].map((a) => `${siteCodeOf.get(a.siteId) ?? ''} / ${a.name}`),
    ignoredColumns: read.ignoredColumns,
    committed,
    createdCount,
  };
}

/** Cabinets (and their audit entries) written in one statement of an import. */
const ROWS_PER_STATEMENT = 250;

/** Inserts rows of a checked import as cabinets, in one statement. */
function insertCabinets(rows: ReadRow[], areaIdByKey: Map<string, string>, transaction: Transaction): Promise<Cabinet[]> {
  return Cabinet.bulkCreate(
    rows.map((r) => {
      const d = r.data!;
      return {
        areaId: r.areaId ?? areaIdByKey.get(`${r.siteId}|${d.area.toLowerCase()}`)!,
        tag: d.tag,
        location: d.location,
        driveMake: d.drive_make,
        driveModel: d.drive_model,
        supplyVolts: d.supply_volts,
        dcBusVolts: d.dc_bus_volts ?? null,
        ratedPowerKilowatts: d.rated_power_kw ?? null,
        markedWaitMinutes: d.marked_wait_minutes ?? null,
        criticality: d.criticality,
        environmentNotes: d.environment_notes,
        commissionedOn: d.commissioned_on ?? null,
        status: d.status,
      };
    }),
    { transaction, returning: true },
  );
}

/**
 * Reads a file and says what importing it would do, storing nothing: its problems, and its
 * unlikely values as questions.
 * @param asOfOn - today (`YYYY-MM-DD`), for the question about dates more than a year ahead
 */
export async function previewCabinetImport(file: ImportFile, asOfOn: string): Promise<ImportPreview> {
  return toPreview(await checkAgainstRegister(await readRows(file, asOfOn)), false, 0);
}

/**
 * Imports every row of the file in the unit of work: new areas first, then the cabinets, each
 * with its audit entry. When any row has a problem, or an unlikely value the request does not
 * confirm, nothing is stored.
 * @param confirmed - the person has checked the file's unlikely values and keeps them
 * @throws AppError `import-rejected` listing the first IMPORT_PROBLEMS_LISTED problems (path "row N, column C")
 * @throws AppError `confirmation-needed` listing the first IMPORT_PROBLEMS_LISTED questions, unless `confirmed`
 * @throws AppError `file-too-large` when the file has more than IMPORT_MAX_ROWS rows
 */
export async function importCabinets(uow: UnitOfWork, file: ImportFile, confirmed = false): Promise<ImportPreview> {
  const { transaction } = uow;
  // the file is read before the table lock, so the lock is held only for the register checks and the writes
  const rowsRead = await readRows(file, dateOn(uow.now));
  // a table lock keeps two imports (or an import and a form) from taking the same tag at once
  await sequelize.query('LOCK TABLE cabinets IN SHARE ROW EXCLUSIVE MODE', { transaction });
  const read = await checkAgainstRegister(rowsRead, transaction);
  const problems = allProblems(read);
  if (problems.length > 0) throw importRejected(problems);
  const questions = allQuestions(read);
  if (questions.length > 0 && !confirmed) throw questionsUnconfirmed(questions);
  const audit: AuditRecordInput[] = [];
  const areaIdByKey = new Map<string, string>();
  for (const [key, area] of read.newAreas) {
    const created = await Area.create({ siteId: area.siteId, name: area.name, description: '' }, { transaction });
    areaIdByKey.set(key, created.id);
    audit.push({
      entityType: 'area',
      entityId: created.id,
      action: 'import',
      summary: `Added area ${created.name} while importing ${file.name}`,
      before: null,
      after: snapshotOf(created, AREA_AUDITED),
    });
  }
  const cabinets: Cabinet[] = [];
  // in statements of a few hundred rows: building one statement never holds other requests up for long
  for (let start = 0; start < read.rows.length; start += ROWS_PER_STATEMENT) {
    cabinets.push(...(await insertCabinets(read.rows.slice(start, start + ROWS_PER_STATEMENT), areaIdByKey, transaction)));
  }
  // bulkCreate returns the cabinets in the order of the rows
  for (const [i, cabinet] of cabinets.entries()) {
    const asked = read.rows[i]?.questions.map((q) => q.column) ?? [];
    audit.push({
      entityType: 'cabinet',
      entityId: cabinet.id,
      action: 'import',
      summary: `Imported cabinet ${cabinet.tag} from ${file.name}${asked.length ? ` (unlikely ${asked.join(' and ')} confirmed)` : ''}`,
      before: null,
      after: snapshotOf(cabinet, CABINET_AUDITED),
    });
  }
  // the audit entries in the same few hundreds: one statement's JSON never holds other requests up for long
  for (let start = 0; start < audit.length; start += ROWS_PER_STATEMENT) {
    await recordAuditBatch(uow, audit.slice(start, start + ROWS_PER_STATEMENT));
  }
  return toPreview(read, true, cabinets.length);
}
