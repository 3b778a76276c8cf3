/**
 * The noise of a decay's readings, for a fit weighted by it.
 *
 * A reading's scatter has three parts (each one standard deviation):
 * - a constant part a, volts: the meter's own noise and its rounding (a resolution step q adds
 *   q²/12, the variance of a uniform rounding error);
 * - a part in proportion to the reading, b·V: a %-of-reading flicker;
 * - timing jitter δt: a reading taken δt early or late is off by |dV/dt|·δt = V·δt/τ on an RC
 *   decay, again in proportion to the reading.
 *
 * So σ² = a² + c²·V² with c² = b² + (δt/τ)². Given parts act as floors; the rest is estimated from
 * the fit's residuals ({@link estimateNoiseModel}), and the fit is repeated with weights 1/σ²
 * (iteratively reweighted least squares).
 */

/** What is known of the readings' scatter (one standard deviation each), all optional. */
export interface ReadingNoiseInput {
  /** Constant noise of the meter, volts (not its specified accuracy limit: a gain error does not change τ). */
  volts?: number;
  /** Noise in proportion to the reading, as a fraction (0.001 = 0.1 % of the reading). */
  fractionOfReading?: number;
  /** Scatter of the moment each reading was taken about its recorded time, seconds. */
  timingJitterSeconds?: number;
  /** Display resolution, volts (e.g. 1 or 0.1); found from the readings' decimals when absent. */
  resolutionVolts?: number;
}

/** σ² = aSquared + cSquared · V², volts². */
export interface NoiseModel {
  /** a², the constant part including rounding, volts². */
  aSquared: number;
  /** c², the part in proportion to the reading (%-of-reading and timing jitter), dimensionless. */
  cSquared: number;
}

/** Readings looked at to find the display resolution (a logger file may hold 100,000). */
const RESOLUTION_PROBES = 200;

/**
 * The display resolution the readings were written at: 1 V when every reading is a whole number,
 * 0.1 V when one decimal is the most any reading has, and so on; 0 for readings with more than
 * six decimals (no rounding to speak of).
 *
 * @param volts - readings, volts
 * @returns the resolution step, volts
 * @example
 * readingResolutionVolts([562, 498.5, 441]) // 0.1
 */
export function readingResolutionVolts(volts: ArrayLike<number>): number {
  const n = volts.length;
  const step = Math.max(1, Math.floor(n / RESOLUTION_PROBES));
  let decimals = 0;
  for (let i = 0; i < n; i += step) {
    const value = Math.abs(volts[i]!);
    while (decimals <= 6) {
      const scaled = value * 10 ** decimals;
      if (Math.abs(scaled - Math.round(scaled)) <= 1e-11 * Math.max(1, scaled)) break;
      decimals++;
    }
    if (decimals > 6) return 0;
  }
  return 10 ** -decimals;
}

/**
 * The floors of a² and c² from what is known: the rounding (q²/12), the meter's constant and
 * proportional noise, and the timing jitter at the current decay rate.
 *
 * @param input - what is known (see {@link ReadingNoiseInput})
 * @param resolutionVolts - the display resolution, volts
 * @param ratePerSecond - the current decay rate 1/τ, per second
 * @example
 * noiseFloor({ timingJitterSeconds: 2 }, 1, 1 / 200) // { aSquared: 1/12, cSquared: 1e-4 }
 */
export function noiseFloor(
  input: ReadingNoiseInput,
  resolutionVolts: number,
  ratePerSecond: number,
): NoiseModel {
  const jitter = (input.timingJitterSeconds ?? 0) * ratePerSecond;
  return {
    aSquared: (resolutionVolts * resolutionVolts) / 12 + (input.volts ?? 0) ** 2,
    cSquared: (input.fractionOfReading ?? 0) ** 2 + jitter * jitter,
  };
}

/**
 * Fills `out[i]` with σᵢ² = a² + c²·Vᵢ², volts², for every reading.
 *
 * @example
 * const out = new Float64Array(2);
 * noiseVariances({ aSquared: 0.25, cSquared: 1e-4 }, [100, 10], out); // out = [1.25, 0.26]
 */
export function noiseVariances(
  model: NoiseModel,
  volts: ArrayLike<number>,
  out: Float64Array,
): Float64Array {
  // Readings are not known better than to a part in 10⁹ (the arithmetic of the fit itself):
  // this keeps exact synthetic data (zero residuals) from dividing by zero.
  for (let i = 0; i < volts.length; i++) {
    const v = volts[i]!;
    out[i] = model.aSquared + (model.cSquared + PRECISION_SQUARED) * v * v + 1e-24;
  }
  return out;
}

/** (Relative precision of a reading in the arithmetic)², see {@link noiseVariances}. */
export const PRECISION_SQUARED = 1e-18;

/** Readings below which both parts of the scatter are not estimated separately. */
export const MIN_READINGS_FOR_TWO_PARTS = 8;

/**
 * Estimates σ² = a² + c²·V² from a fit's residuals (iteratively reweighted moment regression of
 * rᵢ²/(1 − hᵢ) on 1 and Vᵢ², each part at or above its floor). With fewer than 8 readings only
 * the level is estimated and the shape of `current` kept.
 *
 * @param volts - readings, volts
 * @param residualsVolts - reading minus fitted curve, volts
 * @param leverage - each reading's leverage hᵢ in the weighted fit (0 ≤ h < 1)
 * @param include - mask of the readings in the fit (1 = yes)
 * @param floor - the floors of both parts (see {@link noiseFloor})
 * @param current - the model the fit was weighted with (start and shape)
 * @returns the estimated model
 * @example
 * // residuals of ±1 V at every voltage: a² ≈ 1, c² at its floor
 * estimateNoiseModel(volts, residuals, leverage, include, { aSquared: 1 / 12, cSquared: 0 }, start)
 */
export function estimateNoiseModel(
  volts: ArrayLike<number>,
  residualsVolts: ArrayLike<number>,
  leverage: ArrayLike<number>,
  include: ArrayLike<number>,
  floor: NoiseModel,
  current: NoiseModel,
): NoiseModel {
  const n = volts.length;
  // Work with u = V / vScale so that the 2 × 2 system is well scaled.
  let vScale = 0;
  let count = 0;
  for (let i = 0; i < n; i++) {
    if (!include[i]) continue;
    if (volts[i]! > vScale) vScale = volts[i]!;
    count++;
  }
  if (count < 3 || !(vScale > 0)) return current;
  let a = Math.max(current.aSquared, floor.aSquared);
  let c = Math.max(current.cSquared, floor.cSquared) * vScale * vScale;
  const cFloor = floor.cSquared * vScale * vScale;
  if (!(a + c > 0)) a = 1e-12;

  if (count < MIN_READINGS_FOR_TWO_PARTS) {
    // One level: the mean of rᵢ²/(1 − hᵢ)/σᵢ² scales the current shape, kept above the floors.
    let ratio = 0;
    for (let i = 0; i < n; i++) {
      if (!include[i]) continue;
      const u = volts[i]! / vScale;
      ratio += squaredResidual(residualsVolts[i]!, leverage[i]!) / (a + c * u * u);
    }
    const level = ratio / count;
    return {
      aSquared: Math.max(a * level, floor.aSquared),
      cSquared: Math.max((c * level) / (vScale * vScale), floor.cSquared),
    };
  }

  for (let round = 0; round < 4; round++) {
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let e0 = 0;
    let e1 = 0;
    for (let i = 0; i < n; i++) {
      if (!include[i]) continue;
      const u2 = (volts[i]! / vScale) ** 2;
      const variance = a + c * u2;
      // Each squared residual has variance about 2σ⁴: weight by its inverse.
      const weight = 1 / (variance * variance);
      const e = squaredResidual(residualsVolts[i]!, leverage[i]!);
      s0 += weight;
      s1 += weight * u2;
      s2 += weight * u2 * u2;
      e0 += weight * e;
      e1 += weight * e * u2;
    }
    const det = s0 * s2 - s1 * s1;
    let nextA = det > 0 ? (s2 * e0 - s1 * e1) / det : e0 / s0;
    let nextC = det > 0 ? (s0 * e1 - s1 * e0) / det : 0;
    if (nextA < floor.aSquared) {
      nextA = floor.aSquared;
      nextC = Math.max(cFloor, (e1 - nextA * s1) / s2);
    } else if (nextC < cFloor) {
      nextC = cFloor;
      nextA = Math.max(floor.aSquared, (e0 - nextC * s1) / s0);
    }
    if (!(nextA + nextC > 0) || !Number.isFinite(nextA + nextC)) break;
    const settled = Math.abs(nextA - a) <= 1e-3 * (a + c) && Math.abs(nextC - c) <= 1e-3 * (a + c);
    a = nextA;
    c = nextC;
    if (settled) break;
  }
  return { aSquared: a, cSquared: c / (vScale * vScale) };
}

/** rᵢ²/(1 − hᵢ): a residual's square corrected for what the fit itself took out. */
function squaredResidual(residual: number, leverage: number): number {
  return (residual * residual) / Math.max(1 - leverage, 0.05);
}
