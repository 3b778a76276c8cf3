import { useState } from 'react';
import { Link } from 'react-router';
import { formatFigure, formatPercentFigure } from '../../../../../../shared/domain';
import type { DecayRun } from '../../../../../../shared/schemas/decay-run';
import { Button } from '../../../../components/ui/button';
import { ErrorPanel } from '../../../../components/ui/error-panel';
import { Spinner } from '../../../../components/ui/spinner';
import { formatInstant } from '../../../../lib/dates';
import { useVisitDecayRuns } from '../../api/get-decay-runs';
import { newestFirst } from './bank-run-history';
import { CorrectionForm } from './correction-form';
import { mayCorrectRun, ReviewBadge, ReviewNote, type RunViewer } from './run-detail';
import { HealthMark, verdictLook, verdictWord } from './run-verdict';

function VisitRun({
  run,
  earlierVersions,
  viewer,
}: {
  run: DecayRun;
  earlierVersions: number;
  viewer?: RunViewer;
}) {
  const [correcting, setCorrecting] = useState(false);
  const [stored, setStored] = useState<DecayRun | null>(null);
  const look = verdictLook(run.verdict);
  const queried = run.review.state === 'queried';
  return (
    <li
      className={`rounded-xl border bg-white px-4 py-3 shadow-sm ${queried ? 'border-watch-600/60' : 'border-tide-100'}`}
      data-testid="visit-run"
      data-run-id={run.id}
      data-review={run.review.state}
    >
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div>
          <p className="font-bold text-tide-900">Bank {run.bankPosition}</p>
          <p className="text-sm text-tide-600">
            {formatInstant(run.isolatedAt)}
            {run.version > 1 ? ` · version ${run.version}` : ''}
            {earlierVersions > 0
              ? ` (${earlierVersions === 1 ? 'one earlier version' : `${earlierVersions} earlier versions`})`
              : ''}
          </p>
        </div>
        <ReviewBadge state={run.review.state} />
      </div>
      <p className="mt-2 flex flex-wrap items-center gap-x-3 gap-y-1 text-base">
        <span className="inline-flex items-center gap-1.5 font-bold">
          <HealthMark look={look} size={20} /> {verdictWord(look)}
        </span>
        {run.tauSeconds !== null ? (
          <span className="text-sm">τ {formatFigure(run.tauSeconds)} s</span>
        ) : null}
        {run.capacitanceRatio !== null ? (
          <span className="text-sm">{formatPercentFigure(run.capacitanceRatio)} of baseline</span>
        ) : null}
        {run.safetyFinding ? (
          <span className="text-sm font-bold text-eol-600">⚠ safety finding</span>
        ) : null}
      </p>
      {run.supersedesId && run.correctionReason ? (
        <p className="mt-2 text-sm text-tide-800" data-testid="visit-run-correction">
          Corrects version {run.version - 1}: {run.correctionReason}
        </p>
      ) : null}
      {run.review.state !== 'pending' ? (
        <div className="mt-3">
          <ReviewNote run={run} />
        </div>
      ) : null}
      {stored ? (
        <p
          role="status"
          className="mt-3 rounded-lg border border-ok-600/40 bg-ok-600/10 px-3 py-2 text-sm text-tide-950"
        >
          Version {stored.version} is stored and goes to the reviewer.
        </p>
      ) : null}
      {correcting ? (
        <div className="mt-3 border-t border-tide-100 pt-3">
          <h3 className="mb-2 text-base font-bold text-tide-900">Correct version {run.version}</h3>
          <CorrectionForm
            run={run}
            onCancel={() => setCorrecting(false)}
            onCorrected={(next) => {
              setCorrecting(false);
              setStored(next);
            }}
          />
        </div>
      ) : (
        <div className="mt-3 flex flex-wrap gap-2">
          <Link
            to={`/runs/${run.id}`}
            className="inline-flex min-h-12 items-center rounded-lg border border-tide-200 bg-white px-4 text-sm font-medium text-tide-800 hover:bg-tide-50"
          >
            Open the run
          </Link>
          {mayCorrectRun(run, viewer) && !stored ? (
            <Button
              variant={queried ? 'primary' : 'secondary'}
              className="min-h-12"
              onClick={() => setCorrecting(true)}
            >
              Correct this run
            </Button>
          ) : null}
        </div>
      )}
    </li>
  );
}

/**
 * The runs stored on a visit: the current version of each, queried ones first with the
 * reviewer's comment in plain sight and "Correct this run" (a new version with a reason), then
 * the newest first. Each opens its page, where every version is shown.
 *
 * @param viewer - who is reading: offers the correction to the run's recorder and to reliability engineers and admins
 */
export function VisitRuns({ visitId, viewer }: { visitId: string; viewer?: RunViewer }) {
  const runs = useVisitDecayRuns(visitId);
  if (runs.isPending) return <Spinner label="Loading the runs of this visit…" />;
  if (runs.isError)
    return (
      <ErrorPanel title="The runs of this visit cannot be shown.">{runs.error.message}</ErrorPanel>
    );
  const current = newestFirst(runs.data.filter((run) => run.supersededById === null));
  const ordered = [
    ...current.filter((run) => run.review.state === 'queried'),
    ...current.filter((run) => run.review.state !== 'queried'),
  ];
  const queried = ordered.filter((run) => run.review.state === 'queried').length;
  return (
    <section className="space-y-3" data-testid="visit-runs">
      <h2 className="text-lg font-bold text-tide-900">Runs stored on this visit</h2>
      {ordered.length === 0 ? (
        <p className="text-sm text-tide-800" data-testid="visit-runs-empty">
          No run is stored on this visit yet. A saved run appears here once it reaches Ebbline.
        </p>
      ) : (
        <>
          {queried > 0 ? (
            <p
              className="rounded-lg bg-watch-600/10 px-3 py-2 text-sm font-medium text-tide-950"
              data-testid="visit-runs-queried"
            >
              {queried === 1 ? 'One run is queried' : `${queried} runs are queried`} by the
              reviewer: read the comment, then correct the run or record it again.
            </p>
          ) : null}
          <ul className="space-y-3">
            {ordered.map((run) => (
              <VisitRun key={run.id} run={run} viewer={viewer} earlierVersions={run.version - 1} />
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
