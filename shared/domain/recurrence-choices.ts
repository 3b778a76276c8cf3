/**
 * The recurrence of a shutdown window as a person chooses it in plain words ("every week on
 * Saturday", "the first Saturday of every month", "8 times"), turned into the RRULE body that
 * is stored, and read back from one for editing. A rule the choices cannot say is `custom`:
 * it is kept as typed.
 */

/** How often a window repeats, in the form's words. */
export const REPEAT_KINDS = ['once', 'daily', 'weekly', 'monthly-weekday', 'monthly-day', 'custom'] as const;
export type RepeatKind = (typeof REPEAT_KINDS)[number];

/** When a repeating window stops. */
export const REPEAT_ENDS = ['never', 'count', 'until'] as const;
export type RepeatEnd = (typeof REPEAT_ENDS)[number];

/** A recurrence as the form holds it. */
export interface RecurrenceChoice {
  kind: RepeatKind;
  /** Every `interval` days, weeks or months (1 = every). */
  interval: number;
  ends: RepeatEnd;
  /** Occurrences in all, when `ends` is `count`. */
  count: number;
  /** The last day it may happen on (YYYY-MM-DD, the site's calendar), when `ends` is `until`. */
  untilOn: string;
  /** The RRULE as typed, when `kind` is `custom`. */
  custom: string;
}

const WEEKDAYS = ['SU', 'MO', 'TU', 'WE', 'TH', 'FR', 'SA'] as const;
const WEEKDAY_NAMES = ['Sunday', 'Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'] as const;
const ORDINALS = ['', 'first', 'second', 'third', 'fourth'] as const;

/** The parts of a local start "YYYY-MM-DDTHH:mm" the choices depend on. */
function startParts(startLocal: string): { weekday: number; day: number; nth: number; last: boolean } {
  const [y, m, d] = startLocal.slice(0, 10).split('-').map(Number) as [number, number, number];
  const date = new Date(Date.UTC(y, m - 1, d));
  const daysInMonth = new Date(Date.UTC(y, m, 0)).getUTCDate();
  return { weekday: date.getUTCDay(), day: d, nth: Math.ceil(d / 7), last: d + 7 > daysInMonth };
}

/** The BYDAY of "the nth weekday of the month" for a start: the fifth is said as the last (-1). */
function monthlyWeekday(startLocal: string): string {
  const { weekday, nth } = startParts(startLocal);
  return `${nth >= 5 ? -1 : nth}${WEEKDAYS[weekday]}`;
}

/**
 * Labels of the repeat choices for a window starting at `startLocal`, e.g. for Saturday
 * 9 January: "Every week on Saturday", "Every month on the second Saturday", "Every month on day 9".
 */
export function repeatLabels(startLocal: string): Record<RepeatKind, string> {
  const { weekday, day, nth } = startParts(startLocal);
  const name = WEEKDAY_NAMES[weekday];
  return {
    once: 'Does not repeat',
    daily: 'Every day',
    weekly: `Every week on ${name}`,
    'monthly-weekday': `Every month on the ${nth >= 5 ? 'last' : ORDINALS[nth]} ${name}`,
    'monthly-day': `Every month on day ${day}`,
    custom: 'Custom rule (RRULE)',
  };
}

/**
 * The RRULE body of a choice for a window starting at `startLocal` (the site's wall time,
 * "YYYY-MM-DDTHH:mm"); null for `once`; the typed text for `custom`.
 *
 * @example
 * recurrenceFromChoice({ kind: 'weekly', interval: 1, ends: 'count', count: 8, untilOn: '', custom: '' }, '2027-01-09T06:00')
 * // 'FREQ=WEEKLY;BYDAY=SA;COUNT=8'
 */
export function recurrenceFromChoice(choice: RecurrenceChoice, startLocal: string): string | null {
  if (choice.kind === 'once') return null;
  if (choice.kind === 'custom') return choice.custom.trim() || null;
  const parts: string[] = [];
  const { weekday, day } = startParts(startLocal);
  if (choice.kind === 'daily') parts.push('FREQ=DAILY');
  if (choice.kind === 'weekly') parts.push('FREQ=WEEKLY', `BYDAY=${WEEKDAYS[weekday]}`);
  if (choice.kind === 'monthly-weekday') parts.push('FREQ=MONTHLY', `BYDAY=${monthlyWeekday(startLocal)}`);
  if (choice.kind === 'monthly-day') parts.push('FREQ=MONTHLY', `BYMONTHDAY=${day}`);
  if (choice.interval > 1) parts.push(`INTERVAL=${Math.round(choice.interval)}`);
  if (choice.ends === 'count') parts.push(`COUNT=${Math.round(choice.count)}`);
  if (choice.ends === 'until' && /^\d{4}-\d{2}-\d{2}$/.test(choice.untilOn)) parts.push(`UNTIL=${choice.untilOn.replaceAll('-', '')}`);
  return parts.join(';');
}

/** The choice of a window with no recurrence. */
export const NO_REPEAT: RecurrenceChoice = { kind: 'once', interval: 1, ends: 'count', count: 8, untilOn: '', custom: '' };

/**
 * The choice that builds a stored recurrence again, for editing; `custom` (with the rule as
 * stored) when no choice says it.
 *
 * @example
 * choiceFromRecurrence('FREQ=WEEKLY;BYDAY=SA;COUNT=8', '2027-01-09T06:00').kind // 'weekly'
 */
export function choiceFromRecurrence(recurrence: string | null, startLocal: string): RecurrenceChoice {
  if (!recurrence) return NO_REPEAT;
  const fields = new Map(recurrence.split(';').map((p) => p.split('=') as [string, string]));
  const interval = Number(fields.get('INTERVAL') ?? '1');
  const count = fields.get('COUNT');
  const until = fields.get('UNTIL');
  const choice: RecurrenceChoice = {
    kind: 'custom',
    interval,
    ends: count ? 'count' : until ? 'until' : 'never',
    count: count ? Number(count) : 8,
    untilOn: until ? `${until.slice(0, 4)}-${until.slice(4, 6)}-${until.slice(6, 8)}` : '',
    custom: recurrence,
  };
  for (const kind of ['daily', 'weekly', 'monthly-weekday', 'monthly-day'] as const) {
    const candidate = { ...choice, kind };
    const built = recurrenceFromChoice(candidate, startLocal);
    // UNTIL is stored as the end of its day
    if (built && built.replace(/UNTIL=(\d{8})$/, 'UNTIL=$1T235959') === recurrence) return candidate;
  }
  return choice;
}
