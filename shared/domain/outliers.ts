/**
 * Readings that are off the decay curve: finding them and naming the likely slip.
 *
 * A reading is off the curve when it is more than {@link OFF_CURVE_Z} scatter-widths from the fit
 * both in volts and in log volts. Requiring both keeps honest scatter from being thrown out
 * whatever the meter's noise is like: constant noise in volts looks large in log terms at low
 * voltages, noise proportional to the reading looks large in volts at high voltages, but a typing
 * slip is large in both. The scatter is estimated robustly (MAD and a trimmed estimate, the
 * larger wins), with a floor so that near-perfect data do not make every rounding look like an error.
 */

import { MAD_TO_SIGMA, medianInPlace, trimmedScale } from './robust';
import { formatNumber, formatVolts } from './format';

/** Scatter-widths beyond which a reading is off the curve (both in volts and in log volts). */
export const OFF_CURVE_Z = 5;

/** Share of the smallest residuals the trimmed scatter estimate keeps (room for the 20 % of slips the fit tolerates, and then some). */
const TRIMMED_KEEP = 0.7;

/** Why a reading was left out of a fit. */
export type ExclusionCode =
  | 'control-supply-phase'
  | 'swapped-readings'
  | 'swapped-digits'
  | 'dropped-digit'
  | 'extra-digit'
  | 'misplaced-decimal-point'
  | 'rebound'
  | 'off-curve';

/** Robust scatter of the residuals. */
export interface ResidualScales {
  /** Typical scatter in volts. */
  volts: number;
  /** Typical scatter of ln V (a fraction of the reading). */
  log: number;
}

/**
 * Robust scatter of the residuals of the included readings: the larger of 1.4826 × median
 * |residual| and the trimmed estimate of ./robust (smallest 70 %), with floors of 0.02 % of the
 * highest included reading (volts) and 0.02 % (log).
 *
 * @param volts - readings, volts
 * @param fittedVolts - the curve at each reading, volts
 * @param include - mask of readings that take part (1 = yes)
 * @example
 * residualScales([100, 50, 25], [100, 50, 25], [1, 1, 1]) // { volts: 0.02, log: 0.0002 }
 */
export function residualScales(
  volts: ArrayLike<number>,
  fittedVolts: ArrayLike<number>,
  include: ArrayLike<number>,
): ResidualScales {
  const n = volts.length;
  const absVolts = new Float64Array(n);
  const absLog = new Float64Array(n);
  let count = 0;
  let highest = 0;
  for (let i = 0; i < n; i++) {
    if (!include[i]) continue;
    const v = volts[i]!;
    const f = fittedVolts[i]!;
    absVolts[count] = Math.abs(v - f);
    absLog[count] = Math.abs(Math.log(v / f));
    if (v > highest) highest = v;
    count++;
  }
  // The larger of two robust estimates: the MAD alone can come out at half the true scatter in a
  // sample of 20 or so, and then honest readings would look off the curve.
  const madVolts = MAD_TO_SIGMA * medianInPlace(absVolts, count);
  const madLog = MAD_TO_SIGMA * medianInPlace(absLog, count);
  return {
    volts: Math.max(madVolts, trimmedScale(absVolts, count, TRIMMED_KEEP), 2e-4 * highest, 1e-12),
    log: Math.max(madLog, trimmedScale(absLog, count, TRIMMED_KEEP), 2e-4),
  };
}

/**
 * True when `readingVolts` is within {@link OFF_CURVE_Z} scatter-widths of `expectedVolts` in volts
 * or in log volts (that is, not off the curve).
 *
 * @example
 * isOnCurve(412, 410, { volts: 0.5, log: 0.002 }) // true
 */
export function isOnCurve(
  readingVolts: number,
  expectedVolts: number,
  scales: ResidualScales,
): boolean {
  if (!(readingVolts > 0)) return false;
  const zVolts = Math.abs(readingVolts - expectedVolts) / scales.volts;
  const zLog = Math.abs(Math.log(readingVolts / expectedVolts)) / scales.log;
  return !(zVolts > OFF_CURVE_Z && zLog > OFF_CURVE_Z);
}

/** A typing slip that turns an off-curve reading into one on the curve. */
export interface TypingSlip {
  code: 'swapped-digits' | 'dropped-digit' | 'extra-digit' | 'misplaced-decimal-point';
  /** What the reading probably was, volts. */
  likelyVolts: number;
}

/**
 * Looks for the one keystroke slip (two neighbouring digits swapped, a digit dropped, a digit
 * too many, the decimal point in the wrong place) that would put `readingVolts` back on the
 * curve. When several fit, the one closest to the curve wins.
 *
 * @param readingVolts - the reading as recorded, volts
 * @param expectedVolts - the curve's value at its time, volts
 * @param scales - scatter of the good readings
 * @returns the slip, or null when no single slip explains the reading
 * @example
 * findTypingSlip(41, 412.3, { volts: 0.5, log: 0.002 }) // { code: 'dropped-digit', likelyVolts: 412 }
 * findTypingSlip(421, 412.3, { volts: 0.5, log: 0.002 }) // { code: 'swapped-digits', likelyVolts: 412 }
 */
export function findTypingSlip(
  readingVolts: number,
  expectedVolts: number,
  scales: ResidualScales,
): TypingSlip | null {
  const text = String(readingVolts);
  // Only readings a person could have typed: plain decimals of at most 5 significant digits.
  if (!/^\d+(\.\d+)?$/.test(text) || text.replace('.', '').replace(/^0+/, '').length > 5)
    return null;
  let best: TypingSlip | null = null;
  let bestDistance = Infinity;
  const consider = (code: TypingSlip['code'], candidateText: string | number): void => {
    const candidate = typeof candidateText === 'number' ? candidateText : Number(candidateText);
    if (!(candidate > 0) || candidate === readingVolts) return;
    if (!isOnCurve(candidate, expectedVolts, scales)) return;
    const distance = Math.abs(candidate - expectedVolts);
    if (distance < bestDistance) {
      bestDistance = distance;
      best = { code, likelyVolts: candidate };
    }
  };
  const isDigit = (c: string | undefined): boolean => c !== undefined && c >= '0' && c <= '9';
  for (let i = 0; i + 1 < text.length; i++) {
    const a = text[i];
    const b = text[i + 1];
    if (isDigit(a) && isDigit(b) && a !== b)
      consider('swapped-digits', text.slice(0, i) + b + a + text.slice(i + 2));
  }
  for (let k = -3; k <= 3; k++) {
    if (k !== 0)
      consider('misplaced-decimal-point', Number((readingVolts * 10 ** k).toPrecision(12)));
  }
  for (let i = 0; i <= text.length; i++) {
    for (let d = 0; d <= 9; d++)
      consider('dropped-digit', text.slice(0, i) + String(d) + text.slice(i));
  }
  for (let i = 0; i < text.length; i++) {
    if (isDigit(text[i]) && text.length > 1)
      consider('extra-digit', text.slice(0, i) + text.slice(i + 1));
  }
  return best;
}

/** A reading left out as off the curve, with the slip named in plain words. */
export interface NamedOffCurveReading {
  index: number;
  code: Exclude<ExclusionCode, 'control-supply-phase'>;
  /** Plain-words reason, naming the reading, its time and what was expected. */
  reason: string;
}

/**
 * Names each off-curve reading: two neighbouring readings that would fit if exchanged
 * ("swapped-readings"), a rise at the very end ("rebound", e.g. dielectric absorption or a source
 * reconnected), a single keystroke slip (see {@link findTypingSlip}), or plainly "off-curve".
 *
 * @param tSeconds - all times, seconds
 * @param volts - all readings, volts
 * @param fittedVolts - the fitted curve at every reading, volts
 * @param offCurve - indices of the off-curve readings, ascending
 * @param scales - scatter of the good readings
 * @example
 * nameOffCurveReadings([0, 60, 120], [560, 41, 325], [560, 425, 325], [1], { volts: 1, log: 0.003 })
 * // [{ index: 1, code: 'dropped-digit', reason: 'The reading 41 V at t = 60 s is far off the decay (about 425 V expected): it looks like a dropped digit (perhaps 421 V).' }]
 */
export function nameOffCurveReadings(
  tSeconds: ArrayLike<number>,
  volts: ArrayLike<number>,
  fittedVolts: ArrayLike<number>,
  offCurve: readonly number[],
  scales: ResidualScales,
): NamedOffCurveReading[] {
  const n = volts.length;
  const named: NamedOffCurveReading[] = [];
  const set = new Set(offCurve);
  const at = (i: number): string =>
    `${formatVolts(volts[i]!)} at t = ${formatNumber(tSeconds[i]!, 4)} s`;
  const expected = (i: number): string => `about ${formatVolts(fittedVolts[i]!)} expected`;

  // A rise at the very end: off-curve readings above the curve that run to the last reading and
  // start with a reading higher than the one before.
  let reboundFrom = n;
  for (let i = n - 1; i >= 0 && set.has(i) && volts[i]! > fittedVolts[i]!; i--) reboundFrom = i;
  if (reboundFrom < n && reboundFrom > 0 && volts[reboundFrom]! > volts[reboundFrom - 1]!) {
    for (let i = reboundFrom; i < n; i++) set.delete(i);
  } else {
    reboundFrom = n;
  }

  const sorted = [...set].sort((a, b) => a - b);
  const done = new Set<number>();
  for (const i of sorted) {
    if (done.has(i)) continue;
    const j = i + 1;
    if (
      set.has(j) &&
      Math.sign(volts[i]! - fittedVolts[i]!) !== Math.sign(volts[j]! - fittedVolts[j]!) &&
      isOnCurve(volts[j]!, fittedVolts[i]!, scales) &&
      isOnCurve(volts[i]!, fittedVolts[j]!, scales)
    ) {
      named.push({
        index: i,
        code: 'swapped-readings',
        reason: `The readings ${at(i)} and ${at(j)} look swapped: each fits the decay at the other's time.`,
      });
      named.push({
        index: j,
        code: 'swapped-readings',
        reason: `The readings ${at(j)} and ${at(i)} look swapped: each fits the decay at the other's time.`,
      });
      done.add(i);
      done.add(j);
      continue;
    }
    const slip = findTypingSlip(volts[i]!, fittedVolts[i]!, scales);
    const lead = `The reading ${at(i)} is far off the decay (${expected(i)})`;
    if (slip) {
      const what = {
        'swapped-digits': 'two digits swapped',
        'dropped-digit': 'a dropped digit',
        'extra-digit': 'a digit too many',
        'misplaced-decimal-point': 'a misplaced decimal point',
      }[slip.code];
      named.push({
        index: i,
        code: slip.code,
        reason: `${lead}: it looks like ${what} (perhaps ${formatVolts(slip.likelyVolts)}).`,
      });
    } else {
      const times = Math.abs(volts[i]! - fittedVolts[i]!) / scales.volts;
      named.push({
        index: i,
        code: 'off-curve',
        reason: `${lead}, ${formatNumber(times, 2)} times the typical scatter: likely a mistyped or disturbed reading.`,
      });
    }
    done.add(i);
  }
  for (let i = reboundFrom; i < n; i++) {
    named.push({
      index: i,
      code: 'rebound',
      reason: `The voltage rose again at the end of the run (${at(i)}, ${expected(i)}): a rebound from dielectric absorption or a reconnected source. Left out of the fit; log the rebound.`,
    });
  }
  return named.sort((a, b) => a.index - b.index);
}
