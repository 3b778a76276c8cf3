/**
 * The Planner's part of the demo scenario: shutdown windows in every demo area (recurring
 * weekly, fortnightly or monthly through an RRULE, and one-offs, in each site's time zone),
 * the technicians' sites, a history of logged and reviewed visits (so some banks were inspected
 * recently, some about a year ago, the rest are overdue), one missed visit, and planned visits
 * over the next three weeks for every technician, each inside a window of its area.
 *
 * Everything counts from the seed's instant (`uow.now`), so the Planner and My visits show work
 * ahead whenever the demo is first started. Deterministic (a seeded generator over cabinets
 * sorted by tag) and idempotent: windows are found by area and title, a technician with sites
 * keeps them, and visits are added only to demo areas that have none yet.
 *
 * Windows and visits go through the services a planner's request would use, so each has its
 * audit entries; the demo people act (Tomas plans, the technicians start and log, Ines reviews),
 * and Ebbline itself marks the missed visit. The history's steps are written at the instants
 * they happened in the story (a unit of work of its own `now`, in the seed's one transaction).
 */
import { sequelize } from '../../api/src/db/sequelize';
import { User } from '../../api/src/models/user';
import { recordAuditBatch } from '../../api/src/services/audit';
import { createShutdownWindow } from '../../api/src/services/shutdown-windows';
import type { Actor as Acting, UnitOfWork } from '../../api/src/services/unit-of-work';
import { createVisits, transitionVisit } from '../../api/src/services/visits';
import type { AuthUser } from '../../api/src/types/express';
import {
  instantOfLocalWallTime,
  localWallTimeOf,
  windowOccurrences,
  type WindowOccurrence,
} from '../../shared/domain/shutdown-windows';
import { estimateVisitMinutes } from '../../shared/domain/visit-duration';
import type { VisitAction } from '../../shared/domain/visit-states';
import { seededRandom } from './seeded-random';

export interface PlannerSeedSummary {
  shutdownWindows: number;
  personSites: number;
  visits: number;
}

/** The sites (by code) each demo technician works at. */
export const TECHNICIAN_SITES: Record<string, readonly string[]> = {
  dario: ['M', 'H'],
  lucia: ['H', 'S'],
  kofi: ['S', 'M'],
};

/** The one-off shutdown of each demo area over the coming months, by the area's name. */
const ONE_OFF_TITLES: Record<string, string> = {
  'Line 1 milling': 'Roll change outage',
  'Line 2 milling': 'Sifter overhaul',
  'Dryer hall': 'Dryer belt replacement',
  'Packing hall': 'Palletiser retrofit',
  'Intake conveyors': 'Unloader inspection',
  'Silo top': 'Elevator belt change',
  'Pump house': 'Cooling pump overhaul',
  'Press hall': 'Press rebuild',
  'Boiler house': 'Boiler inspection outage',
  'Effluent plant': 'Blower overhaul',
};

/** The area whose outage is on now, so My visits has a visit today. */
const OUTAGE_TODAY_AREA = 'Pump house';
const OUTAGE_TODAY_TITLE = 'Pump changeover outage';

/** Days ahead that the demo plans visits for. */
const PLANNED_AHEAD_DAYS = 21;
/** Planned visits per demo area (the rest of its due banks are left for "Plan this window"). */
const PLANNED_PER_AREA = 3;

const MINUTE_MS = 60_000;
const DAY_MS = 86_400_000;

interface AreaRow {
  id: string;
  name: string;
  siteId: string;
  siteCode: string;
  siteName: string;
  timeZone: string;
}

interface CabinetRow {
  id: string;
  tag: string;
  areaId: string;
  markedWaitMinutes: number | null;
  banks: Array<{ id: string; baselineTauSeconds: number }>;
  /** The latest date any of its banks can be due, never inspected (a year after install). */
  dueBy: string;
}

/** A shutdown window as the seed makes it. */
export interface WindowPlan {
  areaId: string;
  title: string;
  startsAt: string;
  endsAt: string;
  recurrence: string | null;
  notes: string;
}

// local calendar dates, `YYYY-MM-DD`
const addDays = (on: string, days: number) =>
  new Date(Date.parse(`${on}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
const weekdayOf = (on: string) => new Date(`${on}T00:00:00Z`).getUTCDay(); // 0 Sunday … 6 Saturday
/** The latest date on or before `on` that falls on `weekday`. */
const onOrBefore = (on: string, weekday: number) =>
  addDays(on, -((weekdayOf(on) - weekday + 7) % 7));
/** Christmas, Boxing Day and New Year's Day, when no plant plans a shutdown of its own. */
const isHoliday = (on: string) => ['12-25', '12-26', '01-01'].includes(on.slice(5));
/** The first `weekday` of the month of `on`, `months` months later (negative: earlier). */
function firstWeekdayOfMonth(on: string, months: number, weekday: number): string {
  const d = new Date(`${on.slice(0, 7)}-01T00:00:00Z`);
  d.setUTCMonth(d.getUTCMonth() + months);
  const first = d.toISOString().slice(0, 10);
  return addDays(first, (weekday - weekdayOf(first) + 7) % 7);
}

/** The instant of a local date and wall time in a zone (the seed only asks for real times). */
function at(on: string, time: string, timeZone: string): string {
  const instant = instantOfLocalWallTime(`${on} ${time}`, timeZone);
  if (!instant) throw new Error(`No such local time: ${on} ${time} ${timeZone}`);
  return instant;
}

/**
 * The shutdown windows of one demo area: one recurring window (weekly on Saturdays, fortnightly
 * on Wednesday nights or monthly on the first Sunday, by the area's place in the list) that
 * began eight weeks ago and runs three months ahead, last year's annual shutdown, and a one-off
 * on a weekday in the coming weeks; the pump house also has an outage on now.
 *
 * @param area - the area and its site's zone
 * @param index - the area's place among the demo areas (0-based)
 * @param now - the seed's instant
 */
export function windowsOfArea(area: AreaRow, index: number, now: Date): WindowPlan[] {
  const zone = area.timeZone;
  const todayOn = localWallTimeOf(now.toISOString(), zone).slice(0, 10);
  const windows: WindowPlan[] = [];
  if (index % 3 === 0) {
    const firstOn = onOrBefore(addDays(todayOn, -56), 6);
    windows.push({
      areaId: area.id,
      title: 'Saturday line stop',
      startsAt: at(firstOn, '06:00', zone),
      endsAt: at(firstOn, '14:00', zone),
      recurrence: 'FREQ=WEEKLY;BYDAY=SA;COUNT=22',
      notes: 'Drives isolated after the last batch on Friday night; restart from 14:00.',
    });
  } else if (index % 3 === 1) {
    const firstOn = firstWeekdayOfMonth(todayOn, -2, 0);
    windows.push({
      areaId: area.id,
      title: 'Monthly maintenance shutdown',
      startsAt: at(firstOn, '07:00', zone),
      endsAt: at(firstOn, '17:00', zone),
      recurrence: 'FREQ=MONTHLY;BYDAY=1SU;COUNT=6',
      notes: 'First Sunday of the month; the area is handed back by 17:00.',
    });
  } else {
    const firstOn = onOrBefore(addDays(todayOn, -56), 3);
    windows.push({
      areaId: area.id,
      title: 'Fortnightly night stop',
      startsAt: at(firstOn, '22:00', zone),
      endsAt: at(addDays(firstOn, 1), '06:00', zone),
      recurrence: 'FREQ=WEEKLY;INTERVAL=2;BYDAY=WE;COUNT=11',
      notes: 'Wednesday night cleaning stop, 22:00 to 06:00.',
    });
  }
  let annualOn = addDays(todayOn, -(320 + 3 * index));
  while (isHoliday(annualOn)) annualOn = addDays(annualOn, 1);
  windows.push({
    areaId: area.id,
    title: 'Annual shutdown',
    startsAt: at(annualOn, '06:00', zone),
    endsAt: at(annualOn, '20:00', zone),
    recurrence: null,
    notes: 'Last year’s annual shutdown of the area.',
  });
  let oneOffOn = addDays(todayOn, 8 + 5 * index);
  while (weekdayOf(oneOffOn) === 0 || weekdayOf(oneOffOn) === 6 || isHoliday(oneOffOn))
    oneOffOn = addDays(oneOffOn, 1);
  windows.push({
    areaId: area.id,
    title: ONE_OFF_TITLES[area.name] ?? 'Planned outage',
    startsAt: at(oneOffOn, '07:00', zone),
    endsAt: at(oneOffOn, '19:00', zone),
    recurrence: null,
    notes: 'One-off outage agreed with production.',
  });
  if (area.name === OUTAGE_TODAY_AREA) {
    const hourMs = Math.floor(now.getTime() / (60 * MINUTE_MS)) * 60 * MINUTE_MS;
    windows.push({
      areaId: area.id,
      title: OUTAGE_TODAY_TITLE,
      startsAt: new Date(hourMs - 60 * MINUTE_MS).toISOString(),
      endsAt: new Date(hourMs + 11 * 60 * MINUTE_MS).toISOString(),
      recurrence: null,
      notes: 'The duty pump is changed over; the standby drives are off meanwhile.',
    });
  }
  return windows;
}

/** When each technician is busy, so the demo never books anyone twice. */
class Bookings {
  private readonly busy = new Map<string, Array<[number, number]>>();

  isFree(userId: string, startMs: number, endMs: number): boolean {
    return (this.busy.get(userId) ?? []).every(([s, e]) => endMs <= s || startMs >= e);
  }

  book(userId: string, startMs: number, endMs: number): void {
    const list = this.busy.get(userId) ?? [];
    list.push([startMs, endMs]);
    this.busy.set(userId, list);
  }

  /**
   * The earliest start in the occurrence at which one of the technicians (tried in order) is
   * free for `minutes`, and who; null when none fits before the occurrence ends.
   */
  firstFit(
    occurrence: WindowOccurrence,
    minutes: number,
    technicianIds: readonly string[],
    notBeforeMs = 0,
  ): { userId: string; startMs: number } | null {
    const occStart = Math.max(Date.parse(occurrence.startsAt), notBeforeMs);
    const occEnd = Date.parse(occurrence.endsAt);
    const length = minutes * MINUTE_MS;
    for (const userId of technicianIds) {
      const candidates = [occStart, ...(this.busy.get(userId) ?? []).map(([, e]) => e)]
        .filter((s) => s >= occStart)
        .sort((a, b) => a - b);
      for (const s of candidates) {
        if (s + length <= occEnd && this.isFree(userId, s, s + length))
          return { userId, startMs: s };
      }
    }
    return null;
  }
}

/** One step of a visit's history: what was done, when, by whom (null: Ebbline itself). */
interface Step {
  action: VisitAction;
  atMs: number;
  by: AuthUser | null;
}

/** A visit's length as planned: the estimate rounded up to the quarter hour. */
function plannedMinutesOf(cabinet: CabinetRow): number {
  return (
    Math.ceil(
      estimateVisitMinutes(cabinet.banks, { markedWaitMinutes: cabinet.markedWaitMinutes }) / 15,
    ) * 15
  );
}

/** The same seeded shuffle on every run. */
function shuffled<T>(items: readonly T[], seed: number): T[] {
  const random = seededRandom(seed);
  const out = [...items];
  for (let i = out.length - 1; i > 0; i -= 1) {
    const j = Math.floor(random() * (i + 1));
    [out[i], out[j]] = [out[j]!, out[i]!];
  }
  return out;
}

async function actorOf(
  email: string,
  transaction: UnitOfWork<Acting>['transaction'],
): Promise<AuthUser | null> {
  const user = await User.findOne({ where: { email }, transaction });
  return user
    ? {
        id: user.id,
        name: user.name,
        email: user.email,
        roles: [...user.roles] as AuthUser['roles'],
      }
    : null;
}

/**
 * Adds what is missing of the Planner's demo in the caller's unit of work (acting as Ebbline):
 * windows, technicians' sites, the visit history, a missed visit and the planned visits.
 * Returns how many of each it added.
 */
export async function seedPlanner(
  uow: UnitOfWork<Acting>,
  demoAreaNames: readonly string[],
): Promise<PlannerSeedSummary> {
  const { transaction, now } = uow;
  const added: PlannerSeedSummary = { shutdownWindows: 0, personSites: 0, visits: 0 };
  const nowMs = now.getTime();

  const [areaRows] = await sequelize.query(
    `SELECT a.id, a.name, s.id AS "siteId", upper(s.code) AS "siteCode", s.name AS "siteName", s.time_zone AS "timeZone"
       FROM areas a JOIN sites s ON s.id = a.site_id
      WHERE a.retired_at IS NULL AND s.retired_at IS NULL AND a.name = ANY($1::text[])`,
    { bind: [demoAreaNames], transaction },
  );
  const order = new Map(demoAreaNames.map((name, i) => [name, i]));
  const areas = (areaRows as AreaRow[]).sort(
    (a, b) => a.siteCode.localeCompare(b.siteCode) || order.get(a.name)! - order.get(b.name)!,
  );
  // the demo's own order: sites as the register lists them (M, H, S), then their areas
  const siteOrder = ['M', 'H', 'S'];
  areas.sort(
    (a, b) =>
      siteOrder.indexOf(a.siteCode) - siteOrder.indexOf(b.siteCode) ||
      order.get(a.name)! - order.get(b.name)!,
  );

  const planner = await actorOf('tomas@brackenmoor.example', transaction);
  const engineer = await actorOf('ines@brackenmoor.example', transaction);
  const admin = await actorOf('maren@brackenmoor.example', transaction);
  const technicians = new Map<string, AuthUser>();
  for (const login of Object.keys(TECHNICIAN_SITES)) {
    const tech = await actorOf(`${login}@brackenmoor.example`, transaction);
    if (tech) technicians.set(login, tech);
  }
  if (!planner || !engineer) return added;

  // the technicians' sites: a technician who has sites keeps them as they are
  const siteIdByCode = new Map(areas.map((a) => [a.siteCode, { id: a.siteId, name: a.siteName }]));
  const audits: Parameters<typeof recordAuditBatch>[1][number][] = [];
  for (const [login, tech] of technicians) {
    const [[held]] = (await sequelize.query(
      'SELECT count(*)::int AS n FROM person_sites WHERE user_id = $1',
      { bind: [tech.id], transaction },
    )) as [Array<{ n: number }>, unknown];
    if (held!.n > 0) continue;
    const sites = TECHNICIAN_SITES[login]!.map((code) => siteIdByCode.get(code)).filter(
      (s) => s !== undefined,
    );
    if (!sites.length) continue;
    await sequelize.query(
      'INSERT INTO person_sites (user_id, site_id) SELECT $1, unnest($2::uuid[]) ON CONFLICT DO NOTHING',
      {
        bind: [tech.id, sites.map((s) => s.id)],
        transaction,
      },
    );
    added.personSites += sites.length;
    audits.push({
      entityType: 'person',
      entityId: tech.id,
      action: 'update',
      actor: admin ? { id: admin.id, name: admin.name } : null,
      summary: `Gave ${tech.name} the sites ${sites.map((s) => s.name).join(', ')}`,
      before: { siteIds: [] },
      after: { siteIds: sites.map((s) => s.id) },
    });
  }
  await recordAuditBatch(uow, audits);

  // shutdown windows, by area and title (a retired one is not brought back)
  const [windowRows] = await sequelize.query(
    `SELECT area_id || '|' || lower(title) AS key FROM shutdown_windows`,
    { transaction },
  );
  const takenWindows = new Set((windowRows as Array<{ key: string }>).map((r) => r.key));
  const asPlanner: UnitOfWork = { actor: planner, now, transaction };
  const windowsByArea = new Map<string, WindowPlan[]>();
  for (const [index, area] of areas.entries()) {
    const windows = windowsOfArea(area, index, now);
    windowsByArea.set(area.id, windows);
    for (const window of windows) {
      if (takenWindows.has(`${area.id}|${window.title.toLowerCase()}`)) continue;
      await createShutdownWindow(asPlanner, window);
      added.shutdownWindows += 1;
    }
  }

  // visits: only in demo areas with none yet
  const [visitedRows] = await sequelize.query(
    `SELECT DISTINCT c.area_id AS "areaId" FROM visits v JOIN cabinets c ON c.id = v.cabinet_id WHERE c.area_id = ANY($1::uuid[])`,
    { bind: [areas.map((a) => a.id)], transaction },
  );
  const visitedAreas = new Set((visitedRows as Array<{ areaId: string }>).map((r) => r.areaId));
  const [cabinetRows] = await sequelize.query(
    `SELECT c.id, c.tag, c.area_id AS "areaId", c.marked_wait_minutes AS "markedWaitMinutes",
            json_agg(json_build_object('id', b.id, 'baselineTauSeconds', b.baseline_tau_seconds) ORDER BY b.position) AS banks,
            to_char(max(coalesce(b.installed_on, (b.baseline_set_at AT TIME ZONE 'UTC')::date)) + 366, 'YYYY-MM-DD') AS "dueBy"
       FROM cabinets c JOIN banks b ON b.cabinet_id = c.id AND b.status = 'in-service'
      WHERE c.area_id = ANY($1::uuid[]) AND c.retired_at IS NULL AND c.status = 'in-service'
      GROUP BY c.id ORDER BY c.tag`,
    { bind: [areas.filter((a) => !visitedAreas.has(a.id)).map((a) => a.id)], transaction },
  );
  const cabinetsOfArea = new Map<string, CabinetRow[]>();
  for (const cabinet of cabinetRows as CabinetRow[]) {
    cabinetsOfArea.set(cabinet.areaId, [...(cabinetsOfArea.get(cabinet.areaId) ?? []), cabinet]);
  }

  const bookings = new Bookings();
  const techniciansOfSite = (siteCode: string) =>
    [...technicians.entries()]
      .filter(([login]) => TECHNICIAN_SITES[login]!.includes(siteCode))
      .map(([, tech]) => tech);
  const technicianById = new Map([...technicians.values()].map((t) => [t.id, t]));
  let missedPlaced = false;
  /** Creates one visit as Tomas would have, at `plannedOnMs`, and takes it through `steps`. */
  const addVisit = async (
    cabinet: CabinetRow,
    fit: { userId: string; startMs: number },
    minutes: number,
    plannedOnMs: number,
    steps: Step[],
    notes = '',
  ) => {
    const endMs = fit.startMs + minutes * MINUTE_MS;
    bookings.book(fit.userId, fit.startMs, endMs);
    const [visit] = await createVisits(
      { actor: planner, now: new Date(plannedOnMs), transaction },
      [
        {
          cabinetId: cabinet.id,
          bankIds: cabinet.banks.map((b) => b.id),
          plannedStartAt: new Date(fit.startMs).toISOString(),
          plannedEndAt: new Date(endMs).toISOString(),
          technicianIds: [fit.userId],
          notes,
          overrides: [],
        },
      ],
    );
    let version = visit!.version;
    for (const step of steps) {
      // the technicians start and log, Ines reviews, Ebbline itself (actor null) marks it missed
      const moved = await transitionVisit(
        { actor: step.by, now: new Date(step.atMs), transaction },
        visit!.id,
        {
          action: step.action,
          version,
        },
      );
      version = moved.version;
    }
    added.visits += 1;
  };

  for (const [index, area] of areas.entries()) {
    const cabinets = shuffled(cabinetsOfArea.get(area.id) ?? [], 4_410 + index);
    if (!cabinets.length) continue;
    const techs = techniciansOfSite(area.siteCode).map((t) => t.id);
    if (!techs.length) continue;
    const windows = windowsByArea.get(area.id)!;
    const occurrencesOf = (title: string, fromMs: number, toMs: number) => {
      const window = windows.find((w) => w.title === title);
      return window
        ? windowOccurrences(
            window,
            area.timeZone,
            new Date(fromMs).toISOString(),
            new Date(toMs).toISOString(),
          )
        : [];
    };
    const recurring = windows[0]!;
    const used = new Set<string>();
    // the next cabinet not visited yet whose banks are all due by the day of a visit (a visit
    // of banks not yet due would need an override)
    const nextDue = (occurrence: WindowOccurrence) => {
      const onDate = localWallTimeOf(occurrence.startsAt, area.timeZone).slice(0, 10);
      return cabinets.find((c) => !used.has(c.id) && c.dueBy <= onDate);
    };

    // last year's annual shutdown: about a third of the cabinets inspected and reviewed, so
    // their banks come due again in the coming weeks
    const [annual] = occurrencesOf('Annual shutdown', nowMs - 400 * DAY_MS, nowMs);
    for (let n = 0; annual && n < Math.round(cabinets.length / 3); n += 1) {
      const cabinet = nextDue(annual);
      if (!cabinet) break;
      const minutes = plannedMinutesOf(cabinet);
      const fit = bookings.firstFit(annual, minutes, n % 2 ? [...techs].reverse() : techs);
      if (!fit) break;
      used.add(cabinet.id);
      const endMs = fit.startMs + minutes * MINUTE_MS;
      const by = technicianById.get(fit.userId)!;
      await addVisit(cabinet, fit, minutes, fit.startMs - 21 * DAY_MS, [
        { action: 'start', atMs: fit.startMs, by },
        { action: 'log', atMs: endMs, by },
        { action: 'review', atMs: endMs + 3 * DAY_MS, by: engineer },
      ]);
    }

    // the recurring window's last weeks: two cabinets inspected recently, one reviewed, one
    // still waiting for its review; in the first area, one visit nobody made (missed)
    const past = occurrencesOf(recurring.title, nowMs - 42 * DAY_MS, nowMs).filter(
      (o) => Date.parse(o.endsAt) + 13 * 60 * MINUTE_MS < nowMs,
    );
    const recent: Array<'reviewed' | 'logged' | 'missed'> = missedPlaced
      ? ['reviewed', 'logged']
      : ['reviewed', 'logged', 'missed'];
    for (const [n, outcome] of recent.entries()) {
      const occurrence = past[Math.max(0, past.length - 1 - (outcome === 'missed' ? 0 : n + 1))];
      const cabinet = occurrence && nextDue(occurrence);
      if (!occurrence || !cabinet) break;
      const minutes = plannedMinutesOf(cabinet);
      const fit = bookings.firstFit(occurrence, minutes, n % 2 ? [...techs].reverse() : techs);
      if (!fit) continue;
      used.add(cabinet.id);
      const endMs = fit.startMs + minutes * MINUTE_MS;
      const by = technicianById.get(fit.userId)!;
      const steps: Step[] =
        outcome === 'missed'
          ? [{ action: 'miss', atMs: endMs + 12 * 60 * MINUTE_MS + 15 * MINUTE_MS, by: null }]
          : [
              { action: 'start', atMs: fit.startMs, by },
              { action: 'log', atMs: endMs, by },
              ...(outcome === 'reviewed'
                ? [
                    {
                      action: 'review' as const,
                      atMs: Math.min(endMs + DAY_MS, nowMs),
                      by: engineer,
                    },
                  ]
                : []),
            ];
      await addVisit(cabinet, fit, minutes, fit.startMs - 10 * DAY_MS, steps);
      if (outcome === 'missed') missedPlaced = true;
    }

    // the coming three weeks: a few cabinets planned in the recurring window (and in the
    // outage on now), the rest of the area's due banks left for the planner
    const ahead = [
      ...occurrencesOf(OUTAGE_TODAY_TITLE, nowMs, nowMs + DAY_MS),
      ...occurrencesOf(recurring.title, nowMs, nowMs + PLANNED_AHEAD_DAYS * DAY_MS),
    ];
    // a visit today starts no sooner than the next quarter hour after the seed's instant
    const notBeforeMs = Math.ceil((nowMs + MINUTE_MS) / (15 * MINUTE_MS)) * 15 * MINUTE_MS;
    let planned = 0;
    for (const occurrence of ahead) {
      for (
        let perOccurrence = 0;
        perOccurrence < 2 && planned < PLANNED_PER_AREA;
        perOccurrence += 1
      ) {
        const cabinet = nextDue(occurrence);
        if (!cabinet) break;
        const minutes = plannedMinutesOf(cabinet);
        const fit = bookings.firstFit(
          occurrence,
          minutes,
          (planned + index) % 2 ? [...techs].reverse() : techs,
          notBeforeMs,
        );
        if (!fit) break;
        used.add(cabinet.id);
        await addVisit(cabinet, fit, minutes, nowMs, [], '');
        planned += 1;
      }
    }
  }
  return added;
}
