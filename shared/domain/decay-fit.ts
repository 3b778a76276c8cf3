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
import { countSteepStart, estimateControlSupplyWatts } from './control-supply';
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
  /** Estimated constant power drawn by the control supply, watts; null when not estimable. */
  powerWatts: number | null;
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
  /** Plain-words cautions about the fit (short span, few points, systematic residuals, ...). */
  warnings: string[];
}

/** {@link fitDecay}'s answer: a fit, or a reason why there is none. */
export type DecayFitResult = DecayFit | Unusable;

/** Scatter-widths above the RC line that start a control-supply phase, and that extend it. */
const STEEP_START_Z = 4;
const STEEP_EXTEND_Z = 3;
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
  const leaveOutControlSupply = options.leaveOutControlSupply ?? true;
  const leaveOutOffCurve = options.leaveOutOffCurve ?? true;
  const n = samples.length;
  if (n < 3) {
    return unusable(
      'too-few-points',
      `Only ${n} reading${n === 1 ? '' : 's'}; at least 3 are needed to fit a decay (5 or more over two to three time constants is better).`,
    );
  }
  const t = new Float64Array(n);
  const v = new Float64Array(n);
  const lnV = new Float64Array(n);
  const weights = new Float64Array(n);
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
  if (!robust || !(robust.slope < 0) || !(v[n - 1]! < v[0]!)) return noDecay();

  // Screening against the robust line.
  const fitted = new Float64Array(n);
  for (let i = 0; i < n; i++) fitted[i] = Math.exp(robust.intercept + robust.slope * t[i]!);
  const all = new Uint8Array(n).fill(1);
  let scales = residualScales(v, fitted, all);
  const zVolts = new Float64Array(n);
  const zLog = new Float64Array(n);
  const ratio = new Float64Array(n);
  const standardise = (): void => {
    for (let i = 0; i < n; i++) {
      zVolts[i] = (v[i]! - fitted[i]!) / scales.volts;
      zLog[i] = Math.log(v[i]! / fitted[i]!) / scales.log;
      ratio[i] = v[i]! / fitted[i]!;
    }
  };
  standardise();
  let head = leaveOutControlSupply ? countSteepStart({ zVolts, zLog, ratio }, STEEP_START_Z, 3) : 0;
  let offCurve: Uint8Array = new Uint8Array(n);
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
    const j1 = e;
    const j2 = -against.v0Volts * t[i]! * e;
    const inv = against.inverseNormal;
    const leverage = j1 * j1 * inv.v0v0 + 2 * j1 * j2 * inv.v0Rate + j2 * j2 * inv.rateRate;
    const residual = v[i]! - against.v0Volts * e;
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
      const variance = against.rssVoltsSquared / degreesOfFreedom;
      if (!(variance > 0)) return true;
      statistic = Math.abs(residual) / Math.sqrt(variance * (1 + Math.max(leverage, 0)));
    }
    return statistic > tQuantile(1 - OFF_CURVE_ALPHA / (2 * candidates), degreesOfFreedom);
  };
  offCurve = markOffCurve(head, null, null);

  const candidatesFrom = (from: number): Uint8Array => {
    const mask = new Uint8Array(n);
    mask.fill(1, from);
    return mask;
  };

  // Fit, re-screen against the fit, repeat until the readings used settle.
  const include = new Uint8Array(n);
  let fit: ExponentialFit | null = null;
  let start: ExponentialParameters | null = null;
  for (let pass = 0; pass < MAX_PASSES; pass++) {
    let count = 0;
    for (let i = 0; i < n; i++) {
      include[i] = i >= head && !offCurve[i] ? 1 : 0;
      count += include[i]!;
    }
    if (count < 3) return tooFewLeft(n, head, n - head - count);
    start = start ?? fitLogLinear(t, v, 'volts-squared', include);
    if (!start || !(start.ratePerSecond > 0) || !Number.isFinite(start.v0Volts)) {
      start = { v0Volts: Math.exp(robust.intercept), ratePerSecond: -robust.slope };
    }
    fit = refineExponential(t, v, start, include);
    if (!(fit.ratePerSecond > 0)) return noDecay();
    start = { v0Volts: fit.v0Volts, ratePerSecond: fit.ratePerSecond };
    for (let i = 0; i < n; i++) fitted[i] = fit.v0Volts * Math.exp(-fit.ratePerSecond * t[i]!);
    // The scatter is taken over every reading after the steep start, the off-curve ones too: the
    // median shrugs them off, and measuring it on the kept readings only would make a reading,
    // once left out, look ever further off.
    scales = residualScales(v, fitted, candidatesFrom(head));
    standardise();
    const nextHead = !leaveOutControlSupply
      ? 0
      : countSteepStart(
          { zVolts, zLog, ratio },
          head > 0 ? STEEP_EXTEND_Z : STEEP_START_Z,
          3,
          head,
        );
    const nextOffCurve = markOffCurve(nextHead, fit, include);
    let same = nextHead === head;
    for (let i = 0; same && i < n; i++) same = nextOffCurve[i] === offCurve[i];
    if (same) break;
    head = nextHead;
    offCurve = nextOffCurve;
    if (pass === MAX_PASSES - 1) {
      // Still moving after the last pass: fit once more on the final choice of readings.
      let left = 0;
      for (let i = 0; i < n; i++) {
        include[i] = i >= head && !offCurve[i] ? 1 : 0;
        left += include[i]!;
      }
      if (left < 3) return tooFewLeft(n, head, n - head - left);
      fit = refineExponential(t, v, start, include);
      if (!(fit.ratePerSecond > 0)) return noDecay();
      for (let i = 0; i < n; i++) fitted[i] = fit.v0Volts * Math.exp(-fit.ratePerSecond * t[i]!);
      scales = residualScales(v, fitted, candidatesFrom(head));
    }
  }
  if (!fit) return noDecay();

  const offCurveIndices: number[] = [];
  for (let i = head; i < n; i++) if (offCurve[i]) offCurveIndices.push(i);
  const candidates = n - head;
  if (offCurveIndices.length > Math.max(2, Math.floor(0.2 * candidates))) {
    return unusable(
      'too-many-outliers',
      `${offCurveIndices.length} of ${candidates} readings are far off a single decay curve, too many to leave out: the run does not follow one discharge. Check the readings for typing slips or repeat the run.`,
    );
  }

  return summarise(t, v, fitted, include, head, offCurveIndices, fit, scales, options);
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

function summarise(
  t: Float64Array,
  v: Float64Array,
  fitted: Float64Array,
  include: Uint8Array,
  head: number,
  offCurveIndices: number[],
  fit: ExponentialFit,
  scales: ResidualScales,
  options: DecayFitOptions,
): DecayFitResult {
  const n = t.length;
  const count = fit.count;
  const degreesOfFreedom = count - 2;
  const rate = fit.ratePerSecond;
  const tauSeconds = 1 / rate;
  const variance = fit.rssVoltsSquared / degreesOfFreedom;
  const rateStdError = Math.sqrt(variance * fit.inverseNormal.rateRate);
  const v0StdErrorVolts = Math.sqrt(variance * Math.max(fit.inverseNormal.v0v0, 0));
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
  for (let i = 0; i < n; i++) if (include[i]) totalSquares += (v[i]! - mean) ** 2;
  const r2 = totalSquares > 0 ? 1 - fit.rssVoltsSquared / totalSquares : 0;
  const rmseVolts = Math.sqrt(fit.rssVoltsSquared / count);
  const spanTimeConstants = (t[lastUsed]! - t[firstUsed]!) / tauSeconds;

  if (!(rateLow > 0) || !Number.isFinite(rateStdError)) {
    return unusable(
      'poor-fit',
      `τ cannot be pinned down: the readings are consistent with no decay at all within their scatter (best estimate ${formatSeconds(tauSeconds)}). Record the decay for longer, at least one to two time constants.`,
    );
  }
  const tauCi95: [number, number] = [1 / rateHigh, 1 / rateLow];
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
    const headT = t.subarray(0, head);
    const headV = v.subarray(0, head);
    const powerWatts = options.effectiveOhms
      ? estimateControlSupplyWatts(headT, headV, tauSeconds, options.effectiveOhms)
      : null;
    controlSupply = {
      kneeSeconds: t[firstUsed]!,
      kneeVolts: v[firstUsed]!,
      readingsBefore: head,
      powerWatts,
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
    const power =
      powerWatts !== null ? ` The control supply drew about ${formatNumber(powerWatts, 2)} W.` : '';
    warnings.push(
      `The first ${head === 1 ? 'reading' : `${head} readings`} fell faster than an RC decay while the drive's control supply was running and ${head === 1 ? 'was' : 'were'} left out; the decay is plain RC from ${formatVolts(v[firstUsed]!)} at t = ${formatNumber(t[firstUsed]!, 4)} s.${power}`,
    );
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
    warnings,
  };
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
