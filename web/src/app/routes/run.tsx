import { useEffect } from 'react';
import { useNavigate, useParams } from 'react-router';
import { ErrorPanel } from '../../components/ui/error-panel';
import { Spinner } from '../../components/ui/spinner';
import { useMe } from '../../features/auth/api/get-me';
import { useDecayRun } from '../../features/decay-runs/api/get-decay-runs';
import { RunDetail } from '../../features/decay-runs/components/verdict/run-detail';

/** One stored decay run at `/runs/:runId` (any signed-in role): links from a bank's history, the review and alerts open it. */
export function Component() {
  const { runId = '' } = useParams();
  const navigate = useNavigate();
  const me = useMe();
  const run = useDecayRun(runId);
  // another version opens at its top (the correction was stored from the bottom of the page)
  useEffect(() => {
    window.scrollTo(0, 0);
  }, [runId]);
  return (
    <div className="mx-auto max-w-3xl">
      {run.isPending ? (
        <Spinner label="Loading the decay run…" />
      ) : run.isError ? (
        <ErrorPanel title="This decay run cannot be shown.">{run.error.message}</ErrorPanel>
      ) : (
        <RunDetail
          key={run.data.id}
          run={run.data}
          viewer={me.data ? { id: me.data.id, roles: me.data.roles } : undefined}
          onCorrected={(next) => void navigate(`/runs/${next.id}`)}
        />
      )}
    </div>
  );
}
