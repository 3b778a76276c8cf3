import { describe, expect, it } from 'vitest';
import {
  bankRatingProblem,
  baselineTauQuestion,
  collectIssues,
  dcBusQuestion,
  futureDateQuestion,
  oneYearAfter,
} from '../../../shared/domain/register-plausibility';

describe('dcBusQuestion', () => {
  // rectifier arithmetic (DOMAIN.md): a six-pulse bridge gives 3√2/π ≈ 1.35 × the line voltage
  // under load, up to √2 ≈ 1.41 × at light load; 400 V → 540–565 V, 690 V → 930–975 V
  it.each([
    [230, 310],
    [230, 325],
    [400, 540],
    [400, 565],
    [480, 650],
    [480, 680],
    [690, 930],
    [690, 975],
  ])(
    'when the bus follows the rectifier arithmetic (%s V AC, %s V DC), then no question',
    (supply, bus) => {
      expect(dcBusQuestion(supply, bus)).toBeNull();
    },
  );

  it('when the bus is 5 V on a 400 V supply, then it asks, naming the expected range', () => {
    expect(dcBusQuestion(400, 5)).toMatch(
      /5 V DC bus on a 400 V supply is unlikely: expect about 540–564 V/,
    );
  });

  it('when the bus equals the line voltage (1.0 ×) or is twice it, then it asks', () => {
    expect(dcBusQuestion(400, 400)).not.toBeNull();
    expect(dcBusQuestion(400, 800)).not.toBeNull();
  });

  it('when the bus is at the edges of the 1.2–1.5 band, then no question', () => {
    expect(dcBusQuestion(400, 480)).toBeNull();
    expect(dcBusQuestion(400, 600)).toBeNull();
    expect(dcBusQuestion(400, 479)).not.toBeNull();
    expect(dcBusQuestion(400, 601)).not.toBeNull();
  });

  it('when the bus is not known, then there is nothing to ask', () => {
    expect(dcBusQuestion(400, null)).toBeNull();
  });
});

describe('bankRatingProblem', () => {
  // DOMAIN.md: a 450 V can is common, so 400/480 V drives put cans in series pairs (2 × 450 = 900 V on a 540–680 V bus)
  it('when a series pair of 450 V cans sits on a 400 V drive’s 540 V bus, then it is fine', () => {
    expect(bankRatingProblem(900, 540)).toBeNull();
  });

  it('when a single 450 V can sits on a 930 V bus (690 V supply), then it is refused naming both voltages', () => {
    expect(bankRatingProblem(450, 930, 'Bank DC1')).toMatch(
      /^Bank DC1 is rated 450 V, below the cabinet's 930 V DC bus/,
    );
  });

  it('when the rating equals the bus, then it is fine; just below, refused', () => {
    expect(bankRatingProblem(540, 540)).toBeNull();
    expect(bankRatingProblem(539.5, 540)).not.toBeNull();
  });

  it('when the bus is not known, then nothing is refused', () => {
    expect(bankRatingProblem(450, null)).toBeNull();
  });
});

describe('baselineTauQuestion', () => {
  // τ = R × C (DOMAIN.md): 47 kΩ × 94 µF = 4.418 s
  it('when τ is R × C, then no question', () => {
    expect(baselineTauQuestion(4.418, 94, 47_000)).toBeNull();
  });

  it('when τ is within 30 % of R × C either way, then no question; beyond, it asks', () => {
    expect(baselineTauQuestion(4.418 * 1.29, 94, 47_000)).toBeNull();
    expect(baselineTauQuestion(4.418 * 0.71, 94, 47_000)).toBeNull();
    expect(baselineTauQuestion(4.418 * 1.31, 94, 47_000)).not.toBeNull();
    expect(baselineTauQuestion(4.418 * 0.69, 94, 47_000)).not.toBeNull();
  });

  it('when τ is 218 s with 1 µF on a 47 kΩ bleeder, then it asks, giving R × C', () => {
    expect(baselineTauQuestion(218, 1, 47_000)).toMatch(
      /τ of 218 s does not fit 1 µF with a 47000 Ω bleeder: R × C is 0.047 s/,
    );
  });
});

describe('futureDateQuestion', () => {
  it('when the date is today, in the past or within a year, then no question', () => {
    expect(futureDateQuestion('2026-12-02', '2026-12-02', 'install date')).toBeNull();
    expect(futureDateQuestion('1999-05-01', '2026-12-02', 'install date')).toBeNull();
    expect(futureDateQuestion('2027-12-02', '2026-12-02', 'install date')).toBeNull();
  });

  it('when the date is a year and a day ahead, or 9999, then it asks naming the date', () => {
    expect(futureDateQuestion('2027-12-03', '2026-12-02', 'install date')).toBe(
      'The install date 2027-12-03 is more than a year ahead: is the year right?',
    );
    expect(futureDateQuestion('9999-01-01', '2026-12-02', 'commissioning date')).not.toBeNull();
  });

  it('when the date is empty, then there is nothing to ask', () => {
    expect(futureDateQuestion(null, '2026-12-02', 'install date')).toBeNull();
  });
});

describe('oneYearAfter', () => {
  it('when the day is 29 February, then a year after is 1 March', () => {
    expect(oneYearAfter('2024-02-29')).toBe('2025-03-01');
    expect(oneYearAfter('2026-12-02')).toBe('2027-12-02');
  });
});

describe('collectIssues', () => {
  it('when some checks found something, then only those are issues, under their fields', () => {
    expect(
      collectIssues([
        ['dcBusVolts', 'odd'],
        ['commissionedOn', null],
      ]),
    ).toEqual([{ path: 'dcBusVolts', message: 'odd' }]);
  });
});
