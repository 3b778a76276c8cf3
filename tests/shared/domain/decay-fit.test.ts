import { describe, expect, it } from 'vitest';
import {
  fitDecay,
  validateDecaySamples,
  type DecayFit,
  type DecayFitResult,
} from '../../../shared/domain/decay-fit';
import { EngineInputError } from '../../../shared/domain/errors';
import { evenTimes, exponentialDecay, seededRandom } from './support/synthetic-decay';

function ok(result: DecayFitResult): DecayFit {
  if (result.status !== 'ok') throw new Error(`expected a fit, got: ${result.reason}`);
  return result;
}

function everyNumberFinite(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (Array.isArray(value)) return value.every(everyNumberFinite);
  if (value && typeof value === 'object') return Object.values(value).every(everyNumberFinite);
  return true;
}

describe('fitDecay on clean decays', () => {
  it('when the readings follow V0·e^(−t/τ) exactly, then τ and V0 come back to 1e-9', () => {
    const fit = ok(
      fitDecay(exponentialDecay({ v0Volts: 565, tauSeconds: 312.4, times: evenTimes(15, 40) })),
    );
    expect(fit.tauSeconds / 312.4).toBeCloseTo(1, 9);
    expect(fit.v0Volts / 565).toBeCloseTo(1, 9);
    expect(fit.excluded).toEqual([]);
    expect(fit.controlSupply).toBeNull();
    expect(fit.pointsUsed).toBe(15);
  });

  it('when the readings start late in the decay, then V0 is still the value extended back to t = 0', () => {
    const fit = ok(
      fitDecay(exponentialDecay({ v0Volts: 650, tauSeconds: 90, times: evenTimes(10, 20, 200) })),
    );
    expect(fit.v0Volts / 650).toBeCloseTo(1, 8);
    expect(fit.tauSeconds / 90).toBeCloseTo(1, 8);
  });

  it('when readings are rounded to whole volts like a handheld meter, then τ is within 0.5 % and nothing is left out', () => {
    const fit = ok(
      fitDecay(
        exponentialDecay({
          v0Volts: 562,
          tauSeconds: 218.8,
          times: evenTimes(20, 30),
          roundToVolts: 1,
        }),
      ),
    );
    expect(Math.abs(fit.tauSeconds / 218.8 - 1)).toBeLessThan(0.005);
    expect(fit.excluded).toEqual([]);
    expect(fit.tauCi95[0]).toBeLessThan(218.8);
    expect(fit.tauCi95[1]).toBeGreaterThan(218.8);
  });

  it('when the fit succeeds, then RMSE, R² and the residuals describe it consistently', () => {
    const random = seededRandom(5);
    const samples = exponentialDecay({
      v0Volts: 540,
      tauSeconds: 150,
      times: evenTimes(30, 15),
      noiseVolts: 0.8,
      random,
    });
    const fit = ok(fitDecay(samples));
    const rss = fit.residuals.reduce((sum, r) => sum + r.residualVolts ** 2, 0);
    expect(fit.rmseVolts).toBeCloseTo(Math.sqrt(rss / fit.pointsUsed), 10);
    const mean = samples.reduce((sum, s) => sum + s.volts, 0) / samples.length;
    const total = samples.reduce((sum, s) => sum + (s.volts - mean) ** 2, 0);
    expect(fit.r2).toBeCloseTo(1 - rss / total, 10);
    for (const r of fit.residuals) {
      expect(r.residualVolts).toBeCloseTo(
        samples[r.index]!.volts - fit.v0Volts * Math.exp(-r.tSeconds / fit.tauSeconds),
        9,
      );
    }
  });

  it('when the fit succeeds, then the 95 % interval brackets τ and is wider than ± 1.96 standard errors', () => {
    const random = seededRandom(8);
    const fit = ok(
      fitDecay(
        exponentialDecay({
          v0Volts: 400,
          tauSeconds: 60,
          times: evenTimes(8, 20),
          noiseVolts: 1,
          random,
        }),
      ),
    );
    const [low, high] = fit.tauCi95;
    expect(low).toBeLessThan(fit.tauSeconds);
    expect(high).toBeGreaterThan(fit.tauSeconds);
    // Student's t on 6 degrees of freedom (2.447) is wider than the normal 1.96.
    expect(high - low).toBeGreaterThan(2 * 1.96 * fit.tauStdErrorSeconds);
  });

  it('when only 4 readings are used, then a warning asks for more', () => {
    const fit = ok(
      fitDecay(exponentialDecay({ v0Volts: 560, tauSeconds: 200, times: [0, 100, 200, 300] })),
    );
    expect(fit.warnings.join(' ')).toMatch(/Only 4 readings/);
  });

  it('when the readings span less than half a time constant, then a warning says τ rests on a short stretch', () => {
    const fit = ok(
      fitDecay(exponentialDecay({ v0Volts: 560, tauSeconds: 1000, times: evenTimes(10, 40) })),
    );
    expect(fit.spanTimeConstants).toBeCloseTo(0.36, 2);
    expect(fit.warnings.join(' ')).toMatch(/short stretch/);
  });

  it('when every number of a fit is checked, then none is NaN or infinite', () => {
    const random = seededRandom(3);
    const fit = fitDecay(
      exponentialDecay({
        v0Volts: 300,
        tauSeconds: 45,
        times: evenTimes(12, 10),
        noiseVolts: 0.5,
        random,
      }),
    );
    expect(everyNumberFinite(fit)).toBe(true);
  });
});

describe('fitDecay refusing to answer', () => {
  it('when there are no readings, then it is unusable: too few points', () => {
    expect(fitDecay([])).toMatchObject({ status: 'unusable', code: 'too-few-points' });
  });

  it('when there are 2 readings, then it is unusable with a reason asking for at least 3', () => {
    const result = fitDecay([
      { tSeconds: 0, volts: 560 },
      { tSeconds: 30, volts: 490 },
    ]);
    expect(result).toMatchObject({ status: 'unusable', code: 'too-few-points' });
    if (result.status === 'unusable') expect(result.reason).toMatch(/at least 3/);
  });

  it('when the voltage rises, then it is unusable: no decay', () => {
    const result = fitDecay(
      [300, 310, 305, 320, 330].map((volts, i) => ({ tSeconds: i * 30, volts })),
    );
    expect(result).toMatchObject({ status: 'unusable', code: 'no-decay' });
  });

  it('when the voltage stays flat, then it is unusable', () => {
    const result = fitDecay(
      [400, 400, 400, 400, 400].map((volts, i) => ({ tSeconds: i * 30, volts })),
    );
    expect(result.status).toBe('unusable');
  });

  it('when the voltage fell only a fraction of a per cent, then it is unusable: too little of the decay', () => {
    const result = fitDecay([560, 559, 561, 557].map((volts, i) => ({ tSeconds: i * 10, volts })));
    expect(result).toMatchObject({ status: 'unusable', code: 'poor-fit' });
  });

  it('when the scatter swamps the decay, then it is unusable: poor fit, with τ bounds in the reason', () => {
    const random = seededRandom(11);
    const samples = exponentialDecay({
      v0Volts: 100,
      tauSeconds: 50,
      times: evenTimes(5, 10),
      noiseVolts: 20,
      random,
    }).map((s) => ({
      ...s,
      volts: Math.max(s.volts, 1),
    }));
    const result = fitDecay(samples);
    expect(result.status).toBe('unusable');
  });

  it('when more than a fifth of the readings are far off, then it is unusable: too many outliers', () => {
    const samples = exponentialDecay({ v0Volts: 560, tauSeconds: 200, times: evenTimes(15, 30) });
    const scrambled = samples.map((s, i) => (i % 4 === 1 ? { ...s, volts: s.volts * 0.5 } : s));
    const result = fitDecay(scrambled);
    expect(result).toMatchObject({ status: 'unusable', code: 'too-many-outliers' });
  });
});

describe('validateDecaySamples and fitDecay on bad input', () => {
  const good = exponentialDecay({ v0Volts: 560, tauSeconds: 200, times: evenTimes(6, 30) });

  it('when a voltage is negative, then an EngineInputError names the reading', () => {
    const samples = good.map((s, i) => (i === 3 ? { ...s, volts: -4 } : s));
    expect(() => fitDecay(samples)).toThrow(EngineInputError);
    try {
      fitDecay(samples);
    } catch (error) {
      expect((error as EngineInputError).code).toBe('non-positive-voltage');
      expect((error as EngineInputError).issues[0]!.path).toBe('samples.3.volts');
      expect((error as EngineInputError).message).toMatch(/reading 4/);
    }
  });

  it('when a voltage is zero, then it is refused as not above zero', () => {
    expect(() => fitDecay(good.map((s, i) => (i === 5 ? { ...s, volts: 0 } : s)))).toThrow(
      /not above zero/,
    );
  });

  it('when two readings share a time, then times-not-increasing is thrown', () => {
    const samples = good.map((s, i) => (i === 2 ? { ...s, tSeconds: good[1]!.tSeconds } : s));
    expect(() => fitDecay(samples)).toThrow(
      expect.objectContaining({ code: 'times-not-increasing' }),
    );
  });

  it('when times run backwards, then times-not-increasing is thrown', () => {
    expect(() => fitDecay([...good].reverse())).toThrow(
      expect.objectContaining({ code: 'times-not-increasing' }),
    );
  });

  it('when a number is NaN or infinite, then invalid-number is thrown', () => {
    expect(() => fitDecay(good.map((s, i) => (i === 1 ? { ...s, volts: Number.NaN } : s)))).toThrow(
      expect.objectContaining({ code: 'invalid-number' }),
    );
    expect(() =>
      fitDecay(good.map((s, i) => (i === 1 ? { ...s, tSeconds: Infinity } : s))),
    ).toThrow(expect.objectContaining({ code: 'invalid-number' }));
  });

  it('when several readings are bad, then every one is listed in issues', () => {
    const samples = good.map((s, i) => (i === 1 || i === 4 ? { ...s, volts: -1 } : s));
    expect(() => validateDecaySamples(samples)).toThrow(
      expect.objectContaining({ issues: [expect.anything(), expect.anything()] }),
    );
  });

  it('when a label function is given, then messages use it', () => {
    expect(() => validateDecaySamples([{ tSeconds: 0, volts: -1 }], (i) => `Row ${i + 2}`)).toThrow(
      /^Row 2:/,
    );
  });
});
