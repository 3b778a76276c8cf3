/**
 * Expected life of a capacitor bank from temperature (and optionally voltage), by the Arrhenius
 * "10 K rule" of capacitor makers' application notes (common practice):
 *
 *   L = L0 · 2^((T0 − T) / 10) · (V / V0)^(−n)
 *
 * L0 is the rated life at the rated temperature T0 (°C); life doubles for every 10 K cooler. The
 * rule is a fair guide between about 60 and 105 °C. The voltage term is optional, and its exponent
 * n must come from the design (roughly 3–5 for electrolytics, 7–9 for film, from memory: never
 * assumed here). This estimate sits beside the measured trend; it does not replace it.
 */

import { EngineInputError } from './errors';
import { DAYS_PER_YEAR, dayNumberFromIsoDate, isoDateFromDayNumber } from './calendar-dates';
import { formatNumber } from './format';

/** Hours in a mean Gregorian year. */
export const HOURS_PER_YEAR = DAYS_PER_YEAR * 24;

/** Inputs of {@link estimateArrheniusLife}. */
export interface ArrheniusLifeInput {
  /** Rated (endurance) life at the rated temperature, hours, e.g. 5000. */
  ratedLifeHours: number;
  /** Rated temperature, °C, e.g. 105. */
  ratedTempC: number;
  /** Mean operating temperature of the bank (or the cabinet, if that is all there is), °C. */
  operatingTempC: number;
  /** Optional voltage derating: rated and operating voltage per capacitor, and the exponent n. */
  voltage?: { ratedVolts: number; operatingVolts: number; exponent: number };
  /** Fraction of the time the drive is powered (0–1], default 1 (around the clock). */
  poweredFraction?: number;
}

/** Result of {@link estimateArrheniusLife}. */
export interface ArrheniusLifeEstimate {
  /** Expected life while powered, hours. */
  expectedLifeHours: number;
  /** Expected calendar life, years (powered hours stretched by the powered fraction). */
  expectedLifeYears: number;
  /** Life multiplier against the rating: 2^((T0 − T)/10) × the voltage factor. */
  accelerationFactor: number;
  /** Plain-words notes on how far to trust the figure. */
  notes: string[];
}

/**
 * Expected life from rated life, rated temperature and operating temperature.
 *
 * @example
 * estimateArrheniusLife({ ratedLifeHours: 5000, ratedTempC: 105, operatingTempC: 65 })
 * // { expectedLifeHours: 80000, expectedLifeYears: ≈9.13, accelerationFactor: 16, notes: [] }
 */
export function estimateArrheniusLife(input: ArrheniusLifeInput): ArrheniusLifeEstimate {
  positive(input.ratedLifeHours, 'ratedLifeHours');
  finite(input.ratedTempC, 'ratedTempC');
  finite(input.operatingTempC, 'operatingTempC');
  const poweredFraction = input.poweredFraction ?? 1;
  if (!(poweredFraction > 0 && poweredFraction <= 1)) {
    throw new EngineInputError(
      'invalid-option',
      `poweredFraction must be in (0, 1], got ${String(poweredFraction)}.`,
      [{ path: 'poweredFraction', message: 'must be in (0, 1]' }],
    );
  }
  const notes: string[] = [];
  let factor = 2 ** ((input.ratedTempC - input.operatingTempC) / 10);
  if (input.voltage) {
    positive(input.voltage.ratedVolts, 'voltage.ratedVolts');
    positive(input.voltage.operatingVolts, 'voltage.operatingVolts');
    positive(input.voltage.exponent, 'voltage.exponent');
    factor *= (input.voltage.operatingVolts / input.voltage.ratedVolts) ** -input.voltage.exponent;
    if (input.voltage.operatingVolts > input.voltage.ratedVolts) {
      notes.push('The operating voltage is above the rating: the capacitors are overstressed.');
    }
  }
  if (input.operatingTempC < 60 || input.operatingTempC > 105) {
    notes.push(
      `The 10 K rule is a fair guide between about 60 and 105 °C; at ${formatNumber(input.operatingTempC, 3)} °C treat the figure as optimistic${input.operatingTempC < 60 ? ' (other wear-out, seals and ripple heating, take over)' : ''}.`,
    );
  }
  if (input.operatingTempC > input.ratedTempC)
    notes.push('The operating temperature is above the rated temperature.');
  notes.push(
    "A capacitor's core runs warmer than the cabinet air; with cabinet temperature only, the life is overestimated.",
  );
  const expectedLifeHours = input.ratedLifeHours * factor;
  return {
    expectedLifeHours,
    expectedLifeYears: expectedLifeHours / HOURS_PER_YEAR / poweredFraction,
    accelerationFactor: factor,
    notes,
  };
}

/** Result of {@link lifeUsed}. */
export interface LifeUsed {
  /** Fraction of the expected life used so far (may exceed 1). */
  fractionUsed: number;
  /** Expected calendar years left (0 when used up). */
  remainingYears: number;
  /** Date the expected life runs out, "YYYY-MM-DD". */
  expectedEndOn: string;
}

/**
 * How much of an expected life a bank has used since it went into service.
 *
 * @param estimate - from {@link estimateArrheniusLife}
 * @param inServiceSinceOn - "YYYY-MM-DD"
 * @param asOfOn - "YYYY-MM-DD" (no hidden clock)
 * @example
 * lifeUsed(estimateArrheniusLife({ ratedLifeHours: 5000, ratedTempC: 105, operatingTempC: 65 }), '2020-01-01', '2024-07-01')
 * // { fractionUsed: ≈0.49, remainingYears: ≈4.6, expectedEndOn: '2029-02-…' }
 */
export function lifeUsed(
  estimate: ArrheniusLifeEstimate,
  inServiceSinceOn: string,
  asOfOn: string,
): LifeUsed {
  const start = dayNumberFromIsoDate(inServiceSinceOn, 'inServiceSinceOn');
  const now = dayNumberFromIsoDate(asOfOn, 'asOfOn');
  const years = Math.max(0, now - start) / DAYS_PER_YEAR;
  const fractionUsed = years / estimate.expectedLifeYears;
  return {
    fractionUsed,
    remainingYears: Math.max(0, estimate.expectedLifeYears - years),
    expectedEndOn: isoDateFromDayNumber(
      start + Math.round(Math.min(estimate.expectedLifeYears, 10_000) * DAYS_PER_YEAR),
    ),
  };
}

function finite(value: number, path: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new EngineInputError(
      'invalid-number',
      `${path} must be a number, got ${String(value)}.`,
      [{ path, message: 'not a number' }],
    );
  }
}

function positive(value: number, path: string): void {
  if (typeof value !== 'number' || !(value > 0) || !Number.isFinite(value)) {
    throw new EngineInputError(
      'invalid-number',
      `${path} must be a positive number, got ${String(value)}.`,
      [{ path, message: 'must be positive' }],
    );
  }
}
