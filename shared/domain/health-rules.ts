/**
 * Health from a capacitance ratio and a design's limits.
 */

import {
  DEFAULT_HEALTH_LIMITS,
  HEALTH_NAMES,
  type CapacitorTechnology,
  type HealthLimits,
  type HealthName,
} from '../constants/health';
import { EngineInputError } from './errors';

/**
 * The limits that apply: the design's own, or the defaults for its technology (DOMAIN.md).
 *
 * @throws EngineInputError('invalid-ratio') unless 0 < endOfLifeRatio < watchRatio
 * @example
 * resolveHealthLimits('film') // { watchRatio: 0.97, endOfLifeRatio: 0.95 }
 */
export function resolveHealthLimits(
  technology: CapacitorTechnology,
  limits?: HealthLimits,
): HealthLimits {
  const base = DEFAULT_HEALTH_LIMITS[technology];
  if (!base) {
    throw new EngineInputError(
      'invalid-option',
      `Unknown capacitor technology "${String(technology)}" (electrolytic or film).`,
      [{ path: 'technology', message: 'electrolytic or film' }],
    );
  }
  const chosen = limits ?? base;
  if (!(
    chosen.endOfLifeRatio > 0 &&
    chosen.watchRatio > chosen.endOfLifeRatio &&
    chosen.watchRatio < 2
  )) {
    throw new EngineInputError(
      'invalid-ratio',
      `Health limits must satisfy 0 < end of life < watch, got watch ${String(chosen.watchRatio)} and end of life ${String(chosen.endOfLifeRatio)}.`,
      [{ path: 'limits', message: '0 < endOfLifeRatio < watchRatio' }],
    );
  }
  return { watchRatio: chosen.watchRatio, endOfLifeRatio: chosen.endOfLifeRatio };
}

/**
 * Health of a bank from its capacitance ratio: at or above the watch ratio healthy, at or above
 * the end-of-life ratio watch, below it end of life.
 *
 * @param ratio - capacitance at 20 °C / baseline capacitance
 * @param limits - the design's limits
 * @example
 * classifyHealth(0.85, { watchRatio: 0.9, endOfLifeRatio: 0.8 }) // 'watch'
 */
export function classifyHealth(ratio: number, limits: HealthLimits): HealthName {
  if (ratio >= limits.watchRatio) return 'healthy';
  if (ratio >= limits.endOfLifeRatio) return 'watch';
  return 'end-of-life';
}

/**
 * The worse of two health states.
 *
 * @example
 * worseHealth('healthy', 'watch') // 'watch'
 */
export function worseHealth(a: HealthName, b: HealthName): HealthName {
  return HEALTH_NAMES.indexOf(a) >= HEALTH_NAMES.indexOf(b) ? a : b;
}

/**
 * Capacitance ratios a bank can physically reach by ageing. Electrolytics lose capacitance as
 * they age (end of life is commonly 80 %, some manuals 85 %; DOMAIN.md) and never gain much;
 * a ratio above 130 % or below 30 % of the baseline points at a wrong bleeder value, a wrong
 * baseline or mistyped readings rather than at the bank (bounds well outside every design's
 * limits; common practice).
 */
export const PLAUSIBLE_RATIO = { low: 0.3, high: 1.3 } as const;

/**
 * True when a capacitance ratio lies within what ageing can explain ({@link PLAUSIBLE_RATIO});
 * outside it a verdict must not call the bank healthy, nor anything else, before the bleeder
 * value and the readings are checked.
 *
 * @param ratio - capacitance at 20 °C / baseline capacitance
 * @example
 * isPlausibleRatio(0.85) // true
 * isPlausibleRatio(3.355) // false
 */
export function isPlausibleRatio(ratio: number): boolean {
  return Number.isFinite(ratio) && ratio >= PLAUSIBLE_RATIO.low && ratio <= PLAUSIBLE_RATIO.high;
}
