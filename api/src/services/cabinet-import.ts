/**
 * Importing a cabinet register from CSV (as typed, or exported from a spreadsheet): read the
 * file, name every row's problems (row, column, reason), and commit all rows or none.
 */
import Papa from 'papaparse';
import { Op, type Transaction } from 'sequelize';
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
import { Area } from '../models/area';
import { Cabinet } from '../models/cabinet';
import { Site } from '../models/site';
import type { AuditRecordInput } from './audit';
import {
  importPreviewOf,
  readImportRows,
  recordImportAudit,
  refuseUnlessImportable,
  sortProblemsByColumn,
  writeInStatements,
  type ImportFile,
  type ImportRead,
} from './csv-import';
import { AREA_AUDITED, CABINET_AUDITED } from './audited-fields';
import { cabinetQuestions, dateOn } from './register-checks';
import { snapshotOf } from './register-records';
import type { UnitOfWork } from './unit-of-work';

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

interface ReadFile extends ImportRead<ReadRow> {
  newAreas: Map<string, { siteId: string; name: string }>;
}

/** The file's column of each cabinet field the register's plausibility checks question. */
const COLUMN_OF_FIELD: Record<string, string> = { dcBusVolts: 'dc_bus_volts', commissionedOn: 'commissioned_on' };

/** The questions the cabinet form would ask about a row's values (the same rules, the same words). */
function rowQuestions(row: number, data: CabinetImportRow, asOfOn: string): ImportQuestion[] {
  const figures = { supplyVolts: data.supply_volts, dcBusVolts: data.dc_bus_volts ?? null, commissionedOn: data.commissioned_on ?? null };
  return cabinetQuestions(figures, 'all', asOfOn).map((issue) => ({ row, column: COLUMN_OF_FIELD[issue.path] ?? issue.path, message: issue.message }));
}

/**
 * Reads the file and checks every row against the schema and the file itself (no database).
 * Parsing and checking go in slices that let other requests run between them.
 * @throws AppError `file-too-large` as soon as the file passes IMPORT_MAX_ROWS data rows
 */
async function readRows(file: ImportFile, asOfOn: string): Promise<ReadFile> {
  const { rows, ...rest } = await readImportRows(file, {
    columns: CABINET_IMPORT_COLUMNS,
    decode,
    schema: cabinetImportRowSchema,
    tooManyCellsReason: 'the row has more cells than the header',
    toRow: (row, values, data, problems): ReadRow => ({
      row,
      values,
      data,
      problems,
      questions: data ? rowQuestions(row, data, asOfOn) : [],
      areaId: null,
      siteId: null,
      newArea: false,
    }),
  });

  // a tag twice in the file
  const firstRowOfTag = new Map<string, number>();
  for (const r of rows) {
    if (!r.data) continue;
    const key = r.data.tag.toLowerCase();
    const first = firstRowOfTag.get(key);
    if (first !== undefined) r.problems.push({ row: r.row, column: 'tag', reason: `${r.data.tag} is also on row ${first}` });
    else firstRowOfTag.set(key, r.row);
  }
  return { ...rest, rows, newAreas: new Map() };
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
  sortProblemsByColumn(rows, CABINET_IMPORT_COLUMNS);
  return { ...read, newAreas };
}

/** The preview: counts of everything, the first problems and rows one by one (the answer stays small). */
function toPreview(read: ReadFile, committed: boolean, createdCount: number): ImportPreview {
  const siteCodeOf = new Map(read.rows.filter((r) => r.siteId).map((r) => [r.siteId!, r.data!.site_code]));
  return importPreviewOf(read, {
    validCount: read.rows.filter((r) => r.problems.length === 0 && r.data).length,
    toPreviewRow: (r): ImportPreviewRow => ({
      row: r.row,
      tag: r.data?.tag ?? r.values.tag ?? '',
      siteCode: r.data?.site_code ?? r.values.site_code ?? '',
      area: r.data?.area ?? r.values.area ?? '',
      newArea: r.newArea,
      values: r.values,
      problems: r.problems,
      questions: r.questions,
    }),
    extra: { newAreas: [...read.newAreas.values()].map((a) => `${siteCodeOf.get(a.siteId) ?? ''} / ${a.name}`) },
    committed,
    createdCount,
  });
}

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
  refuseUnlessImportable(read, confirmed);
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
  const cabinets = await writeInStatements(read.rows, (rows) => insertCabinets(rows, areaIdByKey, transaction));
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
  await recordImportAudit(uow, audit);
  return toPreview(read, true, cabinets.length);
}
