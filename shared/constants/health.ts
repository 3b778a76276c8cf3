/**
 * Health names, their labels, and the default limits and intervals that a bank design starts
 * with. Every default here is editable per bank design; figures come from ../DOMAIN.md.
 */

/** The three health states of a capacitor bank, best first. */
export const HEALTH_NAMES = ['healthy', 'watch', 'end-of-life'] as const;

/** One health state: `'healthy' | 'watch' | 'end-of-life'`. */
export type HealthName = (typeof HEALTH_NAMES)[number];

/** How each health state is written on screen ("end of life" is the trade's term). */
export const HEALTH_LABELS: Record<HealthName, string> = {
  healthy: 'healthy',
  watch: 'watch',
  'end-of-life': 'end of life',
};

/**
 * True when `value` is one of {@link HEALTH_NAMES}.
 *
 * @example
 * isHealthName('end-of-life') // true
 */
export function isHealthName(value: unknown): value is HealthName {
  return typeof value === 'string' && (HEALTH_NAMES as readonly string[]).includes(value);
}

/** Capacitor technologies a bank design can have. */
export const CAPACITOR_TECHNOLOGIES = ['electrolytic', 'film'] as const;

/** `'electrolytic'` (aluminium electrolytic) or `'film'`. */
export type CapacitorTechnology = (typeof CAPACITOR_TECHNOLOGIES)[number];

/**
 * Limits on the capacitance ratio (capacitance at 20 °C / baseline capacitance, a plain fraction).
 * At or above `watchRatio` the bank is healthy; below it, watch; below `endOfLifeRatio`, end of life.
 */
export interface HealthLimits {
  /** Ratio below which the bank is on watch, e.g. 0.9. */
  watchRatio: number;
  /** Ratio below which the bank is at end of life, e.g. 0.8. */
  endOfLifeRatio: number;
}

/**
 * Default limits per technology (DOMAIN.md, common practice): electrolytic watch 0.90 and end of
 * life 0.80; film watch 0.97 and end of life 0.95.
 */
export const DEFAULT_HEALTH_LIMITS: Readonly<Record<CapacitorTechnology, Readonly<HealthLimits>>> =
  {
    electrolytic: { watchRatio: 0.9, endOfLifeRatio: 0.8 },
    film: { watchRatio: 0.97, endOfLifeRatio: 0.95 },
  };

/** Input resistance of most multimeters on DC volts, in ohms (10 MΩ, common practice). */
export const DEFAULT_METER_INPUT_OHMS = 10_000_000;

/**
 * How far τ may rise above the baseline, as a fraction (0.1 = 10 %), before the rise counts as a
 * safety finding. Capacitance does not grow with age, so a rising τ points at the bleeder.
 */
export const DEFAULT_TAU_RISE_TOLERANCE = 0.1;

/** Longest interval between inspections, in days: at least yearly (common practice, NFPA 70B). */
export const DEFAULT_INSPECTION_INTERVAL_DAYS = 365;

/** Interval between inspections once a bank is on watch, in days (every 6 months, common practice). */
export const NEAR_END_OF_LIFE_INTERVAL_DAYS = 182;
