import { describe, expect, it } from 'vitest';
import { fitLogLinear, refineExponential } from '../../../shared/domain/exponential-least-squares';
import { evenTimes, exponentialDecay, seededRandom } from './support/synthetic-decay';

describe('fitLogLinear', () => {
  it('when the decay is exact, then both weightings recover V0 and the rate', () => {
    const samples = exponentialDecay({ v0Volts: 500, tauSeconds: 200, times: evenTimes(6, 100) });
    for (const weighting of ['volts-squared', 'none'] as const) {
      const fit = fitLogLinear(
        samples.map((s) => s.tSeconds),
        samples.map((s) => s.volts),
        weighting,
      )!;
      expect(fit.v0Volts).toBeCloseTo(500, 9);
      expect(fit.ratePerSecond).toBeCloseTo(1 / 200, 12);
    }
  });

  it('when a reading is masked out, then it has no influence', () => {
    const samples = exponentialDecay({ v0Volts: 500, tauSeconds: 200, times: evenTimes(6, 100) });
    const volts = samples.map((s, i) => (i === 2 ? 1 : s.volts));
    const fit = fitLogLinear(
      samples.map((s) => s.tSeconds),
      volts,
      'volts-squared',
      [1, 1, 0, 1, 1, 1],
    )!;
    expect(fit.ratePerSecond).toBeCloseTo(1 / 200, 12);
  });

  it('when all readings share one time, then there is no line', () => {
    expect(fitLogLinear([5, 5], [100, 90])).toBeNull();
  });
});

describe('refineExponential', () => {
  it('when started far off, then it converges to the least-squares solution', () => {
    const random = seededRandom(2);
    const samples = exponentialDecay({
      v0Volts: 650,
      tauSeconds: 80,
      times: evenTimes(30, 10),
      noiseVolts: 2,
      random,
    });
    const t = samples.map((s) => s.tSeconds);
    const v = samples.map((s) => s.volts);
    const fromGood = refineExponential(t, v, fitLogLinear(t, v)!);
    const fromBad = refineExponential(t, v, { v0Volts: 100, ratePerSecond: 0.1 });
    expect(fromBad.converged).toBe(true);
    expect(fromBad.ratePerSecond).toBeCloseTo(fromGood.ratePerSecond, 9);
    // At the minimum the gradient vanishes: nudging τ either way raises the sum of squares.
    const rss = (rate: number): number =>
      v.reduce((sum, vi, i) => sum + (vi - fromGood.v0Volts * Math.exp(-rate * t[i]!)) ** 2, 0);
    expect(rss(fromGood.ratePerSecond * 1.001)).toBeGreaterThan(fromGood.rssVoltsSquared);
    expect(rss(fromGood.ratePerSecond * 0.999)).toBeGreaterThan(fromGood.rssVoltsSquared);
  });

  it('when the readings start late, then the covariance is carried over to V0 at t = 0 consistently', () => {
    const random = seededRandom(3);
    const samples = exponentialDecay({
      v0Volts: 600,
      tauSeconds: 100,
      times: evenTimes(20, 10, 300),
      noiseVolts: 0.5,
      random,
    });
    const fit = refineExponential(
      samples.map((s) => s.tSeconds),
      samples.map((s) => s.volts),
      { v0Volts: 600, ratePerSecond: 0.01 },
    );
    expect(fit.inverseNormal.v0v0).toBeGreaterThan(0);
    expect(fit.inverseNormal.rateRate).toBeGreaterThan(0);
    // Cauchy–Schwarz: |cov| ≤ √(var·var) for a valid covariance.
    expect(fit.inverseNormal.v0Rate ** 2).toBeLessThanOrEqual(
      fit.inverseNormal.v0v0 * fit.inverseNormal.rateRate * (1 + 1e-9),
    );
  });
});
