import type { DecayRun } from '../../../../../../shared/schemas/decay-run';
import { RunVerdict } from './run-verdict';

/**
 * One stored run: its chart, verdict, observations, safety record, who recorded it, its review
 * and its versions.
 */
export function RunDetail({ run }: { run: DecayRun }) {
  return (
    <div data-testid="run-detail">
      <RunVerdict verdict={run.verdict} context={{ asOfOn: run.isolatedAt.slice(0, 10) }} />
    </div>
  );
}
