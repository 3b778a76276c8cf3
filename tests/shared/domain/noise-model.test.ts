import { describe, expect, it } from 'vitest';
import {
  estimateNoiseModel,
  noiseFloor,
  noiseVariances,
  readingResolutionVolts,
} from '../../../shared/domain/noise-model';
import { fitDecay } from '../../../shared/domain/decay-fit';
import { fitLogLinear, refineExponential } from '../../../shared/domain/exponential-least-squares';
import { EngineInputError } from '../../../shared/domain/errors';
import { gaussian, seededRandom } from './support/synthetic-decay';

describe('readingResolutionVolts', () => {
  it('when every reading is whole, then 1 V; with one decimal, 0.1 V; with many, none', () => {
    expect(readingResolutionVolts([562, 498, 441])).toBe(1);
    expect(readingResolutionVolts([562, 498.5, 441])).toBeCloseTo(0.1, 12);
    expect(readingResolutionVolts([562.123456789, 498])).toBe(0);
  });
});

describe('noiseFloor and noiseVariances', () => {
  it('when rounding, meter noise and jitter are known, then σ² = q²/12 + a² + (b² + (δt/τ)²)·V²', () => {
    const floor = noiseFloor(
      { volts: 0.2, fractionOfReading: 0.001, timingJitterSeconds: 2 },
      1,
      1 / 200,
    );
    expect(floor.aSquared).toBeCloseTo(1 / 12 + 0.04, 12);
    expect(floor.cSquared).toBeCloseTo(1e-6 + 1e-4, 12);
    const out = noiseVariances(floor, [500], new Float64Array(1));
    expect(out[0]).toBeCloseTo(1 / 12 + 0.04 + (1e-6 + 1e-4) * 250_000, 6);
  });
});

describe('estimateNoiseModel', () => {
  it('when residuals have a constant and a proportional part, then both come back to about 10 %', () => {
    const random = seededRandom(4);
    const n = 4000;
    const volts = Array.from({ length: n }, (_, i) => 20 + (600 * i) / n);
    const residuals = volts.map((v) => Math.sqrt(0.25 + (0.004 * v) ** 2) * gaussian(random));
    const model = estimateNoiseModel(
      volts,
      residuals,
      new Float64Array(n),
      new Uint8Array(n).fill(1),
      { aSquared: 0, cSquared: 0 },
      { aSquared: 1, cSquared: 0 },
    );
    expect(Math.sqrt(model.aSquared) / 0.5).toBeCloseTo(1, 0);
    expect(Math.abs(Math.sqrt(model.cSquared) / 0.004 - 1)).toBeLessThan(0.1);
  });

  it('when the residuals are smaller than the floors, then the floors hold', () => {
    const model = estimateNoiseModel(
      [100, 200, 300, 400, 500, 600, 700, 800, 900],
      new Float64Array(9),
      new Float64Array(9),
      new Uint8Array(9).fill(1),
      { aSquared: 1 / 12, cSquared: 1e-6 },
      { aSquared: 1, cSquared: 1e-4 },
    );
    expect(model).toEqual({ aSquared: 1 / 12, cSquared: 1e-6 });
  });
});

describe('the fit weighted by its noise', () => {
  /** A handheld run read every 20 s with 2 s of timing jitter and rounded to whole volts. */
  function jitteredRun(random: () => number): { tSeconds: number; volts: number }[] {
    return Array.from({ length: 20 }, (_, i) => {
      const t = i * 20;
      return { tSeconds: t, volts: Math.round(560 * Math.exp(-(t + 2 * gaussian(random)) / 150)) };
    });
  }

  it('when timing jitter dominates, then the weighted fit beats plain least squares on volts at p95', () => {
    const random = seededRandom(17);
    const weighted: number[] = [];
    const plain: number[] = [];
    for (let r = 0; r < 300; r++) {
      const run = jitteredRun(random);
      const fit = fitDecay(run);
      if (fit.status === 'ok') weighted.push(Math.abs(fit.tauSeconds / 150 - 1));
      const t = run.map((s) => s.tSeconds);
      const v = run.map((s) => s.volts);
      const unweighted = refineExponential(t, v, fitLogLinear(t, v)!);
      plain.push(Math.abs(1 / unweighted.ratePerSecond / 150 - 1));
    }
    const p95 = (values: number[]) =>
      [...values].sort((a, b) => a - b)[Math.floor(0.95 * values.length)]!;
    expect(weighted.length).toBe(300);
    expect(p95(weighted)).toBeLessThan(0.8 * p95(plain));
  });

  it('when the noise the fit found is asked, then it names the display resolution and the proportional part', () => {
    const fit = fitDecay(jitteredRun(seededRandom(3)));
    if (fit.status !== 'ok') throw new Error(fit.reason);
    expect(fit.noise.resolutionVolts).toBe(1);
    expect(fit.noise.volts).toBeGreaterThanOrEqual(Math.sqrt(1 / 12) - 1e-12);
    expect(fit.noise.fractionOfReading).toBeGreaterThan(0.003);
  });

  it('when the meter noise is given as a negative number, then the fit refuses and names the field', () => {
    const run = jitteredRun(seededRandom(3));
    expect(() => fitDecay(run, { noise: { fractionOfReading: -0.01 } })).toThrow(EngineInputError);
    expect(() => fitDecay(run, { noise: { fractionOfReading: -0.01 } })).toThrow(
      /noise\.fractionOfReading/,
    );
  });

  it('when the timing jitter is given, then it is a floor of the proportional part', () => {
    const fit = fitDecay(jitteredRun(seededRandom(5)), { noise: { timingJitterSeconds: 10 } });
    if (fit.status !== 'ok') throw new Error(fit.reason);
    expect(fit.noise.fractionOfReading).toBeGreaterThanOrEqual((10 / fit.tauSeconds) * 0.999);
  });
});
