import { PageHeader } from '../../components/ui/page-header';
import { ReviewQueue } from '../../features/decay-runs/components/review/review-queue';

/** Review (reliability engineers and admins): the logged visits' decay runs to accept or query. */
export function Component() {
  return (
    <div className="mx-auto max-w-3xl">
      <PageHeader
        title="Review"
        lead="Logged visits waiting for review, and runs corrected after a query. Accept each decay run, or query it with a comment that goes back to the technician."
      />
      <ReviewQueue />
    </div>
  );
}
