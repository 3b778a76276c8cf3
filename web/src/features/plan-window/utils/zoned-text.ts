/** Times and durations as the plan-a-window dialog says them, on the site's clock with the zone named. */
import { TZDate } from '@date-fns/tz';
import { format } from 'date-fns';

/**
 * "Sat 9 Jan 2027, 06:00–08:00 Europe/Berlin"; an end on another day gets its own date.
 * @example zonedRangeText('2027-01-09T05:00:00Z', '2027-01-09T07:00:00Z', 'Europe/Berlin') // 'Sat 9 Jan 2027, 06:00–08:00 Europe/Berlin'
 */
export function zonedRangeText(startsAt: string, endsAt: string, timeZone: string): string {
  const start = new TZDate(Date.parse(startsAt), timeZone);
  const end = new TZDate(Date.parse(endsAt), timeZone);
  const sameDay = format(start, 'yyyy-MM-dd') === format(end, 'yyyy-MM-dd');
  const endText = sameDay ? format(end, 'HH:mm') : format(end, 'EEE d MMM, HH:mm');
  return `${format(start, 'EEE d MMM yyyy, HH:mm')}–${endText} ${timeZone}`;
}

/**
 * "06:00–07:10" on the site's clock (the zone is named once, beside the heading).
 * @example zonedTimesText('2027-01-09T05:00:00Z', '2027-01-09T06:10:00Z', 'Europe/Berlin') // '06:00–07:10'
 */
export function zonedTimesText(startsAt: string, endsAt: string, timeZone: string): string {
  return `${format(new TZDate(Date.parse(startsAt), timeZone), 'HH:mm')}–${format(new TZDate(Date.parse(endsAt), timeZone), 'HH:mm')}`;
}

/**
 * Minutes as hours and minutes: "45 min", "1 h 10 min", "2 h".
 * @example minutesText(70) // '1 h 10 min'
 */
export function minutesText(minutes: number): string {
  const whole = Math.round(minutes);
  const hours = Math.floor(whole / 60);
  const rest = whole % 60;
  if (hours === 0) return `${rest} min`;
  return rest === 0 ? `${hours} h` : `${hours} h ${rest} min`;
}
