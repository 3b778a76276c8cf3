import { describe, expect, it } from 'vitest';
import {
  isPlausibleRatio,
  PLAUSIBLE_RATIO,
  classifyHealth,
  resolveHealthLimits,
  worseHealth,
} from '../../../shared/domain/health-rules';
import { DEFAULT_HEALTH_LIMITS } from '../../../shared/constants/health';

describe('resolveHealthLimits', () => {
  it('when a design has no limits, then the defaults of its technology apply (DOMAIN.md: 0.90/0.80 and 0.97/0.95)', () => {
    expect(resolveHealthLimits('electrolytic')).toEqual({ watchRatio: 0.9, endOfLifeRatio: 0.8 });
    expect(resolveHealthLimits('film')).toEqual({ watchRatio: 0.97, endOfLifeRatio: 0.95 });
  });

  it("when a design has its own limits (a drive manual's 85 %), then they apply", () => {
    expect(resolveHealthLimits('electrolytic', { watchRatio: 0.92, endOfLifeRatio: 0.85 })).toEqual(
      { watchRatio: 0.92, endOfLifeRatio: 0.85 },
    );
  });

  it('when end of life is not below watch, then the limits are refused', () => {
    expect(() =>
      resolveHealthLimits('electrolytic', { watchRatio: 0.8, endOfLifeRatio: 0.9 }),
    ).toThrow(/end of life < watch/);
  });

  it('when the technology is unknown, then it is refused', () => {
    expect(() => resolveHealthLimits('ceramic' as never)).toThrow(/Unknown capacitor technology/);
  });
});

describe('classifyHealth', () => {
  const limits = DEFAULT_HEALTH_LIMITS.electrolytic;

  it('when the ratio is at or above the watch ratio, then healthy', () => {
    expect(classifyHealth(limits.watchRatio, limits)).toBe('healthy');
    expect(classifyHealth(1.02, limits)).toBe('healthy');
  });

  it('when the ratio is just below the watch ratio, then watch', () => {
    expect(classifyHealth(limits.watchRatio - 1e-9, limits)).toBe('watch');
    expect(classifyHealth(limits.endOfLifeRatio, limits)).toBe('watch');
  });

  it('when the ratio is below the end-of-life ratio, then end of life', () => {
    expect(classifyHealth(limits.endOfLifeRatio - 1e-9, limits)).toBe('end-of-life');
  });

  it('when a film bank has lost 4 %, then it is on watch, not healthy', () => {
    expect(classifyHealth(0.96, DEFAULT_HEALTH_LIMITS.film)).toBe('watch');
  });
});

describe('worseHealth', () => {
  it('when two states are combined, then the worse one wins', () => {
    expect(worseHealth('healthy', 'watch')).toBe('watch');
    expect(worseHealth('end-of-life', 'watch')).toBe('end-of-life');
    expect(worseHealth('healthy', 'healthy')).toBe('healthy');
  });
});

describe('isPlausibleRatio', () => {
  it('when the ratio is anywhere ageing can take a bank, then plausible, the bounds included', () => {
    for (const ratio of [0.3, 0.5, 0.79, 0.9, 1, 1.1, 1.3])
      expect(isPlausibleRatio(ratio)).toBe(true);
  });

  it('when the ratio is above 130 % or below 30 % of the baseline, then not plausible', () => {
    expect(PLAUSIBLE_RATIO).toEqual({ low: 0.3, high: 1.3 });
    for (const ratio of [1.31, 3.355, 0.29, 0.01, Number.NaN, Number.POSITIVE_INFINITY])
      expect(isPlausibleRatio(ratio)).toBe(false);
  });
});
