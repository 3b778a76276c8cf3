/**
 * The Due list, computed in PostgreSQL with the rule of shared/domain/due.ts (the API tests
 * check that both give the same day on varied banks):
 *
 *   startOn = local date of the latest logged/reviewed visit covering the bank
 *             (logged_at in the site's zone), else installed_on, else the baseline's local date
 *   dueOn   = least(startOn + design interval, startOn + 365, forecast next visit)
 *   bucket  = overdue (before the site's today), this-month (to the end of today's month),
 *             next-quarter (to today + 3 months), later
 *
 * Reads only; `asOf` is the instant the list is judged at (routes pass the request's time).
 */
import { QueryTypes, type Transaction } from 'sequelize';
import { CRITICALITIES } from '../../../shared/constants/register';
import {
  DUE_BUCKETS,
  type DueBasis,
  type DueBucket,
  type DueStartKind,
} from '../../../shared/domain/due';
import type {
  DueBank,
  DueBucketCounts,
  DueHealth,
  DueList,
  DueListQuery,
  DueSortField,
} from '../../../shared/schemas/due';
import { sequelize } from '../db/sequelize';
import { containsPattern, pageWindow } from './register-records';

/** Who is reading: a technician with no fleet role sees only the banks of their sites. */
export interface DueReader {
  /** Null: the whole fleet. Otherwise only banks at sites this person is attached to (person_sites). */
  siteScopeUserId: string | null;
}

/** A list of bound parameters, each value added returning its `$n`. */
class Binds {
  readonly values: unknown[] = [];
  add(value: unknown): string {
    this.values.push(value);
    return `$${this.values.length}`;
  }
}

/**
 * Every bank in service of a cabinet, area and site in use, with its due date and bucket.
 * Its health is that of its newest current (not corrected) accepted decay run that was judged,
 * by the instant; `unmeasured` when it has none. No forecast moves a due date yet; the column
 * is here so the rule already takes it.
 */
function dueBanksSql(asOf: string): string {
  return `
    WITH logged AS (
      -- the latest logged or reviewed visit of each bank by the instant (one pass, not one per bank)
      SELECT vb.bank_id, max(vi.logged_at) AS last_logged_at
      FROM visit_banks vb JOIN visits vi ON vi.id = vb.visit_id
      WHERE vi.state IN ('logged', 'reviewed') AND vi.logged_at <= ${asOf}::timestamptz
      GROUP BY vb.bank_id
    ), health_now AS (
      -- the health of each bank's newest current accepted run that was judged (one pass)
      SELECT DISTINCT ON (r.bank_id) r.bank_id, r.health
      FROM decay_runs r
      WHERE r.review_state = 'accepted' AND r.health IS NOT NULL AND r.isolated_at <= ${asOf}::timestamptz
        AND NOT EXISTS (SELECT 1 FROM decay_runs n WHERE n.supersedes_id = r.id)
      ORDER BY r.bank_id, r.isolated_at DESC, r.recorded_at DESC
    ), judged AS (
      SELECT
        b.id AS bank_id, b.position, b.installed_on, b.bank_design_id,
        d.code AS design_code, v.inspection_interval_days,
        c.id AS cabinet_id, c.tag AS cabinet_tag, c.criticality,
        a.id AS area_id, a.name AS area_name, s.id AS site_id, s.name AS site_name, s.time_zone,
        (${asOf}::timestamptz AT TIME ZONE s.time_zone)::date AS today_on,
        (b.baseline_set_at AT TIME ZONE s.time_zone)::date AS baseline_set_on,
        (l.last_logged_at AT TIME ZONE s.time_zone)::date AS last_inspected_on,
        NULL::date AS forecast_next_visit_on,
        COALESCE(h.health, 'unmeasured')::text AS health
      FROM banks b
      JOIN cabinets c ON c.id = b.cabinet_id
      JOIN areas a ON a.id = c.area_id
      JOIN sites s ON s.id = a.site_id
      JOIN bank_designs d ON d.id = b.bank_design_id
      JOIN bank_design_versions v ON v.id = d.current_version_id
      LEFT JOIN logged l ON l.bank_id = b.id
      LEFT JOIN health_now h ON h.bank_id = b.id
      WHERE b.status = 'in-service' AND b.retired_at IS NULL
        AND c.retired_at IS NULL AND c.status <> 'retired' AND a.retired_at IS NULL AND s.retired_at IS NULL
    ), started AS (
      SELECT judged.*,
        COALESCE(last_inspected_on, installed_on, baseline_set_on) AS start_on,
        CASE WHEN last_inspected_on IS NOT NULL THEN 'last-visit'
             WHEN installed_on IS NOT NULL THEN 'installed' ELSE 'baseline' END AS start_kind
      FROM judged
    ), due AS (
      SELECT started.*,
        LEAST(start_on + inspection_interval_days, start_on + 365, forecast_next_visit_on) AS due_on,
        -- ties go to the design interval, then yearly, then the forecast (as the domain rule)
        CASE
          WHEN forecast_next_visit_on < LEAST(start_on + inspection_interval_days, start_on + 365) THEN 'forecast'
          WHEN start_on + 365 < start_on + inspection_interval_days THEN 'yearly'
          ELSE 'design-interval' END AS basis
      FROM started
    )
    SELECT due.*,
      CASE
        WHEN due_on < today_on THEN 'overdue'
        WHEN due_on <= (date_trunc('month', today_on) + interval '1 month - 1 day')::date THEN 'this-month'
        WHEN due_on <= (today_on + interval '3 months')::date THEN 'next-quarter'
        ELSE 'later' END AS bucket
    FROM due`;
}

const SORT_COLUMNS: Record<DueSortField, string[]> = {
  dueOn: ['due_on'],
  cabinet: ['cabinet_tag'],
  site: ['site_name', 'area_name', 'cabinet_tag'],
  area: ['area_name', 'site_name', 'cabinet_tag'],
  design: ['design_code'],
  // most critical first when descending: the constants list least first
  criticality: [
    `array_position(ARRAY[${CRITICALITIES.map((c) => `'${c}'`).join(', ')}]::text[], criticality)`,
  ],
  lastInspectedOn: ['last_inspected_on'],
};

function orderBy(query: DueListQuery): string {
  const dir = query.sort.direction === 'desc' ? 'DESC' : 'ASC';
  const nulls = dir === 'DESC' ? 'NULLS LAST' : 'NULLS FIRST';
  const keys = SORT_COLUMNS[query.sort.field].map((col) => `${col} ${dir} ${nulls}`);
  // a stable order for paging: then by due date, cabinet, position and id
  return [...keys, 'due_on ASC', 'cabinet_tag ASC', 'lower(position) ASC', 'bank_id ASC'].join(
    ', ',
  );
}

const ACTIVE_VISIT = (
  bank: string,
) => `EXISTS (SELECT 1 FROM visit_banks vb JOIN visits vi ON vi.id = vb.visit_id
  WHERE vb.bank_id = ${bank} AND vi.state IN ('planned', 'under-way'))`;

/** The WHERE conditions of every filter but the bucket (the tabs' counts ignore the bucket). */
function filterConditions(query: DueListQuery, reader: DueReader, binds: Binds): string[] {
  const where: string[] = [];
  if (reader.siteScopeUserId) {
    where.push(
      `site_id IN (SELECT ps.site_id FROM person_sites ps WHERE ps.user_id = ${binds.add(reader.siteScopeUserId)})`,
    );
  }
  if (query.siteId) where.push(`site_id = ${binds.add(query.siteId)}`);
  if (query.areaId) where.push(`area_id = ${binds.add(query.areaId)}`);
  if (query.cabinetId) where.push(`cabinet_id = ${binds.add(query.cabinetId)}`);
  if (query.bankDesignId) where.push(`bank_design_id = ${binds.add(query.bankDesignId)}`);
  if (query.criticality) where.push(`criticality = ${binds.add(query.criticality)}`);
  if (query.health) where.push(`health = ${binds.add(query.health)}`);
  if (query.dueBy) where.push(`due_on <= ${binds.add(query.dueBy)}::date`);
  if (query.planned !== undefined)
    where.push(`${query.planned ? '' : 'NOT '}${ACTIVE_VISIT('due.bank_id')}`);
  if (query.q) {
    const pattern = binds.add(containsPattern(query.q));
    where.push(
      `(cabinet_tag ILIKE ${pattern} OR position ILIKE ${pattern} OR design_code ILIKE ${pattern})`,
    );
  }
  return where;
}

interface DueRow {
  bank_id: string;
  position: string;
  bank_design_id: string;
  design_code: string;
  inspection_interval_days: number;
  cabinet_id: string;
  cabinet_tag: string;
  criticality: DueBank['criticality'];
  site_id: string;
  site_name: string;
  time_zone: string;
  area_id: string;
  area_name: string;
  installed_on: string | null;
  baseline_set_on: string;
  last_inspected_on: string | null;
  start_on: string;
  start_kind: DueStartKind;
  forecast_next_visit_on: string | null;
  due_on: string;
  basis: DueBasis;
  bucket: DueBucket;
  today_on: string;
  days_until_due: number;
  health: DueHealth;
  planned_visit_id: string | null;
  planned_start_at: Date | null;
  planned_end_at: Date | null;
  missed_visit_id: string | null;
  missed_start_at: Date | null;
  missed_end_at: Date | null;
  missed_at: Date | null;
}

function presentDueRow(row: DueRow): DueBank {
  return {
    bankId: row.bank_id,
    position: row.position,
    bankDesignId: row.bank_design_id,
    bankDesignCode: row.design_code,
    cabinetId: row.cabinet_id,
    cabinetTag: row.cabinet_tag,
    criticality: row.criticality,
    siteId: row.site_id,
    siteName: row.site_name,
    timeZone: row.time_zone,
    areaId: row.area_id,
    areaName: row.area_name,
    inspectionIntervalDays: row.inspection_interval_days,
    lastInspectedOn: row.last_inspected_on,
    installedOn: row.installed_on,
    baselineSetOn: row.baseline_set_on,
    startOn: row.start_on,
    startKind: row.start_kind,
    forecastNextVisitOn: row.forecast_next_visit_on,
    dueOn: row.due_on,
    basis: row.basis,
    bucket: row.bucket,
    todayOn: row.today_on,
    daysUntilDue: row.days_until_due,
    health: row.health,
    plannedVisit:
      row.planned_visit_id && row.planned_start_at && row.planned_end_at
        ? {
            id: row.planned_visit_id,
            plannedStartAt: row.planned_start_at.toISOString(),
            plannedEndAt: row.planned_end_at.toISOString(),
          }
        : null,
    missedVisit:
      row.missed_visit_id && row.missed_start_at && row.missed_end_at
        ? {
            id: row.missed_visit_id,
            plannedStartAt: row.missed_start_at.toISOString(),
            plannedEndAt: row.missed_end_at.toISOString(),
            missedAt: row.missed_at ? row.missed_at.toISOString() : null,
          }
        : null,
  };
}

/**
 * One page of the Due list for `query`, judged at `asOf`, with the count of each bucket under the
 * same filters (for the tabs) and the total of the bucket asked for (or of all).
 *
 * @param query - filters, sort and page (shared/schemas/due.ts)
 * @param asOf - the instant the list is judged at; each bank's "today" is this instant's date at its site
 * @param reader - `siteScopeUserId` limits the list to that person's sites (technicians)
 */
export async function listDueBanks(
  query: DueListQuery,
  asOf: Date,
  reader: DueReader = { siteScopeUserId: null },
  transaction?: Transaction,
): Promise<DueList> {
  const countBinds = new Binds();
  const countAsOf = countBinds.add(asOf.toISOString());
  const countWhere = filterConditions(query, reader, countBinds);
  const countRows = await sequelize.query<{ bucket: DueBucket; n: number }>(
    `SELECT bucket, count(*)::int AS n FROM (${dueBanksSql(countAsOf)}) due
     ${countWhere.length ? `WHERE ${countWhere.join(' AND ')}` : ''} GROUP BY bucket`,
    { bind: countBinds.values, type: QueryTypes.SELECT, transaction },
  );
  const counts = Object.fromEntries(DUE_BUCKETS.map((b) => [b, 0])) as DueBucketCounts;
  for (const row of countRows) counts[row.bucket] = row.n;
  const total = query.bucket
    ? counts[query.bucket]
    : DUE_BUCKETS.reduce((sum, b) => sum + counts[b], 0);

  const binds = new Binds();
  const asOfParam = binds.add(asOf.toISOString());
  const where = filterConditions(query, reader, binds);
  if (query.bucket) where.push(`bucket = ${binds.add(query.bucket)}`);
  const { limit, offset } = pageWindow(query);
  const rows =
    total === 0
      ? []
      : await sequelize.query<DueRow>(
          `SELECT page.*, (page.due_on - page.today_on) AS days_until_due,
             pv.id AS planned_visit_id, pv.planned_start_at, pv.planned_end_at,
             mv.id AS missed_visit_id, mv.planned_start_at AS missed_start_at,
             mv.planned_end_at AS missed_end_at, mv.missed_at
           FROM (
             SELECT * FROM (${dueBanksSql(asOfParam)}) due
             ${where.length ? `WHERE ${where.join(' AND ')}` : ''}
             ORDER BY ${orderBy(query)}
             LIMIT ${binds.add(limit)} OFFSET ${binds.add(offset)}
           ) page
           LEFT JOIN LATERAL (
             SELECT vi.id, vi.planned_start_at, vi.planned_end_at FROM visit_banks vb JOIN visits vi ON vi.id = vb.visit_id
             WHERE vb.bank_id = page.bank_id AND vi.state IN ('planned', 'under-way')
             ORDER BY vi.planned_start_at, vi.id LIMIT 1
           ) pv ON true
           LEFT JOIN LATERAL (
             SELECT vi.id, vi.state, vi.planned_start_at, vi.planned_end_at, vi.missed_at FROM visit_banks vb JOIN visits vi ON vi.id = vb.visit_id
             WHERE vb.bank_id = page.bank_id AND vi.state IN ('logged', 'reviewed', 'missed')
             ORDER BY vi.planned_start_at DESC, vi.id DESC LIMIT 1
           ) lastv ON true
           LEFT JOIN LATERAL (SELECT lastv.id, lastv.planned_start_at, lastv.planned_end_at, lastv.missed_at WHERE lastv.state = 'missed') mv ON true
           ORDER BY ${orderBy(query)}`,
          { bind: binds.values, type: QueryTypes.SELECT, transaction },
        );
  return {
    items: rows.map(presentDueRow),
    total,
    page: query.page,
    pageSize: query.pageSize,
    counts,
    asOf: asOf.toISOString(),
  };
}

/** A bank's due date as {@link dueDatesOfBanks} gives it. */
export interface BankDueDate {
  bankId: string;
  dueOn: string;
  bucket: DueBucket;
  todayOn: string;
  timeZone: string;
}

/**
 * The due dates of some banks, judged at `asOf`: for planning checks (a bank not yet due by a
 * visit's end) and proposals. Banks not in service, or of a retired cabinet, area or site, are
 * left out.
 *
 * @returns a map from bank id to its due date; banks not found are absent
 */
export async function dueDatesOfBanks(
  bankIds: readonly string[],
  asOf: Date,
  transaction?: Transaction,
): Promise<Map<string, BankDueDate>> {
  if (bankIds.length === 0) return new Map();
  const binds = new Binds();
  const asOfParam = binds.add(asOf.toISOString());
  const rows = await sequelize.query<{
    bank_id: string;
    due_on: string;
    bucket: DueBucket;
    today_on: string;
    time_zone: string;
  }>(
    `SELECT bank_id, due_on, bucket, today_on, time_zone FROM (${dueBanksSql(asOfParam)}) due
     WHERE bank_id = ANY(${binds.add([...bankIds])}::uuid[])`,
    { bind: binds.values, type: QueryTypes.SELECT, transaction },
  );
  return new Map(
    rows.map((r) => [
      r.bank_id,
      {
        bankId: r.bank_id,
        dueOn: r.due_on,
        bucket: r.bucket,
        todayOn: r.today_on,
        timeZone: r.time_zone,
      },
    ]),
  );
}
