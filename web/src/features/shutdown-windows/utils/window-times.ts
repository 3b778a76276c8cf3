/**
 * A window's times as people read them: on the site's clock with the zone named, so a window at
 * a site in another zone never reads as the browser's local time.
 */
import { tz } from '@date-fns/tz';
import { format } from 'date-fns';

/**
 * A span on the site's clock, the zone named once at the end.
 *
 * @example windowTimeText('2026-12-12T05:00:00Z', '2026-12-12T13:00:00Z', 'Europe/Berlin')
 *   // 'Sat 12 Dec, 06:00–14:00 Europe/Berlin'
 * @example windowTimeText('2026-12-12T21:00:00Z', '2026-12-13T05:00:00Z', 'Europe/Berlin')
 *   // 'Sat 12 Dec, 22:00 – Sun 13 Dec, 06:00 Europe/Berlin'
 */
export function windowTimeText(startsAt: string, endsAt: string, timeZone: string): string {
  const zone = { in: tz(timeZone) };
  const start = new Date(startsAt);
  const end = new Date(endsAt);
  const sameDay = format(start, 'yyyy-MM-dd', zone) === format(end, 'yyyy-MM-dd', zone);
  const from = format(start, 'EEE d MMM, HH:mm', zone);
  return sameDay ? `${from}–${format(end, 'HH:mm', zone)} ${timeZone}` : `${from} – ${format(end, 'EEE d MMM, HH:mm', zone)} ${timeZone}`;
}
