import { describe, expect, it } from 'vitest';
import {
  bankCapacitanceMicrofarads,
  bleederOhmsFromBalancingResistors,
  capacitanceFromTauMicrofarads,
  effectiveDischargeOhms,
  normaliseCapacitanceTo20C,
  resolveMeterInputOhms,
} from '../../../shared/domain/capacitance';
import { EngineInputError } from '../../../shared/domain/errors';
import { DEFAULT_METER_INPUT_OHMS } from '../../../shared/constants/health';

describe('effectiveDischargeOhms', () => {
  it('when no meter resistance is given, then the 10 MΩ default is in parallel with the bleeder', () => {
    expect(effectiveDischargeOhms(470_000)).toBeCloseTo(
      (470_000 * DEFAULT_METER_INPUT_OHMS) / (470_000 + DEFAULT_METER_INPUT_OHMS),
      6,
    );
  });

  it('when the meter is null or 0, then there is no loading', () => {
    expect(effectiveDischargeOhms(94_000, null)).toBe(94_000);
    expect(effectiveDischargeOhms(94_000, 0)).toBe(94_000);
  });

  it('when a 1 MΩ logger input is given, then it is used', () => {
    expect(effectiveDischargeOhms(1_000_000, 1_000_000)).toBe(500_000);
  });

  it('when the bleeder is not positive, then an EngineInputError says so', () => {
    expect(() => effectiveDischargeOhms(0)).toThrow(EngineInputError);
    expect(() => effectiveDischargeOhms(-5)).toThrow(
      /bleeder resistance must be a positive number/,
    );
    expect(() => effectiveDischargeOhms(Number.NaN)).toThrow(EngineInputError);
  });

  it('when the meter resistance is negative, then it is refused', () => {
    expect(() => resolveMeterInputOhms(-1)).toThrow(
      expect.objectContaining({ code: 'invalid-resistance' }),
    );
  });
});

describe('capacitance from τ and bank construction', () => {
  it('when τ is divided by R, then the capacitance is in microfarads', () => {
    expect(capacitanceFromTauMicrofarads(2, 2_000)).toBeCloseTo(1000, 9);
  });

  it('when 3 strings of 2 cans of 3300 µF are built, then the bank has 4950 µF', () => {
    expect(
      bankCapacitanceMicrofarads({
        unitCapacitanceMicrofarads: 3300,
        seriesCount: 2,
        parallelCount: 3,
      }),
    ).toBeCloseTo((3 * 3300) / 2, 9);
  });

  it('when the counts are not whole numbers of at least 1, then the construction is refused', () => {
    expect(() =>
      bankCapacitanceMicrofarads({
        unitCapacitanceMicrofarads: 3300,
        seriesCount: 0,
        parallelCount: 1,
      }),
    ).toThrow(EngineInputError);
    expect(() =>
      bankCapacitanceMicrofarads({
        unitCapacitanceMicrofarads: 3300,
        seriesCount: 1.5,
        parallelCount: 1,
      }),
    ).toThrow(EngineInputError);
  });

  it('when each of 2 strings has its own pair of balancing resistors, then the bleeder is the two pairs in parallel', () => {
    expect(
      bleederOhmsFromBalancingResistors({ resistorOhms: 33_000, seriesCount: 2, stringCount: 2 }),
    ).toBe(33_000);
  });
});

describe('normaliseCapacitanceTo20C', () => {
  it('when a coefficient is given, then C20 = C(T) / (1 + α (T − 20))', () => {
    const result = normaliseCapacitanceTo20C(2400, 35, { kind: 'coefficient', perKelvin: 0.002 });
    expect(result.capacitanceAt20CMicrofarads).toBeCloseTo(2400 / (1 + 0.002 * 15), 9);
    expect(result.note).toBeNull();
  });

  it('when the bank is at 20 °C, then nothing changes', () => {
    expect(
      normaliseCapacitanceTo20C(2400, 20, { kind: 'coefficient', perKelvin: 0.003 })
        .capacitanceAt20CMicrofarads,
    ).toBe(2400);
  });

  it('when a curve is given, then it is interpolated linearly between its points', () => {
    const curve = {
      kind: 'curve' as const,
      points: [
        { tempC: 60, relativeToTwentyC: 1.08 },
        { tempC: 0, relativeToTwentyC: 0.9 },
        { tempC: 20, relativeToTwentyC: 1 },
      ],
    };
    expect(normaliseCapacitanceTo20C(1040, 40, curve).relativeToTwentyC).toBeCloseTo(1.04, 12);
    expect(normaliseCapacitanceTo20C(950, 10, curve).capacitanceAt20CMicrofarads).toBeCloseTo(
      950 / 0.95,
      9,
    );
  });

  it('when the temperature is outside the curve, then the curve is extended and a note says so', () => {
    const curve = {
      kind: 'curve' as const,
      points: [
        { tempC: 0, relativeToTwentyC: 0.9 },
        { tempC: 20, relativeToTwentyC: 1 },
      ],
    };
    const result = normaliseCapacitanceTo20C(1000, 30, curve);
    expect(result.relativeToTwentyC).toBeCloseTo(1.05, 12);
    expect(result.note).toMatch(/outside the design's temperature curve/);
  });

  it('when the model gives an implausible factor, then it is refused', () => {
    expect(() =>
      normaliseCapacitanceTo20C(1000, 80, { kind: 'coefficient', perKelvin: -0.02 }),
    ).toThrow(EngineInputError);
  });
});
