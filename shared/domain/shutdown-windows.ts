/**
 * Shutdown windows: when an area's drives are de-energised, so decay runs can be made.
 *
 * A window is its first occurrence (`startsAt`, `endsAt`, UTC instants) and, when it repeats,
 * an RRULE body without DTSTART (RFC 5545 §3.3.10, e.g. `FREQ=WEEKLY;BYDAY=SA;COUNT=8`).
 * Recurrences are expanded in the SITE's time zone: every occurrence starts at the first one's
 * local wall-clock time and lasts as long as the first one (in elapsed time), so a Saturday
 * 06:00 window stays at 06:00 local across a change to or from summer time while its UTC
 * instant moves by the hour. `UNTIL` is read as the site's local wall time too.
 *
 * The rules are expanded with the rrule package on "floating" dates: the site's wall-clock
 * fields written as UTC fields (the way rrule asks for local times), then turned back into
 * instants with @date-fns/tz. A wall time that does not exist on a spring-forward day (02:30 in
 * Europe/Berlin on the last Sunday of March) moves forward to the first time that does.
 */
import { TZDate } from '@date-fns/tz';
import * as rruleModule from 'rrule';

// rrule ships an ES module for bundlers and a UMD file for Node: under Node the named exports
// sit on the default export (read by a computed name, which bundlers leave alone).
const NODE_DEFAULT_EXPORT = 'default';
const rrule: typeof rruleModule =
  'RRule' in rruleModule && rruleModule.RRule
    ? rruleModule
    : (rruleModule as unknown as Record<string, typeof rruleModule>)[NODE_DEFAULT_EXPORT]!;

const MS_PER_DAY = 86_400_000;

/** A window's times as stored: its first occurrence and its recurrence (null: a one-off). */
export interface WindowTimes {
  /** First occurrence's start, UTC ISO. */
  startsAt: string;
  /** First occurrence's end, UTC ISO; after `startsAt`. */
  endsAt: string;
  /** RRULE body without DTSTART, or null for a one-off. */
  recurrence: string | null;
}

/** One occurrence of a window, UTC ISO instants. */
export interface WindowOccurrence {
  startsAt: string;
  endsAt: string;
}

/** The frequencies a shutdown window may repeat at (hourly or finer makes no sense for a shutdown). */
export const RECURRENCE_FREQUENCIES = ['DAILY', 'WEEKLY', 'MONTHLY', 'YEARLY'] as const;

/** At most this many occurrences are given for one window in one range. */
export const MAX_OCCURRENCES_PER_WINDOW = 2000;

/** The greatest COUNT a recurrence may have. */
export const MAX_RECURRENCE_COUNT = 1000;

const WEEKDAY_CODES = ['MO', 'TU', 'WE', 'TH', 'FR', 'SA', 'SU'] as const;

/** The answer of `normalizeRecurrence`: the rule as stored, or why it is refused. */
export type RecurrenceCheck = { ok: true; recurrence: string | null } | { ok: false; message: string };

const intList = (value: string, min: number, max: number, nonZero: boolean) =>
  value.split(',').every((part) => {
    if (!/^[+-]?\d{1,3}$/.test(part)) return false;
    const n = Number(part);
    return n >= min && n <= max && !(nonZero && n === 0);
  });

/**
 * Checks a recurrence as a person typed it and gives it in the form it is stored in: upper
 * case, an optional leading `RRULE:` dropped, `UNTIL` as a local wall time
 * (`UNTIL=20270301` becomes the end of that day, `UNTIL=20270301T060000`), parts in the order
 * typed. An empty text is no recurrence (null). Refused: unknown parts, DTSTART (the window's
 * start is the first occurrence), BYHOUR/BYMINUTE/BYSECOND (the start gives the time of day),
 * frequencies finer than daily, COUNT with UNTIL, and values out of range.
 *
 * @param text - e.g. "FREQ=WEEKLY;BYDAY=SA;COUNT=8"
 * @returns `{ ok: true, recurrence }` or `{ ok: false, message }` with a sentence to show
 * @example
 * normalizeRecurrence('rrule:freq=weekly;byday=sa;until=20270301')
 * // { ok: true, recurrence: 'FREQ=WEEKLY;BYDAY=SA;UNTIL=20270301T235959' }
 */
export function normalizeRecurrence(text: string | null | undefined): RecurrenceCheck {
  const trimmed = (text ?? '').trim().replace(/^RRULE:/i, '').replace(/;+$/, '');
  if (trimmed === '') return { ok: true, recurrence: null };
  const refuse = (message: string): RecurrenceCheck => ({ ok: false, message });
  const parts: string[] = [];
  const seen = new Set<string>();
  for (const raw of trimmed.toUpperCase().split(';')) {
    const match = /^([A-Z]+)=([A-Z0-9,+-]+)$/.exec(raw.trim());
    if (!match) return refuse(`"${raw.trim()}" is not a recurrence part (write NAME=VALUE, e.g. FREQ=WEEKLY).`);
    const [, name, value] = match as unknown as [string, string, string];
    if (seen.has(name)) return refuse(`${name} is given twice.`);
    seen.add(name);
    switch (name) {
      case 'FREQ':
        if (!(RECURRENCE_FREQUENCIES as readonly string[]).includes(value))
          return refuse('FREQ must be DAILY, WEEKLY, MONTHLY or YEARLY.');
        break;
      case 'INTERVAL':
        if (!/^\d{1,3}$/.test(value) || Number(value) < 1 || Number(value) > 366)
          return refuse('INTERVAL must be a whole number from 1 to 366.');
        break;
      case 'COUNT':
        if (!/^\d{1,4}$/.test(value) || Number(value) < 1 || Number(value) > MAX_RECURRENCE_COUNT)
          return refuse(`COUNT must be a whole number from 1 to ${MAX_RECURRENCE_COUNT}.`);
        break;
      case 'UNTIL': {
        const until = /^(\d{4})(\d{2})(\d{2})(?:T(\d{2})(\d{2})(\d{2})Z?)?$/.exec(value);
        if (!until) return refuse('UNTIL must be a date (20270301) or a local date and time (20270301T060000).');
        const [, y, mo, d, h = '23', mi = '59', s = '59'] = until as unknown as string[];
        const ms = Date.UTC(Number(y), Number(mo) - 1, Number(d), Number(h), Number(mi), Number(s));
        const check = new Date(ms);
        if (
          check.getUTCFullYear() !== Number(y) ||
          check.getUTCMonth() !== Number(mo) - 1 ||
          check.getUTCDate() !== Number(d) ||
          Number(h) > 23 ||
          Number(mi) > 59 ||
          Number(s) > 59 ||
          Number(y) < 1900 ||
          Number(y) > 2200
        )
          return refuse(`UNTIL ${value} is not a real date between 1900 and 2200.`);
        parts.push(`UNTIL=${y}${mo}${d}T${h}${mi}${s}`);
        continue;
      }
      case 'BYDAY':
        if (!value.split(',').every((day) => /^([+-]?[1-5])?(MO|TU|WE|TH|FR|SA|SU)$/.test(day)))
          return refuse('BYDAY lists weekdays as MO, TU, WE, TH, FR, SA, SU (with a position for monthly rules: 1SA, -1FR).');
        break;
      case 'BYMONTHDAY':
        if (!intList(value, -31, 31, true)) return refuse('BYMONTHDAY lists days of the month from 1 to 31 (or -1 for the last).');
        break;
      case 'BYMONTH':
        if (!intList(value, 1, 12, true)) return refuse('BYMONTH lists months from 1 to 12.');
        break;
      case 'BYSETPOS':
        if (!intList(value, -366, 366, true)) return refuse('BYSETPOS lists positions from 1 to 366 (or negative from the end).');
        break;
      case 'BYWEEKNO':
        if (!intList(value, -53, 53, true)) return refuse('BYWEEKNO lists weeks from 1 to 53.');
        break;
      case 'BYYEARDAY':
        if (!intList(value, -366, 366, true)) return refuse('BYYEARDAY lists days of the year from 1 to 366.');
        break;
      case 'WKST':
        if (!(WEEKDAY_CODES as readonly string[]).includes(value)) return refuse('WKST is a weekday: MO, TU, WE, TH, FR, SA or SU.');
        break;
      case 'DTSTART':
        return refuse("Leave DTSTART out: the window's start is its first occurrence.");
      case 'BYHOUR':
      case 'BYMINUTE':
      case 'BYSECOND':
        return refuse(`Leave ${name} out: the window's start gives the time of day.`);
      default:
        return refuse(`${name} is not a recurrence part Ebbline knows (FREQ, INTERVAL, COUNT, UNTIL, BYDAY, BYMONTHDAY, BYMONTH, BYSETPOS).`);
    }
    parts.push(`${name}=${value}`);
  }
  if (!seen.has('FREQ')) return refuse('Say how often it repeats: FREQ=DAILY, WEEKLY, MONTHLY or YEARLY.');
  if (seen.has('COUNT') && seen.has('UNTIL')) return refuse('Give COUNT or UNTIL, not both.');
  if (seen.has('BYWEEKNO') && !trimmed.toUpperCase().includes('FREQ=YEARLY')) return refuse('BYWEEKNO is for yearly rules only.');
  return { ok: true, recurrence: parts.join(';') };
}

/** The rule of a stored recurrence starting at a floating date. */
function ruleOf(recurrence: string, dtstartFloating: Date) {
  const options = rrule.RRule.parseString(recurrence);
  return new rrule.RRule({ ...options, dtstart: dtstartFloating });
}

/**
 * The recurrence in plain English words, as the rrule package writes it.
 *
 * @param recurrence - a stored recurrence, or null
 * @returns e.g. "every week on Saturday for 8 times"; "once" for null
 * @example
 * recurrenceText('FREQ=WEEKLY;BYDAY=SA;COUNT=8') // 'every week on Saturday for 8 times'
 */
export function recurrenceText(recurrence: string | null): string {
  if (!recurrence) return 'once';
  try {
    return ruleOf(recurrence, new Date(0)).toText();
  } catch {
    return recurrence;
  }
}

/**
 * The wall-clock time of an instant in a time zone, as a floating date (its UTC fields are the
 * local fields). Seconds and milliseconds are kept.
 */
function floatingOf(instantMs: number, timeZone: string): Date {
  const local = new TZDate(instantMs, timeZone);
  return new Date(
    Date.UTC(
      local.getFullYear(),
      local.getMonth(),
      local.getDate(),
      local.getHours(),
      local.getMinutes(),
      local.getSeconds(),
      local.getMilliseconds(),
    ),
  );
}

/** The instant at which a floating date's wall-clock time happens in a time zone. */
function instantOfFloating(floating: Date, timeZone: string): number {
  return new TZDate(
    floating.getUTCFullYear(),
    floating.getUTCMonth(),
    floating.getUTCDate(),
    floating.getUTCHours(),
    floating.getUTCMinutes(),
    floating.getUTCSeconds(),
    floating.getUTCMilliseconds(),
    timeZone,
  ).getTime();
}

/**
 * The instant of a local wall time in a time zone.
 *
 * @param localDateTime - "2027-01-09 06:00" or "2027-01-09T06:00" (seconds optional)
 * @param timeZone - IANA zone, e.g. "Europe/Berlin"
 * @returns the UTC ISO instant, or null when the text is not a real date and time
 * @example
 * instantOfLocalWallTime('2027-01-09 06:00', 'Europe/Berlin') // '2027-01-09T05:00:00.000Z'
 */
export function instantOfLocalWallTime(localDateTime: string, timeZone: string): string | null {
  const match = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{1,2}):(\d{2})(?::(\d{2}))?$/.exec(localDateTime.trim());
  if (!match) return null;
  const [y, mo, d, h, mi, s] = match.slice(1).map((part) => Number(part ?? 0)) as [number, number, number, number, number, number];
  const floating = new Date(Date.UTC(y, mo - 1, d, h, mi, s));
  if (
    floating.getUTCFullYear() !== y ||
    floating.getUTCMonth() !== mo - 1 ||
    floating.getUTCDate() !== d ||
    h > 23 ||
    mi > 59 ||
    s > 59 ||
    y < 1900 ||
    y > 2200
  )
    return null;
  return new Date(instantOfFloating(floating, timeZone)).toISOString();
}

/**
 * The local wall time of an instant in a time zone, "YYYY-MM-DDTHH:mm" (what a
 * datetime-local input holds).
 *
 * @example
 * localWallTimeOf('2027-01-09T05:00:00.000Z', 'Europe/Berlin') // '2027-01-09T06:00'
 */
export function localWallTimeOf(instantAt: string, timeZone: string): string {
  return floatingOf(Date.parse(instantAt), timeZone).toISOString().slice(0, 16);
}

/**
 * The occurrences of a window that overlap `[fromAt, toAt)`, in time order: each starts at the
 * first occurrence's local wall-clock time in `timeZone` on its day and lasts as long as the
 * first occurrence. A one-off window has at most its one occurrence.
 *
 * @param window - the first occurrence and the recurrence (RRULE body, stored form)
 * @param timeZone - the site's IANA zone, e.g. "Europe/Berlin"
 * @param fromAt - range start, UTC ISO (inclusive)
 * @param toAt - range end, UTC ISO (exclusive)
 * @param limit - at most this many occurrences (default `MAX_OCCURRENCES_PER_WINDOW`)
 * @example
 * windowOccurrences(
 *   { startsAt: '2026-03-21T05:00:00Z', endsAt: '2026-03-21T13:00:00Z', recurrence: 'FREQ=WEEKLY;COUNT=2' },
 *   'Europe/Berlin', '2026-03-01T00:00:00Z', '2026-04-01T00:00:00Z',
 * )
 * // [{ startsAt: '2026-03-21T05:00:00.000Z', endsAt: '2026-03-21T13:00:00.000Z' },
 * //  { startsAt: '2026-03-28T05:00:00.000Z', endsAt: '2026-03-28T13:00:00.000Z' }]  (Berlin on CET both days)
 */
export function windowOccurrences(
  window: WindowTimes,
  timeZone: string,
  fromAt: string,
  toAt: string,
  limit = MAX_OCCURRENCES_PER_WINDOW,
): WindowOccurrence[] {
  const startMs = Date.parse(window.startsAt);
  const durationMs = Date.parse(window.endsAt) - startMs;
  const fromMs = Date.parse(fromAt);
  const toMs = Date.parse(toAt);
  if (!(durationMs > 0) || !(toMs > fromMs)) return [];
  const overlaps = (s: number) => s < toMs && s + durationMs > fromMs;
  const occurrence = (s: number): WindowOccurrence => ({
    startsAt: new Date(s).toISOString(),
    endsAt: new Date(s + durationMs).toISOString(),
  });
  if (!window.recurrence) return overlaps(startMs) && limit > 0 ? [occurrence(startMs)] : [];

  const rule = ruleOf(window.recurrence, floatingOf(startMs, timeZone));
  // floating times differ from instants by the zone's offset (under a day): search a day wider
  const after = new Date(Math.max(startMs, fromMs - durationMs) - MS_PER_DAY);
  const before = new Date(toMs + MS_PER_DAY);
  const out: WindowOccurrence[] = [];
  for (const floating of rule.between(after, before, true)) {
    const s = instantOfFloating(floating, timeZone);
    if (s < startMs || !overlaps(s)) continue;
    out.push(occurrence(s));
    if (out.length >= limit) break;
  }
  return out;
}

/** A problem with a window's times: the field it concerns and a sentence to show. */
export interface WindowTimesProblem {
  path: 'startsAt' | 'endsAt' | 'recurrence';
  message: string;
}

/**
 * What is wrong with a window's times, in the site's zone: an end not after the start, a
 * recurrence whose first occurrence is not the window's start (the start must be the first
 * occurrence, e.g. a Saturday for `BYDAY=SA`), or occurrences that run into the next one.
 *
 * @returns the problems (empty when the times are sound)
 * @example
 * windowTimesProblems({ startsAt: '2026-12-12T05:00:00Z', endsAt: '2026-12-12T04:00:00Z', recurrence: null }, 'Europe/Berlin')
 * // [{ path: 'endsAt', message: 'The end must be after the start.' }]
 */
export function windowTimesProblems(window: WindowTimes, timeZone: string): WindowTimesProblem[] {
  const startMs = Date.parse(window.startsAt);
  const endMs = Date.parse(window.endsAt);
  if (!(endMs > startMs)) return [{ path: 'endsAt', message: 'The end must be after the start.' }];
  if (!window.recurrence) return [];
  const durationMs = endMs - startMs;
  const rule = ruleOf(window.recurrence, floatingOf(startMs, timeZone));
  const firstFew = rule.all((_, i) => i < 60).map((f) => instantOfFloating(f, timeZone));
  if (firstFew.length === 0) return [{ path: 'recurrence', message: 'This recurrence never happens after the start (check UNTIL).' }];
  if (firstFew[0] !== startMs) {
    const first = localWallTimeOf(new Date(firstFew[0]!).toISOString(), timeZone).replace('T', ' ');
    return [
      {
        path: 'recurrence',
        message: `The recurrence's first occurrence would be ${first}, not the start: make the start a day the rule names.`,
      },
    ];
  }
  for (let i = 1; i < firstFew.length; i += 1) {
    if (firstFew[i]! < firstFew[i - 1]! + durationMs)
      return [{ path: 'recurrence', message: 'Each occurrence must end before the next one begins: repeat less often or shorten the window.' }];
  }
  return [];
}
