/**
 * Words and links of the Due list: due dates and distances, a visit's start on its site's clock
 * with the zone named, and the Planner links ("Plan a visit", a planned visit's day).
 */
import { TZDate } from '@date-fns/tz';
import { format, parseISO } from 'date-fns';
import type { DueBasis } from '../../../../../shared/domain/due';
import type { DueBank } from '../../../../../shared/schemas/due';

/**
 * A calendar date as people read it.
 *
 * @example formatDueOn('2026-12-10') // 'Thu 10 Dec 2026'
 */
export function formatDueOn(dateOn: string): string {
  // a plain date: parsed and shown on the same (local) calendar, so no zone can move it
  return format(parseISO(dateOn), 'EEE d MMM yyyy');
}

/**
 * How far away a due date is, from the site's today: days up to two months, then months up to
 * two years, then years (whole ones, rounded down).
 *
 * @example dueDistance(-3) // '3 days overdue'
 * @example dueDistance(0) // 'due today'
 * @example dueDistance(1) // 'in 1 day'
 * @example dueDistance(-6532) // '17 years overdue'
 */
export function dueDistance(daysUntilDue: number): string {
  if (daysUntilDue === 0) return 'due today';
  const days = Math.abs(daysUntilDue);
  const amount =
    days < 60
      ? plural(days, 'day')
      : days < 730
        ? plural(Math.floor(days / 30.436875), 'month')
        : plural(Math.floor(days / 365.2425), 'year');
  return daysUntilDue < 0 ? `${amount} overdue` : `in ${amount}`;
}

function plural(n: number, unit: string): string {
  return `${n} ${unit}${n === 1 ? '' : 's'}`;
}

/**
 * How far away the due date is and why, in a few words. A bank never inspected that is already
 * overdue reads "never inspected: due now": counting years since its install date says nothing
 * a planner can act on.
 *
 * @example dueWhenText({ daysUntilDue: -6532, lastInspectedOn: null, basis: 'design-interval', inspectionIntervalDays: 365 }) // 'never inspected: due now'
 * @example dueWhenText({ daysUntilDue: -3, lastInspectedOn: '2025-11-01', basis: 'yearly', inspectionIntervalDays: 730 }) // '3 days overdue · at least yearly'
 */
export function dueWhenText(
  bank: Pick<DueBank, 'daysUntilDue' | 'lastInspectedOn' | 'basis' | 'inspectionIntervalDays'>,
): string {
  if (bank.lastInspectedOn === null && bank.daysUntilDue < 0) return 'never inspected: due now';
  return `${dueDistance(bank.daysUntilDue)} · ${dueBasisText(bank.basis, bank.inspectionIntervalDays)}`;
}

/**
 * Why the bank is due then, in a few words.
 *
 * @example dueBasisText('yearly', 730) // 'at least yearly'
 */
export function dueBasisText(basis: DueBasis, inspectionIntervalDays: number): string {
  if (basis === 'forecast') return 'the forecast asks sooner';
  if (basis === 'yearly') return 'at least yearly';
  return `every ${inspectionIntervalDays} days (design)`;
}

/**
 * An instant on a site's clock with the zone named.
 *
 * @example formatSiteTime('2026-12-10T08:00:00Z', 'Europe/Berlin') // 'Thu 10 Dec, 09:00 Europe/Berlin'
 */
export function formatSiteTime(atIso: string, timeZone: string): string {
  return `${format(new TZDate(atIso, timeZone), 'EEE d MMM, HH:mm')} ${timeZone}`;
}

/**
 * The calendar date of an instant on a site's clock.
 *
 * @example siteDateOn('2026-12-10T23:30:00Z', 'Europe/Berlin') // '2026-12-11'
 */
export function siteDateOn(atIso: string, timeZone: string): string {
  return format(new TZDate(atIso, timeZone), 'yyyy-MM-dd');
}

/** The Planner's day view on the day of a bank's planned visit, at its site. */
export function plannedVisitHref(
  bank: Pick<DueBank, 'siteId' | 'timeZone' | 'plannedVisit'>,
): string | null {
  if (!bank.plannedVisit) return null;
  const search = new URLSearchParams({
    siteId: bank.siteId,
    view: 'day',
    date: siteDateOn(bank.plannedVisit.plannedStartAt, bank.timeZone),
  });
  return `/planner?${search.toString()}`;
}

/**
 * The banks one "Plan a visit" covers: this bank and the other banks of its cabinet on the same
 * page that no visit covers yet (a visit covers banks of one cabinet), this bank first.
 */
export function banksToPlanWith(bank: DueBank, page: readonly DueBank[]): string[] {
  const others = page.filter(
    (b) => b.cabinetId === bank.cabinetId && b.bankId !== bank.bankId && !b.plannedVisit,
  );
  return [bank.bankId, ...others.map((b) => b.bankId)];
}

/**
 * The Planner opened on a new visit for a cabinet's banks: `/planner?cabinetId=…&bankIds=a,b`
 * (with the site, so the calendar shows its windows).
 *
 * @example planVisitHref({ siteId: 's', cabinetId: 'c' }, ['b1', 'b2']) // '/planner?siteId=s&cabinetId=c&bankIds=b1%2Cb2'
 */
export function planVisitHref(
  bank: Pick<DueBank, 'siteId' | 'cabinetId'>,
  bankIds: readonly string[],
): string {
  const search = new URLSearchParams({
    siteId: bank.siteId,
    cabinetId: bank.cabinetId,
    bankIds: bankIds.join(','),
  });
  return `/planner?${search.toString()}`;
}
