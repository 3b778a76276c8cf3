/**
 * Invented bank histories for the forecast's simulation tests and the coverage script: yearly
 * decay runs over 3–10 years whose true capacitance loss is linear, quadratic or exponential in
 * time, read with the scatter of real runs, and the day the true curve reaches the limit.
 *
 * The scatter: the decay engine's 95 % τ intervals on handheld runs are about ±1–3 % (the fit
 * tests' figures), and the ratio also carries the temperature normalisation and the bleeder's
 * tolerance, so one run's ratio is taken as uncertain by σ = 0.5–2 % of the baseline. Half the
 * histories state that σ with each run (as the engine's intervals do), half state nothing.
 */

import { addDays, DAYS_PER_YEAR } from '../../../../shared/domain/calendar-dates';
import type { RatioHistoryPoint } from '../../../../shared/domain/trend-forecast';
import { gaussian } from './synthetic-decay';

/** How the true capacitance loss grows with time. */
export type LossShape = 'linear' | 'quadratic' | 'exponential';

export const LOSS_SHAPES: readonly LossShape[] = ['linear', 'quadratic', 'exponential'];

/** One invented bank: its runs, the forecast day, and the truth the forecast should find. */
export interface SimulatedHistory {
  shape: LossShape;
  history: RatioHistoryPoint[];
  /** The forecast is made on the day of the last run. */
  asOfOn: string;
  endOfLifeRatio: number;
  /** The day the true curve reaches `endOfLifeRatio`, "YYYY-MM-DD" (first run + `lifeYears`). */
  trueEndOfLifeOn: string;
  /** Years of history, years from the first run to the true end of life, and from the last run. */
  historyYears: number;
  lifeYears: number;
  remainingYears: number;
  /** The runs' scatter (standard deviation of the ratio). */
  sigma: number;
  /** The true ratio, without scatter, `years` after the first run. */
  trueRatioAt: (years: number) => number;
}

const START_ON = '2012-03-01';
const LIMIT = 0.8;

/**
 * One history of the given shape drawn from `random` (infra/seed/seeded-random.ts).
 *
 * - history 3–10 whole years, one run a year give or take 45 days (a shutdown moves);
 * - the true end of life 0.5–8 years after the last run;
 * - linear: loss ∝ t; quadratic: loss ∝ α·t + (1 − α)·t² with α in [0, 0.5] (mostly
 *   accelerating); exponential: loss ∝ e^(k·t) − 1 with k·L in [1, 3] (L the true life);
 *   all scaled so the ratio is 1 at the first run and 0.8 at L.
 */
export function simulateHistory(shape: LossShape, random: () => number): SimulatedHistory {
  const historyYears = 3 + Math.floor(random() * 8);
  const remainingYears = 0.5 + 7.5 * random();
  const lifeYears = historyYears + remainingYears;
  const sigma = 0.005 + 0.015 * random();
  const statesUncertainty = random() < 0.5;
  const loss = lossCurve(shape, lifeYears, random);
  const ratioAt = (years: number): number => 1 - (1 - LIMIT) * loss(years);

  const history: RatioHistoryPoint[] = [];
  let lastDay = 0;
  for (let year = 0; year <= historyYears; year++) {
    const shift = year === 0 ? 0 : Math.round((random() * 2 - 1) * 45);
    const day = Math.round(year * DAYS_PER_YEAR) + shift;
    lastDay = day;
    const ratio = ratioAt(day / DAYS_PER_YEAR) + sigma * gaussian(random);
    history.push({
      measuredOn: addDays(START_ON, day),
      ratio,
      ...(statesUncertainty ? { ratioStdError: sigma } : {}),
    });
  }
  return {
    shape,
    history,
    asOfOn: addDays(START_ON, lastDay),
    endOfLifeRatio: LIMIT,
    trueEndOfLifeOn: addDays(START_ON, Math.round(lifeYears * DAYS_PER_YEAR)),
    historyYears,
    lifeYears,
    remainingYears: lifeYears - lastDay / DAYS_PER_YEAR,
    sigma,
    trueRatioAt: ratioAt,
  };
}

/** Loss as a fraction of the loss at end of life: 0 at t = 0, 1 at t = lifeYears. */
function lossCurve(
  shape: LossShape,
  lifeYears: number,
  random: () => number,
): (years: number) => number {
  switch (shape) {
    case 'linear':
      return (t) => t / lifeYears;
    case 'quadratic': {
      const alpha = 0.5 * random();
      return (t) => alpha * (t / lifeYears) + (1 - alpha) * (t / lifeYears) ** 2;
    }
    case 'exponential': {
      const k = (1 + 2 * random()) / lifeYears;
      const scale = Math.expm1(k * lifeYears);
      return (t) => Math.expm1(k * t) / scale;
    }
  }
}
