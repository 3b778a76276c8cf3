/**
 * Plan a shutdown window: the proposal for one occurrence (reads only; the planner confirms it
 * with the visit batch, services/visits.ts `createVisits`, in one transaction).
 *
 * What goes in:
 * - the banks in service of the window's area whose due date (shared/domain/due.ts, through
 *   `dueDatesOfBanks`) is on or before the occurrence's last local day, minus those a planned
 *   or under-way visit already covers (listed as left out);
 * - the technicians: active people holding the technician role attached to the window's site
 *   (person_sites), or every technician when nobody is attached to it, or those the planner
 *   chose; their planned or under-way visits during the occurrence are planned around (a new
 *   visit never double-books anyone), and listed.
 * The split itself is the pure rule of shared/domain/plan-window.ts.
 */
import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';
import { QueryTypes } from 'sequelize';
import { VISIT_TECHNICIAN_ROLE } from '../../../shared/constants/planning';
import { calendarDateInZone } from '../../../shared/domain/due';
import { proposeWindowPlan, type PlanCabinet } from '../../../shared/domain/plan-window';
import { windowOccurrences } from '../../../shared/domain/shutdown-windows';
import type {
  ProposalLeftOutBank,
  TechnicianPool,
  WindowProposal,
  WindowProposalRequest,
} from '../../../shared/schemas/plan-window';
import { sequelize } from '../db/sequelize';
import { AppError } from '../errors';
import { dueDatesOfBanks } from './due';

interface WindowRow {
  id: string;
  title: string;
  starts_at: Date;
  ends_at: Date;
  recurrence: string | null;
  retired_at: Date | null;
  area_id: string;
  area_name: string;
  site_id: string;
  site_name: string;
  time_zone: string;
}

interface AreaBankRow {
  bank_id: string;
  position: string;
  baseline_tau_seconds: number;
  cabinet_id: string;
  cabinet_tag: string;
  marked_wait_minutes: number | null;
  planned_visit_start_at: Date | null;
}

interface PersonRow {
  id: string;
  name: string;
  roles: string[];
  active: boolean;
}

interface BusyRow {
  user_id: string;
  cabinet_tag: string;
  planned_start_at: Date;
  planned_end_at: Date;
}

/** States of a visit that hold its technicians and its banks. */
const PLANNED_STATES = ['planned', 'under-way'];

/** "Sat 9 Jan 2027, 06:00" on the site's clock. */
function localDateTime(at: Date, timeZone: string): string {
  return format(new TZDate(at.getTime(), timeZone), 'EEE d MMM yyyy, HH:mm');
}

/** "06:00" on the site's clock. */
function localTime(at: Date, timeZone: string): string {
  return format(new TZDate(at.getTime(), timeZone), 'HH:mm');
}

const byText = (a: string, b: string) =>
  a.localeCompare(b, 'en', { numeric: true, sensitivity: 'base' });

async function windowOf(windowId: string): Promise<WindowRow> {
  const [row] = await sequelize.query<WindowRow>(
    `SELECT w.id, w.title, w.starts_at, w.ends_at, w.recurrence, w.retired_at,
            a.id AS area_id, a.name AS area_name, s.id AS site_id, s.name AS site_name, s.time_zone
       FROM shutdown_windows w JOIN areas a ON a.id = w.area_id JOIN sites s ON s.id = a.site_id
      WHERE w.id = :windowId`,
    { replacements: { windowId }, type: QueryTypes.SELECT },
  );
  if (!row) throw AppError.notFound('Shutdown window');
  if (row.retired_at)
    throw new AppError(
      'retired',
      `The shutdown window ${row.title} is retired: it cannot be planned.`,
    );
  return row;
}

/** The banks in service of the area's cabinets in use, with the first planned visit covering each. */
async function banksOfArea(areaId: string): Promise<AreaBankRow[]> {
  return sequelize.query<AreaBankRow>(
    `SELECT b.id AS bank_id, b.position, b.baseline_tau_seconds, c.id AS cabinet_id, c.tag AS cabinet_tag,
            c.marked_wait_minutes,
            (SELECT min(v.planned_start_at) FROM visit_banks vb JOIN visits v ON v.id = vb.visit_id
              WHERE vb.bank_id = b.id AND v.state IN (:planned)) AS planned_visit_start_at
       FROM banks b JOIN cabinets c ON c.id = b.cabinet_id
      WHERE c.area_id = :areaId AND c.retired_at IS NULL AND c.status <> 'retired'
        AND b.status = 'in-service' AND b.retired_at IS NULL`,
    { replacements: { areaId, planned: PLANNED_STATES }, type: QueryTypes.SELECT },
  );
}

/** The technicians to split across, and where they come from. @throws AppError `validation-failed` naming `technicianIds.N` */
async function technicianPool(
  siteId: string,
  chosenIds: readonly string[] | undefined,
): Promise<{ pool: PersonRow[]; kind: TechnicianPool }> {
  if (chosenIds) {
    const people = await sequelize.query<PersonRow>(
      'SELECT id, name, roles, active FROM users WHERE id IN (:ids)',
      {
        replacements: { ids: [...chosenIds] },
        type: QueryTypes.SELECT,
      },
    );
    const byId = new Map(people.map((p) => [p.id, p]));
    const issues = chosenIds.flatMap((id, index) => {
      const person = byId.get(id);
      return person && person.active && person.roles.includes(VISIT_TECHNICIAN_ROLE)
        ? []
        : [
            {
              path: `technicianIds.${index}`,
              message: 'Choose an active person who holds the technician role.',
            },
          ];
    });
    if (issues.length > 0)
      throw AppError.badRequest(`technicianIds: ${issues[0]!.message}`, issues);
    return { pool: chosenIds.map((id) => byId.get(id)!), kind: 'chosen' };
  }
  const technicians = await sequelize.query<PersonRow & { at_site: boolean }>(
    `SELECT u.id, u.name, u.roles, u.active,
            EXISTS (SELECT 1 FROM person_sites ps WHERE ps.user_id = u.id AND ps.site_id = :siteId) AS at_site
       FROM users u WHERE u.active AND :role = ANY(u.roles)`,
    { replacements: { siteId, role: VISIT_TECHNICIAN_ROLE }, type: QueryTypes.SELECT },
  );
  const atSite = technicians.filter((t) => t.at_site);
  return atSite.length > 0 ? { pool: atSite, kind: 'site' } : { pool: technicians, kind: 'all' };
}

/** Visits of these people that overlap [startsAt, endsAt) and still hold them. */
async function busyDuring(
  userIds: readonly string[],
  startsAt: string,
  endsAt: string,
): Promise<BusyRow[]> {
  if (userIds.length === 0) return [];
  return sequelize.query<BusyRow>(
    `SELECT vt.user_id, c.tag AS cabinet_tag, v.planned_start_at, v.planned_end_at
       FROM visit_technicians vt JOIN visits v ON v.id = vt.visit_id JOIN cabinets c ON c.id = v.cabinet_id
      WHERE vt.user_id IN (:userIds) AND v.state IN (:planned)
        AND v.planned_start_at < :endsAt AND v.planned_end_at > :startsAt
      ORDER BY v.planned_start_at`,
    {
      replacements: { userIds: [...userIds], planned: PLANNED_STATES, startsAt, endsAt },
      type: QueryTypes.SELECT,
    },
  );
}

/**
 * The proposal for one occurrence of a shutdown window: one visit per cabinet covering its due
 * banks, split across the available technicians, never past the occurrence's end, and the
 * banks left out with the reason. Stores nothing.
 *
 * @param windowId - the shutdown window
 * @param request - the occurrence's start, and optionally the technicians to use
 * @param asOf - the instant the due dates are judged at (the request's time)
 * @throws AppError `not-found` (window), `retired` (window retired), `validation-failed` naming
 *   `occurrenceStartsAt` (no occurrence starts then) or `technicianIds.N` (not an active technician)
 */
export async function proposeWindowVisits(
  windowId: string,
  request: WindowProposalRequest,
  asOf: Date,
): Promise<WindowProposal> {
  const window = await windowOf(windowId);
  const timeZone = window.time_zone;
  const fromMs = Date.parse(request.occurrenceStartsAt);
  const occurrence = windowOccurrences(
    {
      startsAt: window.starts_at.toISOString(),
      endsAt: window.ends_at.toISOString(),
      recurrence: window.recurrence,
    },
    timeZone,
    new Date(fromMs).toISOString(),
    new Date(fromMs + 1).toISOString(),
  ).find((o) => Date.parse(o.startsAt) === fromMs);
  if (!occurrence) {
    const message = `${window.title} has no occurrence starting at ${localDateTime(new Date(fromMs), timeZone)} (${timeZone}). Choose one of its occurrences.`;
    throw AppError.badRequest(`occurrenceStartsAt: ${message}`, [
      { path: 'occurrenceStartsAt', message },
    ]);
  }
  const dueBy = calendarDateInZone(occurrence.endsAt, timeZone);

  // the banks due by the occurrence's last day
  const areaBanks = await banksOfArea(window.area_id);
  const dueDates = await dueDatesOfBanks(
    areaBanks.map((b) => b.bank_id),
    asOf,
  );
  const dueBanks = areaBanks
    .filter((b) => {
      const due = dueDates.get(b.bank_id);
      return due !== undefined && due.dueOn <= dueBy;
    })
    .sort((a, b) => byText(a.cabinet_tag, b.cabinet_tag) || byText(a.position, b.position));
  const dueOn = (bankId: string) => dueDates.get(bankId)!.dueOn;

  const alreadyPlanned: ProposalLeftOutBank[] = dueBanks
    .filter((b) => b.planned_visit_start_at !== null)
    .map((b) => ({
      bankId: b.bank_id,
      cabinetId: b.cabinet_id,
      cabinetTag: b.cabinet_tag,
      position: b.position,
      dueOn: dueOn(b.bank_id),
      kind: 'already-planned',
      reason: `Already in a planned visit on ${localDateTime(b.planned_visit_start_at!, timeZone)} (${timeZone}).`,
    }));
  const cabinets = new Map<string, PlanCabinet & { banks: PlanCabinet['banks'][number][] }>();
  for (const b of dueBanks.filter((row) => row.planned_visit_start_at === null)) {
    const cabinet = cabinets.get(b.cabinet_id) ?? {
      cabinetId: b.cabinet_id,
      cabinetTag: b.cabinet_tag,
      markedWaitMinutes: b.marked_wait_minutes,
      banks: [],
    };
    cabinet.banks.push({
      bankId: b.bank_id,
      position: b.position,
      baselineTauSeconds: Number(b.baseline_tau_seconds),
    });
    cabinets.set(b.cabinet_id, cabinet);
  }

  // the technicians by name, with the visits they already have during the occurrence
  const { pool, kind } = await technicianPool(window.site_id, request.technicianIds);
  const busy = await busyDuring(
    pool.map((p) => p.id),
    occurrence.startsAt,
    occurrence.endsAt,
  );
  const ordered = [...pool].sort((a, b) => byText(a.name, b.name) || byText(a.id, b.id));
  const technicians = ordered.map((p) => ({
    id: p.id,
    name: p.name,
    busy: busy
      .filter((row) => row.user_id === p.id)
      .map((row) => ({
        startsAt: row.planned_start_at.toISOString(),
        endsAt: row.planned_end_at.toISOString(),
        cabinetTag: row.cabinet_tag,
      })),
  }));
  const busyTechnicians = technicians
    .filter((t) => t.busy.length > 0)
    .map((t) => ({
      id: t.id,
      name: t.name,
      reason: `Already has ${t.busy
        .map(
          (b) =>
            `${b.cabinetTag} ${localTime(new Date(b.startsAt), timeZone)}–${localTime(new Date(b.endsAt), timeZone)}`,
        )
        .join(', ')} (${timeZone}) during this window: planned around.`,
    }));
  const names = new Map(technicians.map((t) => [t.id, t.name]));

  const plan = proposeWindowPlan({
    occurrence: { ...occurrence, timeZone },
    cabinets: [...cabinets.values()],
    technicians,
  });
  return {
    window: {
      id: window.id,
      title: window.title,
      areaId: window.area_id,
      areaName: window.area_name,
      siteId: window.site_id,
      siteName: window.site_name,
      timeZone,
      startsAt: occurrence.startsAt,
      endsAt: occurrence.endsAt,
    },
    dueBy,
    visits: plan.visits.map((v) => ({
      cabinetId: v.cabinetId,
      cabinetTag: v.cabinetTag,
      markedWaitMinutes: v.markedWaitMinutes,
      bankIds: v.bankIds,
      banks: v.banks.map((b) => ({
        id: b.bankId,
        position: b.position,
        baselineTauSeconds: b.baselineTauSeconds,
        dueOn: dueOn(b.bankId),
        estimatedMinutes: b.estimatedMinutes,
      })),
      technicianIds: v.technicianIds,
      technicians: v.technicianIds.map((id) => ({ id, name: names.get(id) ?? '' })),
      plannedStartAt: v.plannedStartAt,
      plannedEndAt: v.plannedEndAt,
      notes: `Shutdown window: ${window.title}`,
      estimatedMinutes: v.estimatedMinutes,
    })),
    leftOut: [...plan.leftOut.map((b) => ({ ...b, dueOn: dueOn(b.bankId) })), ...alreadyPlanned],
    technicians,
    technicianPool: kind,
    busyTechnicians,
  };
}
