import { tz } from '@date-fns/tz';
import { format } from 'date-fns';
import { useState } from 'react';
import { Link } from 'react-router';
import { useUpcomingWindows } from '../api/upcoming-windows';

/** How far ahead a cabinet's page looks for shutdown windows. */
const DAYS_AHEAD = 90;
/** Occurrences listed before "and N more". */
const LISTED = 6;

/** "Sat 12 Dec, 06:00–14:00 Europe/Berlin": on the site's clock, the zone named. */
function spanText(startsAt: string, endsAt: string, timeZone: string): string {
  const zone = { in: tz(timeZone) };
  const sameDay = format(new Date(startsAt), 'yyyy-MM-dd', zone) === format(new Date(endsAt), 'yyyy-MM-dd', zone);
  const from = format(new Date(startsAt), 'EEE d MMM, HH:mm', zone);
  const to = format(new Date(endsAt), sameDay ? 'HH:mm' : 'EEE d MMM, HH:mm', zone);
  return sameDay ? `${from}–${to} ${timeZone}` : `${from} – ${to} ${timeZone}`;
}

/**
 * The shutdown windows of a cabinet's area in the coming 90 days, each occurrence on the site's
 * clock: when its drives can be de-energised for a decay run.
 */
export function UpcomingWindows({ siteId, areaId, areaName }: { siteId: string; areaId: string; areaName: string }) {
  // the range is fixed when the page opens, so the query key stays the same while it is shown
  const [range] = useState(() => {
    const now = new Date();
    return { fromAt: now.toISOString(), toAt: new Date(now.getTime() + DAYS_AHEAD * 86_400_000).toISOString() };
  });
  const windows = useUpcomingWindows(areaId, range.fromAt, range.toAt);
  if (windows.isPending) return <p className="text-sm text-tide-600">Loading the shutdown windows…</p>;
  if (windows.isError) return <p className="text-sm text-eol-600">The shutdown windows could not be loaded: {windows.error.message}</p>;
  const occurrences = windows.data.items
    .flatMap((w) => (w.occurrences ?? []).map((o) => ({ ...o, window: w })))
    .sort((a, b) => a.startsAt.localeCompare(b.startsAt));
  if (occurrences.length === 0)
    return (
      <p className="text-sm text-tide-800">
        No shutdown window in {areaName} in the next {DAYS_AHEAD} days. A planner adds them on the{' '}
        <Link to={`/planner?siteId=${siteId}&areaId=${areaId}`} className="font-medium underline">
          Planner
        </Link>
        .
      </p>
    );
  return (
    <div>
      <ul className="divide-y divide-tide-100" aria-label={`Shutdown windows of ${areaName}`}>
        {occurrences.slice(0, LISTED).map((o) => (
          <li key={`${o.window.id}-${o.startsAt}`} className="py-2 text-sm">
            <span className="block font-medium text-tide-900">{spanText(o.startsAt, o.endsAt, o.window.timeZone)}</span>
            <span className="text-tide-600">
              {o.window.title}
              {o.window.recurrence ? ` · repeats ${o.window.recurrenceText}` : ''}
            </span>
          </li>
        ))}
      </ul>
      {occurrences.length > LISTED ? (
        <p className="mt-1 text-sm text-tide-600">
          …and {occurrences.length - LISTED} more in the next {DAYS_AHEAD} days on the{' '}
          <Link to={`/planner?siteId=${siteId}&areaId=${areaId}`} className="font-medium underline">
            Planner
          </Link>
          .
        </p>
      ) : null}
    </div>
  );
}
