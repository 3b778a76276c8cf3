import { useState, type FormEvent } from 'react';
import { Link } from 'react-router';
import {
  RUN_SOURCE_LABELS,
  VISUAL_FINDING_LABELS,
} from '../../../../../../shared/constants/decay-runs';
import { HEALTH_LABELS, type HealthName } from '../../../../../../shared/constants/health';
import { formatFigure } from '../../../../../../shared/domain/format';
import { explainVerdict } from '../../../../../../shared/domain/verdict-explanation';
import type { DecayRun } from '../../../../../../shared/schemas/decay-run';
import { Badge } from '../../../../components/ui/badge';
import { Button } from '../../../../components/ui/button';
import { Field, TextArea } from '../../../../components/ui/field';
import { ApiError } from '../../../../lib/api-client';
import { formatInstant } from '../../../../lib/dates';
import { useReviewDecayRun } from '../../api/review-decay-run';
import { microfarads, seconds } from '../../utils/figures';
import { plottedSamples } from '../../utils/plotted-samples';
import { DecayPlot } from '../decay-plot';
import { RunVerdict } from '../verdict/run-verdict';

/** What the reviewer may do with a run's baseline: offered, or why not. */
export type BaselineChoice = { offered: true } | { offered: false; reason: string | null };

/** The review of a run in words and colour (the word carries the meaning). */
export function ReviewStateBadge({ state }: { state: DecayRun['review']['state'] }) {
  if (state === 'accepted') return <Badge tone="ok">accepted</Badge>;
  if (state === 'queried') return <Badge tone="warn">queried</Badge>;
  return <Badge tone="muted">waiting for review</Badge>;
}

const HEALTH_TONE: Record<HealthName, 'ok' | 'warn' | 'danger'> = {
  healthy: 'ok',
  watch: 'warn',
  'end-of-life': 'danger',
};

/**
 * What a reviewer reads first: the health word, τ and the capacitance against the baseline, and
 * any safety finding, each in plain words (the whole verdict folds out below it).
 */
function RunSummary({
  run,
  markedWaitSeconds,
}: {
  run: DecayRun;
  markedWaitSeconds: number | null;
}) {
  const text = explainVerdict(run.verdict, {
    asOfOn: run.isolatedAt.slice(0, 10),
    markedWaitSeconds,
  });
  const { verdict } = run;
  return (
    <div className="space-y-1 text-sm text-tide-900" data-testid="review-run-summary">
      <p className="flex flex-wrap items-center gap-2">
        {verdict.health ? (
          <Badge tone={HEALTH_TONE[verdict.health]}>{HEALTH_LABELS[verdict.health]}</Badge>
        ) : (
          <Badge tone="muted">not judged</Badge>
        )}
        {verdict.status === 'ok' ? (
          <span>
            τ {seconds(verdict.tauSeconds)}
            {verdict.baseline
              ? ` · ${formatFigure(verdict.baseline.ratio * 100)} % of the baseline`
              : ''}
          </span>
        ) : null}
      </p>
      {verdict.status === 'ok' ? <p>{text.capacitance ?? text.health}</p> : <p>{text.tau}</p>}
      {text.safety ? <p className="font-medium text-eol-600">⚠ {text.safety}</p> : null}
    </div>
  );
}

/** The figures a run would set as the bank's baseline: τ and the capacitance at 20 °C, else the compared one. */
export function baselineFiguresOf(
  run: DecayRun,
): { tauSeconds: number; capacitanceMicrofarads: number } | null {
  if (run.verdict.status !== 'ok') return null;
  const { capacitance } = run.verdict;
  return {
    tauSeconds: run.verdict.tauSeconds,
    capacitanceMicrofarads: capacitance.at20CMicrofarads ?? capacitance.comparedMicrofarads,
  };
}

/**
 * One current run of a logged visit as a reliability engineer reviews it: the chart with the
 * fit, the verdict, what the technician recorded, and Accept / Query with a comment for the
 * technician; "use this run as the baseline" when the bank has no decay-run baseline yet.
 */
export function ReviewRun({
  run,
  bankLabel,
  baseline,
  markedWaitSeconds,
  onReviewed,
}: {
  run: DecayRun;
  bankLabel: string;
  baseline: BaselineChoice;
  /** The cabinet's marked wait time, seconds, when known. */
  markedWaitSeconds: number | null;
  onReviewed?: (run: DecayRun) => void;
}) {
  const review = useReviewDecayRun({ onReviewed });
  const [comment, setComment] = useState(run.review.comment);
  const [useAsBaseline, setUseAsBaseline] = useState(false);
  const [commentProblem, setCommentProblem] = useState<string | null>(null);
  const [editing, setEditing] = useState(run.review.state === 'pending');
  const figures = baselineFiguresOf(run);
  const id = `review-${run.id}`;
  const serverProblem =
    review.error instanceof ApiError
      ? (review.error.issues.find((i) => i.path === 'comment')?.message ?? review.error.message)
      : review.error?.message;

  function send(outcome: 'accepted' | 'queried') {
    const text = comment.trim();
    if (outcome === 'queried' && text === '') {
      setCommentProblem('Say what is wrong or missing, so the technician can put it right.');
      return;
    }
    setCommentProblem(null);
    review.mutate(
      {
        run,
        review: {
          outcome,
          comment: text,
          ...(outcome === 'accepted' && baseline.offered && useAsBaseline
            ? { useAsBaseline: true }
            : {}),
        },
      },
      { onSuccess: () => setEditing(false) },
    );
  }

  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
    send('accepted');
  };

  return (
    <article
      className="space-y-3 rounded-xl border border-tide-100 bg-white p-4 shadow-sm"
      aria-label={`Decay run on ${bankLabel}`}
      data-testid="review-run"
    >
      <header className="flex flex-wrap items-center gap-2">
        <h4 className="text-base font-bold text-tide-900">{bankLabel}</h4>
        <ReviewStateBadge state={run.review.state} />
        {run.version > 1 ? <Badge tone="tide">version {run.version}</Badge> : null}
        {run.usedAsBaseline ? <Badge tone="spark">baseline of this bank</Badge> : null}
      </header>
      <p className="text-sm text-tide-700">
        Recorded by {run.recordedBy.name}, {formatInstant(run.recordedAt)} ·{' '}
        {RUN_SOURCE_LABELS[run.source]}
        {run.loggerFileName ? ` (${run.loggerFileName})` : ''}
      </p>
      {run.correctionReason ? (
        <p className="text-sm text-tide-800">
          <span className="font-medium">Corrected:</span> {run.correctionReason}{' '}
          <Link to={`/runs/${run.id}`} className="font-medium text-tide-800 underline">
            Every version
          </Link>
        </p>
      ) : null}

      {run.verdict.status === 'ok' ? (
        <DecayPlot samples={plottedSamples(run.samples)} verdict={run.verdict} />
      ) : (
        <div className="space-y-1">
          <DecayPlot samples={plottedSamples(run.samples)} verdict={null} />
          <p className="text-sm text-tide-800">
            The readings as recorded: they gave no trustworthy τ, so no decay is fitted.
          </p>
        </div>
      )}
      <RunSummary run={run} markedWaitSeconds={markedWaitSeconds} />
      <details className="rounded-lg border border-tide-100 px-3 py-2">
        <summary className="flex min-h-10 cursor-pointer items-center text-sm font-medium text-tide-800">
          The whole verdict
        </summary>
        <div className="mt-2">
          <RunVerdict
            verdict={run.verdict}
            context={{ asOfOn: run.isolatedAt.slice(0, 10), markedWaitSeconds }}
          />
        </div>
      </details>

      {run.observations.visualFindings.length > 0 ? (
        <p className="text-sm font-medium text-eol-600">
          Seen at the cabinet:{' '}
          {run.observations.visualFindings.map((f) => VISUAL_FINDING_LABELS[f]).join(', ')}
        </p>
      ) : null}
      {run.observations.notes ? (
        <p className="text-sm text-tide-800">
          <span className="font-medium">Technician’s notes:</span> {run.observations.notes}
        </p>
      ) : null}

      {!editing ? (
        <div
          className="space-y-2 rounded-lg bg-tide-50 p-3 text-sm text-tide-900"
          data-testid="review-outcome"
        >
          <p>
            {run.review.state === 'accepted' ? 'Accepted' : 'Queried'}
            {run.review.reviewedBy ? ` by ${run.review.reviewedBy.name}` : ''}
            {run.review.reviewedAt ? `, ${formatInstant(run.review.reviewedAt)}` : ''}.
          </p>
          {run.review.comment ? (
            <p className="whitespace-pre-line">“{run.review.comment}”</p>
          ) : null}
          <Button size="sm" variant="ghost" onClick={() => setEditing(true)}>
            Change the review
          </Button>
        </div>
      ) : (
        <form className="space-y-3 border-t border-tide-100 pt-3" onSubmit={onSubmit} noValidate>
          <Field
            id={`${id}-comment`}
            label="Comment for the technician"
            hint="Needed when you query the run: say what is wrong or missing. The technician sees it on the visit."
            error={commentProblem ?? undefined}
          >
            <TextArea
              id={`${id}-comment`}
              value={comment}
              maxLength={4000}
              invalid={commentProblem !== null}
              onChange={(event) => setComment(event.target.value)}
            />
          </Field>
          {baseline.offered && figures ? (
            <label className="flex min-h-12 cursor-pointer items-start gap-3 rounded-lg border border-tide-100 p-3 text-sm text-tide-900">
              <input
                type="checkbox"
                className="mt-0.5 h-5 w-5 shrink-0 accent-tide-800"
                checked={useAsBaseline}
                onChange={(event) => setUseAsBaseline(event.target.checked)}
              />
              <span>
                <span className="font-medium">Use this run as the baseline</span> of {bankLabel}: τ{' '}
                {seconds(figures.tauSeconds)} and {microfarads(figures.capacitanceMicrofarads)}{' '}
                become what its later runs are compared with (when you accept it).
              </span>
            </label>
          ) : !baseline.offered && baseline.reason ? (
            <p className="text-xs text-tide-600">{baseline.reason}</p>
          ) : null}
          {serverProblem ? (
            <p role="alert" className="text-sm font-medium text-eol-600">
              {serverProblem}
            </p>
          ) : null}
          <div className="grid grid-cols-2 gap-2">
            <Button
              type="submit"
              variant="primary"
              className="min-h-12"
              disabled={review.isPending}
            >
              Accept
            </Button>
            <Button
              variant="danger"
              className="min-h-12"
              disabled={review.isPending}
              onClick={() => send('queried')}
            >
              Query
            </Button>
          </div>
          {run.review.state !== 'pending' ? (
            <Button size="sm" variant="ghost" onClick={() => setEditing(false)}>
              Keep the review as it is
            </Button>
          ) : null}
        </form>
      )}
    </article>
  );
}
