import { describe, expect, it } from 'vitest';
import {
  BANK_SETUP_MINUTES,
  CAPTURE_TIME_CONSTANTS,
  UNKNOWN_MARKED_WAIT_MINUTES,
} from '../../../shared/constants/planning-estimates';
import {
  estimateBankMinutes,
  estimateVisitMinutes,
  plannedWaitMinutes,
} from '../../../shared/domain/visit-duration';

describe('the estimate’s constants', () => {
  it('when a capture lasts 5 τ, then less than 1 % of the voltage is left (DOMAIN.md: e^-5 ≈ 0.67 %)', () => {
    expect(CAPTURE_TIME_CONSTANTS).toBe(5);
    expect(Math.exp(-CAPTURE_TIME_CONSTANTS)).toBeLessThan(0.01);
  });

  it('when the marked wait is unknown, then the longest wait drive manuals commonly mark is planned (3–15 min, DOMAIN.md)', () => {
    expect(UNKNOWN_MARKED_WAIT_MINUTES).toBe(15);
  });
});

describe('plannedWaitMinutes', () => {
  it('when the cabinet has a marked wait, then it is planned as it is', () => {
    expect(plannedWaitMinutes({ markedWaitMinutes: 7 })).toBe(7);
    expect(plannedWaitMinutes({ markedWaitMinutes: 0 })).toBe(0);
  });

  it('when the cabinet has none, then the unknown wait is planned', () => {
    expect(plannedWaitMinutes({ markedWaitMinutes: null })).toBe(UNKNOWN_MARKED_WAIT_MINUTES);
  });

  it('when the marked wait is not a number of minutes, then the unknown wait is planned', () => {
    expect(plannedWaitMinutes({ markedWaitMinutes: Number.NaN })).toBe(UNKNOWN_MARKED_WAIT_MINUTES);
    expect(plannedWaitMinutes({ markedWaitMinutes: -3 })).toBe(UNKNOWN_MARKED_WAIT_MINUTES);
  });
});

describe('estimateBankMinutes', () => {
  it('when τ is 120 s and the marked wait 5 min, then 15 min setup + 10 min capture + 5 min wait = 30 min', () => {
    expect(BANK_SETUP_MINUTES).toBe(15);
    expect(estimateBankMinutes({ baselineTauSeconds: 120 }, { markedWaitMinutes: 5 })).toBe(30);
  });

  it('when τ is not a whole share of a minute, then the minutes are not rounded (5 × 100 s = 8⅓ min)', () => {
    expect(estimateBankMinutes({ baselineTauSeconds: 100 }, { markedWaitMinutes: 5 })).toBeCloseTo(
      15 + 500 / 60 + 5,
      10,
    );
  });

  it('when another setup time is given, then it replaces the default', () => {
    expect(
      estimateBankMinutes(
        { baselineTauSeconds: 120 },
        { markedWaitMinutes: 5 },
        { setupMinutes: 0 },
      ),
    ).toBe(15);
  });

  it('when the cabinet’s wait is unknown, then 15 min are planned for it', () => {
    expect(estimateBankMinutes({ baselineTauSeconds: 60 }, { markedWaitMinutes: null })).toBe(
      15 + 5 + 15,
    );
  });

  it('when τ is zero, negative or not a number, then it refuses', () => {
    for (const tau of [0, -1, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(() =>
        estimateBankMinutes({ baselineTauSeconds: tau }, { markedWaitMinutes: 5 }),
      ).toThrow(RangeError);
    }
  });
});

describe('estimateVisitMinutes', () => {
  it('when a visit covers two banks, then their minutes add up', () => {
    expect(
      estimateVisitMinutes([{ baselineTauSeconds: 120 }, { baselineTauSeconds: 180 }], {
        markedWaitMinutes: 5,
      }),
    ).toBe(30 + 35);
  });

  it('when the sum has a fraction, then it is rounded up to the next minute (2 × 28⅓ = 56⅔ → 57)', () => {
    expect(
      estimateVisitMinutes([{ baselineTauSeconds: 100 }, { baselineTauSeconds: 100 }], {
        markedWaitMinutes: 5,
      }),
    ).toBe(57);
  });

  it('when the sum is whole but float arithmetic leaves a crumb above it, then it is not rounded up', () => {
    // 10 banks of τ = 4.8 s: 10 × (15 + 0.4 + 0) = 154 min, summed in floats as 154.00000000000003
    const banks = Array.from({ length: 10 }, () => ({ baselineTauSeconds: 4.8 }));
    expect(banks.reduce((sum) => sum + 15 + (5 * 4.8) / 60, 0)).toBeGreaterThan(154);
    expect(estimateVisitMinutes(banks, { markedWaitMinutes: 0 })).toBe(154);
  });

  it('when there are no banks, then the visit takes no time', () => {
    expect(estimateVisitMinutes([], { markedWaitMinutes: 5 })).toBe(0);
  });
});
