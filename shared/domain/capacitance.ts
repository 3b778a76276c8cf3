/**
 * From τ to capacitance, and the bank's nominal capacitance.
 *
 * τ = R·C (ohm × farad = second). During the measurement the bus discharges through the bleeder
 * and the meter in parallel, so C = τ / R_eff with R_eff = R_bleed ∥ R_meter.
 */

import { EngineInputError } from './errors';
import { DEFAULT_METER_INPUT_OHMS } from '../constants/health';
import { formatNumber } from './format';

/**
 * Effective discharge resistance: the bleeder in parallel with the meter's input resistance.
 *
 * @param bleederOhms - bleeder resistance across the bus, ohms (> 0)
 * @param meterInputOhms - the meter's input resistance, ohms; `undefined` = the 10 MΩ default
 *   (common practice for DC volts); `null` or 0 = no meter loading (e.g. a high-impedance logger)
 * @returns ohms
 * @throws EngineInputError('invalid-resistance')
 * @example
 * effectiveDischargeOhms(94_000) // ≈ 93 124.6 (94 kΩ ∥ 10 MΩ)
 * effectiveDischargeOhms(94_000, null) // 94 000
 */
export function effectiveDischargeOhms(
  bleederOhms: number,
  meterInputOhms?: number | null,
): number {
  requirePositive(bleederOhms, 'bleederOhms', 'The bleeder resistance');
  const meter = resolveMeterInputOhms(meterInputOhms);
  if (meter === null) return bleederOhms;
  return (bleederOhms * meter) / (bleederOhms + meter);
}

/**
 * The meter input resistance that applies: the 10 MΩ default when not given, null for none.
 *
 * @example
 * resolveMeterInputOhms(undefined) // 10 000 000
 * resolveMeterInputOhms(0) // null
 */
export function resolveMeterInputOhms(meterInputOhms?: number | null): number | null {
  if (meterInputOhms === undefined) return DEFAULT_METER_INPUT_OHMS;
  if (meterInputOhms === null || meterInputOhms === 0 || meterInputOhms === Infinity) return null;
  requirePositive(meterInputOhms, 'meterInputOhms', "The meter's input resistance");
  return meterInputOhms;
}

/**
 * Capacitance from a time constant and the resistance it discharged through: C = τ / R.
 *
 * @param tauSeconds - seconds
 * @param ohms - effective discharge resistance, ohms
 * @returns microfarads
 * @example
 * capacitanceFromTauMicrofarads(220.9, 94_000) // ≈ 2350
 */
export function capacitanceFromTauMicrofarads(tauSeconds: number, ohms: number): number {
  requirePositive(ohms, 'ohms', 'The discharge resistance');
  return (tauSeconds / ohms) * 1e6;
}

/**
 * Time constant of a resistance and a capacitance: τ = R·C (ohm × farad = second).
 *
 * @param ohms - ohms
 * @param capacitanceMicrofarads - microfarads
 * @returns seconds
 * @example
 * tauSecondsOf(94_000, 2350) // 220.9
 */
export function tauSecondsOf(ohms: number, capacitanceMicrofarads: number): number {
  return ohms * capacitanceMicrofarads * 1e-6;
}

/** A bank's construction: identical units, `seriesCount` in series per string, `parallelCount` strings. */
export interface BankConstruction {
  /** Nameplate capacitance of one unit (can), microfarads. */
  unitCapacitanceMicrofarads: number;
  /** Units in series per string (≥ 1). */
  seriesCount: number;
  /** Strings in parallel (≥ 1). */
  parallelCount: number;
}

/**
 * Nominal bank capacitance: C_bank = p × C_unit / s.
 *
 * @example
 * bankCapacitanceMicrofarads({ unitCapacitanceMicrofarads: 4700, seriesCount: 2, parallelCount: 1 }) // 2350
 */
export function bankCapacitanceMicrofarads(bank: BankConstruction): number {
  requirePositive(
    bank.unitCapacitanceMicrofarads,
    'unitCapacitanceMicrofarads',
    'The unit capacitance',
    'invalid-option',
  );
  requireCount(bank.seriesCount, 'seriesCount');
  requireCount(bank.parallelCount, 'parallelCount');
  return (bank.parallelCount * bank.unitCapacitanceMicrofarads) / bank.seriesCount;
}

/**
 * Bleeder resistance formed by balancing resistors: `seriesCount` resistors in series across the
 * bus, in `stringCount` parallel sets (1 when the strings share one set of balancing resistors).
 *
 * @example
 * bleederOhmsFromBalancingResistors({ resistorOhms: 47_000, seriesCount: 2 }) // 94 000
 */
export function bleederOhmsFromBalancingResistors(input: {
  resistorOhms: number;
  seriesCount: number;
  stringCount?: number;
}): number {
  requirePositive(input.resistorOhms, 'resistorOhms', 'The balancing resistor');
  requireCount(input.seriesCount, 'seriesCount');
  const strings = input.stringCount ?? 1;
  requireCount(strings, 'stringCount');
  return (input.seriesCount * input.resistorOhms) / strings;
}

/**
 * How a design's capacitance depends on temperature, relative to its value at 20 °C:
 * a linear coefficient, or a curve of points (linear interpolation between them).
 */
export type CapacitanceTemperatureModel =
  | {
      kind: 'coefficient';
      /** Fractional change of capacitance per kelvin, e.g. 0.002 for +0.2 %/K. */
      perKelvin: number;
    }
  | {
      kind: 'curve';
      /** Capacitance at `tempC` divided by capacitance at 20 °C; at least two points. */
      points: readonly { tempC: number; relativeToTwentyC: number }[];
    };

/** Result of {@link normaliseCapacitanceTo20C}. */
export interface NormalisedCapacitance {
  /** Capacitance at 20 °C, microfarads. */
  capacitanceAt20CMicrofarads: number;
  /** C(T) / C(20 °C) used for the correction. */
  relativeToTwentyC: number;
  /** A plain-words note when the curve was extended beyond its points; otherwise null. */
  note: string | null;
}

/**
 * Normalises a capacitance measured at `bankTempC` to 20 °C (the reference temperature of
 * IEC 60384-1/-4) with the design's temperature model.
 *
 * @param capacitanceMicrofarads - measured at `bankTempC`, microfarads
 * @param bankTempC - bank temperature during the run, °C
 * @param model - the design's model
 * @example
 * normaliseCapacitanceTo20C(2397, 30, { kind: 'coefficient', perKelvin: 0.002 })
 * // { capacitanceAt20CMicrofarads: 2350, relativeToTwentyC: 1.02, note: null }
 */
export function normaliseCapacitanceTo20C(
  capacitanceMicrofarads: number,
  bankTempC: number,
  model: CapacitanceTemperatureModel,
): NormalisedCapacitance {
  if (!Number.isFinite(bankTempC)) {
    throw new EngineInputError(
      'invalid-number',
      `The bank temperature must be a number of °C, got ${String(bankTempC)}.`,
      [{ path: 'bankTempC', message: 'not a number' }],
    );
  }
  let relative: number;
  let note: string | null = null;
  if (model.kind === 'coefficient') {
    if (!Number.isFinite(model.perKelvin)) {
      throw new EngineInputError(
        'invalid-option',
        'The temperature coefficient must be a number per kelvin.',
        [{ path: 'capacitanceTemperature.perKelvin', message: 'not a number' }],
      );
    }
    relative = 1 + model.perKelvin * (bankTempC - 20);
  } else {
    const points = [...model.points].sort((a, b) => a.tempC - b.tempC);
    if (
      points.length < 2 ||
      points.some((p) => !Number.isFinite(p.tempC) || !(p.relativeToTwentyC > 0))
    ) {
      throw new EngineInputError(
        'invalid-option',
        'A temperature curve needs at least two points with a positive relative capacitance.',
        [{ path: 'capacitanceTemperature.points', message: 'at least two valid points' }],
      );
    }
    let i = 0;
    while (i < points.length - 2 && bankTempC > points[i + 1]!.tempC) i++;
    const a = points[i]!;
    const b = points[i + 1]!;
    relative =
      a.relativeToTwentyC +
      ((bankTempC - a.tempC) * (b.relativeToTwentyC - a.relativeToTwentyC)) / (b.tempC - a.tempC);
    if (bankTempC < points[0]!.tempC || bankTempC > points[points.length - 1]!.tempC) {
      note = `The bank temperature ${formatNumber(bankTempC, 3)} °C is outside the design's temperature curve (${formatNumber(points[0]!.tempC, 3)} to ${formatNumber(points[points.length - 1]!.tempC, 3)} °C); the curve was extended in a straight line.`;
    }
  }
  if (!(relative > 0.2 && relative < 5)) {
    throw new EngineInputError(
      'invalid-option',
      `The temperature model gives an implausible factor ${formatNumber(relative, 3)} at ${formatNumber(bankTempC, 3)} °C.`,
      [{ path: 'capacitanceTemperature', message: 'implausible factor' }],
    );
  }
  return {
    capacitanceAt20CMicrofarads: capacitanceMicrofarads / relative,
    relativeToTwentyC: relative,
    note,
  };
}

function requirePositive(
  value: number,
  path: string,
  what: string,
  code: 'invalid-resistance' | 'invalid-option' = 'invalid-resistance',
): void {
  if (typeof value !== 'number' || !(value > 0) || !Number.isFinite(value)) {
    throw new EngineInputError(code, `${what} must be a positive number, got ${String(value)}.`, [
      { path, message: 'must be positive' },
    ]);
  }
}

function requireCount(value: number, path: string): void {
  if (!Number.isInteger(value) || value < 1) {
    throw new EngineInputError(
      'invalid-option',
      `${path} must be a whole number of at least 1, got ${String(value)}.`,
      [{ path, message: 'whole number ≥ 1' }],
    );
  }
}
