/**
 * The control-supply phase at the start of a decay.
 *
 * While the bus is high, the drive's switched-mode control supply draws roughly constant power P
 * from it, so C·dV/dt = −V/R − P/V. Then u = V² obeys du/dt = −(2/τ)(u + P·R): the quantity
 * V² + P·R decays with τ/2, and ln V falls faster than the RC line, ever faster as V drops, until
 * the supply drops out and the decay becomes plainly RC (the knee). Readings before the knee lie
 * above the backward extension of the RC line. The fit leaves them out; this module finds them
 * ({@link findControlSupplyKnee}), fits the constant-power model to them to estimate P and the
 * dropout voltage and to check that the model explains them ({@link fitControlSupplyPhase}), and
 * can simulate the whole curve.
 */

import { normalQuantile, tQuantile } from './student-t';
import { PRECISION_SQUARED } from './noise-model';

/** Facts of a decay with a control supply, for {@link controlSupplyDecayVolts}. */
export interface ControlSupplyDecay {
  /** Bus voltage at isolation (t = 0), volts. */
  v0Volts: number;
  /** RC time constant of the bus (bleeder ∥ meter × capacitance), seconds. */
  tauSeconds: number;
  /** Constant power drawn by the control supply while it runs, watts (0 = none). */
  controlSupplyWatts: number;
  /** Effective discharge resistance R (bleeder ∥ meter), ohms. */
  effectiveOhms: number;
  /** Bus voltage below which the control supply stops drawing, volts. */
  dropoutVolts: number;
}

/**
 * Time at which the control supply drops out (the knee), seconds after isolation:
 * t = (τ/2) · ln((V0² + P·R) / (Vd² + P·R)). Zero when the bus starts at or below the dropout.
 *
 * @example
 * controlSupplyKneeSeconds({ v0Volts: 560, tauSeconds: 220.9, controlSupplyWatts: 30,
 *   effectiveOhms: 94_000, dropoutVolts: 300 }) // ≈ 8.2
 */
export function controlSupplyKneeSeconds(decay: ControlSupplyDecay): number {
  const { v0Volts, tauSeconds, dropoutVolts } = decay;
  if (v0Volts <= dropoutVolts) return 0;
  const a = decay.controlSupplyWatts * decay.effectiveOhms;
  return (tauSeconds / 2) * Math.log((v0Volts * v0Volts + a) / (dropoutVolts * dropoutVolts + a));
}

/**
 * Bus voltage at `tSeconds` after isolation for a decay with a constant-power control supply
 * (exact solution of C·dV/dt = −V/R − P/V above the dropout voltage, plain RC below it).
 *
 * @param decay - the decay's facts
 * @param tSeconds - time after isolation, seconds (≥ 0)
 * @returns volts
 * @example
 * controlSupplyDecayVolts({ v0Volts: 560, tauSeconds: 220.9, controlSupplyWatts: 0,
 *   effectiveOhms: 94_000, dropoutVolts: 300 }, 220.9) // ≈ 206 (560 · e^−1)
 */
export function controlSupplyDecayVolts(decay: ControlSupplyDecay, tSeconds: number): number {
  const { v0Volts, tauSeconds, dropoutVolts } = decay;
  const a = decay.controlSupplyWatts * decay.effectiveOhms;
  const kneeSeconds = controlSupplyKneeSeconds(decay);
  if (tSeconds < kneeSeconds) {
    const squared = (v0Volts * v0Volts + a) * Math.exp((-2 * tSeconds) / tauSeconds) - a;
    return Math.sqrt(Math.max(squared, 0));
  }
  const startVolts = v0Volts <= dropoutVolts ? v0Volts : dropoutVolts;
  return startVolts * Math.exp(-(tSeconds - kneeSeconds) / tauSeconds);
}

/**
 * Estimates the control supply's power from the readings before the knee, given τ from the RC
 * part: V² = A · e^(−2t/τ) − P·R is linear in (A, P·R), solved by least squares.
 *
 * @param tSeconds - times of the readings before the knee, seconds
 * @param volts - those readings, volts
 * @param tauSeconds - τ of the RC part, seconds
 * @param effectiveOhms - effective discharge resistance, ohms
 * @returns watts, or null with fewer than 3 readings or no sign of a constant-power draw
 * @example
 * // readings from a 30 W supply on a 94 kΩ / 220.9 s bus
 * estimateControlSupplyWatts([0, 2, 4, 6], [560, 507, 450, 385], 220.9, 94_000) // ≈ 30
 */
export function estimateControlSupplyWatts(
  tSeconds: ArrayLike<number>,
  volts: ArrayLike<number>,
  tauSeconds: number,
  effectiveOhms: number,
): number | null {
  const n = tSeconds.length;
  if (n < 3 || !(tauSeconds > 0) || !(effectiveOhms > 0)) return null;
  // Regress y = V² on x = e^(−2t/τ): y = A·x − a. Times from the first reading keep x near 1.
  const t0 = tSeconds[0]!;
  let sx = 0;
  let sy = 0;
  for (let i = 0; i < n; i++) {
    sx += Math.exp((-2 * (tSeconds[i]! - t0)) / tauSeconds);
    sy += volts[i]! * volts[i]!;
  }
  const mx = sx / n;
  const my = sy / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    const dx = Math.exp((-2 * (tSeconds[i]! - t0)) / tauSeconds) - mx;
    sxx += dx * dx;
    sxy += dx * (volts[i]! * volts[i]! - my);
  }
  if (!(sxx > 0)) return null;
  const slope = sxy / sxx; // A (at t0)
  const a = slope * mx - my; // P·R
  if (!(a > 0) || !Number.isFinite(a)) return null;
  return a / effectiveOhms;
}

/**
 * False-alarm rate of the whole scan (the chance that a run without a control-supply phase is
 * given one), shared among the candidate knees (Bonferroni), and at most 0.1 % per candidate.
 */
const SCAN_ALPHA = 0.01;
const MAX_CANDIDATE_ALPHA = 0.001;
/** The reading just before the knee lies this many scatter-widths above the RC line, or the knee may move earlier. */
const EDGE_Z = 2.5;
/** How many readings further back than the latest passing knee an edge is looked for. */
const EDGE_SEARCH = 20;
/** Each reading before the knee must lie above the RC line by at least this one-sided quantile. */
const EARLIER_ALPHA = 0.1;
/**
 * The tail's own scatter is pooled with the noise model's (which expects a scale of 1) as if the
 * model were worth this many degrees of freedom: a short tail's scatter can come out low by
 * chance, and would then make an honest run look bent.
 */
const PRIOR_DEGREES_OF_FREEDOM = 4;
/**
 * The phase ends before the bus has fallen below this fraction of the first reading: a drive's
 * switched-mode control supply stops well above a third of the bus voltage (from memory: most
 * stop between about 40 and 80 % of the nominal bus), so readings lower than that are plain RC.
 */
const LOWEST_KNEE_FRACTION = 0.3;
/** A reading this many times the RC line is a typing slip, not physics. */
const MAX_PHASE_RATIO = 7;

/** Quantiles already computed, by false-alarm rate (a pure cache: same input, same output). */
const criticalCache = new Map<number, Float64Array>();

/**
 * One-sided Student's t quantile 1 − alpha on `degreesOfFreedom`; beyond 200 degrees of freedom,
 * the value at 201 (within 0.1 % of the normal quantile there).
 */
function criticalValue(alpha: number, degreesOfFreedom: number): number {
  let known = criticalCache.get(alpha);
  if (!known) {
    if (criticalCache.size > 1000) criticalCache.clear();
    known = new Float64Array(202);
    criticalCache.set(alpha, known);
  }
  const df = Math.max(1, Math.min(Math.floor(degreesOfFreedom), 201));
  if (known[df] === 0) known[df] = tQuantile(1 - alpha, df);
  return known[df]!;
}

/**
 * Finds the knee of a control-supply phase by scanning its position from the end of the run
 * backwards. For each candidate start h of the plain RC part, a weighted straight line through
 * ln V of the readings from h on (kept as running sums, so the whole scan is one pass) predicts
 * the reading before; the knee is the latest h at which that reading lies significantly above the
 * line (one-sided Student's t on the tail's own scatter, false-alarm rate 0.1 %) and every earlier
 * reading lies above it too. Scanning backwards means the line is never bent by the steep start,
 * however many readings it holds.
 *
 * @param tSeconds - times, seconds, increasing
 * @param lnVolts - ln V of each reading, less any straight line in t (the test is unchanged by
 *   one; subtracting a rough fit keeps the running sums precise)
 * @param logWeights - inverse variance of each ln V (Vᵢ²/σᵢ²)
 * @param volts - the readings, volts (for the lowest possible knee)
 * @param usable - mask of readings that may take part in the RC line (1 = yes; 0 for readings
 *   already known to be off the curve)
 * @returns the number of leading readings in the control-supply phase (0 = none)
 * @example
 * // 4 steep readings, then a clean RC decay: 4
 * findControlSupplyKnee(t, lnVMinusLine, weights, volts, usable)
 */
export function findControlSupplyKnee(
  tSeconds: ArrayLike<number>,
  lnVolts: ArrayLike<number>,
  logWeights: ArrayLike<number>,
  volts: ArrayLike<number>,
  usable: ArrayLike<number>,
): number {
  const n = tSeconds.length;
  if (n < 4) return 0;
  const lowestKneeVolts = LOWEST_KNEE_FRACTION * volts[0]!;
  const candidateAlpha = Math.min(MAX_CANDIDATE_ALPHA, SCAN_ALPHA / (n - 3));

  const reference = tSeconds[n - 1]!;
  let s0 = 0;
  let s1 = 0;
  let s11 = 0;
  let sy = 0;
  let s1y = 0;
  let syy = 0;
  let count = 0;
  let slope = 0;
  let intercept = 0;
  let xMean = 0;
  let sxx = 0;
  let scale = 0;
  // Predicts reading j from the current line; returns its studentised distance above the line.
  const above = (j: number): number => {
    const x = tSeconds[j]! - reference;
    const dx = x - xMean;
    const varianceFactor = 1 / logWeights[j]! + 1 / s0 + (dx * dx) / sxx;
    return (lnVolts[j]! - (intercept + slope * x)) / (scale * Math.sqrt(varianceFactor));
  };
  const ratioPlausible = (j: number): boolean =>
    lnVolts[j]! - (intercept + slope * (tSeconds[j]! - reference)) < Math.log(MAX_PHASE_RATIO);
  let found = 0;
  for (let h = n - 1; h >= 1; h--) {
    if (usable[h]) {
      const w = logWeights[h]!;
      const x = tSeconds[h]! - reference;
      const y = lnVolts[h]!;
      s0 += w;
      s1 += w * x;
      s11 += w * x * x;
      sy += w * y;
      s1y += w * x * y;
      syy += w * y * y;
      count++;
    }
    if (found > 0 && found - h > EDGE_SEARCH) break;
    if (count < 3) continue;
    if (volts[h]! < lowestKneeVolts) continue;
    xMean = s1 / s0;
    sxx = s11 - s1 * xMean;
    if (!(sxx > 0)) continue;
    const yMean = sy / s0;
    const sxy = s1y - s1 * yMean;
    slope = sxy / sxx;
    intercept = yMean - slope * xMean;
    const rss = Math.max(syy - sy * yMean - slope * sxy, 0);
    const degreesOfFreedom = count - 2 + PRIOR_DEGREES_OF_FREEDOM;
    scale = Math.sqrt((rss + PRIOR_DEGREES_OF_FREEDOM) / degreesOfFreedom);
    // Every reading before h must lie above the line (each by the 90 % one-sided quantile), and
    // together they must lie significantly above it: one steep reading far back counts, and so
    // do several mildly steep ones. Their weighted sum of distances T = Σ wⱼ·dⱼ is tested with its
    // full variance s²·(Σ wⱼ + (Σ wⱼ)²/S₀ + (Σ wⱼ·Δxⱼ)²/Sₓₓ), which counts that all of them are
    // measured against the same uncertain line.
    const each = criticalValue(EARLIER_ALPHA, degreesOfFreedom);
    let all = true;
    const lastAbove = above(h - 1);
    let sumW = 0;
    let sumWdx = 0;
    let sumWd = 0;
    for (let j = h - 1; all && j >= 0; j--) {
      all = above(j) > each && ratioPlausible(j);
      const w = logWeights[j]!;
      const x = tSeconds[j]! - reference;
      sumW += w;
      sumWdx += w * (x - xMean);
      sumWd += w * (lnVolts[j]! - (intercept + slope * x));
    }
    const spread = Math.sqrt(sumW + (sumW * sumW) / s0 + (sumWdx * sumWdx) / sxx);
    const passes =
      all && sumWd / (scale * spread) > criticalValue(candidateAlpha, degreesOfFreedom);
    if (!passes) continue;
    // The latest passing h may have taken readings after the knee that sat above the curve by
    // chance. The knee is the latest passing h whose reading just before lies clearly above the
    // line (looking a few readings further back); without one, the latest passing h.
    if (lastAbove > EDGE_Z) return h;
    if (found === 0) found = h;
  }
  return found;
}

/** The constant-power model fitted to the readings before the knee (see {@link fitControlSupplyPhase}). */
export interface ControlSupplyPhaseFit {
  /** P·R, volts² (P times the effective discharge resistance). */
  powerTimesOhms: number;
  /** The voltage at which the supply dropped out (where the two curves meet), volts; null when they do not meet between the readings around the knee. */
  dropoutVolts: number | null;
  /** When it dropped out, seconds after isolation; null with dropoutVolts. */
  dropoutSeconds: number | null;
  /**
   * Whether the constant-power model explains the readings before the knee: `'yes'`, `'no'`
   * (a lack-of-fit test fails, the fitted power is not positive, or the curves do not meet near
   * the knee), or `'too-few'` readings to tell (one, or two that the model always passes through).
   */
  explained: 'yes' | 'no' | 'too-few';
}

/**
 * Fits the constant-power model V² = A·e^(−2t/τ) − P·R to the readings before the knee, with τ
 * from the RC part, by weighted least squares on V² (var(V²) ≈ 4V²σ²), and checks it: P·R must
 * be positive, the model must meet the RC curve between the last reading before the knee and the
 * first after it, and with three or more readings its χ² must pass a lack-of-fit test (0.1 %).
 * Each reading's scatter counts timing jitter at the steeper slope of this phase: τ·|dV/dt| =
 * (V² + P·R)/V instead of V.
 *
 * @param tSeconds - all times, seconds
 * @param volts - all readings, volts
 * @param head - readings before the knee (≥ 1)
 * @param rc - the RC fit: V(t) = v0Volts · e^(−ratePerSecond·t)
 * @param noise - σ² = aSquared + cSquared · V² of the RC part, and the scale s² of the fit
 * @returns the fit; P·R of 0 and null dropout with a single reading
 * @example
 * // readings at 0, 2, 4 s of a 30 W supply on 94 kΩ / 220.9 s, then RC
 * fitControlSupplyPhase(t, v, 3, { v0Volts, ratePerSecond }, { aSquared: 0.01, cSquared: 0, scale: 1 })
 * // { powerTimesOhms: ≈ 2.82e6, dropoutVolts: ≈ 300, ... , explained: 'yes' }
 */
export function fitControlSupplyPhase(
  tSeconds: ArrayLike<number>,
  volts: ArrayLike<number>,
  head: number,
  rc: { v0Volts: number; ratePerSecond: number },
  noise: { aSquared: number; cSquared: number; scale: number },
): ControlSupplyPhaseFit {
  const none: ControlSupplyPhaseFit = {
    powerTimesOhms: 0,
    dropoutVolts: null,
    dropoutSeconds: null,
    explained: 'too-few',
  };
  if (head < 2 || head >= tSeconds.length) return none;
  const rate = rc.ratePerSecond;
  const t0 = tSeconds[0]!;
  // x = e^(−2(t − t0)/τ); V² = A·x − a before the knee, V² = K·x on the RC curve.
  const xOf = (t: number): number => Math.exp(-2 * rate * (t - t0));
  const k = rc.v0Volts * rc.v0Volts * Math.exp(-2 * rate * t0);
  let a = 0;
  let bigA = 0;
  for (let round = 0; round < 2; round++) {
    let s0 = 0;
    let s1 = 0;
    let s11 = 0;
    let sy = 0;
    let s1y = 0;
    for (let i = 0; i < head; i++) {
      const v = volts[i]!;
      const x = xOf(tSeconds[i]!);
      const w = 1 / (4 * v * v * phaseVariance(v, a, noise));
      s0 += w;
      s1 += w * x;
      s11 += w * x * x;
      sy += w * v * v;
      s1y += w * x * v * v;
    }
    const det = s0 * s11 - s1 * s1;
    if (!(det > 0)) return none;
    bigA = (s0 * s1y - s1 * sy) / det;
    a = -(s11 * sy - s1 * s1y) / det;
    if (!(a > 0)) break;
  }
  if (!(a > 0) || !(bigA > k)) return { ...none, explained: 'no' };
  // Where the two curves meet: A·x − a = K·x.
  const xKnee = a / (bigA - k);
  const dropoutSeconds = t0 - Math.log(xKnee) / (2 * rate);
  const dropoutVolts = Math.sqrt(k * xKnee);
  const before = tSeconds[head - 1]!;
  const after = tSeconds[head]!;
  const slack = 0.5 * (after - before);
  const meets = dropoutSeconds >= before - slack && dropoutSeconds <= after + slack;
  let explained: ControlSupplyPhaseFit['explained'] = meets ? 'yes' : 'no';
  if (meets && head >= 3) {
    let chiSquare = 0;
    for (let i = 0; i < head; i++) {
      const v = volts[i]!;
      const model = Math.sqrt(Math.max(bigA * xOf(tSeconds[i]!) - a, 0));
      chiSquare += (v - model) ** 2 / (phaseVariance(v, a, noise) * noise.scale);
    }
    if (chiSquare > chiSquareQuantile(1 - 0.001, head - 2)) explained = 'no';
  }
  return {
    powerTimesOhms: a,
    dropoutVolts: meets ? dropoutVolts : null,
    dropoutSeconds: meets ? dropoutSeconds : null,
    explained,
  };
}

/** σ² of a reading in the constant-power phase: the proportional part at τ·|dV/dt| = (V² + P·R)/V. */
function phaseVariance(
  volts: number,
  powerTimesOhms: number,
  noise: { aSquared: number; cSquared: number },
): number {
  const steep = (volts * volts + Math.max(powerTimesOhms, 0)) / volts;
  return noise.aSquared + (noise.cSquared + PRECISION_SQUARED) * steep * steep + 1e-24;
}

/** χ² quantile by the Wilson–Hilferty cube-root approximation (good to about 1 % from 1 degree of freedom up). */
function chiSquareQuantile(probability: number, degreesOfFreedom: number): number {
  const k = degreesOfFreedom;
  const z = normalQuantile(probability);
  const c = 2 / (9 * k);
  return k * (1 - c + z * Math.sqrt(c)) ** 3;
}
