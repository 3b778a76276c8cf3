/**
 * Property-based tests of the decay fit (fast-check, fixed seeds so every run sees the same cases).
 */

import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fitDecay } from '../../../shared/domain/decay-fit';
import { EngineInputError } from '../../../shared/domain/errors';
import { gaussian, seededRandom } from './support/synthetic-decay';

function everyNumberFinite(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (Array.isArray(value)) return value.every(everyNumberFinite);
  if (value && typeof value === 'object') return Object.values(value).every(everyNumberFinite);
  return true;
}

/** A random decay run: τ, V0, noise, number and spacing of readings. */
const decayCase = fc.record({
  tauSeconds: fc.double({ min: 5, max: 2000, noNaN: true }),
  v0Volts: fc.double({ min: 50, max: 1000, noNaN: true }),
  noiseFraction: fc.double({ min: 0.0005, max: 0.01, noNaN: true }),
  count: fc.integer({ min: 6, max: 60 }),
  spanTimeConstants: fc.double({ min: 1, max: 3, noNaN: true }),
  startTimeConstants: fc.double({ min: 0, max: 0.5, noNaN: true }),
  jittered: fc.boolean(),
  noiseSeed: fc.integer({ min: 1, max: 2 ** 31 - 1 }),
});

type DecayCase = typeof decayCase extends fc.Arbitrary<infer T> ? T : never;

function samplesOf(c: DecayCase): { tSeconds: number; volts: number }[] | null {
  const random = seededRandom(c.noiseSeed);
  const step = (c.spanTimeConstants * c.tauSeconds) / (c.count - 1);
  const start = c.startTimeConstants * c.tauSeconds;
  const samples: { tSeconds: number; volts: number }[] = [];
  for (let i = 0; i < c.count; i++) {
    // Jittered sampling: a technician reads the meter roughly, not exactly, every step.
    const tSeconds = start + step * (i + (c.jittered && i > 0 ? 0.4 * (random() - 0.5) : 0));
    const volts =
      c.v0Volts * Math.exp(-tSeconds / c.tauSeconds) +
      c.noiseFraction * c.v0Volts * gaussian(random);
    if (!(volts > 0)) return null;
    samples.push({ tSeconds, volts });
  }
  return samples;
}

describe('decay fit properties', () => {
  it('when τ, V0, noise and sampling are random, then the true τ lies inside the reported 95 % interval in about 95 % of cases', () => {
    const cases = fc.sample(decayCase, { seed: 20240611, numRuns: 600 });
    let covered = 0;
    let judged = 0;
    let unusable = 0;
    for (const c of cases) {
      const samples = samplesOf(c);
      if (!samples) continue;
      const fit = fitDecay(samples);
      if (fit.status !== 'ok') {
        unusable++;
        continue;
      }
      judged++;
      if (fit.tauCi95[0] <= c.tauSeconds && c.tauSeconds <= fit.tauCi95[1]) covered++;
    }
    const coverage = covered / judged;
    // 600 cases: the binomial standard deviation of 95 % coverage is 0.9 %; the band is about ±3.5 of it.
    expect(judged).toBeGreaterThan(550);
    expect(unusable).toBeLessThan(10);
    expect(coverage).toBeGreaterThan(0.92);
    expect(coverage).toBeLessThan(0.98);
  });

  it('when the decays are clean, then the recovered τ is within 3 standard errors of the truth', () => {
    fc.assert(
      fc.property(decayCase, (c) => {
        const samples = samplesOf({ ...c, noiseFraction: 0.001 });
        fc.pre(samples !== null);
        const fit = fitDecay(samples!);
        if (fit.status !== 'ok') return false;
        return (
          Math.abs(fit.tauSeconds - c.tauSeconds) <=
          4.5 * fit.tauStdErrorSeconds + 1e-9 * c.tauSeconds
        );
      }),
      { seed: 42, numRuns: 300 },
    );
  });

  it('when the input is arbitrary numbers, then the fit returns a result with finite numbers or throws an EngineInputError, never anything else', () => {
    const anyNumber = fc.oneof(
      fc.double(),
      fc.double({ min: -1e3, max: 1e4 }),
      fc.constantFrom(0, -0, 1e-300, 1e300, Number.NaN, Infinity, -Infinity),
    );
    const sample = fc.record({ tSeconds: anyNumber, volts: anyNumber });
    fc.assert(
      fc.property(fc.array(sample, { maxLength: 40 }), (samples) => {
        try {
          const result = fitDecay(samples);
          return everyNumberFinite(result) && (result.status === 'ok' || result.reason.length > 0);
        } catch (error) {
          return error instanceof EngineInputError && error.message.length > 0;
        }
      }),
      { seed: 7, numRuns: 1500 },
    );
  });

  it('when the input is a valid but strange decay (tiny, huge, sparse, rising tails), then no NaN and no untyped error', () => {
    const strange = fc
      .array(fc.double({ min: 1e-6, max: 1e6, noNaN: true }), { minLength: 0, maxLength: 30 })
      .chain((volts) =>
        fc
          .array(fc.double({ min: 1e-3, max: 1e5, noNaN: true }), {
            minLength: volts.length,
            maxLength: volts.length,
          })
          .map((gaps) => {
            let t = 0;
            return volts.map((v, i) => {
              t += gaps[i]!;
              return { tSeconds: t, volts: v };
            });
          }),
      );
    fc.assert(
      fc.property(strange, (samples) => {
        try {
          return everyNumberFinite(fitDecay(samples));
        } catch (error) {
          return error instanceof EngineInputError;
        }
      }),
      { seed: 11, numRuns: 1500 },
    );
  });
});
