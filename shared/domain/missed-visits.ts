/**
 * When a visit counts as missed: it is still `planned` a while after its planned end (nobody
 * started it). The while is a setting (MISSED_VISIT_AFTER_HOURS, 12 h by default), so a
 * technician who logs a late shift's visit the next morning is not flagged at once.
 */

const HOUR_MS = 3_600_000;

/**
 * The instant before which a planned visit's end makes it missed at `asOf`.
 *
 * @param asOf - the instant the check runs at
 * @param afterHours - hours after the planned end, ≥ 0
 * @returns `asOf` minus `afterHours`
 * @throws RangeError when `afterHours` is negative or not a finite number
 * @example
 *   missedVisitCutoff(new Date('2027-01-10T12:00:00Z'), 12) // 2027-01-10T00:00:00Z
 */
export function missedVisitCutoff(asOf: Date, afterHours: number): Date {
  if (!Number.isFinite(afterHours) || afterHours < 0) {
    throw new RangeError(`afterHours must be a finite number ≥ 0, got ${afterHours}`);
  }
  return new Date(asOf.getTime() - afterHours * HOUR_MS);
}

/**
 * Whether a visit is missed at `asOf`: still planned, and its planned end plus `afterHours`
 * lies strictly before `asOf` (a visit whose end plus the while is exactly now is not yet missed).
 *
 * @param visit - its state and planned end (UTC ISO instant)
 * @param asOf - the instant the check runs at
 * @param afterHours - hours after the planned end, ≥ 0
 * @example
 *   isVisitMissed({ state: 'planned', plannedEndAt: '2027-01-09T14:00:00Z' }, new Date('2027-01-10T02:00:01Z'), 12) // true
 *   isVisitMissed({ state: 'under-way', plannedEndAt: '2027-01-01T14:00:00Z' }, new Date('2027-01-10T00:00:00Z'), 12) // false
 */
export function isVisitMissed(
  visit: { state: string; plannedEndAt: string },
  asOf: Date,
  afterHours: number,
): boolean {
  return (
    visit.state === 'planned' &&
    new Date(visit.plannedEndAt).getTime() < missedVisitCutoff(asOf, afterHours).getTime()
  );
}
