/**
 * Plan a shutdown window in one step: a proposal of one visit per cabinet covering its due
 * banks, split across the available technicians by estimated duration, and never past the
 * occurrence's end. Pure: no clock, no I/O; the caller chooses the banks (due by the window's
 * end, not yet planned) and the technicians (available for the window).
 *
 * The rule ("longest first onto the technician free soonest"):
 * 1. Each cabinet's visit covers its banks in position order; its estimate is
 *    {@link estimateVisitMinutes} (per bank: setup + 5 τ + marked wait, the sum rounded up).
 * 2. Visits are taken longest first (ties: cabinet tag, then cabinet id).
 * 3. Every technician starts free at the occurrence's start. Each visit goes to the technician
 *    who can start it soonest (ties: the order the technicians were given in), and that
 *    technician is then free at its end: each technician's visits follow one another. Visits a
 *    technician already has (`busy`) are planned around: a new visit never overlaps one.
 * 4. A visit that fits nobody before the occurrence's end keeps the banks (in position order)
 *    that still fit someone; the others are left out, with the reason.
 * 5. With no technician at all, every bank is left out.
 */
import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';
import { estimateBankMinutes, estimateVisitMinutes, type DurationOptions } from './visit-duration';

const MS_PER_MINUTE = 60_000;

/** The occurrence of a shutdown window being planned, and its site's zone (for the reasons' times). */
export interface PlanOccurrence {
  /** UTC ISO instant. */
  startsAt: string;
  /** UTC ISO instant, after `startsAt`. */
  endsAt: string;
  /** The site's IANA time zone, e.g. 'Europe/Berlin'. */
  timeZone: string;
}

/** A span of time, UTC ISO instants. */
export interface BusySpan {
  startsAt: string;
  endsAt: string;
}

/** A technician who may take visits in the occurrence. */
export interface PlanTechnician {
  id: string;
  name: string;
  /** Visits the technician already has during the occurrence: new visits go around them. */
  busy?: readonly BusySpan[];
}

/** Busy spans as sorted [start, end) pairs in ms. */
function busyMs(spans: readonly BusySpan[] | undefined): Array<[number, number]> {
  return (spans ?? [])
    .map((span): [number, number] => [Date.parse(span.startsAt), Date.parse(span.endsAt)])
    .filter(([from, to]) => Number.isFinite(from) && Number.isFinite(to) && to > from)
    .sort((a, b) => a[0] - b[0]);
}

/** The first moment ≥ `fromMs` at which `minutes` fit without meeting a busy span. */
function firstFitMs(
  fromMs: number,
  minutes: number,
  busy: ReadonlyArray<[number, number]>,
): number {
  let at = fromMs;
  const lengthMs = minutes * MS_PER_MINUTE;
  for (const [from, to] of busy) {
    if (from < at + lengthMs && to > at) at = to;
  }
  return at;
}

/** A bank to cover. */
export interface PlanBank {
  bankId: string;
  /** Where the bank sits in the cabinet, e.g. 'DC1'. */
  position: string;
  /** Baseline τ, seconds. */
  baselineTauSeconds: number;
}

/** A cabinet with the banks to cover in it. */
export interface PlanCabinet {
  cabinetId: string;
  cabinetTag: string;
  /** The drive maker's marked wait, minutes; null: unknown. */
  markedWaitMinutes: number | null;
  banks: readonly PlanBank[];
}

/** One bank of a proposed visit, with its own estimate. */
export interface ProposedBank {
  bankId: string;
  position: string;
  baselineTauSeconds: number;
  /** Not rounded; the visit rounds its sum. */
  estimatedMinutes: number;
}

/** A visit the proposal puts forward: the fields of a visit to create, and its estimate. */
export interface ProposedVisit {
  cabinetId: string;
  cabinetTag: string;
  markedWaitMinutes: number | null;
  bankIds: string[];
  banks: ProposedBank[];
  technicianIds: string[];
  /** UTC ISO. */
  plannedStartAt: string;
  /** UTC ISO: the start plus `estimatedMinutes`. */
  plannedEndAt: string;
  /** Whole minutes. */
  estimatedMinutes: number;
}

/** Why a bank is not in the proposal. */
export type LeftOutKind = 'past-window-end' | 'no-technician';

/** A bank the proposal leaves out, with the reason in words. */
export interface LeftOutBank {
  bankId: string;
  cabinetId: string;
  cabinetTag: string;
  position: string;
  kind: LeftOutKind;
  reason: string;
}

/** What {@link proposeWindowPlan} answers. */
export interface WindowPlan {
  /** Ordered by start, then by the technicians' order. */
  visits: ProposedVisit[];
  /** Ordered as the cabinets were taken (longest first), banks in position order. */
  leftOut: LeftOutBank[];
}

/** Compares texts as people sort tags and positions: 'DC2' before 'DC10'. */
const naturalOrder = (a: string, b: string) =>
  a.localeCompare(b, 'en', { numeric: true, sensitivity: 'base' });

/** "07:50" on the site's clock. */
function clockTime(ms: number, timeZone: string): string {
  return format(new TZDate(ms, timeZone), 'HH:mm');
}

/**
 * The proposal for one occurrence (see the module comment for the rule).
 *
 * @param input.occurrence - the occurrence's start and end, and its site's zone
 * @param input.cabinets - the cabinets with the banks to cover (banks with no cabinet entry are not planned)
 * @param input.technicians - the technicians available, in the order ties go to (e.g. by name)
 * @param options - the estimate's settings (setup minutes)
 * @returns the visits and the banks left out
 * @example
 * proposeWindowPlan({
 *   occurrence: { startsAt: '2027-01-09T05:00:00Z', endsAt: '2027-01-09T07:00:00Z', timeZone: 'Europe/Berlin' },
 *   cabinets: [{ cabinetId: 'c1', cabinetTag: 'DR-101', markedWaitMinutes: 5,
 *     banks: [{ bankId: 'b1', position: 'DC1', baselineTauSeconds: 120 }] }],
 *   technicians: [{ id: 't1', name: 'Ana' }],
 * }).visits[0]
 * // { cabinetTag: 'DR-101', technicianIds: ['t1'], plannedStartAt: '2027-01-09T05:00:00.000Z',
 * //   plannedEndAt: '2027-01-09T05:30:00.000Z', estimatedMinutes: 30, ... }
 */
export function proposeWindowPlan(
  input: {
    occurrence: PlanOccurrence;
    cabinets: readonly PlanCabinet[];
    technicians: readonly PlanTechnician[];
  },
  options: DurationOptions = {},
): WindowPlan {
  const { occurrence, technicians } = input;
  const startMs = Date.parse(occurrence.startsAt);
  const endMs = Date.parse(occurrence.endsAt);
  if (!Number.isFinite(startMs) || !Number.isFinite(endMs) || endMs <= startMs) {
    throw new RangeError('The occurrence must have a start before its end (UTC ISO instants).');
  }
  const windowEnd = clockTime(endMs, occurrence.timeZone);

  const candidates = input.cabinets
    .filter((cabinet) => cabinet.banks.length > 0)
    .map((cabinet) => {
      const banks = [...cabinet.banks].sort(
        (a, b) => naturalOrder(a.position, b.position) || naturalOrder(a.bankId, b.bankId),
      );
      return { cabinet, banks, minutes: estimateVisitMinutes(banks, cabinet, options) };
    })
    .sort(
      (a, b) =>
        b.minutes - a.minutes ||
        naturalOrder(a.cabinet.cabinetTag, b.cabinet.cabinetTag) ||
        naturalOrder(a.cabinet.cabinetId, b.cabinet.cabinetId),
    );

  const visits: Array<ProposedVisit & { technicianIndex: number }> = [];
  const leftOut: LeftOutBank[] = [];
  const leave = (cabinet: PlanCabinet, bank: PlanBank, kind: LeftOutKind, reason: string) =>
    leftOut.push({
      bankId: bank.bankId,
      cabinetId: cabinet.cabinetId,
      cabinetTag: cabinet.cabinetTag,
      position: bank.position,
      kind,
      reason,
    });

  const freeAtMs = technicians.map(() => startMs);
  const busy = technicians.map((t) => busyMs(t.busy));
  /** The technician who can start `minutes` soonest, ending by the occurrence's end; null when nobody can. */
  const soonest = (minutes: number): { index: number; fromMs: number } | null => {
    let best: { index: number; fromMs: number } | null = null;
    technicians.forEach((_t, index) => {
      const fromMs = firstFitMs(freeAtMs[index]!, minutes, busy[index]!);
      if (fromMs + minutes * MS_PER_MINUTE <= endMs && (best === null || fromMs < best.fromMs))
        best = { index, fromMs };
    });
    return best;
  };

  for (const { cabinet, banks } of candidates) {
    if (technicians.length === 0) {
      for (const bank of banks)
        leave(
          cabinet,
          bank,
          'no-technician',
          'No technician is available for this window at its site.',
        );
      continue;
    }
    const kept: PlanBank[] = [];
    const dropped: PlanBank[] = [];
    for (const bank of banks) {
      if (soonest(estimateVisitMinutes([...kept, bank], cabinet, options)) !== null)
        kept.push(bank);
      else dropped.push(bank);
    }
    const keptMinutes = estimateVisitMinutes(kept, cabinet, options);
    for (const bank of dropped) {
      const needs = estimateVisitMinutes([bank], cabinet, options);
      // the technician free soonest (past any visit they already have), to say when they would finish
      let first = 0;
      const freeFrom = technicians.map((_t, i) =>
        firstFitMs(freeAtMs[i]!, 1 / MS_PER_MINUTE, busy[i]!),
      );
      for (let i = 1; i < freeFrom.length; i += 1) if (freeFrom[i]! < freeFrom[first]!) first = i;
      const fromMs =
        freeFrom[first]! +
        (kept.length > 0 && soonest(keptMinutes)?.index === first
          ? keptMinutes * MS_PER_MINUTE
          : 0);
      const wouldEndMs = fromMs + needs * MS_PER_MINUTE;
      const reason =
        wouldEndMs > endMs && busy[first]!.every(([from, to]) => to <= fromMs || from >= wouldEndMs)
          ? `Needs about ${needs} min; ${technicians[first]!.name}, free soonest (from ${clockTime(fromMs, occurrence.timeZone)}), ` +
            `would finish at ${clockTime(wouldEndMs, occurrence.timeZone)}, after the window ends at ${windowEnd} (${occurrence.timeZone}).`
          : `Needs about ${needs} min; no technician has that long free before the window ends at ${windowEnd} (${occurrence.timeZone}).`;
      leave(cabinet, bank, 'past-window-end', reason);
    }
    if (kept.length === 0) continue;

    const place = soonest(keptMinutes)!;
    const chosen = place.index;
    const fromMs = place.fromMs;
    const technician = technicians[chosen]!;
    const minutes = keptMinutes;
    const untilMs = fromMs + minutes * MS_PER_MINUTE;
    freeAtMs[chosen] = untilMs;
    visits.push({
      cabinetId: cabinet.cabinetId,
      cabinetTag: cabinet.cabinetTag,
      markedWaitMinutes: cabinet.markedWaitMinutes,
      bankIds: kept.map((bank) => bank.bankId),
      banks: kept.map((bank) => ({
        bankId: bank.bankId,
        position: bank.position,
        baselineTauSeconds: bank.baselineTauSeconds,
        estimatedMinutes: estimateBankMinutes(bank, cabinet, options),
      })),
      technicianIds: [technician.id],
      plannedStartAt: new Date(fromMs).toISOString(),
      plannedEndAt: new Date(untilMs).toISOString(),
      estimatedMinutes: minutes,
      technicianIndex: chosen,
    });
  }

  visits.sort(
    (a, b) =>
      Date.parse(a.plannedStartAt) - Date.parse(b.plannedStartAt) ||
      a.technicianIndex - b.technicianIndex,
  );
  return { visits: visits.map(({ technicianIndex: _drop, ...visit }) => visit), leftOut };
}

/** A row of a proposal being edited: who does it and how long it takes. */
export interface PackableRow {
  technicianIds: readonly string[];
  /** Whole minutes. */
  estimatedMinutes: number;
}

/** A row with the times {@link packProposalRows} gives it. */
export type PackedRow<R extends PackableRow> = R & {
  plannedStartAt: string;
  plannedEndAt: string;
  /** True when the row would end after the occurrence's end: it cannot be confirmed as it is. */
  endsAfterWindow: boolean;
};

/**
 * Lays the rows of an edited proposal out again, the way {@link proposeWindowPlan} does: in
 * the order given, each row starts when all of its technicians are free (every technician free
 * from the occurrence's start, around the visits they already have) and keeps them busy until
 * its end. After a row is removed or given to another technician, each technician's rows follow
 * one another again with no overlap. A row with no technician starts at the occurrence's start.
 *
 * @param rows - in the order to lay them out (a proposal's own order reproduces its times)
 * @param occurrence - the occurrence's start and end (UTC ISO)
 * @param busyOf - the visits each technician already has during the occurrence, by technician id
 * @example
 * packProposalRows([{ technicianIds: ['t1'], estimatedMinutes: 30 }, { technicianIds: ['t1'], estimatedMinutes: 45 }],
 *   { startsAt: '2027-01-09T05:00:00Z', endsAt: '2027-01-09T06:00:00Z' })
 * // [{ …, plannedStartAt: '2027-01-09T05:00:00.000Z', plannedEndAt: '2027-01-09T05:30:00.000Z', endsAfterWindow: false },
 * //  { …, plannedStartAt: '2027-01-09T05:30:00.000Z', plannedEndAt: '2027-01-09T06:15:00.000Z', endsAfterWindow: true }]
 */
export function packProposalRows<R extends PackableRow>(
  rows: readonly R[],
  occurrence: { startsAt: string; endsAt: string },
  busyOf: Readonly<Record<string, readonly BusySpan[]>> = {},
): Array<PackedRow<R>> {
  const startMs = Date.parse(occurrence.startsAt);
  const endMs = Date.parse(occurrence.endsAt);
  const freeAtMs = new Map<string, number>();
  return rows.map((row) => {
    const minutes = Math.max(0, row.estimatedMinutes);
    const busy = busyMs(row.technicianIds.flatMap((id) => busyOf[id] ?? [])).sort(
      (a, b) => a[0] - b[0],
    );
    const fromMs = firstFitMs(
      Math.max(startMs, ...row.technicianIds.map((id) => freeAtMs.get(id) ?? startMs)),
      minutes,
      busy,
    );
    const untilMs = fromMs + minutes * MS_PER_MINUTE;
    for (const id of row.technicianIds) freeAtMs.set(id, untilMs);
    return {
      ...row,
      plannedStartAt: new Date(fromMs).toISOString(),
      plannedEndAt: new Date(untilMs).toISOString(),
      endsAfterWindow: untilMs > endMs,
    };
  });
}
