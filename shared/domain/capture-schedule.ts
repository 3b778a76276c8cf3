/**
 * When a guided capture prompts the technician for a reading: dense at first, where the fit and
 * the control-supply knee need readings (the drive's control supply steepens the first seconds),
 * then spaced out as the decay slows, to about 5 τ (under 1 % of V0 is left: e^−5 ≈ 0.67 %).
 *
 * The times are for a person reading a meter and typing on a phone: never closer than a few
 * seconds, and on round figures (multiples of 5 s, then 10 s, 15 s, 30 s, 1 min …) so a paper
 * sheet kept beside the phone reads naturally.
 */

import { EngineInputError } from './errors';

/** Prompts are never closer than this by default, seconds: reading a meter and typing takes a few seconds. */
export const CAPTURE_MIN_SPACING_SECONDS = 5;

/** The smallest spacing a caller may ask for, seconds. */
export const CAPTURE_MIN_SPACING_FLOOR_SECONDS = 3;

/** The schedule runs to this many time constants (e^−5 ≈ 0.67 % of V0 left). */
export const CAPTURE_HORIZON_TIME_CONSTANTS = 5;

/**
 * The schedule never runs longer than this, seconds (4 h): a bank with a very long τ is stopped
 * by the technician or below the end voltage long before 5 τ.
 */
export const CAPTURE_MAX_SCHEDULE_SECONDS = 4 * 3600;

/** Each gap is about this fraction of the time elapsed: the prompts are spaced evenly on a log scale at first. */
const GROWTH = 0.25;

/** A gap is at most this fraction of τ, so the RC part has readings spread over it. */
const MAX_GAP_TIME_CONSTANTS = 1 / 3;

/** Round gaps, seconds: a gap is the largest of these not above the ideal one. */
const ROUND_GAPS_SECONDS = [
  3, 4, 5, 10, 15, 20, 30, 60, 90, 120, 180, 300, 600, 900, 1200, 1800, 3600,
];

/** Options of {@link captureScheduleSeconds}. */
export interface CaptureScheduleOptions {
  /**
   * The voltage at which the capture ends, volts (e.g. CAPTURE_END_VOLTS, 50 V). With
   * `startVolts`, the schedule ends at the first prompt after the bus is expected below it (at
   * most 5 τ) instead of at 5 τ.
   */
  endVolts?: number;
  /** The bus voltage at isolation, volts (e.g. the cabinet's nominal DC-bus voltage). */
  startVolts?: number;
  /** The smallest gap between two prompts, seconds (default 5, never below 3). */
  minSpacingSeconds?: number;
}

/**
 * Prompt times for a guided capture, seconds after isolation, increasing: every
 * `minSpacingSeconds` at first, then gaps that grow with the time elapsed (about a quarter of
 * it) up to a third of τ, until about 5 τ, when under 1 % of V0 is left.
 *
 * Bounds: a τ so short that the bus is gone within seconds still gets three prompts at the
 * smallest spacing (a hand capture cannot follow it: use a logger; the caller can tell by the
 * count, fewer than 5 prompts); a very long τ stops at {@link CAPTURE_MAX_SCHEDULE_SECONDS}.
 *
 * @param expectedTauSeconds - the bank's expected τ, seconds (its last measured τ, else its baseline); finite, > 0
 * @param options - see {@link CaptureScheduleOptions}
 * @returns prompt times in seconds since isolation, strictly increasing, the first one at the smallest spacing
 * @throws EngineInputError ('invalid-option') when τ, the spacing or a voltage is not a positive finite number
 * @example
 * captureScheduleSeconds(120)
 * // [5, 10, 15, 20, 25, 30, 35, 40, 50, 60, 75, 90, 100, 120, 150, 180, 210, …, 570, 600] (30 prompts; 600 s = 5 τ)
 * captureScheduleSeconds(120, { startVolts: 560, endVolts: 50 })
 * // the same up to 300: the bus is expected below 50 V after 120 · ln(560/50) ≈ 290 s
 */
export function captureScheduleSeconds(
  expectedTauSeconds: number,
  options: CaptureScheduleOptions = {},
): number[] {
  const tau = expectedTauSeconds;
  if (!(tau > 0) || !Number.isFinite(tau)) {
    throw new EngineInputError(
      'invalid-option',
      `The expected τ must be a positive number of seconds, got ${String(tau)}.`,
      [{ path: 'expectedTauSeconds', message: 'must be a positive number of seconds' }],
    );
  }
  const minGap = Math.max(
    CAPTURE_MIN_SPACING_FLOOR_SECONDS,
    options.minSpacingSeconds ?? CAPTURE_MIN_SPACING_SECONDS,
  );
  if (!Number.isFinite(minGap)) {
    throw new EngineInputError(
      'invalid-option',
      'The smallest spacing between prompts must be a number of seconds.',
      [{ path: 'minSpacingSeconds', message: 'must be a number of seconds' }],
    );
  }
  const { startVolts, endVolts } = options;
  for (const [path, value] of [
    ['startVolts', startVolts],
    ['endVolts', endVolts],
  ] as const) {
    if (value !== undefined && !(value > 0 && Number.isFinite(value))) {
      throw new EngineInputError(
        'invalid-option',
        `${path} must be a positive number of volts, got ${String(value)}.`,
        [{ path, message: 'must be a positive number of volts' }],
      );
    }
  }

  let horizon = CAPTURE_HORIZON_TIME_CONSTANTS * tau;
  if (startVolts !== undefined && endVolts !== undefined && startVolts > endVolts) {
    // the capture ends below endVolts: one prompt past the expected crossing is enough
    horizon = Math.min(horizon, tau * Math.log(startVolts / endVolts));
  }
  horizon = Math.min(horizon, CAPTURE_MAX_SCHEDULE_SECONDS);

  const maxGap = Math.max(minGap, tau * MAX_GAP_TIME_CONSTANTS);
  const times: number[] = [];
  let t = 0;
  // the schedule ends at the first prompt at or past the horizon, with at least three prompts
  while (times.length < 3 || t < horizon) {
    const ideal = Math.min(maxGap, Math.max(minGap, t * GROWTH));
    const gap = roundGap(ideal, minGap);
    // on a multiple of the gap (a round figure on the sheet), never sooner than minGap
    let next = (Math.floor(t / gap + 1e-9) + 1) * gap;
    if (next - t < minGap - 1e-9) next += gap;
    t = next;
    times.push(t);
    if (t >= CAPTURE_MAX_SCHEDULE_SECONDS) break;
  }
  return times;
}

/** The largest round gap not above `ideal`, and never below `minGap` (the smallest gap is `minGap` itself). */
function roundGap(ideal: number, minGap: number): number {
  let gap = minGap;
  for (const round of ROUND_GAPS_SECONDS) if (round >= minGap && round <= ideal) gap = round;
  return gap;
}
