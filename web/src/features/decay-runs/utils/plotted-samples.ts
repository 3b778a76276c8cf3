import type { DecaySample } from '../../../../../shared/domain';

/**
 * A stored run's readings as its verdict was fitted on them, for `DecayPlot`: in time order
 * (a stable sort, as the server's judge puts readings typed out of order back in order) and
 * without the readings at or below 0 V that were set aside before the fit. The verdict's
 * indices of readings left out count in this list, not in the samples as stored.
 *
 * @example
 * plottedSamples([{ tSeconds: 10, volts: 300 }, { tSeconds: 0, volts: 560 }, { tSeconds: 90, volts: 0 }])
 * // [{ tSeconds: 0, volts: 560 }, { tSeconds: 10, volts: 300 }]
 */
export function plottedSamples(samples: readonly DecaySample[]): DecaySample[] {
  const ordered = samples.some((s, i) => i > 0 && s.tSeconds < samples[i - 1]!.tSeconds)
    ? [...samples].sort((a, b) => a.tSeconds - b.tSeconds)
    : [...samples];
  return ordered.filter((s) => !(Number.isFinite(s.volts) && s.volts <= 0));
}
