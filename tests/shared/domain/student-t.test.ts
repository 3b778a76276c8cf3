import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { tCdf, tQuantile } from '../../../shared/domain/student-t';

describe('tQuantile and tCdf', () => {
  it('when the quantile is fed back to the CDF, then the probability comes back', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.001, max: 0.999, noNaN: true }),
        fc.integer({ min: 1, max: 500 }),
        (p, df) => {
          return Math.abs(tCdf(tQuantile(p, df), df) - p) < 1e-9;
        },
      ),
      { seed: 12, numRuns: 300 },
    );
  });

  it('when p and 1 − p are asked, then the quantiles are mirror images', () => {
    expect(tQuantile(0.05, 7)).toBeCloseTo(-tQuantile(0.95, 7), 12);
  });

  it('when there is one degree of freedom, then it is the Cauchy distribution: tan(π(p − ½))', () => {
    expect(tQuantile(0.9, 1)).toBeCloseTo(Math.tan(Math.PI * 0.4), 9);
  });

  it('when the arguments are out of range, then RangeError', () => {
    expect(() => tQuantile(1, 5)).toThrow(RangeError);
    expect(() => tQuantile(0.5, 0.5)).toThrow(RangeError);
  });
});
