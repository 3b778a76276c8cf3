import { useNavigate } from 'react-router';
import { Button, ButtonLink } from '../../../components/ui/button';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { ApiError } from '../../../lib/api-client';
import { useMyVisitUnderWayAt, useStartUnplannedVisit } from '../api/start-unplanned-visit';

/**
 * For a technician at a cabinet (its QR label opened the cabinet's page): "Start an unplanned
 * visit here", which records the visit as unplanned, under way and theirs, and opens it; or, when
 * they have a visit under way there already, "Open your visit".
 */
export function StartAtCabinet({ cabinetId, cabinetTag }: { cabinetId: string; cabinetTag: string }) {
  const navigate = useNavigate();
  const open = useMyVisitUnderWayAt(cabinetId);
  const start = useStartUnplannedVisit(cabinetId);
  if (open.isPending) return null;
  const visit = open.data ?? null;
  return (
    <section aria-labelledby="at-the-cabinet-heading" className="rounded-xl border border-spark-400/60 bg-white p-4 shadow-sm">
      <h2 id="at-the-cabinet-heading" className="text-lg font-bold text-tide-900">
        At the cabinet
      </h2>
      {visit ? (
        <>
          <p className="mt-1 text-sm text-tide-800">Your visit to {cabinetTag} is under way.</p>
          <ButtonLink to={`/my-visits/${visit.id}`} variant="primary" className="mt-3 min-h-12 w-full text-base sm:w-auto">
            Open your visit
          </ButtonLink>
        </>
      ) : (
        <>
          <p className="mt-1 text-sm text-tide-800">
            Here for work that is not in the plan? Start a visit now: it is recorded as unplanned, with you as its technician, and the planners see it.
          </p>
          <Button
            variant="primary"
            className="mt-3 min-h-12 w-full text-base sm:w-auto"
            disabled={start.isPending}
            onClick={() => start.mutate(undefined, { onSuccess: (started) => navigate(`/my-visits/${started.id}`) })}
          >
            {start.isPending ? 'Starting…' : 'Start an unplanned visit here'}
          </Button>
        </>
      )}
      {start.error ? (
        <div className="mt-3">
          <ErrorPanel title="The visit was not started">
            {start.error instanceof ApiError ? start.error.message : 'Ebbline could not be reached. Try again when the connection is back.'}
          </ErrorPanel>
        </div>
      ) : null}
    </section>
  );
}
