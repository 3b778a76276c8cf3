import type { RecordedRunVerdict } from '../../../../../../shared/domain/recorded-run';
import { explainVerdict } from '../../../../../../shared/domain/verdict-explanation';
import { todayOn } from '../../utils/figures';

/** What the verdict screen needs beside the verdict. */
export interface RunVerdictContext {
  /** The day of the run (ISO date); today when absent (a run just captured). */
  asOfOn?: string;
  /** The cabinet's marked wait time, seconds, when known (an unusable run has no estimate of its own). */
  markedWaitSeconds?: number | null;
}

/**
 * The verdict screen of a recorded run: the health in big words, each part in one plain
 * sentence, τ with its interval, capacitance against baseline and nameplate, the safe-after
 * time, the next step and the discharge caution.
 */
export function RunVerdict({
  verdict,
  context = {},
}: {
  verdict: RecordedRunVerdict;
  context?: RunVerdictContext;
}) {
  const text = explainVerdict(verdict, {
    asOfOn: context.asOfOn ?? todayOn(),
    markedWaitSeconds: context.markedWaitSeconds ?? null,
  });
  return (
    <div data-testid="run-verdict" className="space-y-2">
      {Object.entries(text).map(([part, sentence]) =>
        sentence ? <p key={part}>{sentence}</p> : null,
      )}
    </div>
  );
}
