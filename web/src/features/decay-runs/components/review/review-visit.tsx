import { useQueries, useQuery } from '@tanstack/react-query';
import type { DecayRun } from '../../../../../../shared/schemas/decay-run';
import type { Bank } from '../../../../../../shared/schemas/bank';
import type { Visit, VisitBankRef } from '../../../../../../shared/schemas/visit';
import { VISIT_STATE_LABELS } from '../../../../../../shared/domain/visit-states';
import { Badge } from '../../../../components/ui/badge';
import { Button } from '../../../../components/ui/button';
import { DischargeCaution } from '../../../../components/ui/discharge-caution';
import { ErrorPanel } from '../../../../components/ui/error-panel';
import { Spinner } from '../../../../components/ui/spinner';
import { formatInstant } from '../../../../lib/dates';
import { visitDecayRunsQueryOptions } from '../../api/get-decay-runs';
import {
  reviewBankQueryOptions,
  reviewVisitQueryOptions,
  useMarkVisitReviewed,
} from '../../api/review-decay-run';
import { VisitPhotos } from '../photos/visit-photos';
import { ReviewRun, type BaselineChoice } from './review-run';

/** The runs of a visit nobody has corrected since: the versions a review applies to. */
export function currentRuns(runs: readonly DecayRun[]): DecayRun[] {
  return runs.filter((run) => run.supersededById === null);
}

/**
 * Whether a run may be offered as its bank's baseline: the bank has no decay-run baseline yet,
 * and the run gave a trustworthy τ with nothing seen wrong at the cabinet.
 */
export function baselineChoiceFor(run: DecayRun, bank: Bank | undefined): BaselineChoice {
  if (!bank) return { offered: false, reason: null };
  if (bank.baseline.source === 'decay-run') {
    return {
      offered: false,
      reason: run.usedAsBaseline
        ? null
        : `Bank ${bank.position} already has a baseline from a decay run (set ${formatInstant(bank.baseline.setAt)}).`,
    };
  }
  if (bank.status !== 'in-service')
    return { offered: false, reason: `Bank ${bank.position} is no longer in service.` };
  if (run.verdict.status !== 'ok')
    return { offered: false, reason: 'A run without a trustworthy τ cannot be the baseline.' };
  if (run.verdict.visualFindings.length > 0) {
    return {
      offered: false,
      reason: 'A run with something seen wrong at the cabinet cannot be the baseline.',
    };
  }
  return { offered: true };
}

function bankLabel(bank: VisitBankRef): string {
  return `Bank ${bank.position} (${bank.bankDesignCode})`;
}

/**
 * One logged visit in the review queue: where and who, each bank's current runs to accept or
 * query, the visit's photos, and the discharge caution. Shows when the visit has become reviewed.
 */
export function ReviewVisit({
  visitId,
  initial,
  open,
  onToggle,
  onReviewed,
}: {
  visitId: string;
  initial?: Visit;
  /** Shows the runs and photos; a closed visit shows its header alone. */
  open: boolean;
  onToggle: () => void;
  onReviewed?: (visitId: string) => void;
}) {
  const visitQuery = useQuery({ ...reviewVisitQueryOptions(visitId), initialData: initial });
  const runsQuery = useQuery(visitDecayRunsQueryOptions(visitId));
  const visit = visitQuery.data;
  const banks = useQueries({
    queries: (open ? (visit?.banks ?? []) : []).map((bank) => reviewBankQueryOptions(bank.id)),
  });
  const markReviewed = useMarkVisitReviewed({
    onReviewed: (reviewed) => onReviewed?.(reviewed.id),
  });

  if (!visit) {
    return visitQuery.isError ? (
      <ErrorPanel title="This visit could not be loaded">{visitQuery.error.message}</ErrorPanel>
    ) : (
      <Spinner label="Loading the visit…" />
    );
  }
  const bankById = new Map(
    banks.flatMap((answer) => (answer.data ? [[answer.data.id, answer.data] as const] : [])),
  );
  const runs = currentRuns(runsQuery.data ?? []);
  const reviewed = visit.state === 'reviewed';
  const waiting = runs.filter((run) => run.review.state === 'pending').length;

  return (
    <section
      className="space-y-4 rounded-xl border border-tide-200 bg-tide-50/40 p-3 sm:p-5"
      aria-labelledby={`visit-${visit.id}-title`}
      data-testid="review-visit"
    >
      <header className="space-y-1">
        <div className="flex flex-wrap items-center gap-2">
          <h3 id={`visit-${visit.id}-title`} className="text-xl font-bold text-tide-900">
            {visit.cabinetTag}
          </h3>
          <Badge tone={reviewed ? 'ok' : 'tide'}>{VISIT_STATE_LABELS[visit.state]}</Badge>
          {visit.unplanned ? <Badge tone="muted">unplanned</Badge> : null}
        </div>
        <p className="text-sm text-tide-700">
          {visit.siteName} · {visit.areaName}
          {visit.loggedAt ? ` · logged ${formatInstant(visit.loggedAt)}` : ''}
        </p>
        <p className="text-sm text-tide-700">
          By {visit.technicians.map((t) => t.name).join(', ') || 'nobody assigned'}
        </p>
        {reviewed && runsQuery.isSuccess && waiting === 0 ? (
          <p role="status" className="rounded-lg bg-ok-600/10 p-2 text-sm font-medium text-ok-600">
            Every run of this visit has been reviewed: the visit is reviewed.
          </p>
        ) : reviewed && waiting > 0 ? (
          <p className="text-sm text-tide-800">
            Reviewed before;{' '}
            {waiting === 1
              ? 'a run corrected after a query waits'
              : `${waiting} runs corrected after a query wait`}{' '}
            for review.
          </p>
        ) : runsQuery.isSuccess && runs.length > 0 ? (
          <p className="text-sm text-tide-800">
            {waiting === 0
              ? 'Every run has been reviewed.'
              : `${waiting} of ${runs.length} run${runs.length === 1 ? '' : 's'} waiting for review.`}
          </p>
        ) : null}
        <Button
          className="mt-1 min-h-12 w-full sm:w-auto"
          variant={open ? 'ghost' : 'secondary'}
          aria-expanded={open}
          aria-controls={`visit-${visit.id}-runs`}
          onClick={onToggle}
        >
          {open ? 'Hide the runs' : `Show the run${runs.length === 1 ? '' : 's'} and photos`}
        </Button>
      </header>

      {open ? (
        <div id={`visit-${visit.id}-runs`} className="space-y-4">
          <DischargeCaution compact />

          {runsQuery.isPending ? <Spinner label="Loading the decay runs…" /> : null}
          {runsQuery.isError ? (
            <ErrorPanel title="The decay runs could not be loaded">
              {runsQuery.error.message}
            </ErrorPanel>
          ) : null}
          {runsQuery.isSuccess && runs.length === 0 ? (
            <div className="space-y-2 rounded-lg bg-white p-3 text-sm text-tide-800">
              <p>No decay run was recorded on this visit.</p>
              {visit.state === 'logged' ? (
                <Button
                  variant="primary"
                  className="min-h-12"
                  disabled={markReviewed.isPending}
                  onClick={() => markReviewed.mutate(visit)}
                >
                  Mark the visit reviewed
                </Button>
              ) : null}
              {markReviewed.error ? (
                <p role="alert" className="font-medium text-eol-600">
                  {markReviewed.error.message}
                </p>
              ) : null}
            </div>
          ) : null}

          {runsQuery.isSuccess
            ? visit.banks.map((bank) => {
                const ofBank = runs.filter((run) => run.bankId === bank.id);
                if (ofBank.length === 0 && runs.length === 0) return null;
                return (
                  <div key={bank.id} className="space-y-3">
                    {ofBank.length === 0 ? (
                      <p className="text-sm text-tide-700">
                        {bankLabel(bank)}: no decay run recorded.
                      </p>
                    ) : (
                      ofBank.map((run) => (
                        <ReviewRun
                          key={run.id}
                          run={run}
                          bankLabel={bankLabel(bank)}
                          baseline={baselineChoiceFor(run, bankById.get(bank.id))}
                          markedWaitSeconds={
                            visit.cabinetMarkedWaitMinutes === null
                              ? null
                              : visit.cabinetMarkedWaitMinutes * 60
                          }
                          onReviewed={() => onReviewed?.(visit.id)}
                        />
                      ))
                    )}
                  </div>
                );
              })
            : null}

          <div>
            <h4 className="mb-2 text-sm font-bold uppercase tracking-wide text-tide-600">Photos</h4>
            <VisitPhotos visitId={visit.id} canAdd={false} />
          </div>
        </div>
      ) : null}
    </section>
  );
}
