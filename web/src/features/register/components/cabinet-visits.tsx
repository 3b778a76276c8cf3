import { Link } from 'react-router';
import { Badge } from '../../../components/ui/badge';
import { DischargeCaution } from '../../../components/ui/discharge-caution';
import { Spinner } from '../../../components/ui/spinner';
import { VisitStateBadge } from '../../../components/ui/visit-state-badge';
import { formatInstant } from '../../../lib/dates';
import { CABINET_VISITS_SHOWN, useCabinetVisits } from '../api/cabinet-visits';

/**
 * A cabinet's latest visits: when, their state, who, and whether it was unplanned. A visit of
 * the person looking opens on My visits; every bank's decay runs are on the bank's page.
 */
export function CabinetVisits({ cabinetId, viewerId }: { cabinetId: string; viewerId?: string }) {
  const visits = useCabinetVisits(cabinetId);
  return (
    <div className="space-y-3">
      {visits.isPending ? <Spinner label="Loading the visits…" /> : null}
      {visits.isError ? <p className="text-sm text-eol-600">The visits could not be loaded: {visits.error.message}</p> : null}
      {visits.isSuccess && visits.data.items.length === 0 ? (
        <p className="text-sm text-tide-800">No visits yet. Once the Planner schedules a visit to this cabinet, or a technician starts one here, it shows here.</p>
      ) : null}
      {visits.isSuccess && visits.data.items.length > 0 ? (
        <>
          <ul className="divide-y divide-tide-100" data-testid="cabinet-visits">
            {visits.data.items.map((visit) => {
              const mine = viewerId !== undefined && visit.technicians.some((t) => t.id === viewerId);
              const when = formatInstant(visit.startedAt ?? visit.plannedStartAt);
              return (
                <li key={visit.id} className="flex flex-wrap items-center gap-x-3 gap-y-1 py-2 text-sm">
                  {mine ? (
                    <Link to={`/my-visits/${visit.id}`} className="font-medium text-tide-900 underline">
                      {when}
                    </Link>
                  ) : (
                    <span className="font-medium text-tide-900">{when}</span>
                  )}
                  <VisitStateBadge state={visit.state} />
                  {visit.unplanned ? <Badge tone="spark">unplanned</Badge> : null}
                  <span className="text-tide-700">{visit.technicians.map((t) => t.name).join(', ') || 'no technician yet'}</span>
                </li>
              );
            })}
          </ul>
          <p className="text-xs text-tide-700">
            {visits.data.total > CABINET_VISITS_SHOWN ? `The latest ${CABINET_VISITS_SHOWN} of ${visits.data.total}. ` : ''}
            Each bank's decay runs, their verdicts and photos are on the bank's page below.
          </p>
        </>
      ) : null}
      <DischargeCaution compact />
    </div>
  );
}
