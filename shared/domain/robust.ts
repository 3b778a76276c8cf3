/**
 * Robust location, scale and line estimates used to screen readings before the least-squares fit.
 * Least squares is thrown off by one mistyped reading; medians are not.
 */

import { normalQuantile } from './student-t';

/** 1.4826 × MAD estimates the standard deviation of normally distributed values. */
export const MAD_TO_SIGMA = 1.4826;

/**
 * Standard deviation estimated from the smallest `keepFraction` of absolute deviations:
 * √(mean of their squares / E[Z² | |Z| ≤ c]) with c the normal quantile that keeps that fraction.
 * Far more efficient than the MAD (which looks at one order statistic only) and, like it, blind to
 * the largest `1 − keepFraction` of the values. Reorders `absValues`.
 *
 * @param absValues - absolute deviations from the centre
 * @param count - how many of them to use
 * @param keepFraction - fraction kept, e.g. 0.8
 * @returns the estimate, or 0 with fewer than 5 values
 * @example
 * trimmedScale(Float64Array.from([0.1, 0.5, 1.2, 0.8, 2.0, 0.3, 0.9, 1.5, 0.2, 9]), 10, 0.8) // ≈ 1.26
 */
export function trimmedScale(absValues: Float64Array, count: number, keepFraction: number): number {
  if (count < 5) return 0;
  const keep = Math.max(3, Math.floor(keepFraction * count));
  if (keep < count) selectInPlace(absValues, count, keep - 1);
  let squares = 0;
  for (let i = 0; i < keep; i++) squares += absValues[i]! * absValues[i]!;
  const q = keep / count;
  if (q >= 1) return Math.sqrt(squares / keep);
  const c = normalQuantile((1 + q) / 2);
  const density = Math.exp((-c * c) / 2) / Math.sqrt(2 * Math.PI);
  const truncatedVariance = 1 - (2 * c * density) / q;
  return Math.sqrt(squares / keep / truncatedVariance);
}

/**
 * Median of `values[0..count)`. Does not modify `values` (works on a copy).
 *
 * @example
 * median(Float64Array.of(3, 1, 2)) // 2
 */
export function median(values: ArrayLike<number>, count = values.length): number {
  if (count <= 0) return 0;
  const copy = new Float64Array(count);
  for (let i = 0; i < count; i++) copy[i] = values[i]!;
  return medianInPlace(copy, count);
}

/**
 * Median of `values[0..count)`, reordering `values` (quickselect, O(n) expected).
 *
 * @example
 * medianInPlace(Float64Array.of(4, 1, 3, 2)) // 2.5
 */
export function medianInPlace(values: Float64Array, count = values.length): number {
  if (count <= 0) return 0;
  const half = count >> 1;
  const upper = selectInPlace(values, count, half);
  if (count % 2 === 1) return upper;
  // After selection every value left of `half` is ≤ upper: the lower middle is their maximum.
  let lower = -Infinity;
  for (let i = 0; i < half; i++) if (values[i]! > lower) lower = values[i]!;
  return (lower + upper) / 2;
}

/**
 * The k-th smallest (0-based) of `values[0..count)`, reordering `values` in place (quickselect).
 *
 * @example
 * selectInPlace(Float64Array.of(9, 7, 8), 3, 0) // 7
 */
export function selectInPlace(values: Float64Array, count: number, k: number): number {
  let left = 0;
  let right = count - 1;
  while (right > left) {
    // Median of three as pivot keeps sorted and reverse-sorted input (decays are sorted) fast.
    const mid = (left + right) >> 1;
    const a = values[left]!;
    const b = values[mid]!;
    const c = values[right]!;
    const pivot = a < b ? (b < c ? b : a < c ? c : a) : a < c ? a : b < c ? c : b;
    let i = left;
    let j = right;
    while (i <= j) {
      while (values[i]! < pivot) i++;
      while (values[j]! > pivot) j--;
      if (i <= j) {
        const swap = values[i]!;
        values[i] = values[j]!;
        values[j] = swap;
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else return values[k]!;
  }
  return values[k]!;
}

/**
 * Weighted median: the value at which the cumulative weight (values in ascending order) first
 * reaches half the total weight. Weights must be ≥ 0 with a positive sum. Does not modify its
 * arguments. Selection by partitioning (O(n) expected), not a full sort: this runs for every fit.
 *
 * @example
 * weightedMedian([1, 2, 10], [1, 1, 5]) // 10
 */
export function weightedMedian(
  values: ArrayLike<number>,
  weights: ArrayLike<number>,
  count = values.length,
): number {
  const x = new Float64Array(count);
  const w = new Float64Array(count);
  let total = 0;
  for (let i = 0; i < count; i++) {
    x[i] = values[i]!;
    w[i] = weights[i]!;
    total += w[i]!;
  }
  return weightedMedianInPlace(x, w, count, total / 2);
}

/** Weighted median of parallel arrays, reordering both in place; `half` is half the total weight. */
function weightedMedianInPlace(
  x: Float64Array,
  w: Float64Array,
  count: number,
  half: number,
): number {
  let left = 0;
  let right = count - 1;
  let below = 0; // weight of the values known to lie left of `left`
  while (left < right) {
    const mid = (left + right) >> 1;
    const a = x[left]!;
    const b = x[mid]!;
    const c = x[right]!;
    const pivot = a < b ? (b < c ? b : a < c ? c : a) : a < c ? a : b < c ? c : b;
    // Three-way partition: [left, lt) < pivot, [lt, gt] = pivot, (gt, right] > pivot.
    let lt = left;
    let gt = right;
    let i = left;
    while (i <= gt) {
      const value = x[i]!;
      if (value < pivot) {
        swap(x, w, i, lt);
        lt++;
        i++;
      } else if (value > pivot) {
        swap(x, w, i, gt);
        gt--;
      } else {
        i++;
      }
    }
    let lowWeight = 0;
    for (let k = left; k < lt; k++) lowWeight += w[k]!;
    let equalWeight = 0;
    for (let k = lt; k <= gt; k++) equalWeight += w[k]!;
    if (below + lowWeight >= half) {
      right = lt - 1;
    } else if (below + lowWeight + equalWeight >= half) {
      return pivot;
    } else {
      below += lowWeight + equalWeight;
      left = gt + 1;
    }
  }
  return x[left]!;
}

function swap(x: Float64Array, w: Float64Array, i: number, j: number): void {
  const xi = x[i]!;
  x[i] = x[j]!;
  x[j] = xi;
  const wi = w[i]!;
  w[i] = w[j]!;
  w[j] = wi;
}

/** A straight line y = intercept + slope × x. */
export interface Line {
  intercept: number;
  slope: number;
}

/** Largest number of points the pairwise estimate looks at; longer series are thinned. */
export const REPEATED_MEDIAN_MAX_POINTS = 64;

/**
 * Robust straight line through (x, y): Siegel's repeated median for the slope (for each point
 * the median of its slopes to all others, then the median of those), and a weighted median of
 * the intercepts. The repeated median withstands up to half the points being wrong, and, unlike
 * a weighted Theil–Sen estimate, gives no extra pull to a point at the end of the range.
 * `weights[i]` (the inverse variance of `y[i]`) only weights the intercepts, each capped at 4 × the
 * median weight so that one heavily weighted point cannot own the median. Series longer than
 * {@link REPEATED_MEDIAN_MAX_POINTS} are thinned evenly by index (the estimate only needs to be
 * robust, not efficient; least squares refines it).
 *
 * @param x - abscissae, strictly increasing
 * @param y - ordinates
 * @param weights - inverse variances of `y`, all > 0
 * @param include - optional mask: only indices with include[i] = 1 take part
 * @returns the line, or null when fewer than 2 points take part
 * @example
 * robustLine([0, 1, 2, 3, 4], [0, 1, 2, 30, 4], [1, 1, 1, 1, 1]) // { intercept: 0, slope: 1 }
 */
export function robustLine(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  weights: ArrayLike<number>,
  include?: ArrayLike<number>,
): Line | null {
  const chosen: number[] = [];
  for (let i = 0; i < x.length; i++) if (!include || include[i]) chosen.push(i);
  let picks = chosen;
  if (chosen.length > REPEATED_MEDIAN_MAX_POINTS) {
    picks = [];
    const last = chosen.length - 1;
    for (let j = 0; j < REPEATED_MEDIAN_MAX_POINTS; j++) {
      picks.push(chosen[Math.round((j * last) / (REPEATED_MEDIAN_MAX_POINTS - 1))]!);
    }
  }
  const m = picks.length;
  if (m < 2) return null;
  // Each pair's slope once, into a symmetric table; row a then holds point a's slopes.
  const table = new Float64Array(m * m);
  for (let a = 0; a < m; a++) {
    const xa = x[picks[a]!]!;
    const ya = y[picks[a]!]!;
    for (let b = a + 1; b < m; b++) {
      const slope = (y[picks[b]!]! - ya) / (x[picks[b]!]! - xa);
      table[a * m + b] = slope;
      table[b * m + a] = slope;
    }
  }
  const own = new Float64Array(m - 1);
  const pointSlopes = new Float64Array(m);
  for (let a = 0; a < m; a++) {
    let k = 0;
    const row = a * m;
    for (let b = 0; b < m; b++) if (b !== a) own[k++] = table[row + b]!;
    pointSlopes[a] = medianInPlace(own, m - 1);
  }
  const slope = medianInPlace(pointSlopes, m);
  const intercepts = new Float64Array(m);
  const interceptWeights = new Float64Array(m);
  for (let a = 0; a < m; a++) interceptWeights[a] = weights[picks[a]!]!;
  // A reading typed ten times too high would carry a hundredfold weight and could own the
  // median on its own; capping each weight at 4 × the median weight keeps the estimate robust.
  const cap = 4 * median(interceptWeights, m);
  for (let a = 0; a < m; a++) {
    const i = picks[a]!;
    intercepts[a] = y[i]! - slope * x[i]!;
    interceptWeights[a] = Math.min(weights[i]!, cap);
  }
  return { intercept: weightedMedian(intercepts, interceptWeights, m), slope };
}
