import { Link } from 'react-router';
import { Badge } from '../../../components/ui/badge';
import type { Visit } from '../../../../../shared/schemas/visit';
import type { VisitWindow } from '../utils/visit-window';
import { clockSpanText, dayText, durationText, spanText } from '../utils/visit-times';
import { VisitStateBadge } from '../../../components/ui/visit-state-badge';

/** The banks of a visit in a few words: "DC1, DC2, DC3" or "DC1, DC2 and 4 more". */
export function banksText(banks: Visit['banks']): string {
  const positions = banks.map((b) => b.position);
  if (positions.length <= 3) return positions.join(', ');
  return `${positions.slice(0, 2).join(', ')} and ${positions.length - 2} more`;
}

/** One visit in the list: the whole card opens it. */
export function VisitCard({
  visit,
  window,
  showTechnicians = false,
}: {
  visit: Visit;
  window: VisitWindow | null | undefined;
  /** Name the technicians (a colleague's visit at my site). */
  showTechnicians?: boolean;
}) {
  const done = visit.state === 'cancelled' || visit.state === 'logged' || visit.state === 'reviewed';
  return (
    <Link
      to={`/my-visits/${visit.id}`}
      aria-label={`Visit to ${visit.cabinetTag}, ${dayText(visit.plannedStartAt, visit.timeZone)} ${clockSpanText(visit.plannedStartAt, visit.plannedEndAt, visit.timeZone)}`}
      data-testid="my-visit-card"
      className={`block rounded-xl border bg-white p-4 shadow-sm transition hover:border-tide-400 focus-visible:border-tide-600 ${
        visit.state === 'under-way' ? 'border-spark-400' : 'border-tide-100'
      } ${done ? 'opacity-75' : ''}`}
    >
      <div className="flex items-start justify-between gap-3">
        <div className="min-w-0">
          <p className="text-sm font-medium text-tide-600">
            {dayText(visit.plannedStartAt, visit.timeZone)}
          </p>
          <p className="text-lg font-bold leading-tight text-tide-950">
            {clockSpanText(visit.plannedStartAt, visit.plannedEndAt, visit.timeZone)}
          </p>
          <p className="text-xs text-tide-600">{visit.timeZone}</p>
        </div>
        <div className="flex flex-col items-end gap-1">
          <VisitStateBadge state={visit.state} />
          {visit.unplanned ? <Badge tone="muted">unplanned</Badge> : null}
        </div>
      </div>
      <p className="mt-3 break-words font-mono text-base font-bold text-tide-900">{visit.cabinetTag}</p>
      <p className="text-sm text-tide-800">
        {visit.siteName} · {visit.areaName}
      </p>
      <p className="mt-1 text-sm text-tide-800">
        {visit.banks.length === 1 ? 'Bank' : `${visit.banks.length} banks`}: {banksText(visit.banks)}
      </p>
      <p className="text-sm text-tide-600">About {durationText(visit.estimatedMinutes)} on site</p>
      <WindowLine window={window} timeZone={visit.timeZone} />
      {showTechnicians ? (
        <p className="mt-1 text-sm text-tide-800">
          <span className="text-tide-600">Technicians:</span> {visit.technicians.map((t) => t.name).join(', ')}
        </p>
      ) : null}
    </Link>
  );
}

/** Which shutdown window the visit falls in, in a line; nothing while the windows load. */
export function WindowLine({ window, timeZone }: { window: VisitWindow | null | undefined; timeZone: string }) {
  if (window === undefined) return null;
  if (window === null) {
    return (
      <p className="mt-1 text-sm font-medium text-watch-600">
        Not inside a shutdown window: confirm with your planner that the drive will be off.
      </p>
    );
  }
  return (
    <p className="mt-1 text-sm text-tide-800">
      <span className="text-tide-600">Window:</span> {window.title}, {spanText(window.startsAt, window.endsAt, timeZone)}
      {window.fit === 'partly' ? (
        <span className="font-medium text-watch-600"> (the visit runs past it)</span>
      ) : null}
    </p>
  );
}
