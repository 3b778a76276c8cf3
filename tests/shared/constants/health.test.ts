import { describe, expect, it } from 'vitest';
import {
  DEFAULT_HEALTH_LIMITS,
  DEFAULT_METER_INPUT_OHMS,
  HEALTH_LABELS,
  HEALTH_NAMES,
  isHealthName,
} from '../../../shared/constants/health';

describe('health constants', () => {
  it("when health states are listed, then they run best to worst with the trade's labels", () => {
    expect(HEALTH_NAMES).toEqual(['healthy', 'watch', 'end-of-life']);
    expect(HEALTH_NAMES.map((name) => HEALTH_LABELS[name])).toEqual([
      'healthy',
      'watch',
      'end of life',
    ]);
  });

  it('when defaults are read, then they are the DOMAIN.md figures (electrolytic 0.90/0.80, film 0.97/0.95, 10 MΩ meter)', () => {
    expect(DEFAULT_HEALTH_LIMITS.electrolytic).toEqual({ watchRatio: 0.9, endOfLifeRatio: 0.8 });
    expect(DEFAULT_HEALTH_LIMITS.film).toEqual({ watchRatio: 0.97, endOfLifeRatio: 0.95 });
    expect(DEFAULT_METER_INPUT_OHMS).toBe(10e6);
  });

  it('when a value is checked, then only the three names pass', () => {
    expect(isHealthName('end-of-life')).toBe(true);
    expect(isHealthName('end of life')).toBe(false);
  });
});
