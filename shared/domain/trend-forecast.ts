/**
 * Trend and forecast: from a bank's history of capacitance ratios to the date the end-of-life
 * limit is crossed, its 90 % interval, the RUL and the latest date for the next visit.
 *
 * Two models are fitted by weighted least squares on time in years since the first run:
 * - linear: r(x) = a + b·x
 * - accelerating: r(x) = a + b·x + c·x² with c < 0 (the decline speeds up, as electrolyte loss
 *   does near end of life); a fit with c ≥ 0 is not an acceleration and is set aside.
 * The choice is by AICc (Akaike's criterion with the small-sample correction, the residual
 * variance counted as a parameter): the accelerating model is taken only when its AICc is lower
 * than the linear model's by more than 2, the usual margin for "clearly better" (otherwise the
 * simpler model stands). AICc needs 6 runs for the accelerating model; with fewer, linear is
 * chosen, though the quadratic is still fitted from 4 runs on 3 dates to bound the interval.
 *
 * The 90 % interval of a model's end-of-life date inverts the 90 % confidence band of its
 * curve: the early bound is the first day the band's lower edge reaches the limit, the late bound
 * the first day its upper edge does (Student's t, n − p degrees of freedom). A bound that is not
 * reached within the horizon is null.
 *
 * Model uncertainty: yearly runs with a percent or two of scatter can seldom tell a straight
 * decline from one that speeds up until late in life, and picking the line alone made the
 * interval miss accelerating losses most of the time. So unless the quadratic's own 90 %
 * interval puts its bend firmly upwards (acceleration ruled out), the forecast's interval is the
 * union of the plausible models on the early side: its early bound, reported as
 * `earliestEndOfLifeOn`, is the earlier of the two models' early bounds, and a note says that
 * acceleration cannot be ruled out. The late bound stays the chosen model's (a decline that
 * slows down is not an ageing to plan for). The next visit is planned before that earliest date.
 */

import { notEnoughData, EngineInputError, type NotEnoughData } from './errors';
import { DAYS_PER_YEAR, dayNumberFromIsoDate, isoDateFromDayNumber } from './calendar-dates';
import { tQuantile } from './student-t';
import { formatNumber } from './format';
import {
  DEFAULT_INSPECTION_INTERVAL_DAYS,
  NEAR_END_OF_LIFE_INTERVAL_DAYS,
} from '../constants/health';

/** One judged decay run in a bank's history. */
export interface RatioHistoryPoint {
  /** Date of the run, "YYYY-MM-DD". */
  measuredOn: string;
  /** Capacitance at 20 °C divided by the baseline capacitance (plain fraction, e.g. 0.93). */
  ratio: number;
  /** Standard error of the ratio (same units); when every point has one, the fit is weighted. */
  ratioStdError?: number;
}

/** The degradation models. */
export type TrendModelName = 'linear' | 'accelerating';

/** One fitted model. */
export interface TrendModelFit {
  model: TrendModelName;
  /** Coefficients [a, b] or [a, b, c] of r(x), x in years since the first run. */
  coefficients: number[];
  /** AICc, or null when there are too few runs to compute it. */
  aicc: number | null;
  /** Root mean square of the (unweighted) residuals, ratio units. */
  rmse: number;
  /** False when the model was set aside (e.g. a quadratic that bends upwards). */
  usable: boolean;
  /** This model's own crossing of the limit; null when not within the horizon. */
  endOfLifeOn: string | null;
  /** This model's own 90 % interval of the crossing, [early, late]. */
  interval90: [string | null, string | null];
}

/** Inputs of {@link forecastEndOfLife}. */
export interface EndOfLifeForecastInput {
  /** The bank's judged runs, any order; at least 3 spanning 30 days or more. */
  history: readonly RatioHistoryPoint[];
  /** The design's end-of-life ratio, e.g. 0.8. */
  endOfLifeRatio: number;
  /** The design's watch ratio, e.g. 0.9; below it visits come every `nearEndIntervalDays`. */
  watchRatio?: number;
  /** The day the forecast is made, "YYYY-MM-DD" (no hidden clock). */
  asOfOn: string;
  /** The design's standard inspection interval, days (default 365). */
  standardIntervalDays?: number;
  /** Interval once on watch, days (default 182). */
  nearEndIntervalDays?: number;
  /** How far ahead to look for the crossing, years (default 30). */
  horizonYears?: number;
}

/** A forecast. Dates are "YYYY-MM-DD"; all numbers finite. */
export interface EndOfLifeForecast {
  status: 'ok';
  /** The model chosen. */
  model: TrendModelName;
  /** The choice in plain words, with the AICc values. */
  criterion: string;
  /** Every model fitted. */
  models: TrendModelFit[];
  /** The chosen curve's ratio on `asOfOn`. */
  ratioNow: number;
  /** The chosen curve's slope on `asOfOn`, ratio per year (negative = declining). */
  ratioPerYearNow: number;
  /** Forecast date of the end-of-life crossing; null when not within the horizon. */
  endOfLifeOn: string | null;
  /**
   * 90 % interval of the crossing date, [early, late]; a bound beyond the horizon is null. It
   * includes model uncertainty: unless acceleration is ruled out, its early bound is the earlier
   * of the linear and the accelerating fit's.
   */
  interval90: [string | null, string | null];
  /**
   * The earliest plausible end-of-life date (the interval's early bound, acceleration included),
   * always given beside the forecast date; null only when not even that falls within the horizon.
   */
  earliestEndOfLifeOn: string | null;
  /** True when the runs cannot rule out a decline that speeds up (a note then says so). */
  accelerationPlausible: boolean;
  /** Remaining useful life from `asOfOn`, days (0 once reached); null when no crossing is forecast. */
  rulDays: number | null;
  /** True when the forecast crossing is on or before `asOfOn`. */
  endOfLifeReached: boolean;
  /** Latest recommended date for the next visit. */
  nextVisitBy: string;
  /** Why that date, in plain words. */
  nextVisitReason: string;
  /** True when `nextVisitBy` is before `asOfOn`: the visit is overdue. */
  nextVisitOverdue: boolean;
  /** Plain-words notes (weighting, horizon, extrapolation). */
  notes: string[];
}

interface WeightedFit {
  coefficients: number[];
  covariance: number[][];
  rssWeighted: number;
  rmse: number;
  degreesOfFreedom: number;
}

/**
 * Fits the trend models to a ratio history and forecasts the end-of-life date.
 *
 * @param input - see {@link EndOfLifeForecastInput}
 * @returns the forecast, or {@link NotEnoughData} with fewer than 3 runs or under 30 days of history
 * @throws EngineInputError for bad dates, ratios or limits
 * @example
 * forecastEndOfLife({
 *   history: [
 *     { measuredOn: '2016-01-10', ratio: 1.0 }, { measuredOn: '2018-01-10', ratio: 0.96 },
 *     { measuredOn: '2020-01-10', ratio: 0.92 }, { measuredOn: '2022-01-10', ratio: 0.88 },
 *   ],
 *   endOfLifeRatio: 0.8, asOfOn: '2022-02-01',
 * }) // { model: 'linear', endOfLifeOn: '2026-01-…', rulDays: ≈1440, ... }
 */
export function forecastEndOfLife(
  input: EndOfLifeForecastInput,
): EndOfLifeForecast | NotEnoughData {
  const limit = input.endOfLifeRatio;
  if (!(limit > 0 && limit < 5)) {
    throw new EngineInputError(
      'invalid-ratio',
      `The end-of-life ratio must be a fraction such as 0.8, got ${String(limit)}.`,
      [{ path: 'endOfLifeRatio', message: 'not a ratio' }],
    );
  }
  const watchRatio = input.watchRatio;
  if (watchRatio !== undefined && !(watchRatio > 0 && watchRatio < 5)) {
    throw new EngineInputError(
      'invalid-ratio',
      `The watch ratio must be a fraction such as 0.9, got ${String(watchRatio)}.`,
      [{ path: 'watchRatio', message: 'not a ratio' }],
    );
  }
  const standardIntervalDays = positiveOption(
    input.standardIntervalDays,
    DEFAULT_INSPECTION_INTERVAL_DAYS,
    'standardIntervalDays',
  );
  const nearEndIntervalDays = positiveOption(
    input.nearEndIntervalDays,
    NEAR_END_OF_LIFE_INTERVAL_DAYS,
    'nearEndIntervalDays',
  );
  const horizonYears = positiveOption(input.horizonYears, 30, 'horizonYears');
  const asOfDay = dayNumberFromIsoDate(input.asOfOn, 'asOfOn');

  const points = input.history.map((point, index) => {
    const day = dayNumberFromIsoDate(point.measuredOn, `history.${index}.measuredOn`);
    if (typeof point.ratio !== 'number' || !(point.ratio > 0 && point.ratio < 5)) {
      throw new EngineInputError(
        'invalid-ratio',
        `history.${index}.ratio: ${String(point.ratio)} is not a capacitance ratio.`,
        [{ path: `history.${index}.ratio`, message: 'not a ratio' }],
      );
    }
    const se = point.ratioStdError;
    if (se !== undefined && !(typeof se === 'number' && se > 0 && Number.isFinite(se))) {
      throw new EngineInputError(
        'invalid-ratio',
        `history.${index}.ratioStdError: ${String(se)} is not a positive standard error.`,
        [{ path: `history.${index}.ratioStdError`, message: 'not a positive number' }],
      );
    }
    return { day, ratio: point.ratio, se };
  });
  points.sort((a, b) => a.day - b.day);
  const n = points.length;
  if (n < 3)
    return notEnoughData(
      `Only ${n} decay run${n === 1 ? '' : 's'} in the history; a trend needs at least 3.`,
    );
  const firstDay = points[0]!.day;
  const lastDay = points[n - 1]!.day;
  if (lastDay - firstDay < 30) {
    return notEnoughData(
      `The runs span only ${lastDay - firstDay} days; a trend needs at least 30 days between the first and the last run.`,
    );
  }

  const notes: string[] = [];
  const weighted = points.every((p) => p.se !== undefined);
  if (weighted) notes.push('Each run is weighted by its stated uncertainty.');
  else if (points.some((p) => p.se !== undefined))
    notes.push('Only some runs state an uncertainty, so all runs are weighted equally.');
  const x = points.map((p) => (p.day - firstDay) / DAYS_PER_YEAR);
  const y = points.map((p) => p.ratio);
  const w = points.map((p) => (weighted ? 1 / (p.se! * p.se!) : 1));

  const horizonDay = Math.max(asOfDay, lastDay) + Math.round(horizonYears * DAYS_PER_YEAR);
  const crossingOf = (fit: WeightedFit): Crossing =>
    crossing(fit, limit, firstDay, horizonDay, tQuantile(0.95, fit.degreesOfFreedom));

  const models: TrendModelFit[] = [];
  const linear = weightedPolynomialFit(x, y, w, 2, weighted);
  const linearAicc = aicc(linear.rssWeighted, n, 2);
  const linearCrossing = crossingOf(linear);
  models.push({
    model: 'linear',
    coefficients: linear.coefficients,
    aicc: linearAicc,
    rmse: linear.rmse,
    usable: true,
    ...crossingDates(linearCrossing),
  });
  let chosen: WeightedFit = linear;
  let chosenCrossing = linearCrossing;
  let model: TrendModelName = 'linear';
  let criterion: string;
  // The quadratic needs one degree of freedom left (4 runs on 3 dates) to say how uncertain its
  // bend is; AICc needs 6 runs to compare it with the line fairly.
  let accelerating: { fit: WeightedFit; crossing: Crossing } | null = null;
  const distinctDays = new Set(points.map((point) => point.day)).size;
  if (n >= 4 && distinctDays >= 3) {
    const fit = weightedPolynomialFit(x, y, w, 3, weighted);
    accelerating = { fit, crossing: crossingOf(fit) };
  }
  const acceleratingAicc = accelerating ? aicc(accelerating.fit.rssWeighted, n, 3) : null;
  const bendsDown = accelerating !== null && accelerating.fit.coefficients[2]! < 0;
  if (accelerating) {
    models.push({
      model: 'accelerating',
      coefficients: accelerating.fit.coefficients,
      aicc: acceleratingAicc,
      rmse: accelerating.fit.rmse,
      usable: bendsDown,
      ...crossingDates(accelerating.crossing),
    });
  }
  if (accelerating && linearAicc !== null && acceleratingAicc !== null) {
    const figures = `AICc linear ${formatNumber(linearAicc, 4)}, accelerating ${formatNumber(acceleratingAicc, 4)}`;
    if (!bendsDown) {
      criterion = `Linear: the quadratic fit bends upwards, which is not an accelerating decline (${figures}).`;
    } else if (acceleratingAicc < linearAicc - 2) {
      chosen = accelerating.fit;
      chosenCrossing = accelerating.crossing;
      model = 'accelerating';
      criterion = `Accelerating: its AICc is lower by more than 2 (${figures}).`;
    } else {
      criterion = `Linear: the accelerating model's AICc is not lower by more than 2 (${figures}).`;
    }
  } else if (n >= 6) {
    criterion = `Linear: the runs fall on only ${distinctDays} distinct dates, too few to fit an acceleration.`;
  } else {
    criterion = `Linear: with ${n} runs only the linear model can be compared fairly (AICc needs 6 runs for the accelerating model).`;
  }

  // Model uncertainty: unless the runs rule an acceleration out (a bend upwards that its own
  // 90 % interval keeps above zero), the accelerating fit's early bound joins the interval, so
  // the earliest plausible date is the earlier of the two models'. The late side stays the
  // chosen model's: a decline that slows down is not an ageing to plan for.
  const accelerationPlausible =
    accelerating !== null &&
    accelerating.fit.coefficients[2]! -
      tQuantile(0.95, accelerating.fit.degreesOfFreedom) *
        Math.sqrt(accelerating.fit.covariance[2]![2]!) <
      0;
  const meanDay = chosenCrossing.meanDay;
  const lateDay = chosenCrossing.lateDay;
  let earlyDay = chosenCrossing.earlyDay;
  if (accelerationPlausible && model === 'linear') {
    earlyDay = earlierDay(earlyDay, accelerating!.crossing.earlyDay);
    const acceleratedEarly = accelerating!.crossing.earlyDay;
    if (acceleratedEarly !== null && acceleratedEarly < (linearCrossing.earlyDay ?? Infinity)) {
      notes.push(
        `Acceleration cannot be ruled out: the runs also fit a decline that speeds up, which could reach ${formatNumber(limit, 3)} as early as ${isoDateFromDayNumber(acceleratedEarly)}${acceleratedEarly <= asOfDay ? ' (already past: the bank may be at its limit now)' : ''}; the 90 % interval includes it.`,
      );
    } else {
      notes.push(
        'Acceleration cannot be ruled out: the runs also fit a decline that speeds up; it does not bring the earliest date forward.',
      );
    }
  }
  if (earlyDay !== null && meanDay !== null && earlyDay > meanDay) earlyDay = meanDay;

  if (meanDay === null)
    notes.push(
      `The fitted trend does not reach ${formatNumber(limit, 3)} within ${formatNumber(horizonYears, 3)} years.`,
    );
  const curve = (xx: number): number => evaluate(chosen.coefficients, xx);
  const xNow = (asOfDay - firstDay) / DAYS_PER_YEAR;
  const ratioNow = curve(xNow);
  const ratioPerYearNow = derivative(chosen.coefficients, xNow);
  if (meanDay !== null && meanDay > lastDay + (lastDay - firstDay)) {
    notes.push(
      'The forecast reaches further ahead than the history goes back; treat the date as a rough guide.',
    );
  }

  const endOfLifeReached = meanDay !== null && meanDay <= asOfDay;
  const rulDays = meanDay === null ? null : Math.max(0, meanDay - asOfDay);

  // Next visit: never later than the standard interval; sooner on watch and as the forecast nears.
  const lastOn = isoDateFromDayNumber(lastDay);
  let nextDay = lastDay + Math.round(standardIntervalDays);
  let nextVisitReason = `The standard interval of ${formatNumber(standardIntervalDays, 4)} days after the last run on ${lastOn}.`;
  const latestRatio = points[n - 1]!.ratio;
  if (watchRatio !== undefined && (ratioNow < watchRatio || latestRatio < watchRatio)) {
    const candidate = lastDay + Math.round(Math.min(nearEndIntervalDays, standardIntervalDays));
    if (candidate < nextDay) {
      nextDay = candidate;
      nextVisitReason = `The bank is below its watch ratio of ${formatNumber(watchRatio, 3)}: every ${formatNumber(nearEndIntervalDays, 4)} days after the last run on ${lastOn}.`;
    }
  }
  if (endOfLifeReached) {
    nextDay = Math.min(nextDay, asOfDay);
    nextVisitReason =
      'The trend has reached the end-of-life ratio: check the bank now and plan its replacement.';
  } else if (earlyDay !== null) {
    const candidate =
      earlyDay <= asOfDay ? asOfDay : asOfDay + Math.floor((earlyDay - asOfDay) / 2);
    if (candidate < nextDay) {
      nextDay = candidate;
      nextVisitReason =
        earlyDay <= asOfDay
          ? 'The 90 % interval of the end-of-life date has already begun: check the bank now.'
          : `Halfway to ${isoDateFromDayNumber(earlyDay)}, the earliest end-of-life date the 90 % interval allows${accelerationPlausible ? ' (a decline that speeds up included)' : ''}, so that one more visit comes before it.`;
    }
  }

  return {
    status: 'ok',
    model,
    criterion,
    models,
    ratioNow,
    ratioPerYearNow,
    endOfLifeOn: meanDay === null ? null : isoDateFromDayNumber(meanDay),
    interval90: [
      earlyDay === null ? null : isoDateFromDayNumber(earlyDay),
      lateDay === null ? null : isoDateFromDayNumber(lateDay),
    ],
    earliestEndOfLifeOn: earlyDay === null ? null : isoDateFromDayNumber(earlyDay),
    accelerationPlausible,
    rulDays,
    endOfLifeReached,
    nextVisitBy: isoDateFromDayNumber(nextDay),
    nextVisitReason,
    nextVisitOverdue: nextDay < asOfDay,
    notes,
  };
}

interface Crossing {
  /** First day the fitted curve is at or below the limit. */
  meanDay: number | null;
  /** First day the lower edge of its 90 % band is (the earliest date the fit allows). */
  earlyDay: number | null;
  /** First day the upper edge is (the latest). */
  lateDay: number | null;
}

/**
 * Inverts a fit's 90 % confidence band at the limit, day by day from the first run to the
 * horizon: the crossing of the curve and of both edges of the band (null: not within it).
 */
function crossing(
  fit: WeightedFit,
  limit: number,
  firstDay: number,
  horizonDay: number,
  q: number,
): Crossing {
  let meanDay: number | null = null;
  let earlyDay: number | null = null;
  let lateDay: number | null = null;
  const p = fit.coefficients.length;
  const g = new Array<number>(p);
  for (
    let day = firstDay;
    day <= horizonDay && (meanDay === null || earlyDay === null || lateDay === null);
    day++
  ) {
    const xx = (day - firstDay) / DAYS_PER_YEAR;
    for (let k = 0; k < p; k++) g[k] = xx ** k;
    let variance = 0;
    for (let i = 0; i < p; i++)
      for (let j = 0; j < p; j++) variance += g[i]! * fit.covariance[i]![j]! * g[j]!;
    const m = evaluate(fit.coefficients, xx);
    const half = q * Math.sqrt(Math.max(variance, 0));
    if (earlyDay === null && m - half <= limit) earlyDay = day;
    if (meanDay === null && m <= limit) meanDay = day;
    if (lateDay === null && m + half <= limit) lateDay = day;
  }
  return { meanDay, earlyDay, lateDay };
}

function crossingDates(c: Crossing): Pick<TrendModelFit, 'endOfLifeOn' | 'interval90'> {
  const on = (day: number | null): string | null =>
    day === null ? null : isoDateFromDayNumber(day);
  return { endOfLifeOn: on(c.meanDay), interval90: [on(c.earlyDay), on(c.lateDay)] };
}

/** The earlier of two days, null standing for "not within the horizon". */
function earlierDay(a: number | null, b: number | null): number | null {
  if (a === null) return b;
  if (b === null) return a;
  return Math.min(a, b);
}

function positiveOption(value: number | undefined, fallback: number, path: string): number {
  if (value === undefined) return fallback;
  if (!(typeof value === 'number' && value > 0 && Number.isFinite(value))) {
    throw new EngineInputError(
      'invalid-option',
      `${path} must be a positive number, got ${String(value)}.`,
      [{ path, message: 'must be positive' }],
    );
  }
  return value;
}

function evaluate(coefficients: readonly number[], x: number): number {
  let value = 0;
  for (let k = coefficients.length - 1; k >= 0; k--) value = value * x + coefficients[k]!;
  return value;
}

function derivative(coefficients: readonly number[], x: number): number {
  let value = 0;
  for (let k = coefficients.length - 1; k >= 1; k--) value = value * x + k * coefficients[k]!;
  return value;
}

/** AICc of a least-squares fit with p coefficients plus the variance; null when n − k − 1 ≤ 0. */
function aicc(rssWeighted: number, n: number, p: number): number | null {
  const k = p + 1;
  if (n - k - 1 <= 0) return null;
  return n * Math.log(Math.max(rssWeighted, 1e-300) / n) + 2 * k + (2 * k * (k + 1)) / (n - k - 1);
}

/**
 * Weighted least squares of y on the polynomial basis 1, x, …, x^(p−1), by the normal equations
 * (p ≤ 3, x in years: well conditioned). With stated uncertainties the covariance is scaled by
 * the reduced χ² only when that exceeds 1 (the scatter may be larger than stated, never smaller).
 */
function weightedPolynomialFit(
  x: number[],
  y: number[],
  w: number[],
  p: number,
  knownErrors: boolean,
): WeightedFit {
  const n = x.length;
  const a: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  const b = new Array<number>(p).fill(0);
  for (let i = 0; i < n; i++) {
    const powers = Array.from({ length: p }, (_, k) => x[i]! ** k);
    for (let r = 0; r < p; r++) {
      b[r]! += w[i]! * powers[r]! * y[i]!;
      for (let c = 0; c < p; c++) a[r]![c]! += w[i]! * powers[r]! * powers[c]!;
    }
  }
  const inverse = invertSymmetric(a);
  const coefficients = inverse.map((row) => row.reduce((sum, value, c) => sum + value * b[c]!, 0));
  let rssWeighted = 0;
  let rss = 0;
  for (let i = 0; i < n; i++) {
    const residual = y[i]! - evaluate(coefficients, x[i]!);
    rssWeighted += w[i]! * residual * residual;
    rss += residual * residual;
  }
  const degreesOfFreedom = n - p;
  const reduced = rssWeighted / degreesOfFreedom;
  const scale = knownErrors ? Math.max(1, reduced) : reduced;
  return {
    coefficients,
    covariance: inverse.map((row) => row.map((value) => value * scale)),
    rssWeighted,
    rmse: Math.sqrt(rss / n),
    degreesOfFreedom,
  };
}

/** Inverse of a small symmetric positive-definite matrix by Gauss–Jordan elimination with pivoting. */
function invertSymmetric(matrix: number[][]): number[][] {
  const size = matrix.length;
  const m = matrix.map((row, r) => [
    ...row,
    ...Array.from({ length: size }, (_, c) => (c === r ? 1 : 0)),
  ]);
  for (let col = 0; col < size; col++) {
    let pivot = col;
    for (let r = col + 1; r < size; r++)
      if (Math.abs(m[r]![col]!) > Math.abs(m[pivot]![col]!)) pivot = r;
    [m[col], m[pivot]] = [m[pivot]!, m[col]!];
    const lead = m[col]![col]!;
    if (lead === 0)
      throw new EngineInputError(
        'invalid-date',
        'The runs fall on too few distinct dates to fit a trend.',
      );
    for (let c = 0; c < 2 * size; c++) m[col]![c]! /= lead;
    for (let r = 0; r < size; r++) {
      if (r === col) continue;
      const factor = m[r]![col]!;
      if (factor === 0) continue;
      for (let c = 0; c < 2 * size; c++) m[r]![c]! -= factor * m[col]![c]!;
    }
  }
  return m.map((row) => row.slice(size));
}
