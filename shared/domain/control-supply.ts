/**
 * The control-supply phase at the start of a decay.
 *
 * While the bus is high, the drive's switched-mode control supply draws roughly constant power P
 * from it, so C·dV/dt = −V/R − P/V. Then u = V² obeys du/dt = −(2/τ)(u + P·R): the quantity
 * V² + P·R decays with τ/2, and ln V falls faster than the RC line, ever faster as V drops, until
 * the supply drops out and the decay becomes plainly RC (the knee). Readings before the knee lie
 * above the backward extension of the RC line. The fit leaves them out; this module finds them,
 * estimates P from them, and can simulate the whole curve.
 */

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

/** Standardised residuals of the readings against a plain RC line (see {@link countSteepStart}). */
export interface StandardisedResiduals {
  /** (reading − line) / scale, in volts terms. */
  zVolts: ArrayLike<number>;
  /** (ln reading − ln line) / scale, in log terms. */
  zLog: ArrayLike<number>;
  /** reading / line. */
  ratio: ArrayLike<number>;
}

/**
 * Counts the readings at the start that lie clearly above the RC line: the steep start of a
 * control-supply phase. A reading counts when it is more than `zThreshold` scatter-widths above
 * the line both in volts and in log volts (so neither high-voltage nor low-voltage scatter alone
 * can trigger it) and less than 7 × the line (a tenfold reading is a typing slip, not physics).
 *
 * @param residuals - standardised residuals against the RC line fitted to the later readings
 * @param zThreshold - scatter-widths, e.g. 4
 * @param minimumRemaining - readings that must stay after the phase (≥ 3 for a fit)
 * @returns how many leading readings belong to the steep start (0 = none)
 * @example
 * countSteepStart({ zVolts: [40, 9, 0.3, -0.5], zLog: [30, 8, 0.2, -0.4], ratio: [1.8, 1.1, 1, 1] }, 4, 2) // 2
 */
export function countSteepStart(
  residuals: StandardisedResiduals,
  zThreshold: number,
  minimumRemaining: number,
  alreadyCounted = 0,
): number {
  const n = residuals.zVolts.length;
  let count = alreadyCounted;
  while (
    count < n - minimumRemaining &&
    residuals.zVolts[count]! > zThreshold &&
    residuals.zLog[count]! > zThreshold &&
    residuals.ratio[count]! < 7
  ) {
    count++;
  }
  return count;
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
