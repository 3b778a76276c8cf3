/**
 * VTIMEZONE components (RFC 5545, 3.6.5) written from the time zone database this process
 * has (Intl, through @date-fns/tz): a feed names each event's zone with TZID, and a calendar
 * app that does not know the zone (or knows an older rule) reads its offsets from here.
 */
import { tzOffset, tzScan } from '@date-fns/tz';

const pad = (n: number, width = 2) => String(Math.trunc(n)).padStart(width, '0');

/** "+0100", "-0330": a UTC offset in minutes as RFC 5545 writes it. */
function utcOffsetText(minutes: number): string {
  const sign = minutes < 0 ? '-' : '+';
  const abs = Math.abs(minutes);
  return `${sign}${pad(abs / 60)}${pad(abs % 60)}`;
}

/** An instant shifted by `offsetMinutes`, written as a local DATE-TIME without zone. */
function localDateTime(instant: Date, offsetMinutes: number): string {
  const d = new Date(instant.getTime() + offsetMinutes * 60_000);
  return (
    `${pad(d.getUTCFullYear(), 4)}${pad(d.getUTCMonth() + 1)}${pad(d.getUTCDate())}` +
    `T${pad(d.getUTCHours())}${pad(d.getUTCMinutes())}${pad(d.getUTCSeconds())}`
  );
}

/**
 * The VTIMEZONE of `timeZone` for the instants from `fromAt` to `toAt`: the offset in force at
 * `fromAt`, then one observance per change of offset in the range (each DTSTART in the local
 * time before the change, as RFC 5545 asks). A zone without changes has one observance.
 *
 * @param timeZone - IANA zone, e.g. "Europe/Berlin"
 * @example
 *   vtimezoneComponent('Europe/Berlin', new Date('2027-01-01'), new Date('2027-12-31'))
 *   // BEGIN:VTIMEZONE, TZID:Europe/Berlin, STANDARD from 20270101T010000 (+0100),
 *   // DAYLIGHT 20270328T020000 (+0100 → +0200), STANDARD 20271031T030000 (+0200 → +0100)
 */
export function vtimezoneComponent(timeZone: string, fromAt: Date, toAt: Date): string {
  const initial = tzOffset(timeZone, fromAt);
  const changes = tzScan(timeZone, { start: fromAt, end: toAt });
  const lines = ['BEGIN:VTIMEZONE', `TZID:${timeZone}`];
  const observance = (kind: 'STANDARD' | 'DAYLIGHT', start: string, from: number, to: number) => {
    lines.push(
      `BEGIN:${kind}`,
      `DTSTART:${start}`,
      `TZOFFSETFROM:${utcOffsetText(from)}`,
      `TZOFFSETTO:${utcOffsetText(to)}`,
      `END:${kind}`,
    );
  };
  // the offset at the start is daylight time when the next change goes back from it
  observance(
    changes[0] && changes[0].change < 0 ? 'DAYLIGHT' : 'STANDARD',
    localDateTime(fromAt, initial),
    initial,
    initial,
  );
  for (const change of changes) {
    const from = change.offset - change.change;
    observance(
      change.change > 0 ? 'DAYLIGHT' : 'STANDARD',
      localDateTime(change.date, from),
      from,
      change.offset,
    );
  }
  lines.push('END:VTIMEZONE');
  return lines.join('\r\n');
}
