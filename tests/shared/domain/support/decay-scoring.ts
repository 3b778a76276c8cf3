/**
 * Scoring the decay fit against simulated runs, shared by the simulation tests and the accuracy
 * report (tests/bench/engine-accuracy.ts).
 */

import { fitDecay, type DecayFitResult } from '../../../../shared/domain/decay-fit';
import {
  effectiveOhmsOf,
  simulateRun,
  type SimulatedRun,
  type SimulatedRunKind,
} from './decay-simulation';
import { seededRandom } from './synthetic-decay';

/** How the fit did on one kind of simulated run. */
export interface KindScore {
  runs: number;
  judged: number;
  covered: number;
  errors: number[];
  /** Errors over 10 % that carried neither a warning nor an unusable answer. */
  silentMisses: number;
  /** Errors of a fit on the readings after the knee alone (control-supply kinds). */
  postKneeErrors: number[];
  /** Runs with 4 or more readings before the knee, and of those, the knee found to within one reading. */
  longPhases: number;
  longPhasesFound: number;
  /** |readings left out as the phase − readings truly before the knee| (control-supply kinds). */
  kneeMisplacements: number[];
}

/** The p quantile of `values` (the value below which a fraction p lies). */
export function quantile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))]!;
}

/**
 * Fits `runs` simulated runs of one kind (seeded) and scores them against their truth: errors,
 * coverage of the 95 % interval, silent misses, and for control-supply kinds the errors of a fit
 * on the readings after the knee alone and how well the knee was placed.
 */
export function scoreRuns(kind: SimulatedRunKind, runs: number, seed: number): KindScore {
  const random = seededRandom(seed);
  const out: KindScore = {
    runs,
    judged: 0,
    covered: 0,
    errors: [],
    silentMisses: 0,
    postKneeErrors: [],
    longPhases: 0,
    longPhasesFound: 0,
    kneeMisplacements: [],
  };
  for (let r = 0; r < runs; r++) {
    const run: SimulatedRun = simulateRun(kind, random);
    const fit: DecayFitResult = fitDecay(run.samples, {
      effectiveOhms: effectiveOhmsOf(run.physics),
    });
    if (run.kneeSeconds > 0) {
      const after = run.samples.filter((sample) => sample.tSeconds >= run.kneeSeconds);
      const reference = fitDecay(after, { leaveOutControlSupply: false });
      if (reference.status === 'ok')
        out.postKneeErrors.push(Math.abs(reference.tauSeconds / run.tauSeconds - 1));
    }
    if (fit.status !== 'ok') continue;
    out.judged++;
    const error = Math.abs(fit.tauSeconds / run.tauSeconds - 1);
    out.errors.push(error);
    if (fit.tauCi95[0] <= run.tauSeconds && run.tauSeconds <= fit.tauCi95[1]) out.covered++;
    if (error > 0.1 && fit.warnings.length === 0) out.silentMisses++;
    if (run.kneeSeconds > 0) {
      const found = fit.controlSupply?.readingsBefore ?? 0;
      out.kneeMisplacements.push(Math.abs(found - run.readingsBeforeKnee));
      if (run.readingsBeforeKnee >= 4) {
        out.longPhases++;
        if (Math.abs(found - run.readingsBeforeKnee) <= 1) out.longPhasesFound++;
      }
    }
  }
  return out;
}
