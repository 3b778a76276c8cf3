import { describe, expect, it } from 'vitest';
import {
  estimateArrheniusLife,
  HOURS_PER_YEAR,
  lifeUsed,
} from '../../../shared/domain/life-estimate';
import { EngineInputError } from '../../../shared/domain/errors';

describe('estimateArrheniusLife', () => {
  const rated = { ratedLifeHours: 5000, ratedTempC: 105 };

  it('when the bank runs 40 K below its rating, then life is 2⁴ = 16 times the rating', () => {
    const estimate = estimateArrheniusLife({ ...rated, operatingTempC: 65 });
    expect(estimate.accelerationFactor).toBeCloseTo(16, 12);
    expect(estimate.expectedLifeYears).toBeCloseTo((16 * 5000) / HOURS_PER_YEAR, 9);
    expect(estimate.notes.some((n) => n.includes('60 and 105'))).toBe(false);
  });

  it('when the temperature is between steps, then the rule is continuous (2^(Δ/10))', () => {
    expect(estimateArrheniusLife({ ...rated, operatingTempC: 100 }).accelerationFactor).toBeCloseTo(
      Math.SQRT2,
      12,
    );
  });

  it('when a voltage derating with exponent n is given, then life grows as (V/V0)^−n', () => {
    const plain = estimateArrheniusLife({ ...rated, operatingTempC: 85 });
    const derated = estimateArrheniusLife({
      ...rated,
      operatingTempC: 85,
      voltage: { ratedVolts: 450, operatingVolts: 360, exponent: 4 },
    });
    expect(derated.expectedLifeHours / plain.expectedLifeHours).toBeCloseTo((360 / 450) ** -4, 12);
  });

  it('when the drive is powered half the time, then the calendar life doubles', () => {
    const full = estimateArrheniusLife({ ...rated, operatingTempC: 75 });
    const half = estimateArrheniusLife({ ...rated, operatingTempC: 75, poweredFraction: 0.5 });
    expect(half.expectedLifeYears / full.expectedLifeYears).toBeCloseTo(2, 12);
  });

  it('when the temperature is outside 60–105 °C, then a note says the rule is only a rough guide there', () => {
    expect(estimateArrheniusLife({ ...rated, operatingTempC: 40 }).notes.join(' ')).toMatch(
      /60 and 105 °C/,
    );
  });

  it('when the inputs are not numbers, then EngineInputError', () => {
    expect(() =>
      estimateArrheniusLife({ ...rated, ratedLifeHours: 0, operatingTempC: 60 }),
    ).toThrow(EngineInputError);
    expect(() => estimateArrheniusLife({ ...rated, operatingTempC: Number.NaN })).toThrow(
      EngineInputError,
    );
    expect(() =>
      estimateArrheniusLife({ ...rated, operatingTempC: 60, poweredFraction: 0 }),
    ).toThrow(EngineInputError);
  });
});

describe('lifeUsed', () => {
  const estimate = estimateArrheniusLife({
    ratedLifeHours: 5000,
    ratedTempC: 105,
    operatingTempC: 65,
  });

  it('when a bank has served half its expected life, then half is used and the rest remains', () => {
    const halfDays = Math.round((estimate.expectedLifeYears / 2) * 365.2425);
    const since = '2020-01-01';
    const asOf = new Date(Date.UTC(2020, 0, 1 + halfDays)).toISOString().slice(0, 10);
    const used = lifeUsed(estimate, since, asOf);
    expect(used.fractionUsed).toBeCloseTo(0.5, 3);
    expect(used.remainingYears).toBeCloseTo(estimate.expectedLifeYears / 2, 2);
  });

  it('when the bank is past its expected life, then more than all of it is used and nothing remains', () => {
    const used = lifeUsed(estimate, '2000-01-01', '2024-01-01');
    expect(used.fractionUsed).toBeGreaterThan(1);
    expect(used.remainingYears).toBe(0);
  });
});
