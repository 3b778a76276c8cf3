import { format, formatDistanceToNowStrict } from 'date-fns';

/** "4 Dec 2026, 09:12" in the browser's time zone. */
export function formatInstant(iso: string): string {
  return format(new Date(iso), 'd MMM yyyy, HH:mm');
}

/** "3 days ago", "in 29 days". */
export function fromNow(iso: string): string {
  const date = new Date(iso);
  return Math.abs(Date.now() - date.getTime()) < 60_000
    ? 'just now'
    : formatDistanceToNowStrict(date, { addSuffix: true });
}
