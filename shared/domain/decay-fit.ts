/**
 * The decay fit: from a recorded discharge (time, volts) to τ and V0 with their uncertainty.
 *
 * Steps:
 * 1. Check the input ({@link validateDecaySamples}): finite numbers, volts > 0, times increasing.
 * 2. A robust line through ln V (Siegel's repeated median) that one mistyped reading cannot move.
 * 3. Leave out the control-supply phase (readings at the start clearly above the RC line, see
 *    ./control-supply) and off-curve readings (see ./outliers).
 * 4. Weighted log-linear least squares for a start, then Levenberg–Marquardt on the volts
 *    (./exponential-least-squares). Steps 3 and 4 repeat against the refined curve until the set
 *    of readings used no longer changes.
 * 5. Uncertainty from the Jacobian at the solution: standard errors and a 95 % interval of τ
 *    (Student's t on n − 2 degrees of freedom, formed on the rate 1/τ and inverted, so it is
 *    positive and asymmetric as it should be).
 * 6. Refuse to answer when the data cannot carry a τ: fewer than 3 readings left, no decay, an
 *    interval wider than τ itself, R² below 0.95, or too many readings off the curve.
 */

import { EngineInputError, unusable, type InputIssue, type Unusable } from './errors';
import {
  fitLogLinear,
  refineExponential,
  type ExponentialFit,
  type ExponentialParameters,
} from './exponential-least-squares';
import { findControlSupplyKnee, fitControlSupplyPhase } from './control-supply';
import {
  estimateNoiseModel,
  MIN_READINGS_FOR_TWO_PARTS,
  noiseFloor,
  noiseVariances,
  readingResolutionVolts,
  type NoiseModel,
  type ReadingNoiseInput,
} from './noise-model';
import {
  OFF_CURVE_Z,
  nameOffCurveReadings,
  residualScales,
  type ExclusionCode,
  type ResidualScales,
} from './outliers';
import { robustLine } from './robust';
import { tQuantile } from './student-t';
import { formatNumber, formatSeconds, formatVolts } from './format';

/** One reading of a decay run: time since isolation and bus voltage. */
export interface DecaySample {
  /** Time since the drive was isolated, seconds. */
  tSeconds: number;
  /** DC-link voltage, volts (> 0). */
  volts: number;
}

/** Options of {@link fitDecay}. */
export interface DecayFitOptions {
  /** Find and leave out the control-supply phase at the start (default true). */
  leaveOutControlSupply?: boolean;
  /** Find and leave out readings off the curve (mistyped readings; default true). */
  leaveOutOffCurve?: boolean;
  /**
   * Effective discharge resistance (bleeder ∥ meter), ohms. Only used to express the control
   * supply's draw in watts; the fit itself does not need it.
   */
  effectiveOhms?: number;
  /**
   * What is known of the readings' scatter: the meter's noise in volts and as a fraction of the
   * reading, the timing jitter of the readings, the display resolution. Each is a floor; the fit
   * estimates the rest from its residuals and weights every reading by 1/σ².
   */
  noise?: ReadingNoiseInput;
}

/** A reading the fit left out, and why. */
export interface ExcludedReading {
  /** Position in the input samples (0-based). */
  index: number;
  tSeconds: number;
  volts: number;
  code: ExclusionCode;
  /** Plain-words reason. */
  reason: string;
  /** The fitted curve's value at this time, volts (the RC line, also before the knee). */
  expectedVolts: number;
}

/** The control-supply phase found at the start of a decay. */
export interface ControlSupplyPhase {
  /**
   * Time of the first reading on the plain RC decay, seconds: the control supply had dropped out
   * by then (with dense logger data this is the knee to within one sample).
   */
  kneeSeconds: number;
  /** The reading at {@link kneeSeconds}, volts. */
  kneeVolts: number;
  /** Readings before the knee (left out of the fit). */
  readingsBefore: number;
  /**
   * Constant power drawn by the control supply, watts, from the constant-power model fitted to the
   * readings before the knee; null without the effective resistance, with a single reading before
   * the knee, or when the model does not explain them.
   */
  powerWatts: number | null;
  /** The bus voltage at which the supply dropped out, volts (where the model meets the RC curve); null when not estimable. */
  dropoutVolts: number | null;
  /** When the supply dropped out, seconds after isolation; null with dropoutVolts. */
  dropoutSeconds: number | null;
  /**
   * Whether a control supply drawing constant power explains the readings before the knee:
   * `'yes'`, `'no'` (then a warning says the start of the run is not understood) or `'too-few'`
   * readings to tell.
   */
  explained: 'yes' | 'no' | 'too-few';
}

/** The readings' scatter as the fit found it: σ² = volts² + (fractionOfReading · V)². */
export interface DecayNoise {
  /** The constant part, rounding included, volts. */
  volts: number;
  /** The part in proportion to the reading (%-of-reading noise and timing jitter), as a fraction. */
  fractionOfReading: number;
  /** The display resolution the readings were written at (or given), volts; 0 = none. */
  resolutionVolts: number;
}

/** A residual of one reading used in the fit. */
export interface DecayResidual {
  index: number;
  tSeconds: number;
  /** Reading minus fitted curve, volts. */
  residualVolts: number;
}

/** A successful decay fit. All numbers are finite. */
export interface DecayFit {
  status: 'ok';
  /** Fitted time constant τ, seconds. */
  tauSeconds: number;
  /** Standard error of τ, seconds. */
  tauStdErrorSeconds: number;
  /** 95 % confidence interval of τ, seconds, [low, high]. */
  tauCi95: [number, number];
  /** Fitted voltage at t = 0 (the RC line extended back), volts. */
  v0Volts: number;
  /** Standard error of V0, volts. */
  v0StdErrorVolts: number;
  /** Root mean square of the residuals, √(RSS / n), volts. */
  rmseVolts: number;
  /** Coefficient of determination of the fit on volts. */
  r2: number;
  /** Readings used in the fit. */
  pointsUsed: number;
  /** Readings given. */
  pointsTotal: number;
  /** Readings left out, with the reason. */
  excluded: ExcludedReading[];
  /** Residuals of the readings used. */
  residuals: DecayResidual[];
  /** The control-supply phase, or null when the decay is RC from the first reading. */
  controlSupply: ControlSupplyPhase | null;
  /** Time span of the readings used, in time constants. */
  spanTimeConstants: number;
  /** The readings' scatter the fit was weighted by. */
  noise: DecayNoise;
  /** Plain-words cautions about the fit (short span, few points, systematic residuals, ...). */
  warnings: string[];
}

/** {@link fitDecay}'s answer: a fit, or a reason why there is none. */
export type DecayFitResult = DecayFit | Unusable;

/** The 95 % interval of τ may be at most this wide, as a fraction of τ. */
const MAX_RELATIVE_CI_WIDTH = 1;
const MIN_R2 = 0.95;
const MAX_PASSES = 8;
/** Family-wise false-alarm rate of the studentised residual test (Bonferroni over the readings). */
const OFF_CURVE_ALPHA = 0.01;
/** Readings that must remain before any can be left out as off the curve. */
const MIN_POINTS_FOR_REJECTION = 5;
/** Less of the decay than this (in time constants, about a 10 % fall) cannot be judged. */
const MIN_SPAN_TIME_CONSTANTS = 0.1;
/** A 95 % interval wider than ± this fraction of τ is worth a warning. */
const LOOSE_HALF_WIDTH = 0.04;

/**
 * Checks decay samples and throws {@link EngineInputError} naming every bad one: numbers that
 * are not finite, voltages at or below zero, times that do not increase.
 *
 * @param samples - the readings
 * @param labelOf - how to name reading `index` in messages (default "reading 4" for index 3); a CSV
 *   reader passes "row 7" so the message points at the file
 * @throws EngineInputError
 * @example
 * validateDecaySamples([{ tSeconds: 0, volts: 560 }, { tSeconds: 0, volts: 500 }])
 * // throws: 'reading 2: time 0 s does not come after the previous reading's 0 s ...'
 */
export function validateDecaySamples(
  samples: readonly DecaySample[],
  labelOf: (index: number) => string = (index) => `reading ${index + 1}`,
): void {
  if (!Array.isArray(samples)) {
    throw new EngineInputError(
      'invalid-number',
      'Samples must be a list of { tSeconds, volts } readings.',
    );
  }
  const issues: InputIssue[] = [];
  let firstCode: EngineInputError['code'] | null = null;
  const add = (code: EngineInputError['code'], path: string, message: string): void => {
    if (issues.length < 50) issues.push({ path, message });
    firstCode ??= code;
  };
  let previous = -Infinity;
  for (let i = 0; i < samples.length; i++) {
    const sample = samples[i] as Partial<DecaySample> | undefined;
    const t = sample?.tSeconds;
    const v = sample?.volts;
    if (typeof t !== 'number' || !Number.isFinite(t)) {
      add('invalid-number', `samples.${i}.tSeconds`, `${labelOf(i)}: the time is not a number.`);
      continue;
    }
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      add('invalid-number', `samples.${i}.volts`, `${labelOf(i)}: the voltage is not a number.`);
    } else if (v <= 0) {
      add(
        'non-positive-voltage',
        `samples.${i}.volts`,
        `${labelOf(i)}: the voltage ${formatNumber(v, 4)} V is not above zero; a decay reading must be positive (check the sign, the probe polarity, or leave out readings at the meter's zero).`,
      );
    }
    if (!(t > previous)) {
      add(
        'times-not-increasing',
        `samples.${i}.tSeconds`,
        `${labelOf(i)}: the time ${formatNumber(t, 6)} s does not come after the previous reading's ${formatNumber(previous, 6)} s; times must increase.`,
      );
    }
    previous = t;
  }
  if (issues.length > 0) {
    const more = issues.length > 1 ? ` (${issues.length} problems in all)` : '';
    throw new EngineInputError(
      firstCode ?? 'invalid-number',
      `${issues[0]!.message}${more}`,
      issues,
    );
  }
}

/**
 * Fits V(t) = V0 · e^(−t/τ) to a recorded discharge, leaving out the control-supply phase and
 * mistyped readings, and reports τ with its uncertainty.
 *
 * @param samples - readings, t from the moment of isolation (seconds), volts > 0, times increasing
 * @param options - see {@link DecayFitOptions}
 * @returns a {@link DecayFit}, or an {@link Unusable} with a plain-words reason
 * @throws EngineInputError for malformed samples (see {@link validateDecaySamples})
 * @example
 * const samples = [0, 60, 120, 180, 240, 300].map((t) => ({ tSeconds: t, volts: 560 * Math.exp(-t / 220.9) }));
 * const fit = fitDecay(samples);
 * if (fit.status === 'ok') fit.tauSeconds; // ≈ 220.9
 */
export function fitDecay(
  samples: readonly DecaySample[],
  options: DecayFitOptions = {},
): DecayFitResult {
  validateDecaySamples(samples);
  const noiseInput = validateNoiseInput(options.noise);
  const leaveOutControlSupply = options.leaveOutControlSupply ?? true;
  const leaveOutOffCurve = options.leaveOutOffCurve ?? true;
  const n = samples.length;
  if (n < 3) {
    return unusable(
      'too-few-points',
      `Only ${n} reading${n === 1 ? '' : 's'}; at least 3 are needed to fit a decay (5 or more over two to three time constants is better).`,
    );
  }
  // One block of memory for the working arrays: a fit runs thousands of times a second, and each
  // separate typed array is an allocation of its own.
  const block = new Float64Array(12 * n);
  const slot = (k: number): Float64Array => block.subarray(k * n, (k + 1) * n);
  const masks = new Uint8Array(4 * n);
  const mask = (k: number): Uint8Array => masks.subarray(k * n, (k + 1) * n);
  const t = slot(0);
  const v = slot(1);
  const lnV = slot(2);
  const weights = slot(3);
  for (let i = 0; i < n; i++) {
    t[i] = samples[i]!.tSeconds;
    v[i] = samples[i]!.volts;
    lnV[i] = Math.log(v[i]!);
    weights[i] = v[i]! * v[i]!;
  }

  const noDecay = (): Unusable =>
    unusable(
      'no-decay',
      `The voltage does not fall as a discharge does (${formatVolts(v[0]!)} at t = ${formatNumber(t[0]!, 4)} s, ${formatVolts(v[n - 1]!)} at t = ${formatNumber(t[n - 1]!, 4)} s). Check that the drive was isolated and that the readings are in order.`,
    );

  const robust = robustLine(t, lnV, weights);
  if (!robust || !(robust.slope < 0) || !fallsOverall(v)) return noDecay();

  // Screening against the robust line.
  const fitted = slot(4);
  for (let i = 0; i < n; i++) fitted[i] = Math.exp(robust.intercept + robust.slope * t[i]!);
  const all = mask(0).fill(1);
  let scales = residualScales(v, fitted, all);
  const zVolts = slot(5);
  const zLog = slot(6);
  const standardise = (): void => {
    for (let i = 0; i < n; i++) {
      zVolts[i] = (v[i]! - fitted[i]!) / scales.volts;
      zLog[i] = Math.log(v[i]! / fitted[i]!) / scales.log;
    }
  };
  standardise();

  // The noise model: floors from what is known, a first guess from the robust scatter (half of it
  // constant, half in proportion to the reading), refined from the residuals of each fit.
  const resolutionVolts = noiseInput.resolutionVolts ?? readingResolutionVolts(v);
  const floorAt = (ratePerSecond: number): NoiseModel =>
    noiseFloor(noiseInput, resolutionVolts, ratePerSecond);
  let noise: NoiseModel = {
    aSquared: Math.max(floorAt(-robust.slope).aSquared, (scales.volts * scales.volts) / 2),
    cSquared: Math.max(floorAt(-robust.slope).cSquared, (scales.log * scales.log) / 2),
  };
  const variance = noiseVariances(noise, v, slot(7));

  // ln V less the current line, and its weights, for the knee scan.
  const lnRelative = slot(8);
  const logWeights = slot(9);
  const usable = mask(1);
  const scanKnee = (intercept: number, slope: number, offCurve: Uint8Array): number => {
    if (!leaveOutControlSupply) return 0;
    for (let i = 0; i < n; i++) {
      lnRelative[i] = lnV[i]! - (intercept + slope * t[i]!);
      logWeights[i] = (v[i]! * v[i]!) / variance[i]!;
      usable[i] = offCurve[i] ? 0 : 1;
    }
    return findControlSupplyKnee(t, lnRelative, logWeights, v, usable);
  };

  /**
   * Marks readings off the curve. A reading must be far off in the robust screening (volts and log
   * volts both), and, once a least-squares fit exists, also fail a Bonferroni-corrected test of its
   * externally studentised residual (Student's t): a robust scale estimated from a dozen readings
   * can come out low by chance, and the t test keeps honest readings in when it does.
   */
  const markOffCurve = (
    from: number,
    against: ExponentialFit | null,
    used: Uint8Array | null,
  ): Uint8Array => {
    const marks = new Uint8Array(n);
    if (!leaveOutOffCurve) return marks;
    let marked = 0;
    for (let i = from; i < n; i++) {
      if (!(Math.abs(zVolts[i]!) > OFF_CURVE_Z && Math.abs(zLog[i]!) > OFF_CURVE_Z)) continue;
      if (against && used && !failsStudentisedTest(i, against, used[i] === 1, n - from)) continue;
      marks[i] = 1;
      marked++;
    }
    // With fewer than 5 readings left there is too little to tell a slip from the curve itself.
    return n - from - marked < MIN_POINTS_FOR_REJECTION ? new Uint8Array(n) : marks;
  };
  const failsStudentisedTest = (
    i: number,
    against: ExponentialFit,
    inFit: boolean,
    candidates: number,
  ): boolean => {
    const m = against.count;
    const e = Math.exp(-against.ratePerSecond * t[i]!);
    const weight = 1 / variance[i]!;
    const leverage = weight * quadraticForm(against, e, -against.v0Volts * t[i]! * e);
    // Residual in units of the reading's own scatter (the fit is weighted by 1/σ²).
    const residual = (v[i]! - against.v0Volts * e) * Math.sqrt(weight);
    let statistic: number;
    let degreesOfFreedom: number;
    if (inFit) {
      degreesOfFreedom = m - 3;
      const oneMinusH = 1 - leverage;
      if (degreesOfFreedom < 1 || !(oneMinusH > 1e-12)) return false;
      const deletedVariance =
        (against.rssVoltsSquared - (residual * residual) / oneMinusH) / degreesOfFreedom;
      if (!(deletedVariance > 0)) return true;
      statistic = Math.abs(residual) / Math.sqrt(deletedVariance * oneMinusH);
    } else {
      degreesOfFreedom = m - 2;
      if (degreesOfFreedom < 1) return false;
      const residualVariance = against.rssVoltsSquared / degreesOfFreedom;
      if (!(residualVariance > 0)) return true;
      statistic = Math.abs(residual) / Math.sqrt(residualVariance * (1 + Math.max(leverage, 0)));
    }
    return statistic > tQuantile(1 - OFF_CURVE_ALPHA / (2 * candidates), degreesOfFreedom);
  };

  const candidatesFrom = (from: number): Uint8Array => {
    const mask = new Uint8Array(n);
    mask.fill(1, from);
    return mask;
  };

  // Residuals and leverages of the readings in a fit, for the noise estimate.
  const residualsVolts = slot(10);
  const leverage = slot(11);
  const reestimateNoise = (against: ExponentialFit, used: Uint8Array): NoiseModel => {
    for (let i = 0; i < n; i++) {
      if (!used[i]) continue;
      const e = Math.exp(-against.ratePerSecond * t[i]!);
      residualsVolts[i] = v[i]! - against.v0Volts * e;
      leverage[i] = quadraticForm(against, e, -against.v0Volts * t[i]! * e) / variance[i]!;
    }
    return estimateNoiseModel(
      v,
      residualsVolts,
      leverage,
      used,
      floorAt(against.ratePerSecond),
      noise,
    );
  };

  let highestVolts = 0;
  for (let i = 0; i < n; i++) if (v[i]! > highestVolts) highestVolts = v[i]!;
  let head = scanKnee(robust.intercept, robust.slope, markOffCurve(0, null, null));
  let offCurve: Uint8Array = markOffCurve(head, null, null);
  // A first estimate of the noise from the robust line's residuals of the readings to be fitted,
  // so that the first least-squares fit is already about rightly weighted.
  {
    const first = mask(2);
    let count = 0;
    for (let i = head; i < n; i++) {
      if (offCurve[i]) continue;
      first[i] = 1;
      residualsVolts[i] = v[i]! - fitted[i]!;
      leverage[i] = 2 / (n - head);
      count++;
    }
    if (count >= 3) {
      noise = estimateNoiseModel(v, residualsVolts, leverage, first, floorAt(-robust.slope), noise);
      noiseVariances(noise, v, variance);
    }
  }

  // Fit, re-weight, re-screen against the fit, repeat until the readings used settle.
  const include = mask(3);
  let fit: ExponentialFit | null = null;
  let start: ExponentialParameters | null = null;
  const fitIncluded = (): ExponentialFit | Unusable => {
    let count = 0;
    for (let i = 0; i < n; i++) {
      include[i] = i >= head && !offCurve[i] ? 1 : 0;
      count += include[i]!;
    }
    if (count < 3) return tooFewLeft(n, head, n - head - count);
    start = start ?? fitLogLinear(t, v, variance, include);
    if (!start || !(start.ratePerSecond > 0) || !Number.isFinite(start.v0Volts)) {
      start = { v0Volts: Math.exp(robust.intercept), ratePerSecond: -robust.slope };
    }
    const next = refineExponential(t, v, start, include, variance);
    if (!(next.ratePerSecond > 0)) return noDecay();
    start = { v0Volts: next.v0Volts, ratePerSecond: next.ratePerSecond };
    return next;
  };
  // Each pass fits, re-weights by the noise the fit showed until the weights settle (iteratively
  // reweighted least squares), then re-screens against the fit; the passes end when the readings
  // used no longer change.
  let settled = false;
  for (let pass = 0; pass < MAX_PASSES && !settled; pass++) {
    for (let round = 0; round < IRLS_ROUNDS; round++) {
      const next = fitIncluded();
      if ('status' in next) return next;
      fit = next;
      const reestimated = reestimateNoise(fit, include);
      // Only the shape of the noise (how it splits between the constant and the proportional
      // part) moves the fit; a change of its level alone scales every weight alike, so the fit
      // is carried over to the new level instead of repeated.
      const moved =
        Math.abs(noiseShape(reestimated, highestVolts) - noiseShape(noise, highestVolts)) >
        NOISE_SETTLED;
      const level = noiseLevel(reestimated, highestVolts) / noiseLevel(noise, highestVolts);
      noise = reestimated;
      noiseVariances(noise, v, variance);
      if (!moved) {
        fit = atNoiseLevel(fit, level);
        break;
      }
    }
    if (!fit) return noDecay();
    for (let i = 0; i < n; i++) fitted[i] = fit.v0Volts * Math.exp(-fit.ratePerSecond * t[i]!);
    // The scatter is taken over every reading after the steep start, the off-curve ones too: the
    // median shrugs them off, and measuring it on the kept readings only would make a reading,
    // once left out, look ever further off.
    scales = residualScales(v, fitted, candidatesFrom(head));
    standardise();
    const nextHead = scanKnee(Math.log(fit.v0Volts), -fit.ratePerSecond, offCurve);
    const nextOffCurve = markOffCurve(nextHead, fit, include);
    let same = nextHead === head;
    for (let i = 0; same && i < n; i++) same = nextOffCurve[i] === offCurve[i];
    settled = same;
    head = nextHead;
    offCurve = nextOffCurve;
  }
  if (!settled || !fit) {
    // Still moving after the last pass: fit once more on the final choice of readings.
    const last = fitIncluded();
    if ('status' in last) return last;
    fit = last;
    for (let i = 0; i < n; i++) fitted[i] = fit.v0Volts * Math.exp(-fit.ratePerSecond * t[i]!);
  }
  const offCurveIndices: number[] = [];
  for (let i = head; i < n; i++) if (offCurve[i]) offCurveIndices.push(i);
  const candidates = n - head;
  if (offCurveIndices.length > Math.max(2, Math.floor(0.2 * candidates))) {
    return unusable(
      'too-many-outliers',
      `${offCurveIndices.length} of ${candidates} readings are far off a single decay curve, too many to leave out: the run does not follow one discharge. Check the readings for typing slips or repeat the run.`,
    );
  }

  return summarise({
    t,
    v,
    lnV,
    fitted,
    include,
    head,
    offCurveIndices,
    fit,
    scales,
    noise,
    resolutionVolts,
    variance,
    options,
  });
}

/** Change of the noise model's shape (see noiseShape) below which the weights count as settled. */
const NOISE_SETTLED = 0.05;
/** Most fits of one pass while the weights settle. */
const IRLS_ROUNDS = 4;

/**
 * True when the run ends lower than it starts: the median of the last three readings below the
 * median of the first three (with fewer than six readings, the last below the first), so one
 * mistyped first or last reading cannot turn a decay into "no decay".
 */
function fallsOverall(v: Float64Array): boolean {
  const n = v.length;
  if (n < 6) return v[n - 1]! < v[0]!;
  const middle = (a: number, b: number, c: number): number =>
    Math.max(Math.min(a, b), Math.min(Math.max(a, b), c));
  return middle(v[n - 3]!, v[n - 2]!, v[n - 1]!) < middle(v[0]!, v[1]!, v[2]!);
}

/** σ² at the highest reading, volts². */
function noiseLevel(model: NoiseModel, highestVolts: number): number {
  return model.aSquared + model.cSquared * highestVolts * highestVolts;
}

/** The proportional part's share of σ² at the highest reading (0 = all constant, 1 = all in proportion). */
function noiseShape(model: NoiseModel, highestVolts: number): number {
  return (model.cSquared * highestVolts * highestVolts) / noiseLevel(model, highestVolts);
}

/**
 * The same fit with every variance multiplied by `level`: the parameters stay, the weighted sum
 * of squares divides by it and the unscaled covariance multiplies by it.
 */
function atNoiseLevel(fit: ExponentialFit, level: number): ExponentialFit {
  if (!(level > 0) || !Number.isFinite(level)) return fit;
  const inverse = fit.inverseNormal;
  return {
    ...fit,
    rssVoltsSquared: fit.rssVoltsSquared / level,
    inverseNormal: {
      v0v0: inverse.v0v0 * level,
      v0Rate: inverse.v0Rate * level,
      rateRate: inverse.rateRate * level,
    },
  };
}

/** Jᵢᵀ (JᵀWJ)⁻¹ Jᵢ for a reading with derivatives (∂/∂V0, ∂/∂rate) = (e, j2). */
function quadraticForm(fit: ExponentialFit, e: number, j2: number): number {
  const inv = fit.inverseNormal;
  return e * e * inv.v0v0 + 2 * e * j2 * inv.v0Rate + j2 * j2 * inv.rateRate;
}

function validateNoiseInput(input: ReadingNoiseInput | undefined): ReadingNoiseInput {
  if (input === undefined) return {};
  const fields = ['volts', 'fractionOfReading', 'timingJitterSeconds', 'resolutionVolts'] as const;
  const issues: InputIssue[] = [];
  for (const field of fields) {
    const value = input[field];
    if (value !== undefined && !(typeof value === 'number' && Number.isFinite(value) && value >= 0))
      issues.push({ path: `noise.${field}`, message: 'must be a number at or above zero' });
  }
  if (issues.length > 0) {
    throw new EngineInputError(
      'invalid-option',
      `The readings' noise must be given as numbers at or above zero (${issues.map((issue) => issue.path).join(', ')}).`,
      issues,
    );
  }
  return input;
}

function tooFewLeft(total: number, head: number, offCurve: number): Unusable {
  const parts: string[] = [];
  if (head > 0) parts.push(`${head} in the control-supply phase at the start`);
  if (offCurve > 0) parts.push(`${offCurve} off the curve`);
  return unusable(
    'too-few-points',
    `Of ${total} readings, fewer than 3 remain for the fit after leaving out ${parts.join(' and ') || 'none'}. Record more readings after the steep start, two to three time constants long.`,
  );
}

interface SettledFit {
  t: Float64Array;
  v: Float64Array;
  lnV: Float64Array;
  fitted: Float64Array;
  include: Uint8Array;
  head: number;
  offCurveIndices: number[];
  fit: ExponentialFit;
  scales: ResidualScales;
  noise: NoiseModel;
  resolutionVolts: number;
  variance: Float64Array;
  options: DecayFitOptions;
}

function summarise(settled: SettledFit): DecayFitResult {
  const { t, v, fitted, include, head, offCurveIndices, fit, scales, noise, options } = settled;
  const n = t.length;
  const count = fit.count;
  // The fit is weighted by 1/σ²: s² = Σ rᵢ²/σᵢ² / (n − 2 − k) is about 1 when the noise model is
  // right, and scales the covariance when it is not. The noise model's level is s² itself; its
  // shape (how the scatter splits between the constant and the proportional part, k = 1) was
  // estimated from the same residuals, so it takes a degree of freedom too, as the two curve
  // parameters do.
  const noiseParts = count >= MIN_READINGS_FOR_TWO_PARTS ? 1 : 0;
  const degreesOfFreedom = Math.max(count - 2 - noiseParts, 1);
  const rate = fit.ratePerSecond;
  const tauSeconds = 1 / rate;
  const scaleSquared = fit.rssVoltsSquared / degreesOfFreedom;
  const rateStdError = Math.sqrt(scaleSquared * fit.inverseNormal.rateRate);
  const v0StdErrorVolts = Math.sqrt(scaleSquared * Math.max(fit.inverseNormal.v0v0, 0));
  const q = tQuantile(0.975, degreesOfFreedom);
  const rateLow = rate - q * rateStdError;
  const rateHigh = rate + q * rateStdError;
  const tauStdErrorSeconds = rateStdError / (rate * rate);

  let firstUsed = -1;
  let lastUsed = -1;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    if (!include[i]) continue;
    if (firstUsed < 0) firstUsed = i;
    lastUsed = i;
    sum += v[i]!;
  }
  const mean = sum / count;
  let totalSquares = 0;
  let rss = 0;
  for (let i = 0; i < n; i++) {
    if (!include[i]) continue;
    totalSquares += (v[i]! - mean) ** 2;
    rss += (v[i]! - fitted[i]!) ** 2;
  }
  const r2 = totalSquares > 0 ? 1 - rss / totalSquares : 0;
  const rmseVolts = Math.sqrt(rss / count);
  const spanTimeConstants = (t[lastUsed]! - t[firstUsed]!) / tauSeconds;

  if (!(rateLow > 0) || !Number.isFinite(rateStdError)) {
    return unusable(
      'poor-fit',
      `τ cannot be pinned down: the readings are consistent with no decay at all within their scatter (best estimate ${formatSeconds(tauSeconds)}). Record the decay for longer, at least one to two time constants.`,
    );
  }
  const tauCi95: [number, number] = [1 / rateHigh, 1 / rateLow];
  if (head > 0) widenForKnee(settled, firstUsed, degreesOfFreedom, tauCi95);
  const relativeWidth = (tauCi95[1] - tauCi95[0]) / tauSeconds;
  if (relativeWidth > MAX_RELATIVE_CI_WIDTH) {
    return unusable(
      'poor-fit',
      `The fit is too loose to trust: τ lies somewhere between ${formatSeconds(tauCi95[0])} and ${formatSeconds(tauCi95[1])} (95 %). Record more readings, over two to three time constants.`,
    );
  }
  if (r2 < MIN_R2) {
    return unusable(
      'poor-fit',
      `The readings do not follow an exponential decay closely enough (R² = ${formatNumber(r2, 3)}, below ${MIN_R2}). Check the readings and the meter, or repeat the run.`,
    );
  }
  if (spanTimeConstants < MIN_SPAN_TIME_CONSTANTS) {
    const fall = 1 - Math.exp(-spanTimeConstants);
    return unusable(
      'poor-fit',
      `The readings cover too little of the decay to judge τ: the voltage fell only ${formatNumber(fall * 100, 2)} % over the run (${formatNumber(spanTimeConstants, 2)} time constants; at least ${MIN_SPAN_TIME_CONSTANTS} are needed, one to three are best). Keep recording until the voltage has fallen by at least half.`,
    );
  }
  if (!Number.isFinite(fit.v0Volts) || fit.v0Volts > 1e6) {
    return unusable(
      'poor-fit',
      `Extending the decay back to t = 0 gives ${formatNumber(fit.v0Volts, 3)} V: the times probably do not count from the moment of isolation.`,
    );
  }

  const warnings: string[] = [];
  const excluded: ExcludedReading[] = [];
  let controlSupply: ControlSupplyPhase | null = null;
  if (head > 0) {
    // The lack-of-fit test of the phase takes the noise model at its word unless the RC part
    // showed more scatter than it (never less: exact readings would make any rounding a misfit).
    const phase = fitControlSupplyPhase(t, v, head, fit, {
      ...noise,
      scale: Math.max(scaleSquared, 1),
    });
    if (phase.explained === 'no' && head >= count) {
      return unusable(
        'poor-fit',
        `The first ${head} readings fell faster than an RC decay, but not as a drive's control supply drawing constant power would make them, and they outnumber the ${count} readings after them: the start of this run is not understood, so no τ is given. Check that the drive was isolated and nothing else was loading the bus, then repeat the run with readings over two to three time constants.`,
      );
    }
    const ohms = options.effectiveOhms;
    const powerWatts =
      phase.explained === 'yes' && ohms && ohms > 0 ? phase.powerTimesOhms / ohms : null;
    controlSupply = {
      kneeSeconds: t[firstUsed]!,
      kneeVolts: v[firstUsed]!,
      readingsBefore: head,
      powerWatts,
      dropoutVolts: phase.explained === 'yes' ? phase.dropoutVolts : null,
      dropoutSeconds: phase.explained === 'yes' ? phase.dropoutSeconds : null,
      explained: phase.explained,
    };
    for (let i = 0; i < head; i++) {
      excluded.push({
        index: i,
        tSeconds: t[i]!,
        volts: v[i]!,
        code: 'control-supply-phase',
        reason:
          "Before the knee: the drive's control supply was still drawing power, so the voltage fell faster than an RC decay.",
        expectedVolts: fitted[i]!,
      });
    }
    const drew =
      powerWatts !== null ? ` The control supply drew about ${formatNumber(powerWatts, 2)} W` : '';
    const dropped =
      controlSupply.dropoutVolts !== null
        ? `${drew ? ' and' : ' The control supply'} dropped out near ${formatVolts(controlSupply.dropoutVolts)}`
        : '';
    const modelled = drew || dropped ? `${drew}${dropped}.` : '';
    warnings.push(
      `The first ${head === 1 ? 'reading' : `${head} readings`} fell faster than an RC decay while the drive's control supply was running and ${head === 1 ? 'was' : 'were'} left out; the decay is plain RC from ${formatVolts(v[firstUsed]!)} at t = ${formatNumber(t[firstUsed]!, 4)} s.${modelled}`,
    );
    if (phase.explained === 'no') {
      warnings.push(
        `The ${head === 1 ? 'reading' : `${head} readings`} before the knee do not follow a control supply drawing constant power either: the start of this run is not understood, and τ rests on the ${count} readings after it. Check that the drive was isolated and nothing else was loading the bus, or repeat the run.`,
      );
    }
    if (head >= count) {
      warnings.push(
        `More readings were left out at the start (${head}) than were used (${count}): check that the drive was isolated when the recording began.`,
      );
    }
  }
  const named = nameOffCurveReadings(t, v, fitted, offCurveIndices, scales);
  for (const reading of named) {
    excluded.push({
      index: reading.index,
      tSeconds: t[reading.index]!,
      volts: v[reading.index]!,
      code: reading.code,
      reason: reading.reason,
      expectedVolts: fitted[reading.index]!,
    });
  }
  if (named.length > 0 && named.length <= 5) {
    for (const reading of named) warnings.push(`Left out: ${reading.reason}`);
  } else if (named.length > 5) {
    warnings.push(
      `${named.length} readings far off the decay curve were left out (see the excluded readings).`,
    );
  }
  if (count < 5) {
    warnings.push(
      `Only ${count} readings were used; 5 or more over two to three time constants give a firmer τ.`,
    );
  }
  if (spanTimeConstants < 0.5) {
    warnings.push(
      `The readings used cover only ${formatNumber(spanTimeConstants, 2)} time constants; τ rests on a short stretch of the curve (one to three time constants is best).`,
    );
  }
  if (relativeWidth > 2 * LOOSE_HALF_WIDTH) {
    warnings.push(
      `τ is known only roughly: its 95 % interval runs from ${formatSeconds(tauCi95[0])} to ${formatSeconds(tauCi95[1])}. More readings over two to three time constants narrow it.`,
    );
  }
  const bend = curvatureOfLogVolts(t, v, settled.lnV, include, settled.variance);
  if (bend !== null && Math.abs(bend) > tQuantile(1 - CURVATURE_ALPHA / 2, count - 3)) {
    warnings.push(
      `The readings bend away from a single exponential (ln V is ${bend < 0 ? 'steeper at the end than at the start' : 'flatter at the end than at the start'}, t = ${formatNumber(bend, 2)}): τ may be off by more than its interval says. ${bend < 0 ? 'A control supply that was still drawing power early in the run can do this; start the readings later or record more of them at the start.' : 'Check for a meter offset or a load still connected.'}`,
    );
  }
  const runs = residualRuns(v, fitted, include);
  if (runs !== null && runs.z < -3.3) {
    warnings.push(
      `The residuals are systematic (${runs.runs} runs of one sign where about ${formatNumber(runs.expected, 2)} are expected): the decay is not quite a single exponential. Check for a meter offset, a load still connected, or a control supply that dropped out gradually.`,
    );
  }

  const residuals: DecayResidual[] = [];
  for (let i = 0; i < n; i++) {
    if (include[i])
      residuals.push({ index: i, tSeconds: t[i]!, residualVolts: v[i]! - fitted[i]! });
  }
  excluded.sort((a, b) => a.index - b.index);
  return {
    status: 'ok',
    tauSeconds,
    tauStdErrorSeconds,
    tauCi95,
    v0Volts: fit.v0Volts,
    v0StdErrorVolts,
    rmseVolts,
    r2,
    pointsUsed: count,
    pointsTotal: n,
    excluded,
    residuals,
    controlSupply,
    spanTimeConstants,
    noise: {
      volts: Math.sqrt(noise.aSquared),
      fractionOfReading: Math.sqrt(noise.cSquared),
      resolutionVolts: settled.resolutionVolts,
    },
    warnings,
  };
}

/**
 * Where exactly the knee lies is uncertain by about a reading: a last reading of the control-supply
 * phase that sat too close to the RC curve to be told from it stays in the fit. So the 95 %
 * interval of τ after a control-supply phase also covers the interval of the fit without the first
 * reading after the knee (their union).
 */
function widenForKnee(
  settled: SettledFit,
  firstUsed: number,
  degreesOfFreedom: number,
  tauCi95: [number, number],
): void {
  const { t, v, include, fit, variance } = settled;
  // With many readings (a logger) one reading cannot move τ by its interval, and the knee is
  // found to within a sample: no second fit is needed.
  if (degreesOfFreedom < 2 || fit.count > KNEE_WIDENING_MAX_READINGS) return;
  const without = Uint8Array.from(include);
  without[firstUsed] = 0;
  const other = refineExponential(t, v, fit, without, variance);
  if (!(other.ratePerSecond > 0)) return;
  const scaleSquared = other.rssVoltsSquared / (degreesOfFreedom - 1);
  const q = tQuantile(0.975, degreesOfFreedom - 1);
  const spread = q * Math.sqrt(scaleSquared * other.inverseNormal.rateRate);
  const rateHigh = other.ratePerSecond + spread;
  const rateLow = other.ratePerSecond - spread;
  if (!(rateLow > 0) || !Number.isFinite(rateHigh)) return;
  tauCi95[0] = Math.min(tauCi95[0], 1 / rateHigh);
  tauCi95[1] = Math.max(tauCi95[1], 1 / rateLow);
}

/** Above this many readings in the fit the interval is not widened for the knee's position. */
const KNEE_WIDENING_MAX_READINGS = 200;

/** Two-sided false-alarm rate of the test that ln V bends. */
const CURVATURE_ALPHA = 0.001;

/**
 * Student's t of the quadratic term when ln V of the readings used is fitted by a parabola in t
 * (weights Vᵢ²/σᵢ², times centred and scaled, its own residual scale on n − 3 degrees of
 * freedom): far from zero when the decay is not one exponential. Null below 6 readings.
 */
function curvatureOfLogVolts(
  t: Float64Array,
  v: Float64Array,
  lnV: Float64Array,
  include: Uint8Array,
  variance: Float64Array,
): number | null {
  let s0 = 0;
  let st = 0;
  let count = 0;
  for (let i = 0; i < t.length; i++) {
    if (!include[i]) continue;
    const w = (v[i]! * v[i]!) / variance[i]!;
    s0 += w;
    st += w * t[i]!;
    count++;
  }
  if (count < 6) return null;
  const centre = st / s0;
  let spread = 0;
  for (let i = 0; i < t.length; i++)
    if (include[i]) spread = Math.max(spread, Math.abs(t[i]! - centre));
  if (!(spread > 0)) return null;
  // Normal equations of y = b0 + b1·x + b2·x² with x = (t − centre)/spread.
  const m = new Float64Array(9);
  const r = new Float64Array(3);
  let syy = 0;
  for (let i = 0; i < t.length; i++) {
    if (!include[i]) continue;
    const w = (v[i]! * v[i]!) / variance[i]!;
    const x = (t[i]! - centre) / spread;
    const y = lnV[i]!;
    const x2 = x * x;
    r[0] = r[0]! + w * y;
    r[1] = r[1]! + w * x * y;
    r[2] = r[2]! + w * x2 * y;
    m[0] = m[0]! + w;
    m[1] = m[1]! + w * x;
    m[2] = m[2]! + w * x2;
    m[4] = m[4]! + w * x2;
    m[5] = m[5]! + w * x2 * x;
    m[8] = m[8]! + w * x2 * x2;
    syy += w * y * y;
  }
  m[3] = m[1]!;
  m[6] = m[2]!;
  m[7] = m[5]!;
  const inverse = invert3(m);
  if (!inverse) return null;
  let fittedSquares = 0;
  let quadratic = 0;
  for (let a = 0; a < 3; a++) {
    const beta =
      inverse[3 * a]! * r[0]! + inverse[3 * a + 1]! * r[1]! + inverse[3 * a + 2]! * r[2]!;
    fittedSquares += beta * r[a]!;
    if (a === 2) quadratic = beta;
  }
  const rss = Math.max(syy - fittedSquares, 0);

  const scaleSquared = rss / (count - 3);
  const standardError = Math.sqrt(scaleSquared * inverse[8]!);
  if (!(standardError > 0)) return null;
  return quadratic / standardError;
}

/** Inverse of a symmetric 3 × 3 matrix (row-major), or null when singular. */
function invert3(m: Float64Array): Float64Array | null {
  const [a, b, c, d, e, f, g, h, k] = m as unknown as number[];
  const c00 = e! * k! - f! * h!;
  const c01 = -(d! * k! - f! * g!);
  const c02 = d! * h! - e! * g!;
  const det = a! * c00 + b! * c01 + c! * c02;
  if (!(Math.abs(det) > 1e-300)) return null;
  const out = new Float64Array(9);
  out[0] = c00 / det;
  out[1] = -(b! * k! - c! * h!) / det;
  out[2] = (b! * f! - c! * e!) / det;
  out[3] = c01 / det;
  out[4] = (a! * k! - c! * g!) / det;
  out[5] = -(a! * f! - c! * d!) / det;
  out[6] = c02 / det;
  out[7] = -(a! * h! - b! * g!) / det;
  out[8] = (a! * e! - b! * d!) / det;
  return out;
}

/** Wald–Wolfowitz runs test on the signs of the residuals (null below 10 readings). */
function residualRuns(
  v: Float64Array,
  fitted: Float64Array,
  include: Uint8Array,
): { runs: number; expected: number; z: number } | null {
  let positives = 0;
  let negatives = 0;
  let runs = 0;
  let previous = 0;
  for (let i = 0; i < v.length; i++) {
    if (!include[i]) continue;
    const residual = v[i]! - fitted[i]!;
    if (residual === 0) continue;
    const sign = residual > 0 ? 1 : -1;
    if (sign > 0) positives++;
    else negatives++;
    if (sign !== previous) runs++;
    previous = sign;
  }
  const total = positives + negatives;
  if (total < 10 || positives === 0 || negatives === 0) return null;
  const expected = (2 * positives * negatives) / total + 1;
  const variance = ((expected - 1) * (expected - 2)) / (total - 1);
  if (!(variance > 0)) return null;
  return { runs, expected, z: (runs - expected) / Math.sqrt(variance) };
}
