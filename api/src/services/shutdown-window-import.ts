/**
 * Importing shutdown windows from CSV (as typed, or exported from a spreadsheet), with the
 * cabinet import's rules: read the file in slices, name every row's problems (row, column,
 * reason), ask about unlikely values, and commit all rows or none. Times are local wall times
 * at the row's site, read in the site's time zone.
 */
import Papa from 'papaparse';
import { Op, type Transaction } from 'sequelize';
import { decodeTextBytes } from '../../../shared/domain/text-decoding';
import {
  instantOfLocalWallTime,
  normalizeRecurrence,
  recurrenceText,
  windowTimesProblems,
} from '../../../shared/domain/shutdown-windows';
import {
  SHUTDOWN_WINDOW_IMPORT_COLUMNS,
  shutdownWindowImportRowSchema,
  type ImportProblem,
  type ImportQuestion,
  type ShutdownWindowImportPreview,
  type ShutdownWindowImportPreviewRow,
} from '../../../shared/schemas/shutdown-window-import';
import { sequelize } from '../db/sequelize';
import { AppError } from '../errors';
import { Area } from '../models/area';
import { ShutdownWindow } from '../models/shutdown-window';
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
import { snapshotOf } from './register-records';
import { SHUTDOWN_WINDOW_AUDITED } from './shutdown-windows';
import type { UnitOfWork } from './unit-of-work';

/** A window longer than this is asked about (a shutdown of more than a week is unusual). */
const LONG_WINDOW_MS = 7 * 86_400_000;

/** The template: the header and two example rows (a weekly stop and a one-off). */
export function shutdownWindowImportTemplate(): string {
  const header = SHUTDOWN_WINDOW_IMPORT_COLUMNS.map((c) => c.name);
  const examples = [
    ['M', 'Line 2', 'Weekend stop', '2027-01-09 06:00', '2027-01-09 14:00', 'FREQ=WEEKLY;BYDAY=SA;COUNT=8', 'Line 2 isolated by the shift electrician'],
    ['M', 'Boiler house', 'Annual inspection', '2027-03-15 07:00', '2027-03-17 17:00', '', ''],
  ];
  return Papa.unparse({ fields: header, data: examples }, { newline: '\r\n' }) + '\r\n';
}

interface ReadRow {
  row: number;
  values: Record<string, string>;
  problems: ImportProblem[];
  questions: ImportQuestion[];
  site: string;
  area: string;
  title: string;
  notes: string;
  areaId: string | null;
  timeZone: string;
  startsAt: string | null;
  endsAt: string | null;
  recurrence: string | null;
}

type ReadFile = ImportRead<ReadRow>;

function decode(bytes: Buffer): string {
  try {
    return decodeTextBytes(bytes).text;
  } catch {
    throw new AppError('unsupported-file', 'The file is not text. Save the sheet as CSV (.csv) and upload that.', [
      { path: 'file', message: 'not a text file' },
    ]);
  }
}

/** Reads the file and checks every row's cells (no database). @throws AppError `file-too-large` */
function readRows(file: ImportFile): Promise<ReadFile> {
  return readImportRows(file, {
    columns: SHUTDOWN_WINDOW_IMPORT_COLUMNS,
    decode,
    schema: shutdownWindowImportRowSchema,
    tooManyCellsReason: 'the row has more cells than the header (a recurrence with ; in a ;-separated file must be in quotes)',
    toRow: (row, values, data, problems): ReadRow => {
      let recurrence: string | null = null;
      if (data) {
        const check = normalizeRecurrence(data.recurrence);
        if (check.ok) recurrence = check.recurrence;
        else problems.push({ row, column: 'recurrence', reason: check.message });
      }
      return {
        row,
        values,
        problems,
        questions: [],
        site: data?.site ?? values.site?.trim() ?? '',
        area: data?.area ?? values.area?.trim() ?? '',
        title: data?.title ?? values.title?.trim() ?? '',
        notes: data?.notes ?? '',
        areaId: null,
        timeZone: '',
        startsAt: null,
        endsAt: null,
        recurrence,
      };
    },
  });
}

/**
 * Checks the rows against the register: the site (by code or name), the area of that site,
 * the times read in the site's zone, a window already in the register or twice in the file;
 * and asks about a start before `asOf` or a window longer than a week.
 */
async function checkAgainstRegister(read: ReadFile, asOf: Date, transaction?: Transaction): Promise<ReadFile> {
  const named = read.rows.filter((r) => r.site && r.area);
  const siteKeys = [...new Set(named.map((r) => r.site.toLowerCase()))];
  const sites = siteKeys.length
    ? await Site.findAll({
        where: {
          retiredAt: null,
          [Op.or]: [
            sequelize.where(sequelize.fn('lower', sequelize.col('code')), { [Op.in]: siteKeys }),
            sequelize.where(sequelize.fn('lower', sequelize.col('name')), { [Op.in]: siteKeys }),
          ],
        },
        transaction,
      })
    : [];
  const siteOf = (key: string) =>
    sites.find((s) => s.code.toLowerCase() === key) ?? sites.find((s) => s.name.toLowerCase() === key);
  const areas = sites.length ? await Area.findAll({ where: { retiredAt: null, siteId: sites.map((s) => s.id) }, transaction }) : [];
  const areaByKey = new Map(areas.map((a) => [`${a.siteId}|${a.name.toLowerCase()}`, a]));

  for (const r of named) {
    const site = siteOf(r.site.toLowerCase());
    if (!site) {
      r.problems.push({ row: r.row, column: 'site', reason: `no site in use has the code or name ${r.site}` });
      // the times' form needs no zone: name a bad one now rather than after the site is fixed
      for (const column of ['start', 'end'] as const) {
        const text = r.values[column]?.trim() ?? '';
        if (text && !instantOfLocalWallTime(text, 'UTC'))
          r.problems.push({ row: r.row, column, reason: `"${text}" is not a date and time (YYYY-MM-DD HH:MM, local time at the site)` });
      }
      continue;
    }
    const area = areaByKey.get(`${site.id}|${r.area.toLowerCase()}`);
    if (!area) r.problems.push({ row: r.row, column: 'area', reason: `${site.code} has no area in use called ${r.area}` });
    else r.areaId = area.id;
    r.timeZone = site.timeZone;
    const startText = r.values.start?.trim() ?? '';
    const endText = r.values.end?.trim() ?? '';
    r.startsAt = startText ? instantOfLocalWallTime(startText, site.timeZone) : null;
    r.endsAt = endText ? instantOfLocalWallTime(endText, site.timeZone) : null;
    if (startText && !r.startsAt) r.problems.push({ row: r.row, column: 'start', reason: `"${startText}" is not a date and time (YYYY-MM-DD HH:MM, local time at the site)` });
    if (endText && !r.endsAt) r.problems.push({ row: r.row, column: 'end', reason: `"${endText}" is not a date and time (YYYY-MM-DD HH:MM, local time at the site)` });
    if (r.startsAt && r.endsAt && !r.problems.some((p) => p.column === 'recurrence')) {
      for (const problem of windowTimesProblems({ startsAt: r.startsAt, endsAt: r.endsAt, recurrence: r.recurrence }, site.timeZone)) {
        const column = problem.path === 'endsAt' ? 'end' : problem.path === 'startsAt' ? 'start' : 'recurrence';
        r.problems.push({ row: r.row, column, reason: problem.message.replace(/^The end/, 'the end') });
      }
    }
    if (r.startsAt && r.endsAt && r.problems.length === 0) {
      if (Date.parse(r.startsAt) < asOf.getTime())
        r.questions.push({ row: r.row, column: 'start', message: `The start ${startText} is in the past at ${site.name}. Is that right?` });
      if (Date.parse(r.endsAt) - Date.parse(r.startsAt) > LONG_WINDOW_MS)
        r.questions.push({ row: r.row, column: 'end', message: 'This shutdown lasts more than a week. Is that right?' });
    }
  }

  // the same window twice in the file, or already in the register (a file imported again)
  const firstRowOf = new Map<string, number>();
  const keyOf = (areaId: string, startsAt: string, title: string) => `${areaId}|${startsAt}|${title.toLowerCase()}`;
  for (const r of read.rows) {
    if (!r.areaId || !r.startsAt) continue;
    const key = keyOf(r.areaId, r.startsAt, r.title);
    const first = firstRowOf.get(key);
    if (first !== undefined) r.problems.push({ row: r.row, column: 'title', reason: `the same window is also on row ${first}` });
    else firstRowOf.set(key, r.row);
  }
  const candidates = read.rows.filter((r) => r.areaId && r.startsAt);
  if (candidates.length > 0) {
    const existing = await ShutdownWindow.findAll({
      attributes: ['areaId', 'startsAt', 'title'],
      where: { retiredAt: null, areaId: [...new Set(candidates.map((r) => r.areaId!))] },
      transaction,
    });
    const taken = new Set(existing.map((w) => keyOf(w.areaId, w.startsAt.toISOString(), w.title)));
    for (const r of candidates) {
      if (taken.has(keyOf(r.areaId!, r.startsAt!, r.title)))
        r.problems.push({ row: r.row, column: 'title', reason: `${r.title} at this start is already in the register` });
    }
  }
  sortProblemsByColumn(read.rows, SHUTDOWN_WINDOW_IMPORT_COLUMNS);
  return read;
}

function toPreview(read: ReadFile, committed: boolean, createdCount: number): ShutdownWindowImportPreview {
  return importPreviewOf(read, {
    validCount: read.rows.filter((r) => r.problems.length === 0).length,
    toPreviewRow: (r): ShutdownWindowImportPreviewRow => ({
      row: r.row,
      site: r.site,
      area: r.area,
      title: r.title,
      timeZone: r.timeZone,
      startsAt: r.startsAt,
      endsAt: r.endsAt,
      recurrence: r.recurrence,
      recurrenceText: recurrenceText(r.recurrence),
      values: r.values,
      problems: r.problems,
      questions: r.questions,
    }),
    extra: {},
    committed,
    createdCount,
  });
}

/**
 * Reads a file and says what importing it would do, storing nothing.
 * @param asOf - now, for the question about starts in the past
 */
export async function previewShutdownWindowImport(file: ImportFile, asOf: Date): Promise<ShutdownWindowImportPreview> {
  return toPreview(await checkAgainstRegister(await readRows(file), asOf), false, 0);
}

/**
 * Imports every row of the file as a shutdown window in the unit of work, each with its audit
 * entry. When any row has a problem, or an unlikely value the request does not confirm,
 * nothing is stored.
 * @throws AppError `import-rejected` (path "row N, column C"), `confirmation-needed` unless `confirmed`, `file-too-large`
 */
export async function importShutdownWindows(uow: UnitOfWork, file: ImportFile, confirmed = false): Promise<ShutdownWindowImportPreview> {
  const { transaction } = uow;
  const rowsRead = await readRows(file);
  // one import at a time: two uploads of one file cannot both pass the "already in the register" check
  await sequelize.query('LOCK TABLE shutdown_windows IN SHARE ROW EXCLUSIVE MODE', { transaction });
  const read = await checkAgainstRegister(rowsRead, uow.now, transaction);
  refuseUnlessImportable(read, confirmed);
  const created = await writeInStatements(read.rows, (slice) =>
    ShutdownWindow.bulkCreate(
      slice.map((r) => ({
        areaId: r.areaId!,
        title: r.title,
        startsAt: new Date(r.startsAt!),
        endsAt: new Date(r.endsAt!),
        recurrence: r.recurrence,
        notes: r.notes,
      })),
      { transaction, returning: true },
    ),
  );
  const audit: AuditRecordInput[] = created.map((window, i) => {
    const asked = read.rows[i]?.questions.map((q) => q.column) ?? [];
    return {
      entityType: 'shutdown-window',
      entityId: window.id,
      action: 'import',
      summary: `Imported shutdown window ${window.title} from ${file.name}${asked.length ? ` (unlikely ${asked.join(' and ')} confirmed)` : ''}`,
      before: null,
      after: snapshotOf(window, SHUTDOWN_WINDOW_AUDITED),
    };
  });
  await recordImportAudit(uow, audit);
  return toPreview(read, true, created.length);
}
