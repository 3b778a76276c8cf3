/**
 * Times in a site's time zone. The calendar lays events out by the browser's clock, so an
 * instant is handed to it as a "calendar date": a browser-local Date whose wall clock reads what
 * the site's clock reads at that instant. Dates coming back from the calendar (a drop, a
 * selected slot) are read the same way round.
 */
import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';

/**
 * The calendar date of an instant in `timeZone`.
 * @example toCalendarDate('2026-12-12T05:00:00Z', 'Europe/Berlin') // a Date reading 12 Dec 06:00 local
 */
export function toCalendarDate(instant: string | Date, timeZone: string): Date {
  const zoned = new TZDate(new Date(instant).getTime(), timeZone);
  return new Date(
    zoned.getFullYear(),
    zoned.getMonth(),
    zoned.getDate(),
    zoned.getHours(),
    zoned.getMinutes(),
    zoned.getSeconds(),
    zoned.getMilliseconds(),
  );
}

/**
 * The instant (UTC ISO) of a calendar date read as the wall clock of `timeZone`; the inverse of
 * {@link toCalendarDate}.
 * @example fromCalendarDate(new Date(2026, 11, 12, 6, 0), 'Europe/Berlin') // '2026-12-12T05:00:00.000Z'
 */
export function fromCalendarDate(date: Date, timeZone: string): string {
  const zoned = new TZDate(
    date.getFullYear(),
    date.getMonth(),
    date.getDate(),
    date.getHours(),
    date.getMinutes(),
    date.getSeconds(),
    date.getMilliseconds(),
    timeZone,
  );
  return new Date(zoned.getTime()).toISOString();
}

/** The value of an `<input type="datetime-local">` showing `instant` in `timeZone`: "2026-12-12T06:00". */
export function toZonedInputValue(instant: string, timeZone: string): string {
  return format(new TZDate(new Date(instant).getTime(), timeZone), "yyyy-MM-dd'T'HH:mm");
}

/**
 * The instant of a datetime-local value read in `timeZone`; null when the value is not a
 * complete date and time.
 */
export function fromZonedInputValue(value: string, timeZone: string): string | null {
  const match = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})/.exec(value);
  if (!match) return null;
  const [, y, mo, d, h, mi] = match.map(Number);
  const zoned = new TZDate(y!, mo! - 1, d!, h!, mi!, 0, 0, timeZone);
  const time = zoned.getTime();
  return Number.isNaN(time) ? null : new Date(time).toISOString();
}

/**
 * A span in the site's zone with the zone named: "Sat 12 Dec, 06:00–14:00 Europe/Berlin", or
 * "Sat 12 Dec, 22:00 – Sun 13 Dec, 06:00 Europe/Berlin" across midnight.
 */
export function formatZonedRange(startAt: string, endAt: string, timeZone: string): string {
  const start = new TZDate(new Date(startAt).getTime(), timeZone);
  const end = new TZDate(new Date(endAt).getTime(), timeZone);
  const sameDay = format(start, 'yyyy-MM-dd') === format(end, 'yyyy-MM-dd');
  return sameDay
    ? `${format(start, 'EEE d MMM, HH:mm')}–${format(end, 'HH:mm')} ${timeZone}`
    : `${format(start, 'EEE d MMM, HH:mm')} – ${format(end, 'EEE d MMM, HH:mm')} ${timeZone}`;
}

/** An instant in the site's zone with the zone named: "Sat 12 Dec 2026, 06:00 Europe/Berlin". */
export function formatZonedInstant(instant: string, timeZone: string): string {
  return `${format(new TZDate(new Date(instant).getTime(), timeZone), 'EEE d MMM yyyy, HH:mm')} ${timeZone}`;
}

/** The calendar date (YYYY-MM-DD) of an instant in `timeZone`. */
export function zonedDateOn(instant: string | Date, timeZone: string): string {
  return format(new TZDate(new Date(instant).getTime(), timeZone), 'yyyy-MM-dd');
}
