/**
 * The demo's decay-run history: every demo bank gets 3–10 years (from its install, or a seeded
 * choice) of decay runs simulated from the physics (decay-history-simulation.ts), held by
 * reviewed visits in past shutdown windows, so the bank pages, the fleet and the forecasts show
 * real history on first start.
 *
 * - Each demo area gets a past "Half-yearly maintenance stop" window (Saturday 06:00–20:00 on its
 *   site's clock, every six months, on a day of its own), which ends over a year before the
 *   seed's instant: the plant fell behind, which is why the Due list has overdue banks.
 * - A cabinet is visited in most of those stops (every 6–12 months) by a technician of its site,
 *   planned by Tomas, started and logged by the technician, reviewed by Ines; each visit holds one
 *   run per bank in service then. The Planner's own reviewed visits (last year's annual shutdown,
 *   the last weeks) get their runs too, and its visit still waiting for review holds runs pending.
 * - Each run is judged by `judgeRecordedRun` exactly as the API judges a submitted run, with the
 *   bank's baseline of the moment: the first trusted run replaces a nameplate baseline
 *   (source 'decay-run'; a baseline entered by hand is kept), later runs are judged against it.
 *   Runs are accepted by Ines; a run whose readings gave no τ is queried with a comment.
 * - An original bank replaced years ago ends its history with bulged cans seen (its last run).
 *
 * Deterministic (a generator per cabinet, seeded from its tag) and idempotent: an area whose
 * cabinets hold any decay run is left alone, and the windows are found by area and title. Everything is written in
 * bulk (a few statements per table) in the seed's one transaction, each step's audit entry stamped
 * at the instant it happened.
 */
import crypto from 'node:crypto';
import type { CreationAttributes } from 'sequelize';
import { sequelize } from '../../api/src/db/sequelize';
import { DecayRun } from '../../api/src/models/decay-run';
import { User } from '../../api/src/models/user';
import { Visit } from '../../api/src/models/visit';
import { VisitBank } from '../../api/src/models/visit-bank';
import { VisitTechnician } from '../../api/src/models/visit-technician';
import { recordAuditBatch, type AuditRecordInput } from '../../api/src/services/audit';
import { decayRunAuditEntry, decayRunRowFor } from '../../api/src/services/decay-runs';
import { createShutdownWindow } from '../../api/src/services/shutdown-windows';
import type { Actor as Acting, UnitOfWork } from '../../api/src/services/unit-of-work';
import type { AuthUser } from '../../api/src/types/express';
import type { CapacitorTechnology } from '../../shared/constants/health';
import type { BaselineSource } from '../../shared/constants/register';
import { bankEngineInputs, type DesignRevisionFigures } from '../../shared/domain/bank-engine-inputs';
import type { RecordedRunVerdict } from '../../shared/domain/recorded-run';
import {
  instantOfLocalWallTime,
  localWallTimeOf,
  windowOccurrences,
  type WindowOccurrence,
} from '../../shared/domain/shutdown-windows';
import { estimateVisitMinutes } from '../../shared/domain/visit-duration';
import type { DecayRunObservations } from '../../shared/schemas/decay-run';
import {
  DEMO_METERS,
  ageingPathOf,
  bleederOhmsAt,
  capacitanceAtMicrofarads,
  capacitanceRatioAt,
  gaussian,
  simulateHistoryRun,
  yearsBetween,
  type AgeingPath,
} from './decay-history-simulation';
import { TECHNICIAN_SITES } from './planner';
import { seededRandom } from './seeded-random';

export interface DecayHistorySeedSummary {
  /** Past shutdown windows added for the history. */
  historyWindows: number;
  /** Reviewed visits added to hold the history. */
  historyVisits: number;
  /** Decay runs added (history and the Planner's visits). */
  decayRuns: number;
}

/** Title of the past window the history's visits are made in. */
export const HISTORY_WINDOW_TITLE = 'Half-yearly maintenance stop';

const MINUTE_MS = 60_000;
const DAY_MS = 86_400_000;
const YEAR_MS = 365.25 * DAY_MS;

/** Typical air temperature inside the cabinets of each demo area, °C (warm halls age banks faster). */
const AREA_CABINET_TEMP_C: Record<string, number> = {
  'Line 1 milling': 33,
  'Line 2 milling': 32,
  'Dryer hall': 43,
  'Packing hall': 30,
  'Intake conveyors': 29,
  'Silo top': 34,
  'Pump house': 28,
  'Press hall': 31,
  'Boiler house': 46,
  'Effluent plant': 30,
};

/** Designs whose drives run their control supply from the DC bus, and its draw, watts. */
const CONTROL_SUPPLY_WATTS: Record<string, number> = {
  'EL-2S3P-4700': 30,
  'EL-2S4P-6800': 45,
  'FI-1S2P-420': 35,
};

interface AreaRow {
  id: string;
  name: string;
  siteCode: string;
  timeZone: string;
}

/** A bank as the seed reads it, with its design revision's figures. */
interface BankRow extends DesignRevisionFigures {
  id: string;
  cabinetId: string;
  tag: string;
  areaId: string;
  position: string;
  status: string;
  installedOn: string | null;
  replacedOn: string | null;
  version: number;
  baselineSource: BaselineSource;
  baselineTauSeconds: number;
  baselineCapacitanceMicrofarads: number;
  baselineSetAt: Date;
  baselineSetById: string | null;
  baselineDesignVersionId: string | null;
  baselineNote: string;
  designCode: string;
  technology: CapacitorTechnology;
  dcBusVolts: number | null;
  markedWaitMinutes: number | null;
}

interface PlannerVisitRow {
  id: string;
  cabinetId: string;
  state: 'logged' | 'reviewed';
  startedAt: Date;
  loggedAt: Date;
  reviewedAt: Date | null;
  technicianId: string;
  bankIds: string[];
}

/** A bank as the history goes along: its path and its baseline of the moment. */
interface BankState {
  row: BankRow;
  installMs: number;
  endMs: number;
  path: AgeingPath;
  cabinetTempC: number;
  baseline: { source: BaselineSource; tauSeconds: number; capacitanceMicrofarads: number };
  baselineFromRun: { runId: string; at: Date; tauSeconds: number; capacitanceMicrofarads: number; isolatedOn: string; normalised: boolean } | null;
  /** The last run saw τ risen (a bleeder fault): the next one measures the bleeder. */
  measureBleederNext: boolean;
}

/**
 * The area's half-yearly stop: a Saturday 06:00–20:00 on its site's clock, the nth Saturday of
 * March, April or May (and six months on), a different (month, week) for each demo area so no
 * technician is wanted in two areas on one day; the last one over a year before `now`.
 */
function historyWindowOf(area: AreaRow, index: number, now: Date): { startsAt: string; endsAt: string; recurrence: string } | null {
  const todayOn = localWallTimeOf(now.toISOString(), area.timeZone).slice(0, 10);
  const year = Number(todayOn.slice(0, 4)) - 11;
  const month = 3 + (index % 3);
  const nth = 1 + (Math.floor(index / 3) % 4);
  const first = new Date(Date.UTC(year, month - 1, 1));
  first.setUTCDate(1 + ((6 - first.getUTCDay() + 7) % 7) + 7 * (nth - 1));
  const firstOn = first.toISOString().slice(0, 10);
  const startsAt = instantOfLocalWallTime(`${firstOn} 06:00`, area.timeZone);
  const endsAt = instantOfLocalWallTime(`${firstOn} 20:00`, area.timeZone);
  if (!startsAt || !endsAt) return null;
  const lastStartMs = now.getTime() - 400 * DAY_MS;
  const count = Math.max(1, Math.floor((lastStartMs - Date.parse(startsAt)) / (182.6 * DAY_MS)));
  return { startsAt, endsAt, recurrence: `FREQ=MONTHLY;INTERVAL=6;BYDAY=${nth}SA;COUNT=${count}` };
}

/** A 32-bit seed from text (FNV-1a), so each cabinet draws from a generator of its own. */
function seedOf(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

async function personOf(email: string, transaction: UnitOfWork<Acting>['transaction']): Promise<AuthUser | null> {
  const user = await User.findOne({ where: { email }, transaction });
  return user ? { id: user.id, name: user.name, email: user.email, roles: [...user.roles] as AuthUser['roles'] } : null;
}

const round = (value: number, step: number) => Math.round(value / step) * step;

/**
 * Adds the decay-run history of the demo areas (see the module comment) in the caller's unit of
 * work, after the register and the Planner's demo. Returns what it added.
 */
export async function seedDecayHistory(uow: UnitOfWork<Acting>, demoAreaNames: readonly string[]): Promise<DecayHistorySeedSummary> {
  const { transaction, now } = uow;
  const nowMs = now.getTime();
  const added: DecayHistorySeedSummary = { historyWindows: 0, historyVisits: 0, decayRuns: 0 };

  const planner = await personOf('tomas@brackenmoor.example', transaction);
  const engineer = await personOf('ines@brackenmoor.example', transaction);
  const technicians = new Map<string, AuthUser>();
  for (const login of Object.keys(TECHNICIAN_SITES)) {
    const tech = await personOf(`${login}@brackenmoor.example`, transaction);
    if (tech) technicians.set(login, tech);
  }
  if (!planner || !engineer || technicians.size === 0) return added;
  const techniciansOfSite = (siteCode: string) =>
    [...technicians.entries()].filter(([login]) => TECHNICIAN_SITES[login]!.includes(siteCode)).map(([, t]) => t);
  const nameOf = new Map([planner, engineer, ...technicians.values()].map((p) => [p.id, p]));

  const [areaRows] = await sequelize.query(
    `SELECT a.id, a.name, upper(s.code) AS "siteCode", s.time_zone AS "timeZone"
       FROM areas a JOIN sites s ON s.id = a.site_id
      WHERE a.retired_at IS NULL AND s.retired_at IS NULL AND a.name = ANY($1::text[])`,
    { bind: [demoAreaNames], transaction },
  );
  const siteOrder = ['M', 'H', 'S'];
  const order = new Map(demoAreaNames.map((name, i) => [name, i]));
  const areas = (areaRows as AreaRow[]).sort(
    (a, b) => siteOrder.indexOf(a.siteCode) - siteOrder.indexOf(b.siteCode) || order.get(a.name)! - order.get(b.name)!,
  );
  if (areas.length === 0) return added;

  // the past half-yearly stops, by area and title
  const [windowRows] = await sequelize.query(
    `SELECT area_id AS "areaId", starts_at AS "startsAt", ends_at AS "endsAt", recurrence FROM shutdown_windows
      WHERE area_id = ANY($1::uuid[]) AND lower(title) = lower($2) AND retired_at IS NULL`,
    { bind: [areas.map((a) => a.id), HISTORY_WINDOW_TITLE], transaction },
  );
  const windowOfArea = new Map(
    (windowRows as Array<{ areaId: string; startsAt: Date; endsAt: Date; recurrence: string | null }>).map((w) => [
      w.areaId,
      { startsAt: w.startsAt.toISOString(), endsAt: w.endsAt.toISOString(), recurrence: w.recurrence },
    ]),
  );
  const asPlanner: UnitOfWork = { actor: planner, now: new Date(nowMs - 12 * YEAR_MS), transaction };
  for (const [index, area] of areas.entries()) {
    if (windowOfArea.has(area.id)) continue;
    const window = historyWindowOf(area, index, now);
    if (!window) continue;
    const [taken] = (await sequelize.query(
      'SELECT count(*)::int AS n FROM shutdown_windows WHERE area_id = $1 AND lower(title) = lower($2)',
      { bind: [area.id, HISTORY_WINDOW_TITLE], transaction },
    )) as [Array<{ n: number }>, unknown];
    if (taken[0]!.n > 0) continue; // retired by someone: not brought back
    await createShutdownWindow(asPlanner, {
      areaId: area.id,
      title: HISTORY_WINDOW_TITLE,
      ...window,
      notes: 'The area stopped for a day twice a year; the drive cabinets were inspected then.',
    });
    windowOfArea.set(area.id, window);
    added.historyWindows += 1;
  }

  // the banks of cabinets with no decay run yet (in service, or replaced: their history stays)
  const [bankRows] = await sequelize.query(
    `SELECT b.id, b.cabinet_id AS "cabinetId", c.tag, c.area_id AS "areaId", b.position, b.status,
            to_char(b.installed_on, 'YYYY-MM-DD') AS "installedOn", to_char(b.replaced_on, 'YYYY-MM-DD') AS "replacedOn", b.version,
            b.baseline_source AS "baselineSource", b.baseline_tau_seconds AS "baselineTauSeconds",
            b.baseline_capacitance_microfarads AS "baselineCapacitanceMicrofarads", b.baseline_set_at AS "baselineSetAt",
            b.baseline_set_by_id AS "baselineSetById", b.baseline_design_version_id AS "baselineDesignVersionId", b.baseline_note AS "baselineNote",
            d.code AS "designCode", v.technology, v.unit_capacitance_microfarads AS "unitCapacitanceMicrofarads",
            v.series_count AS "seriesCount", v.parallel_count AS "parallelCount", v.bleeder_ohms AS "bleederOhms",
            v.temp_coefficient_percent_per_kelvin AS "tempCoefficientPercentPerKelvin", v.watch_ratio AS "watchRatio",
            v.end_of_life_ratio AS "endOfLifeRatio", c.dc_bus_volts AS "dcBusVolts", c.marked_wait_minutes AS "markedWaitMinutes"
       FROM banks b JOIN cabinets c ON c.id = b.cabinet_id
       JOIN bank_designs d ON d.id = b.bank_design_id JOIN bank_design_versions v ON v.id = d.current_version_id
      WHERE c.area_id = ANY($1::uuid[]) AND c.retired_at IS NULL AND b.retired_at IS NULL AND b.status IN ('in-service', 'replaced')
        AND b.installed_on IS NOT NULL
        -- an area whose cabinets hold any decay run has its history already
        AND NOT EXISTS (SELECT 1 FROM decay_runs r JOIN banks rb ON rb.id = r.bank_id JOIN cabinets rc ON rc.id = rb.cabinet_id
                         WHERE rc.area_id = c.area_id)
      ORDER BY c.tag, b.position, b.installed_on`,
    { bind: [areas.map((a) => a.id)], transaction },
  );
  const banksOfCabinet = new Map<string, BankRow[]>();
  for (const bank of bankRows as BankRow[]) banksOfCabinet.set(bank.cabinetId, [...(banksOfCabinet.get(bank.cabinetId) ?? []), bank]);
  if (banksOfCabinet.size === 0) return added;

  // the Planner's logged and reviewed visits of those cabinets
  const [plannerRows] = await sequelize.query(
    `SELECT v.id, v.cabinet_id AS "cabinetId", v.state, v.started_at AS "startedAt", v.logged_at AS "loggedAt", v.reviewed_at AS "reviewedAt",
            (SELECT min(t.user_id::text) FROM visit_technicians t WHERE t.visit_id = v.id) AS "technicianId",
            (SELECT array_agg(vb.bank_id::text) FROM visit_banks vb WHERE vb.visit_id = v.id) AS "bankIds"
       FROM visits v WHERE v.cabinet_id = ANY($1::uuid[]) AND v.state IN ('logged', 'reviewed') AND v.started_at IS NOT NULL
      ORDER BY v.started_at`,
    { bind: [[...banksOfCabinet.keys()]], transaction },
  );
  const plannerVisitsOf = new Map<string, PlannerVisitRow[]>();
  for (const visit of plannerRows as PlannerVisitRow[]) plannerVisitsOf.set(visit.cabinetId, [...(plannerVisitsOf.get(visit.cabinetId) ?? []), visit]);

  const visitRows: Array<Record<string, unknown>> = [];
  const visitBankRows: Array<{ visitId: string; bankId: string }> = [];
  const visitTechnicianRows: Array<{ visitId: string; userId: string }> = [];
  const runRows: Array<CreationAttributes<DecayRun>> = [];
  const audits: AuditRecordInput[] = [];
  const baselineChanges: Array<{ state: BankState }> = [];
  const busy = new Map<string, Array<[number, number]>>();
  const isFree = (userId: string, s: number, e: number) => (busy.get(userId) ?? []).every(([bs, be]) => e <= bs || s >= be);
  // the Planner's visits are booked already
  for (const visits of plannerVisitsOf.values())
    for (const v of visits) busy.set(v.technicianId, [...(busy.get(v.technicianId) ?? []), [v.startedAt.getTime(), v.loggedAt.getTime()]]);

  /** Records one run on a bank at `isolatedMs` in a visit; returns the minutes it took. */
  const recordRun = (
    state: BankState,
    random: () => number,
    visit: { id: string; technicianId: string; reviewedAt: Date | null; reviewer: AuthUser | null },
    isolatedMs: number,
    extra: { visualFindings?: DecayRunObservations['visualFindings']; notes?: string } = {},
  ) => {
    const { row, path } = state;
    const years = yearsBetween(state.installMs, isolatedMs);
    const nominal = (row.unitCapacitanceMicrofarads * row.parallelCount) / row.seriesCount;
    const month = new Date(isolatedMs).getUTCMonth();
    const seasonal = Math.cos(((month - 7) / 12) * 2 * Math.PI) * 4; // warmer in late summer
    const bankTempC = round(state.cabinetTempC + seasonal + 1.5 * gaussian(random), 0.5);
    const bleeder = bleederOhmsAt(path, row.bleederOhms, years);
    const meter = DEMO_METERS[Math.floor(random() * DEMO_METERS.length)]!;
    const busVolts = row.dcBusVolts ?? 540;
    const physics = {
      v0Volts: busVolts * (0.99 + 0.05 * random()),
      capacitanceMicrofarads: capacitanceAtMicrofarads(nominal * capacitanceRatioAt(path, years), row.tempCoefficientPercentPerKelvin, bankTempC),
      bleederOhms: bleeder,
      meterInputOhms: meter.inputOhms,
      controlSupplyWatts: CONTROL_SUPPLY_WATTS[row.designCode] ?? 0,
      dropoutVolts: busVolts * (0.55 + 0.1 * random()),
    };
    const simulated = simulateHistoryRun(
      physics,
      state.baseline.tauSeconds,
      { resolutionVolts: meter.resolutionVolts, mistyped: random() < 0.05 },
      random,
    );
    const observations: DecayRunObservations = {
      bankTempC,
      meterName: meter.name,
      meterInputOhms: meter.inputOhms,
      notes: extra.notes ?? '',
      visualFindings: extra.visualFindings ?? [],
    };
    if (state.measureBleederNext) {
      observations.measuredBleederOhms = Math.round(bleeder * (1 + 0.01 * gaussian(random)));
      observations.notes = observations.notes || 'Bleeder measured with the bus discharged after last time’s τ rise.';
    }
    const engine = bankEngineInputs({
      technology: row.technology,
      designFigures: row,
      baseline: { capacitanceMicrofarads: state.baseline.capacitanceMicrofarads, source: state.baseline.source },
      cabinetDcBusVolts: row.dcBusVolts,
      cabinetMarkedWaitMinutes: row.markedWaitMinutes,
    })!;
    const id = crypto.randomUUID();
    const isolatedAt = new Date(isolatedMs);
    const lastT = simulated.samples[simulated.samples.length - 1]!.tSeconds;
    const recordedAt = new Date(isolatedMs + (lastT + 90) * 1000);
    const body = {
      clientId: crypto.randomUUID(),
      source: 'guided' as const,
      isolatedAt: isolatedAt.toISOString(),
      samples: simulated.samples,
      safety: {
        qualifiedPerson: true as const,
        lockoutTagoutApplied: true as const,
        meterRatedAndProved: true as const,
        meterOnTestPoints: true as const,
        absenceOfVoltageVerified: true as const,
        confirmedAt: new Date(isolatedMs + lastT * 1000 + 60_000).toISOString(),
      },
      observations,
    };
    // the row the API stores for such a submission: judged by judgeRecordedRun with the bank's inputs
    const stored = decayRunRowFor({ visitId: visit.id, bankId: row.id, engine, body, recordedById: visit.technicianId, recordedAt });
    const verdict: RecordedRunVerdict = stored.verdict;
    const ok = verdict.status === 'ok';
    const tauRise = ok && verdict.findings.some((f) => f.code === 'tau-rise');
    state.measureBleederNext = tauRise && !state.measureBleederNext;
    const reviewed = visit.reviewedAt !== null && visit.reviewer !== null;
    const queried = reviewed && !ok;
    const comment = queried
      ? 'The readings gave no τ: take the run again at the next visit.'
      : tauRise
        ? 'τ has risen against the baseline: bleeder to be measured and replaced if high.'
        : '';
    runRows.push({
      ...stored,
      id,
      reviewState: reviewed ? (queried ? 'queried' : 'accepted') : 'pending',
      reviewComment: reviewed ? comment : '',
      reviewedById: reviewed ? visit.reviewer!.id : null,
      reviewedAt: reviewed ? visit.reviewedAt : null,
    });
    const technician = nameOf.get(visit.technicianId) ?? null;
    const snapshot = { visitId: visit.id, bankId: row.id, version: 1, health: verdict.health, tauSeconds: stored.tauSeconds };
    audits.push({
      ...decayRunAuditEntry({ ...stored, id }, { cabinetTag: row.tag, bankPosition: row.position }, technician ? { id: technician.id, name: technician.name } : null),
      at: recordedAt,
    });
    if (reviewed) {
      audits.push({
        entityType: 'decay-run',
        entityId: id,
        action: 'review',
        actor: { id: visit.reviewer!.id, name: visit.reviewer!.name },
        summary: `${queried ? 'Queried' : 'Accepted'} the decay run on ${row.tag} ${row.position}${comment ? `: ${comment}` : ''}`,
        before: { ...snapshot, reviewState: 'pending' },
        after: { ...snapshot, reviewState: queried ? 'queried' : 'accepted' },
        at: visit.reviewedAt!,
      });
    }
    // the first trusted run replaces a nameplate baseline (accepted, judged, nothing seen wrong)
    if (
      reviewed &&
      ok &&
      verdict.notJudgedBecause === null &&
      !verdict.safetyFinding &&
      verdict.visualFindings.length === 0 &&
      state.baseline.source === 'nameplate' &&
      state.baselineFromRun === null
    ) {
      const capacitanceMicrofarads = verdict.capacitance.at20CMicrofarads ?? verdict.capacitance.comparedMicrofarads;
      state.baselineFromRun = {
        runId: id,
        at: visit.reviewedAt!,
        tauSeconds: verdict.tauSeconds,
        capacitanceMicrofarads,
        isolatedOn: isolatedAt.toISOString().slice(0, 10),
        normalised: verdict.capacitance.at20CMicrofarads !== null,
      };
      state.baseline = { source: 'decay-run', tauSeconds: verdict.tauSeconds, capacitanceMicrofarads };
      baselineChanges.push({ state });
    }
    added.decayRuns += 1;
    return lastT / 60;
  };

  /** A reviewed visit of the history, as Tomas planned it and the technician and Ines moved it. */
  const addHistoryVisit = (cabinetTag: string, cabinetId: string, bankIds: string[], technician: AuthUser, startMs: number, endMs: number, reviewedMs: number) => {
    const id = crypto.randomUUID();
    const createdMs = startMs - 21 * DAY_MS;
    const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());
    visitRows.push({
      id,
      cabinetId,
      plannedStartAt: new Date(startMs),
      plannedEndAt: new Date(endMs),
      state: 'reviewed',
      startedAt: new Date(startMs),
      loggedAt: new Date(endMs),
      reviewedAt: new Date(reviewedMs),
      createdById: planner.id,
      version: 4,
      createdAt: new Date(createdMs),
      updatedAt: new Date(reviewedMs),
    });
    for (const bankId of bankIds) visitBankRows.push({ visitId: id, bankId });
    visitTechnicianRows.push({ visitId: id, userId: technician.id });
    const snapshot = (state: string, version: number, startedAt: number | null, loggedAt: number | null, reviewedAt: number | null) => ({
      cabinetId,
      plannedStartAt: iso(startMs),
      plannedEndAt: iso(endMs),
      state,
      technicianIds: [technician.id],
      bankIds: [...bankIds].sort(),
      notes: '',
      overrides: [],
      stateReason: '',
      startedAt: iso(startedAt),
      loggedAt: iso(loggedAt),
      reviewedAt: iso(reviewedAt),
      missedAt: null,
      cancelledAt: null,
      version,
    });
    const planned = snapshot('planned', 1, null, null, null);
    const underWay = snapshot('under-way', 2, startMs, null, null);
    const logged = snapshot('logged', 3, startMs, endMs, null);
    const done = snapshot('reviewed', 4, startMs, endMs, reviewedMs);
    const tomas = { id: planner.id, name: planner.name };
    const tech = { id: technician.id, name: technician.name };
    audits.push(
      { entityType: 'visit', entityId: id, action: 'create', actor: tomas, summary: `Planned a visit to ${cabinetTag}`, before: null, after: planned, at: new Date(createdMs) },
      { entityType: 'visit', entityId: id, action: 'start', actor: tech, summary: `Started the visit to ${cabinetTag} (now under way)`, before: planned, after: underWay, at: new Date(startMs) },
      { entityType: 'visit', entityId: id, action: 'log', actor: tech, summary: `Logged the visit to ${cabinetTag} (now logged)`, before: underWay, after: logged, at: new Date(endMs) },
      { entityType: 'visit', entityId: id, action: 'review', actor: { id: engineer.id, name: engineer.name }, summary: `Reviewed the visit to ${cabinetTag} (now reviewed)`, before: logged, after: done, at: new Date(reviewedMs) },
    );
    added.historyVisits += 1;
    return id;
  };

  for (const area of areas) {
    const window = windowOfArea.get(area.id);
    const techs = techniciansOfSite(area.siteCode);
    const cabinetIds = [...new Set((bankRows as BankRow[]).filter((b) => b.areaId === area.id).map((b) => b.cabinetId))];
    if (cabinetIds.length === 0) continue;
    const occurrences: WindowOccurrence[] = window
      ? windowOccurrences(window, area.timeZone, new Date(nowMs - 12 * YEAR_MS).toISOString(), new Date(nowMs - 395 * DAY_MS).toISOString())
      : [];
    // each cabinet's own generator, path per bank, and when its history starts and ends
    const cabinets = cabinetIds.map((cabinetId) => {
      const banks = banksOfCabinet.get(cabinetId)!;
      const random = seededRandom(seedOf(banks[0]!.tag));
      const cabinetTempC = (AREA_CABINET_TEMP_C[area.name] ?? 32) + (random() - 0.5) * 8;
      const states = banks.map((row): BankState => {
        const installMs = Date.parse(`${row.installedOn}T12:00:00Z`);
        const endMs = row.replacedOn ? Date.parse(`${row.replacedOn}T12:00:00Z`) : nowMs;
        const facts = {
          technology: row.technology,
          nominalMicrofarads: (row.unitCapacitanceMicrofarads * row.parallelCount) / row.seriesCount,
          bleederOhms: row.bleederOhms,
          tempCoefficientPercentPerKelvin: row.tempCoefficientPercentPerKelvin,
          busVolts: row.dcBusVolts ?? 540,
          cabinetTempC,
          controlSupplyWatts: CONTROL_SUPPLY_WATTS[row.designCode] ?? 0,
        };
        const path = ageingPathOf(facts, yearsBetween(installMs, endMs), random);
        if (row.replacedOn) {
          // the original bank was replaced after its cans bulged: it aged fast towards its end
          const life = Math.max(1, yearsBetween(installMs, endMs));
          path.lossPerYear = (0.17 + 0.06 * random()) / life;
          path.kneeYears = null;
          path.kneeLossPerYearSquared = 0;
        }
        return {
          row,
          installMs,
          endMs,
          path,
          cabinetTempC,
          baseline: { source: row.baselineSource, tauSeconds: row.baselineTauSeconds, capacitanceMicrofarads: row.baselineCapacitanceMicrofarads },
          baselineFromRun: null,
          measureBleederNext: false,
        };
      });
      const historyYears = 3 + Math.floor(random() * 8);
      const plannerVisits = plannerVisitsOf.get(cabinetId) ?? [];
      const firstPlannerMs = plannerVisits.length ? plannerVisits[0]!.startedAt.getTime() : Infinity;
      // the history ends half a year before the Planner's own visits of the cabinet, or over a
      // year ago, and reaches 3–10 years back from there (not before the install)
      const toMs = Math.min(firstPlannerMs - 150 * DAY_MS, nowMs - 395 * DAY_MS);
      return {
        id: cabinetId,
        tag: banks[0]!.tag,
        random,
        states,
        fromMs: Math.max(toMs - historyYears * YEAR_MS, Math.min(...states.map((s) => s.installMs)) + 60 * DAY_MS),
        toMs,
        lastVisitMs: -Infinity,
        plannerVisits,
        markedWaitMinutes: banks[0]!.markedWaitMinutes,
      };
    });

    for (const occurrence of occurrences) {
      const occStart = Date.parse(occurrence.startsAt);
      const occEnd = Date.parse(occurrence.endsAt);
      // those longest unvisited first, so no cabinet waits much over a year
      const due = cabinets
        .filter((c) => occStart >= c.fromMs && occStart <= c.toMs)
        .filter((c) => occStart - c.lastVisitMs > 330 * DAY_MS || (occStart - c.lastVisitMs > 150 * DAY_MS && c.random() < 0.5))
        .sort((a, b) => a.lastVisitMs - b.lastVisitMs || a.tag.localeCompare(b.tag));
      for (const cabinet of due) {
        const alive = cabinet.states.filter((s) => s.installMs + 30 * DAY_MS <= occStart && s.endMs > occEnd);
        if (alive.length === 0) continue;
        const minutes =
          Math.ceil(estimateVisitMinutes(alive.map((s) => ({ baselineTauSeconds: s.baseline.tauSeconds })), { markedWaitMinutes: cabinet.markedWaitMinutes }) / 15) * 15;
        let fit: { tech: AuthUser; startMs: number } | null = null;
        for (const tech of cabinet.random() < 0.5 ? techs : [...techs].reverse()) {
          const candidates = [occStart, ...(busy.get(tech.id) ?? []).map(([, e]) => e)].filter((s) => s >= occStart).sort((a, b) => a - b);
          const startMs = candidates.find((s) => s + minutes * MINUTE_MS <= occEnd && isFree(tech.id, s, s + minutes * MINUTE_MS));
          if (startMs !== undefined) {
            fit = { tech, startMs };
            break;
          }
        }
        if (!fit) continue;
        const endMs = fit.startMs + minutes * MINUTE_MS;
        busy.set(fit.tech.id, [...(busy.get(fit.tech.id) ?? []), [fit.startMs, endMs]]);
        cabinet.lastVisitMs = occStart;
        const reviewedMs = Math.min(endMs + (2 + Math.floor(cabinet.random() * 8)) * DAY_MS, nowMs - DAY_MS);
        const visitId = addHistoryVisit(cabinet.tag, cabinet.id, alive.map((s) => s.row.id), fit.tech, fit.startMs, endMs, reviewedMs);
        let at = fit.startMs + 10 * MINUTE_MS;
        for (const state of alive) {
          // the original bank's last visit before it was replaced: the cans had bulged
          const last = state.row.replacedOn !== null && state.endMs - occEnd < 200 * DAY_MS;
          const took = recordRun(
            state,
            cabinet.random,
            { id: visitId, technicianId: fit.tech.id, reviewedAt: new Date(reviewedMs), reviewer: engineer },
            at,
            last ? { visualFindings: ['bulged-can'], notes: 'Two cans bulged at the top; replacement ordered.' } : {},
          );
          at += (10 + took + (cabinet.markedWaitMinutes ?? 15)) * MINUTE_MS;
        }
      }
    }

    // the Planner's own logged and reviewed visits hold runs too (pending while not reviewed)
    for (const cabinet of cabinets) {
      for (const visit of cabinet.plannerVisits) {
        let at = visit.startedAt.getTime() + 10 * MINUTE_MS;
        for (const state of cabinet.states.filter((s) => visit.bankIds.includes(s.row.id))) {
          const took = recordRun(state, cabinet.random, {
            id: visit.id,
            technicianId: visit.technicianId,
            reviewedAt: visit.state === 'reviewed' ? visit.reviewedAt : null,
            reviewer: visit.state === 'reviewed' ? engineer : null,
          }, at);
          at += (5 + took) * MINUTE_MS;
        }
      }
    }
  }

  // write it all: visits, their banks and technicians, runs, baselines, audit entries
  const chunks = <T>(rows: T[], size: number) => Array.from({ length: Math.ceil(rows.length / size) }, (_, i) => rows.slice(i * size, (i + 1) * size));
  for (const chunk of chunks(visitRows, 2000)) await Visit.bulkCreate(chunk as never[], { transaction, validate: false, hooks: false });
  for (const chunk of chunks(visitBankRows, 5000)) await VisitBank.bulkCreate(chunk, { transaction, validate: false, hooks: false });
  for (const chunk of chunks(visitTechnicianRows, 5000)) await VisitTechnician.bulkCreate(chunk, { transaction, validate: false, hooks: false });
  for (const chunk of chunks(runRows, 300)) await DecayRun.bulkCreate(chunk, { transaction, validate: false, hooks: false });

  if (baselineChanges.length) {
    const rows = baselineChanges.map(({ state }) => ({ state, run: state.baselineFromRun! }));
    await sequelize.query(
      `UPDATE banks b SET baseline_source = 'decay-run', baseline_tau_seconds = t.tau, baseline_capacitance_microfarads = t.cap,
              baseline_decay_run_id = t.run_id, baseline_set_at = t.at, baseline_set_by_id = $6, baseline_design_version_id = NULL,
              baseline_note = t.note, version = b.version + 1
         FROM unnest($1::uuid[], $2::float8[], $3::float8[], $4::uuid[], $5::timestamptz[], $7::text[]) AS t(id, tau, cap, run_id, at, note)
        WHERE b.id = t.id`,
      {
        bind: [
          rows.map((r) => r.state.row.id),
          rows.map((r) => r.run.tauSeconds),
          rows.map((r) => r.run.capacitanceMicrofarads),
          rows.map((r) => r.run.runId),
          rows.map((r) => r.run.at.toISOString()),
          engineer.id,
          rows.map((r) => noteOf(r.run)),
        ],
        transaction,
      },
    );
    for (const { state, run } of rows) {
      const row = state.row;
      audits.push({
        entityType: 'bank',
        entityId: row.id,
        action: 'baseline',
        actor: { id: engineer.id, name: engineer.name },
        summary: `Set the baseline of bank ${row.position} of ${row.tag} from its first trusted decay run`,
        before: {
          baselineSource: row.baselineSource,
          baselineTauSeconds: row.baselineTauSeconds,
          baselineCapacitanceMicrofarads: row.baselineCapacitanceMicrofarads,
          baselineDecayRunId: null,
          version: row.version,
        },
        after: {
          baselineSource: 'decay-run',
          baselineTauSeconds: run.tauSeconds,
          baselineCapacitanceMicrofarads: run.capacitanceMicrofarads,
          baselineDecayRunId: run.runId,
          baselineNote: noteOf(run),
          version: row.version + 1,
        },
        at: run.at,
      });
    }
  }
  await recordAuditBatch(uow, audits);
  return added;
}

function noteOf(run: { isolatedOn: string; normalised: boolean }): string {
  return `From the decay run of ${run.isolatedOn}, accepted on review${run.normalised ? '' : ' (capacitance not normalised to 20 °C)'}`;
}
