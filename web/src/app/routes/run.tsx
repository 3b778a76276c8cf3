import { useParams } from 'react-router';
import { ErrorPanel } from '../../components/ui/error-panel';
import { Spinner } from '../../components/ui/spinner';
import { useDecayRun } from '../../features/decay-runs/api/get-decay-runs';
import { RunDetail } from '../../features/decay-runs/components/verdict/run-detail';

/** One stored decay run at `/runs/:runId`: links from a bank's history, the review and alerts open it. */
export function Component() {
  const { runId = '' } = useParams();
  const run = useDecayRun(runId);
  return (
    <div className="mx-auto max-w-3xl">
      {run.isPending ? (
        <Spinner />
      ) : run.isError ? (
        <ErrorPanel title="This decay run cannot be shown.">{run.error.message}</ErrorPanel>
      ) : (
        <RunDetail run={run.data} />
      )}
    </div>
  );
}
