/**
 * The warnings a planning check gives before a visit is saved: a visit outside every shutdown
 * window of its area (a decay run needs the drive de-energised), a technician double-booked,
 * a bank not yet due. Pure: the caller gathers the window occurrences, the technicians' other
 * visits and the banks' due dates; no clock, no I/O.
 */
import { PLANNING_WARNING_KINDS, type PlanningWarningKind } from '../constants/planning';

/** One warning of a planning check. */
export interface PlanningWarningFinding {
  kind: PlanningWarningKind;
  message: string;
  /** The technician double-booked. */
  technicianId?: string;
  /** The bank not yet due. */
  bankId?: string;
}

/** Two instants, UTC ISO; `endAt` after `startAt`. */
export interface TimeSpan {
  startAt: string;
  endAt: string;
}

/** Another visit of an assigned technician (planned or under way). */
export interface OtherVisit extends TimeSpan {
  id: string;
  /** The cabinet the other visit is at, named in the warning. */
  cabinetTag: string;
  technicianIds: readonly string[];
}

/** What the planning check needs to know. */
export interface PlanningFacts {
  /** The visit as it would be saved. */
  visit: TimeSpan & { technicianIds: readonly string[]; bankIds: readonly string[] };
  /** The site's IANA time zone: a bank is due by the visit's end's local date. */
  timeZone: string;
  /** Occurrences of the shutdown windows of the cabinet's area overlapping the visit. */
  windowOccurrences: readonly { startsAt: string; endsAt: string }[];
  /** Other planned or under-way visits of the assigned technicians (the visit itself left out). */
  otherVisits: readonly OtherVisit[];
  /** Names of the technicians, for the messages. */
  technicianNames: Readonly<Record<string, string>>;
  /** Each bank of the visit with its position and due date (`YYYY-MM-DD`, the site's zone). */
  banks: readonly { id: string; position: string; dueOn: string }[];
}

/**
 * The local calendar date of an instant in a zone, `YYYY-MM-DD`.
 *
 * @example localDateOf('2027-01-09T23:30:00Z', 'Europe/Berlin') // '2027-01-10'
 */
export function localDateOf(instantAt: string, timeZone: string): string {
  const parts = new Intl.DateTimeFormat('en-CA', {
    timeZone,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
  }).formatToParts(new Date(instantAt));
  const part = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
  return `${part('year')}-${part('month')}-${part('day')}`;
}

/** True when the two spans overlap (touching ends do not: one may end when the next starts). */
export function spansOverlap(a: TimeSpan, b: TimeSpan): boolean {
  return Date.parse(a.startAt) < Date.parse(b.endAt) && Date.parse(b.startAt) < Date.parse(a.endAt);
}

/** True when the span lies wholly inside one of the occurrences. */
export function insideSomeOccurrence(span: TimeSpan, occurrences: PlanningFacts['windowOccurrences']): boolean {
  const start = Date.parse(span.startAt);
  const end = Date.parse(span.endAt);
  return occurrences.some((o) => Date.parse(o.startsAt) <= start && end <= Date.parse(o.endsAt));
}

/**
 * The planning warnings of a visit, in the order of {@link PLANNING_WARNING_KINDS}:
 * - `outside-window` once, when the visit is not wholly inside one occurrence of a shutdown
 *   window of its area;
 * - `double-booked` once per assigned technician who has another planned or under-way visit
 *   overlapping it (`technicianId` set);
 * - `not-due` once per bank whose due date is after the local date (site's zone) of the
 *   visit's end (`bankId` set).
 *
 * @example
 * planningWarnings({
 *   visit: { startAt: '2027-01-09T05:00:00Z', endAt: '2027-01-09T07:00:00Z', technicianIds: ['t1'], bankIds: ['b1'] },
 *   timeZone: 'Europe/Berlin',
 *   windowOccurrences: [{ startsAt: '2027-01-09T05:00:00Z', endsAt: '2027-01-09T13:00:00Z' }],
 *   otherVisits: [], technicianNames: { t1: 'Ana' },
 *   banks: [{ id: 'b1', position: 'A', dueOn: '2027-03-01' }],
 * })
 * // [{ kind: 'not-due', bankId: 'b1', message: 'Bank A is not due until 2027-03-01.' }]
 */
export function planningWarnings(facts: PlanningFacts): PlanningWarningFinding[] {
  const { visit } = facts;
  const warnings: PlanningWarningFinding[] = [];

  if (!insideSomeOccurrence(visit, facts.windowOccurrences)) {
    warnings.push({
      kind: 'outside-window',
      message:
        facts.windowOccurrences.length === 0
          ? 'The visit falls outside every shutdown window of its area.'
          : 'The visit is not wholly inside one shutdown window of its area.',
    });
  }

  for (const technicianId of visit.technicianIds) {
    const clash = facts.otherVisits
      .filter((other) => other.technicianIds.includes(technicianId) && spansOverlap(visit, other))
      .sort((a, b) => Date.parse(a.startAt) - Date.parse(b.startAt))[0];
    if (clash) {
      const name = facts.technicianNames[technicianId] ?? 'A technician';
      warnings.push({
        kind: 'double-booked',
        technicianId,
        message: `${name} already has a visit to ${clash.cabinetTag} at that time.`,
      });
    }
  }

  const endOn = localDateOf(visit.endAt, facts.timeZone);
  for (const bankId of visit.bankIds) {
    const bank = facts.banks.find((b) => b.id === bankId);
    if (bank && bank.dueOn > endOn) {
      warnings.push({ kind: 'not-due', bankId, message: `Bank ${bank.position} is not due until ${bank.dueOn}.` });
    }
  }

  const rank = (kind: PlanningWarningKind) => PLANNING_WARNING_KINDS.indexOf(kind);
  return warnings.sort((a, b) => rank(a.kind) - rank(b.kind));
}

/** The warning kinds not accepted by an override, each once. */
export function unacceptedKinds(
  warnings: readonly PlanningWarningFinding[],
  overrides: readonly { kind: PlanningWarningKind }[],
): PlanningWarningKind[] {
  const accepted = new Set(overrides.map((o) => o.kind));
  return [...new Set(warnings.map((w) => w.kind))].filter((kind) => !accepted.has(kind));
}
