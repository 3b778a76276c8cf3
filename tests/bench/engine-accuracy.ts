/**
 * Engine accuracy report: `npx tsx tests/bench/engine-accuracy.ts [seed] [runs]`. Prints, per
 * kind of simulated run (tests/shared/domain/support/decay-simulation.ts), the median, p95 and
 * worst τ error, the coverage of the 95 % interval, the unusable answers and the silent misses
 * (errors over 10 % without a warning), and for control-supply kinds the p95 error of a fit on the
 * readings after the knee alone. No assertions: the bands are asserted in
 * tests/shared/domain/decay-simulation.test.ts.
 */

import { quantile, scoreRuns } from '../shared/domain/support/decay-scoring';
import { SIMULATED_RUN_KINDS } from '../shared/domain/support/decay-simulation';

const seed = Number(process.argv[2] ?? 1);
const runs = Number(process.argv[3] ?? 500);
const percent = (value: number): string => `${(100 * value).toFixed(2)} %`;
console.log(`Decay fit on simulated runs (seed ${seed}, ${runs} runs a kind)`);
for (const kind of SIMULATED_RUN_KINDS) {
  const score = scoreRuns(kind, runs, seed + SIMULATED_RUN_KINDS.indexOf(kind));
  const parts = [
    `p50 ${percent(quantile(score.errors, 0.5))}`,
    `p95 ${percent(quantile(score.errors, 0.95))}`,
    `worst ${percent(quantile(score.errors, 1))}`,
    `95 % interval covers ${percent(score.covered / score.judged)}`,
    `unusable ${score.runs - score.judged}`,
    `silent misses ${score.silentMisses}`,
  ];
  if (score.postKneeErrors.length > 0) {
    parts.push(`after-knee-alone p95 ${percent(quantile(score.postKneeErrors, 0.95))}`);
    parts.push(
      `knee within 1 reading ${percent(1 - score.kneeMisplacements.filter((d) => d > 1).length / score.kneeMisplacements.length)}`,
    );
  }
  if (score.longPhases > 0)
    parts.push(
      `4+ readings before the knee: found ${score.longPhasesFound} of ${score.longPhases}`,
    );
  console.log(`  ${kind.padEnd(22)} ${parts.join(', ')}`);
}
