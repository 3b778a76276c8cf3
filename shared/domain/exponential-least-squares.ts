/**
 * Least squares for the discharge law V(t) = V0 · e^(−t/τ), in two steps:
 *
 * 1. {@link fitLogLinear}: ln V = ln V0 − t/τ is a straight line; a weighted linear regression on
 *    ln V gives a closed-form start. With constant meter noise σ in volts, var(ln V) ≈ σ²/V², so
 *    the weights are V².
 * 2. {@link refineExponential}: Levenberg–Marquardt on the volts themselves (the least-squares fit
 *    of the actual readings, whose noise is in volts, not in log volts).
 *
 * Why our own Levenberg–Marquardt rather than ml-levenberg-marquardt: the model has two parameters,
 * so the normal equations are a 2 × 2 system solved in closed form with analytic derivatives, in
 * one pass over the data per step and without allocating. The general package builds matrices,
 * differentiates numerically and allocates per iteration; measured here it is well over an order of
 * magnitude slower (see tests/bench/engine.ts), and the product needs ≥ 20,000 handheld fits per
 * second for live previews and fleet re-evaluation. Agreement with the package on the same data is
 * checked in tests/shared/domain/exponential-least-squares.test.ts.
 */

/** Parameters of V(t) = v0Volts · e^(−ratePerSecond · t). */
export interface ExponentialParameters {
  /** Voltage extrapolated to t = 0, volts. */
  v0Volts: number;
  /** Decay rate 1/τ, per second. */
  ratePerSecond: number;
}

/**
 * How {@link fitLogLinear} weights each reading: `'volts-squared'` for constant noise in volts
 * (var(ln V) ≈ σ²/V²), `'none'` for a plain regression on ln V, or the variance of each reading
 * in volts² (σᵢ², e.g. from ./noise-model), which weights ln Vᵢ by Vᵢ²/σᵢ².
 */
export type LogLinearWeighting = 'volts-squared' | 'none' | ArrayLike<number>;

/**
 * Weighted straight-line fit of ln V against t.
 *
 * @param tSeconds - times, seconds
 * @param volts - readings, volts (> 0)
 * @param weighting - `'volts-squared'` (default; constant noise in volts), `'none'` (plain
 *   regression on ln V, as a spreadsheet trend line does), or each reading's variance, volts²
 * @param include - optional mask (1 = use the reading)
 * @returns the parameters, or null with fewer than 2 distinct times
 * @example
 * fitLogLinear([0, 100, 200], [500, 500 * Math.exp(-0.5), 500 * Math.exp(-1)])
 * // { v0Volts: 500, ratePerSecond: 0.005 }
 */
export function fitLogLinear(
  tSeconds: ArrayLike<number>,
  volts: ArrayLike<number>,
  weighting: LogLinearWeighting = 'volts-squared',
  include?: ArrayLike<number>,
): ExponentialParameters | null {
  let sw = 0;
  let st = 0;
  let sy = 0;
  for (let i = 0; i < tSeconds.length; i++) {
    if (include && !include[i]) continue;
    const v = volts[i]!;
    const w = weightOf(weighting, v, i);
    sw += w;
    st += w * tSeconds[i]!;
    sy += w * Math.log(v);
  }
  if (!(sw > 0)) return null;
  const tMean = st / sw;
  const yMean = sy / sw;
  let stt = 0;
  let sty = 0;
  for (let i = 0; i < tSeconds.length; i++) {
    if (include && !include[i]) continue;
    const v = volts[i]!;
    const w = weightOf(weighting, v, i);
    const dt = tSeconds[i]! - tMean;
    stt += w * dt * dt;
    sty += w * dt * (Math.log(v) - yMean);
  }
  if (!(stt > 0)) return null;
  const slope = sty / stt;
  return { v0Volts: Math.exp(yMean - slope * tMean), ratePerSecond: -slope };
}

function weightOf(weighting: LogLinearWeighting, volts: number, index: number): number {
  if (weighting === 'none') return 1;
  if (weighting === 'volts-squared') return volts * volts;
  return (volts * volts) / weighting[index]!;
}

/** Result of {@link refineExponential}. */
export interface ExponentialFit extends ExponentialParameters {
  /**
   * Sum of squared residuals, volts²; with variances given, the weighted sum Σ rᵢ²/σᵢ²
   * (dimensionless, about count − 2 when the variances are right).
   */
  rssVoltsSquared: number;
  /** Readings used. */
  count: number;
  /**
   * Unscaled inverse of JᵀWJ for (v0Volts, ratePerSecond) (W = 1/σᵢ², or 1 without variances);
   * multiply by s² = rss / (count − 2) for the covariance.
   */
  inverseNormal: { v0v0: number; v0Rate: number; rateRate: number };
  /** Levenberg–Marquardt steps taken. */
  iterations: number;
  /** True when the relative change fell below 1e-10 before the step limit. */
  converged: boolean;
}

const MAX_ITERATIONS = 200;

/**
 * Levenberg–Marquardt least squares of V(t) = V0 · e^(−λt) on volts, from a start (usually
 * {@link fitLogLinear}'s). Time is measured internally from the first included reading, which
 * keeps the problem well conditioned when the readings start late in the decay.
 *
 * @param tSeconds - times, seconds, increasing
 * @param volts - readings, volts
 * @param start - starting parameters (ratePerSecond > 0)
 * @param include - optional mask (1 = use the reading)
 * @param varianceVolts2 - optional variance σᵢ² of each reading, volts²: weighted least squares
 *   (each squared residual divided by its variance); plain least squares without
 * @returns the fitted parameters with the data for their covariance; ratePerSecond may come out
 *   ≤ 0 for data that do not decay (the caller decides)
 * @example
 * const t = [0, 50, 100, 150], v = t.map((s) => 560 * Math.exp(-s / 220.9));
 * refineExponential(t, v, { v0Volts: 500, ratePerSecond: 0.004 }).ratePerSecond // ≈ 1 / 220.9
 */
export function refineExponential(
  tSeconds: ArrayLike<number>,
  volts: ArrayLike<number>,
  start: ExponentialParameters,
  include?: ArrayLike<number>,
  varianceVolts2?: ArrayLike<number>,
): ExponentialFit {
  const n = tSeconds.length;
  let reference = NaN;
  let count = 0;
  for (let i = 0; i < n; i++) {
    if (include && !include[i]) continue;
    if (count === 0) reference = tSeconds[i]!;
    count++;
  }
  // b = V(reference), rate = λ; the model is b · e^(−λ (t − reference)).
  let rate = start.ratePerSecond;
  let b = start.v0Volts * Math.exp(-rate * reference);
  if (!Number.isFinite(b) || b <= 0) b = firstIncluded(volts, include);

  // Sums at the current parameters: rss, JᵀJ (a11, a12, a22) and Jᵀr (g1, g2).
  let rss = 0;
  let a11 = 0;
  let a12 = 0;
  let a22 = 0;
  let g1 = 0;
  let g2 = 0;
  const evaluate = (bb: number, rr: number): number => {
    let sum = 0;
    let s11 = 0;
    let s12 = 0;
    let s22 = 0;
    let h1 = 0;
    let h2 = 0;
    for (let i = 0; i < n; i++) {
      if (include && !include[i]) continue;
      const dt = tSeconds[i]! - reference;
      const e = Math.exp(-rr * dt);
      const residual = volts[i]! - bb * e;
      const j2 = -bb * dt * e; // ∂model/∂λ; ∂model/∂b is e
      const w = varianceVolts2 ? 1 / varianceVolts2[i]! : 1;
      sum += w * residual * residual;
      s11 += w * e * e;
      s12 += w * e * j2;
      s22 += w * j2 * j2;
      h1 += w * e * residual;
      h2 += w * j2 * residual;
    }
    if (sum < Infinity) {
      a11 = s11;
      a12 = s12;
      a22 = s22;
      g1 = h1;
      g2 = h2;
    }
    return sum;
  };

  rss = evaluate(b, rate);
  let damping = 1e-3;
  let iterations = 0;
  let converged = false;
  // Saved sums of the accepted point (evaluate overwrites them on every trial).
  let k11 = a11,
    k12 = a12,
    k22 = a22,
    q1 = g1,
    q2 = g2;
  while (iterations < MAX_ITERATIONS) {
    iterations++;
    let accepted = false;
    while (damping < 1e16) {
      // Marquardt's scaling: damp each parameter in proportion to its own curvature.
      const m11 = k11 * (1 + damping);
      const m22 = k22 * (1 + damping);
      const det = m11 * m22 - k12 * k12;
      if (!(det > 0)) {
        damping *= 10;
        continue;
      }
      const db = (m22 * q1 - k12 * q2) / det;
      const dr = (m11 * q2 - k12 * q1) / det;
      const nb = b + db;
      const nr = rate + dr;
      const trial = nb > 0 ? evaluate(nb, nr) : Infinity;
      if (trial <= rss) {
        const small =
          Math.abs(db) <= 1e-10 * Math.abs(b) &&
          Math.abs(dr) <= 1e-10 * Math.max(Math.abs(rate), 1e-300);
        const flat = rss - trial <= 1e-15 * rss;
        b = nb;
        rate = nr;
        rss = trial;
        k11 = a11;
        k12 = a12;
        k22 = a22;
        q1 = g1;
        q2 = g2;
        damping = Math.max(damping / 10, 1e-12);
        accepted = true;
        if (small || flat) converged = true;
        break;
      }
      damping *= 10;
    }
    if (!accepted) {
      // No step lowers the sum of squares: we are at the minimum to machine precision.
      converged = true;
      break;
    }
    if (converged) break;
  }

  // Inverse of JᵀJ at the solution for (b, λ), then carried over to (V0, λ): V0 = b · e^(λ·ref).
  const det = k11 * k22 - k12 * k12;
  const ibb = det > 0 ? k22 / det : Infinity;
  const ibr = det > 0 ? -k12 / det : 0;
  const irr = det > 0 ? k11 / det : Infinity;
  const grow = Math.exp(rate * reference);
  const v0Volts = b * grow;
  const dV0db = grow;
  const dV0dr = b * reference * grow;
  return {
    v0Volts,
    ratePerSecond: rate,
    rssVoltsSquared: rss,
    count,
    inverseNormal: {
      v0v0: dV0db * dV0db * ibb + 2 * dV0db * dV0dr * ibr + dV0dr * dV0dr * irr,
      v0Rate: dV0db * ibr + dV0dr * irr,
      rateRate: irr,
    },
    iterations,
    converged,
  };
}

function firstIncluded(values: ArrayLike<number>, include?: ArrayLike<number>): number {
  for (let i = 0; i < values.length; i++) if (!include || include[i]) return values[i]!;
  return 1;
}
