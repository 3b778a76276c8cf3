/**
 * Invented decay runs for tests: a seeded random source, Gaussian noise, and sampling helpers.
 */

import type { DecaySample } from '../../../../shared/domain/decay-fit';
import { seededRandom } from '../../../../infra/seed/seeded-random';

export { seededRandom };

/** Standard normal deviate by Box–Muller. */
export function gaussian(random: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
}

/** Readings of V0·e^(−t/τ) at the given times, optionally with noise (volts) and rounding. */
export function exponentialDecay(options: {
  v0Volts: number;
  tauSeconds: number;
  times: readonly number[];
  noiseVolts?: number;
  roundToVolts?: number;
  random?: () => number;
}): DecaySample[] {
  const random = options.random ?? seededRandom(1);
  return options.times.map((tSeconds) => {
    let volts = options.v0Volts * Math.exp(-tSeconds / options.tauSeconds);
    if (options.noiseVolts) volts += options.noiseVolts * gaussian(random);
    if (options.roundToVolts)
      volts = Math.round(volts / options.roundToVolts) * options.roundToVolts;
    return { tSeconds, volts };
  });
}

/** `count` evenly spaced times from `fromSeconds` in steps of `stepSeconds`. */
export function evenTimes(count: number, stepSeconds: number, fromSeconds = 0): number[] {
  return Array.from({ length: count }, (_, i) => fromSeconds + i * stepSeconds);
}

/** Replaces the reading at `index` with `volts`. */
export function withReading(
  samples: readonly DecaySample[],
  index: number,
  volts: number,
): DecaySample[] {
  return samples.map((sample, i) => (i === index ? { ...sample, volts } : sample));
}
