/**
 * A visit's times as a technician reads them: on the site's clock, with the zone named, so a
 * visit at a site in another zone never reads as the phone's local time.
 */
import { tz } from '@date-fns/tz';
import { addDays, format, startOfWeek } from 'date-fns';

/** The calendar day (YYYY-MM-DD) of an instant on the clock of `timeZone`. */
export function localDayOn(instant: string | Date, timeZone: string): string {
  return format(new Date(instant), 'yyyy-MM-dd', { in: tz(timeZone) });
}

/** The Monday (YYYY-MM-DD) of the week holding an instant, on the clock of `timeZone`. */
export function weekStartOn(instant: string | Date, timeZone: string): string {
  const monday = startOfWeek(new Date(instant), { weekStartsOn: 1, in: tz(timeZone) });
  return format(monday, 'yyyy-MM-dd', { in: tz(timeZone) });
}

/** The day (YYYY-MM-DD) `days` after a calendar day. */
export function dayAfter(dayOn: string, days: number): string {
  const [y, m, d] = dayOn.split('-').map(Number);
  return format(addDays(new Date(Date.UTC(y!, m! - 1, d!, 12)), days), 'yyyy-MM-dd', { in: tz('UTC') });
}

/**
 * A span of time on the site's clock, the zone named once at the end.
 *
 * @example visitTimeText('2026-12-12T05:00:00Z', '2026-12-12T13:00:00Z', 'Europe/Berlin')
 *   // 'Sat 12 Dec, 06:00–14:00 Europe/Berlin'
 * @example visitTimeText('2026-12-12T21:00:00Z', '2026-12-13T05:00:00Z', 'Europe/Berlin')
 *   // 'Sat 12 Dec, 22:00 – Sun 13 Dec, 06:00 Europe/Berlin'
 */
export function visitTimeText(startAt: string, endAt: string, timeZone: string): string {
  return `${spanText(startAt, endAt, timeZone)} ${timeZone}`;
}

/**
 * A span on the clock of `timeZone` without naming the zone (for a line under one that does).
 *
 * @example spanText('2026-12-12T21:00:00Z', '2026-12-13T05:00:00Z', 'Europe/Berlin')
 *   // 'Sat 12 Dec, 22:00 – Sun 13 Dec, 06:00'
 */
export function spanText(startAt: string, endAt: string, timeZone: string): string {
  const zone = { in: tz(timeZone) };
  const start = new Date(startAt);
  const end = new Date(endAt);
  const sameDay = localDayOn(start, timeZone) === localDayOn(end, timeZone);
  const from = format(start, 'EEE d MMM, HH:mm', zone);
  return sameDay ? `${from}–${format(end, 'HH:mm', zone)}` : `${from} – ${format(end, 'EEE d MMM, HH:mm', zone)}`;
}

/** Only the clock times, for a list already grouped by day: "06:00–14:00". */
export function clockSpanText(startAt: string, endAt: string, timeZone: string): string {
  const zone = { in: tz(timeZone) };
  const sameDay = localDayOn(startAt, timeZone) === localDayOn(endAt, timeZone);
  const to = sameDay ? format(new Date(endAt), 'HH:mm', zone) : format(new Date(endAt), 'EEE d MMM, HH:mm', zone);
  return `${format(new Date(startAt), 'HH:mm', zone)}–${to}`;
}

/** "Sat 12 Dec" of an instant on the clock of `timeZone`. */
export function dayText(instant: string, timeZone: string): string {
  return format(new Date(instant), 'EEE d MMM', { in: tz(timeZone) });
}

/**
 * A duration in minutes, rounded to 5 minutes above a quarter of an hour.
 *
 * @example durationText(80) // '1 h 20 min'
 * @example durationText(45) // '45 min'
 */
export function durationText(minutes: number): string {
  const rounded = minutes > 15 ? Math.ceil(minutes / 5) * 5 : Math.max(1, Math.ceil(minutes));
  const hours = Math.floor(rounded / 60);
  const rest = rounded % 60;
  if (hours === 0) return `${rest} min`;
  return rest === 0 ? `${hours} h` : `${hours} h ${rest} min`;
}
