import { Link } from 'react-router';
import { formatFigure, formatPercentFigure } from '../../../../../../shared/domain';
import type { DecayRun } from '../../../../../../shared/schemas/decay-run';
import { Card } from '../../../../components/ui/card';
import { ErrorPanel } from '../../../../components/ui/error-panel';
import { Spinner } from '../../../../components/ui/spinner';
import { useBankDecayRuns } from '../../api/get-decay-runs';
import { ReviewBadge } from './run-detail';
import { HealthMark, verdictLook, verdictWord } from './run-verdict';

/** Newest first: by the moment of isolation, then the later version first. */
export function newestFirst(runs: readonly DecayRun[]): DecayRun[] {
  return [...runs].sort(
    (a, b) => b.isolatedAt.localeCompare(a.isolatedAt) || b.version - a.version,
  );
}

/** "9 Jan 2027" in the browser's calendar. */
function dayOf(iso: string): string {
  return new Date(iso).toLocaleDateString('en-GB', {
    day: 'numeric',
    month: 'short',
    year: 'numeric',
  });
}

function HistoryRow({ run }: { run: DecayRun }) {
  const look = verdictLook(run.verdict);
  const corrected = run.supersededById !== null;
  return (
    <tr
      className={`border-t border-tide-100 align-top ${corrected ? 'text-tide-600' : 'text-tide-950'}`}
      data-testid="bank-run-row"
      data-run-id={run.id}
      data-version={run.version}
    >
      <td className="whitespace-nowrap py-2 pr-2">
        <Link
          className="font-medium text-tide-900 underline decoration-tide-300 underline-offset-2 hover:decoration-tide-900"
          to={`/runs/${run.id}`}
        >
          {dayOf(run.isolatedAt)}
        </Link>
        {run.version > 1 || corrected ? (
          <span className="block text-xs text-tide-600">
            v{run.version}
            {corrected ? ', corrected' : ''}
          </span>
        ) : null}
      </td>
      <td className="whitespace-nowrap py-2 pr-2 tabular-nums">
        {run.tauSeconds !== null ? `${formatFigure(run.tauSeconds)} s` : '—'}
      </td>
      <td className="whitespace-nowrap py-2 pr-2 tabular-nums">
        {run.capacitanceRatio !== null ? formatPercentFigure(run.capacitanceRatio) : '—'}
      </td>
      <td className="whitespace-nowrap py-2 pr-2">
        <span className="inline-flex items-center gap-1">
          <HealthMark look={look} size={16} />
          <span>{verdictWord(look).toLowerCase()}</span>
        </span>
        {run.safetyFinding ? (
          <span className="block text-xs font-bold text-eol-600">⚠ safety</span>
        ) : null}
        {/* on a phone the review sits under the health, so the table fits the width */}
        <span className="mt-1 block sm:hidden">
          <ReviewBadge state={run.review.state} short />
        </span>
      </td>
      <td className="hidden py-2 sm:table-cell">
        <ReviewBadge state={run.review.state} />
      </td>
    </tr>
  );
}

/**
 * The decay runs stored on a bank, newest first, every version (a corrected one greyed, under
 * its correction): date, τ, the capacitance as a share of the baseline, health and review. Each
 * date opens the run's page.
 */
export function BankRunHistory({ bankId }: { bankId: string }) {
  const runs = useBankDecayRuns(bankId);
  return (
    <Card title="Decay runs">
      <div data-testid="bank-run-history">
        {runs.isPending ? (
          <Spinner label="Loading the decay runs…" />
        ) : runs.isError ? (
          <ErrorPanel title="The decay runs cannot be shown.">{runs.error.message}</ErrorPanel>
        ) : runs.data.length === 0 ? (
          <p className="text-sm text-tide-800" data-testid="bank-run-history-empty">
            No decay run is stored for this bank yet. Runs recorded on a visit appear here once they
            are sent.
          </p>
        ) : (
          <div className="-mx-1 overflow-x-auto px-1">
            <table className="w-full text-sm">
              <caption className="sr-only">Decay runs of this bank, newest first</caption>
              <thead>
                <tr className="text-left text-xs font-bold uppercase tracking-wide text-tide-600">
                  <th scope="col" className="pb-1 pr-2">
                    Date
                  </th>
                  <th scope="col" className="pb-1 pr-2">
                    <span className="normal-case">τ</span>
                  </th>
                  <th
                    scope="col"
                    className="pb-1 pr-2"
                    title="Capacitance as a share of the baseline"
                  >
                    Of baseline
                  </th>
                  <th scope="col" className="pb-1 pr-2">
                    Health<span className="sm:hidden"> · review</span>
                  </th>
                  <th scope="col" className="hidden pb-1 sm:table-cell">
                    Review
                  </th>
                </tr>
              </thead>
              <tbody>
                {newestFirst(runs.data).map((run) => (
                  <HistoryRow key={run.id} run={run} />
                ))}
              </tbody>
            </table>
          </div>
        )}
      </div>
    </Card>
  );
}
