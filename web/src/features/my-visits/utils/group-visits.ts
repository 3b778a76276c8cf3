/**
 * My visits, in the order a technician plans their days: what is under way, today, the rest of
 * this week, then the coming weeks one by one; past visits not done last. "Today" and "this week" are read on each visit's
 * site clock, so a visit at a site in another zone lands on the right day.
 */
import type { Visit } from '../../../../../shared/schemas/visit';
import { dayAfter, localDayOn, weekStartOn } from './visit-times';

export type VisitGroupKind = 'under-way' | 'earlier' | 'today' | 'this-week' | 'coming';

/** A heading of the list and the visits under it, earliest first. */
export interface VisitGroup {
  kind: VisitGroupKind;
  /** For `coming`: the Monday (YYYY-MM-DD) of the week on the site's clock. */
  weekOn?: string;
  visits: Visit[];
}

/** States of a past visit that still ask something of the technician. */
const STILL_OPEN_STATES = new Set<Visit['state']>(['planned', 'missed']);

/** The group a visit belongs to at `now`, or null when it is done and past. */
export function groupOfVisit(visit: Visit, now: Date): { kind: VisitGroupKind; weekOn?: string } | null {
  if (visit.state === 'under-way') return { kind: 'under-way' };
  const zone = visit.timeZone;
  const today = localDayOn(now, zone);
  const startDay = localDayOn(visit.plannedStartAt, zone);
  const endDay = localDayOn(visit.plannedEndAt, zone);
  if (endDay < today) return STILL_OPEN_STATES.has(visit.state) ? { kind: 'earlier' } : null;
  if (startDay <= today) return { kind: 'today' };
  const nextMonday = dayAfter(weekStartOn(now, zone), 7);
  if (startDay < nextMonday) return { kind: 'this-week' };
  return { kind: 'coming', weekOn: weekStartOn(visit.plannedStartAt, zone) };
}

const ORDER: VisitGroupKind[] = ['under-way', 'today', 'this-week', 'coming', 'earlier'];

/**
 * Groups visits for the My visits list: under way, today, this week, each coming week, then
 * earlier ones still open (planned or missed); done visits of past days are left out. Empty groups
 * are left out too; visits inside a group run by planned start.
 */
export function groupMyVisits(visits: readonly Visit[], now: Date): VisitGroup[] {
  const groups = new Map<string, VisitGroup>();
  const sorted = [...visits].sort(
    (a, b) => a.plannedStartAt.localeCompare(b.plannedStartAt) || a.id.localeCompare(b.id),
  );
  for (const visit of sorted) {
    const group = groupOfVisit(visit, now);
    if (!group) continue;
    const key = group.kind === 'coming' ? `coming:${group.weekOn}` : group.kind;
    const existing = groups.get(key);
    if (existing) existing.visits.push(visit);
    else groups.set(key, { ...group, visits: [visit] });
  }
  return [...groups.values()].sort(
    (a, b) => ORDER.indexOf(a.kind) - ORDER.indexOf(b.kind) || (a.weekOn ?? '').localeCompare(b.weekOn ?? ''),
  );
}

/** The heading of a group. */
export function groupTitle(group: Pick<VisitGroup, 'kind' | 'weekOn'>): string {
  switch (group.kind) {
    case 'under-way':
      return 'Under way';
    case 'earlier':
      return 'Earlier, not done';
    case 'today':
      return 'Today';
    case 'this-week':
      return 'Later this week';
    case 'coming': {
      const [y, m, d] = (group.weekOn ?? '').split('-').map(Number);
      const monday = new Date(Date.UTC(y!, m! - 1, d!));
      return `Week of ${monday.toLocaleDateString('en-GB', { weekday: 'short', day: 'numeric', month: 'short', timeZone: 'UTC' })}`;
    }
  }
}
