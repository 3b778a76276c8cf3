import { useState } from 'react';
import { ErrorPanel } from '../../../../components/ui/error-panel';
import { Spinner } from '../../../../components/ui/spinner';
import { REVIEW_QUEUE_SIZE, useReviewQueue } from '../../api/review-decay-run';
import { ReviewVisit } from './review-visit';

/**
 * The review queue of reliability engineers: the logged visits (and reviewed ones holding a run
 * corrected after a query), the one waiting longest first,
 * each with its runs to accept or query (the one waiting longest shown open, the others opened
 * one tap away). A visit whose last run is reviewed leaves the queue
 * and stays below, under "Reviewed just now", for as long as the screen is open.
 */
export function ReviewQueue() {
  const queue = useReviewQueue();
  const [reviewedHere, setReviewedHere] = useState<string[]>([]);
  // the visits shown open; until the reviewer opens or closes one, the one waiting longest
  const [openIds, setOpenIds] = useState<string[] | null>(null);
  const firstWaiting = queue.data?.items[0]?.id;
  const openNow = (ids: string[] | null) => ids ?? (firstWaiting ? [firstWaiting] : []);
  const isOpen = (visitId: string) => openNow(openIds).includes(visitId);
  const toggle = (visitId: string) =>
    setOpenIds((ids) => {
      const current = openNow(ids);
      return current.includes(visitId)
        ? current.filter((id) => id !== visitId)
        : [...current, visitId];
    });
  const noteReviewed = (visitId: string) => {
    setReviewedHere((ids) => (ids.includes(visitId) ? ids : [...ids, visitId]));
    // a visit reviewed stays open where it goes (under "Reviewed just now")
    setOpenIds((ids) => {
      const current = openNow(ids);
      return current.includes(visitId) ? current : [...current, visitId];
    });
  };

  if (queue.isPending) return <Spinner label="Loading the visits waiting for review…" />;
  if (queue.isError) {
    return (
      <ErrorPanel title="The visits waiting for review could not be loaded">
        {queue.error.message}
      </ErrorPanel>
    );
  }
  const waiting = queue.data.items;
  const waitingIds = new Set(waiting.map((visit) => visit.id));
  const done = reviewedHere.filter((id) => !waitingIds.has(id));

  return (
    <div className="space-y-6" data-testid="review-queue">
      {waiting.length === 0 ? (
        <p
          role="status"
          className="rounded-xl border border-tide-100 bg-white p-5 text-tide-800 shadow-sm"
        >
          Nothing is waiting for review: every logged visit has been reviewed.
        </p>
      ) : (
        <>
          <p className="text-sm text-tide-800">
            {queue.data.total === 1 ? 'One visit is' : `${queue.data.total} visits are`} waiting for
            review
            {queue.data.total > waiting.length
              ? ` (the ${REVIEW_QUEUE_SIZE} waiting longest are shown)`
              : ''}
            .
          </p>
          {waiting.map((visit) => (
            <ReviewVisit
              key={visit.id}
              visitId={visit.id}
              initial={visit}
              open={isOpen(visit.id)}
              onToggle={() => toggle(visit.id)}
              onReviewed={noteReviewed}
            />
          ))}
        </>
      )}
      {done.length > 0 ? (
        <section className="space-y-4" aria-labelledby="reviewed-just-now">
          <h2 id="reviewed-just-now" className="text-lg font-bold text-tide-900">
            Reviewed just now
          </h2>
          {done.map((visitId) => (
            <ReviewVisit
              key={visitId}
              visitId={visitId}
              open={isOpen(visitId)}
              onToggle={() => toggle(visitId)}
              onReviewed={noteReviewed}
            />
          ))}
        </section>
      ) : null}
    </div>
  );
}
