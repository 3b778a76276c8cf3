import { describe, expect, it } from 'vitest';
import {
  estimateDischargeSafety,
  iec60204Sentence,
  timeToVoltsSeconds,
} from '../../../shared/domain/discharge-safety';
import { DISCHARGE_CAUTION } from '../../../shared/constants/safety';
import { EngineInputError } from '../../../shared/domain/errors';

describe('timeToVoltsSeconds', () => {
  it('when the bus starts at 560 V with τ = 220.9 s, then 60 V comes after τ · ln(560/60)', () => {
    expect(timeToVoltsSeconds(220.9, 560, 60)).toBeCloseTo(220.9 * Math.log(560 / 60), 9);
  });

  it('when the start voltage is already below the threshold, then the time is 0', () => {
    expect(timeToVoltsSeconds(100, 48, 50)).toBe(0);
  });

  it('when τ doubles, then the time doubles', () => {
    expect(timeToVoltsSeconds(400, 650, 50) / timeToVoltsSeconds(200, 650, 50)).toBeCloseTo(2, 12);
  });

  it('when τ is not positive, then it is refused', () => {
    expect(() => timeToVoltsSeconds(0, 560, 60)).toThrow(EngineInputError);
  });
});

describe('estimateDischargeSafety', () => {
  const base = { busTauSeconds: 220.9, fromVolts: 560, fromSource: 'nominal-bus' as const };

  it('when every estimate is made, then it carries the discharge caution', () => {
    expect(estimateDischargeSafety(base).caution).toBe(DISCHARGE_CAUTION);
  });

  it('when the time to 50 V is within the marked wait, then nothing is flagged', () => {
    const estimate = estimateDischargeSafety({ ...base, markedWaitSeconds: 15 * 60 });
    expect(estimate.safeAfterSeconds['50']).toBeCloseTo(220.9 * Math.log(560 / 50), 9);
    expect(estimate.exceedsMarkedWait).toBe(false);
    expect(estimate.flagged).toBe(false);
  });

  it('when the time to 50 V is longer than the marked wait, then it is flagged with a finding', () => {
    const estimate = estimateDischargeSafety({ ...base, markedWaitSeconds: 5 * 60 });
    expect(estimate.exceedsMarkedWait).toBe(true);
    expect(estimate.flagged).toBe(true);
    expect(estimate.findings[0]).toMatch(/longer than the marked wait time/);
  });

  it('when only the upper 95 % τ exceeds the marked wait, then it is flagged as a possibility', () => {
    const marked = 220.9 * Math.log(560 / 50) + 5;
    const estimate = estimateDischargeSafety({
      ...base,
      busTauHigh95Seconds: 230,
      markedWaitSeconds: marked,
    });
    expect(estimate.exceedsMarkedWait).toBe(true);
    expect(estimate.findings[0]).toMatch(/may need up to/);
  });

  it('when τ has grown beyond the tolerance against the baseline, then it is flagged', () => {
    const estimate = estimateDischargeSafety({ ...base, baselineBusTauSeconds: 180 });
    expect(estimate.grownAgainstBaseline).toBe(true);
    expect(estimate.baselineSafeAfterSeconds!['60']).toBeCloseTo(180 * Math.log(560 / 60), 9);
    expect(estimate.findings.join(' ')).toMatch(/longer than at the baseline/);
  });

  it('when τ is within the tolerance of the baseline, then it is not flagged', () => {
    expect(
      estimateDischargeSafety({ ...base, baselineBusTauSeconds: 215 }).grownAgainstBaseline,
    ).toBe(false);
  });

  it('when the bus takes minutes to reach 60 V, then it does not meet the 5 s of IEC 60204-1', () => {
    expect(estimateDischargeSafety(base).meetsIec60204Within5Seconds).toBe(false);
    expect(estimateDischargeSafety({ ...base, busTauSeconds: 1 }).meetsIec60204Within5Seconds).toBe(
      true,
    );
  });

  it('when the marked wait is not positive, then it is refused', () => {
    expect(() => estimateDischargeSafety({ ...base, markedWaitSeconds: -1 })).toThrow(
      EngineInputError,
    );
  });
});

describe('iec60204Sentence', () => {
  it('when the bus needs longer than 5 s, then the sentence asks for a durable warning', () => {
    expect(iec60204Sentence(493)).toMatch(/durable warning/);
  });

  it('when the bus is below 60 V within 5 s, then the sentence says it meets the clause', () => {
    expect(iec60204Sentence(3)).toMatch(/within 5 s/);
  });
});
