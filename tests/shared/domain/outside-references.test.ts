/**
 * Checks of the engine against sources outside it. Each check names its source beside it.
 */

import { describe, expect, it } from 'vitest';
import { linearRegression, probit } from 'simple-statistics';
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { fitDecay } from '../../../shared/domain/decay-fit';
import { fitLogLinear, refineExponential } from '../../../shared/domain/exponential-least-squares';
import {
  bankCapacitanceMicrofarads,
  bleederOhmsFromBalancingResistors,
  capacitanceFromTauMicrofarads,
  effectiveDischargeOhms,
  tauSecondsOf,
} from '../../../shared/domain/capacitance';
import { timeToVoltsSeconds } from '../../../shared/domain/discharge-safety';
import { estimateArrheniusLife } from '../../../shared/domain/life-estimate';
import { normalQuantile, tQuantile } from '../../../shared/domain/student-t';
import {
  IEC_60204_SAFE_VOLTS,
  IEC_60204_SAFE_WITHIN_SECONDS,
} from '../../../shared/constants/safety';
import { evenTimes, exponentialDecay, seededRandom } from './support/synthetic-decay';

describe('the RC decay law against a handbook table (common practice; a handbook table)', () => {
  const tauSeconds = 220.9;
  const v0Volts = 560;
  const samples = exponentialDecay({ v0Volts, tauSeconds, times: evenTimes(23, tauSeconds / 4) });
  const fit = fitDecay(samples);
  const fitted = (t: number): number => {
    if (fit.status !== 'ok') throw new Error(fit.reason);
    return fit.v0Volts * Math.exp(-t / fit.tauSeconds);
  };

  it('when one time constant has passed, then 36.8 % of the start voltage remains', () => {
    expect(fitted(tauSeconds) / v0Volts).toBeCloseTo(0.368, 3);
  });

  it('when two time constants have passed, then 13.5 % remains', () => {
    expect(fitted(2 * tauSeconds) / v0Volts).toBeCloseTo(0.135, 3);
  });

  it('when five time constants have passed, then under 1 % remains', () => {
    expect(fitted(5 * tauSeconds) / v0Volts).toBeLessThan(0.01);
    expect(fitted(4 * tauSeconds) / v0Volts).toBeGreaterThan(0.01);
  });
});

describe('units (SI brochure: ohm × farad = second)', () => {
  it('when 1 Ω meets 1 F, then τ is 1 s', () => {
    expect(tauSecondsOf(1, 1e6)).toBe(1);
  });

  it('when 1 MΩ meets 1 µF, then τ is 1 s', () => {
    expect(tauSecondsOf(1e6, 1)).toBeCloseTo(1, 12);
  });

  it('when a τ of 1 s came through 1 kΩ, then the capacitance is 1000 µF', () => {
    expect(capacitanceFromTauMicrofarads(1, 1000)).toBeCloseTo(1000, 9);
  });
});

describe('worked example: 2 × 4700 µF in series with 2 × 47 kΩ balancing resistors (arithmetic from τ = R·C)', () => {
  const capacitanceMicrofarads = bankCapacitanceMicrofarads({
    unitCapacitanceMicrofarads: 4700,
    seriesCount: 2,
    parallelCount: 1,
  });
  const bleederOhms = bleederOhmsFromBalancingResistors({ resistorOhms: 47_000, seriesCount: 2 });

  it('when the bank is built, then it has 2350 µF and a 94 kΩ bleeder', () => {
    expect(capacitanceMicrofarads).toBe(4700 / 2);
    expect(bleederOhms).toBe(2 * 47_000);
  });

  it('when nothing else loads the bus, then τ = 94 kΩ × 2350 µF = 220.9 s', () => {
    expect(tauSecondsOf(bleederOhms, capacitanceMicrofarads)).toBeCloseTo(220.9, 1);
  });

  it('when a 10 MΩ meter is connected, then R_eff = 94 kΩ ∥ 10 MΩ and τ = 218.8 s', () => {
    const effective = effectiveDischargeOhms(bleederOhms);
    expect(effective).toBeCloseTo(1 / (1 / 94_000 + 1 / 10_000_000), 6);
    expect(tauSecondsOf(effective, capacitanceMicrofarads)).toBeCloseTo(218.8, 1);
  });

  it('when a decay of that bank is fitted, then the capacitance back from τ / R_eff is 2350 µF', () => {
    const effective = effectiveDischargeOhms(bleederOhms);
    const tau = tauSecondsOf(effective, capacitanceMicrofarads);
    const fit = fitDecay(
      exponentialDecay({ v0Volts: 560, tauSeconds: tau, times: evenTimes(20, 30) }),
    );
    expect(fit.status).toBe('ok');
    if (fit.status === 'ok')
      expect(capacitanceFromTauMicrofarads(fit.tauSeconds, effective)).toBeCloseTo(2350, 3);
  });

  it('when the meter is ignored with a 100 kΩ bleeder, then the error is about 1 %; with 470 kΩ about 4.5 % (DOMAIN.md figures)', () => {
    expect(100_000 / effectiveDischargeOhms(100_000) - 1).toBeCloseTo(0.01, 3);
    expect(470_000 / effectiveDischargeOhms(470_000) - 1).toBeCloseTo(0.047, 3);
  });
});

describe('the fit against independent npm libraries', () => {
  const random = seededRandom(99);
  const noisy = exponentialDecay({
    v0Volts: 548,
    tauSeconds: 173,
    times: evenTimes(25, 20),
    noiseVolts: 1.5,
    random,
  });
  const t = noisy.map((s) => s.tSeconds);
  const v = noisy.map((s) => s.volts);

  it('when ln V is regressed on t without weights, then our log-linear fit matches simple-statistics linearRegression', () => {
    // Independent reference: simple-statistics' ordinary least-squares line.
    const reference = linearRegression(noisy.map((s) => [s.tSeconds, Math.log(s.volts)]));
    const ours = fitLogLinear(t, v, 'none');
    expect(ours).not.toBeNull();
    expect(ours!.ratePerSecond).toBeCloseTo(-reference.m, 12);
    expect(Math.log(ours!.v0Volts)).toBeCloseTo(reference.b, 10);
  });

  it('when the volts are fitted by nonlinear least squares, then τ and V0 match ml-levenberg-marquardt', () => {
    // Independent reference: ml-levenberg-marquardt, a general-purpose LM with its own stopping rules.
    const start = fitLogLinear(t, v)!;
    const reference = levenbergMarquardt(
      { x: t, y: v },
      ([a, k]) =>
        (x: number) =>
          a! * Math.exp(-k! * x),
      {
        initialValues: [start.v0Volts, start.ratePerSecond],
        jacobianFunction:
          ([a, k]) =>
          (x: number) => [Math.exp(-k! * x), -a! * x * Math.exp(-k! * x)],
        damping: 1e-3,
        maxIterations: 500,
        errorTolerance: 1e-12,
      },
    );
    const ours = refineExponential(t, v, start);
    const [referenceV0, referenceRate] = reference.parameterValues;
    expect(ours.v0Volts).toBeCloseTo(referenceV0!, 3);
    expect(1 / ours.ratePerSecond / (1 / referenceRate!)).toBeCloseTo(1, 5);
    // Ours must be at least as good a least-squares solution as the reference's.
    expect(ours.rssVoltsSquared).toBeLessThanOrEqual(reference.parameterError * (1 + 1e-9));
  });

  it('when the whole fit runs on the same data, then its τ agrees with ml-levenberg-marquardt from a naive start', () => {
    const reference = levenbergMarquardt(
      { x: t, y: v },
      ([a, k]) =>
        (x: number) =>
          a! * Math.exp(-k! * x),
      {
        initialValues: [v[0]!, 1 / 100],
        damping: 1e-2,
        maxIterations: 2000,
        errorTolerance: 1e-12,
        gradientDifference: 1e-6,
        centralDifference: true,
      },
    );
    const fit = fitDecay(noisy);
    expect(fit.status).toBe('ok');
    if (fit.status === 'ok')
      expect(fit.tauSeconds * reference.parameterValues[1]!).toBeCloseTo(1, 3);
  });

  it('when the normal quantile is asked, then it matches simple-statistics probit within that approximation (about 0.3 %)', () => {
    // simple-statistics' probit uses a short inverse-erf approximation: good to a few parts per thousand.
    for (const p of [0.001, 0.025, 0.1, 0.9, 0.95, 0.975, 0.999]) {
      expect(Math.abs(normalQuantile(p) / probit(p) - 1)).toBeLessThan(0.005);
    }
    expect(normalQuantile(0.5)).toBeCloseTo(probit(0.5), 12);
  });

  it('when the normal quantile is asked, then it matches a printed z table (from memory: 1.95996, 2.57583, 3.09023)', () => {
    expect(normalQuantile(0.975)).toBeCloseTo(1.95996, 5);
    expect(normalQuantile(0.995)).toBeCloseTo(2.57583, 5);
    expect(normalQuantile(0.001)).toBeCloseTo(-3.09023, 5);
  });

  it("when Student's t quantiles are asked, then they match a printed t table (from memory: 12.706, 2.228, 2.042, 1.960)", () => {
    expect(tQuantile(0.975, 1)).toBeCloseTo(12.706, 3);
    expect(tQuantile(0.975, 10)).toBeCloseTo(2.228, 3);
    expect(tQuantile(0.975, 30)).toBeCloseTo(2.042, 3);
    expect(tQuantile(0.95, 10)).toBeCloseTo(1.812, 3);
    expect(tQuantile(0.975, Infinity)).toBeCloseTo(1.96, 3);
  });
});

describe('IEC 60204-1, 6.2.4: 60 V within 5 s after disconnection', () => {
  it('when the standard is quoted, then the constants are 60 V and 5 s', () => {
    expect(IEC_60204_SAFE_VOLTS).toBe(60);
    expect(IEC_60204_SAFE_WITHIN_SECONDS).toBe(5);
  });

  it('when τ is short enough, then 560 V falls to 60 V within 5 s; when τ is a drive bus, then it takes minutes', () => {
    // t = τ · ln(V0 / V): the bus meets the 5 s rule only when τ ≤ 5 / ln(560 / 60) ≈ 2.24 s.
    expect(timeToVoltsSeconds(2.2, 560, 60)).toBeLessThanOrEqual(5);
    expect(timeToVoltsSeconds(2.3, 560, 60)).toBeGreaterThan(5);
    expect(timeToVoltsSeconds(220.9, 560, 60) / 60).toBeGreaterThan(3);
  });
});

describe("Arrhenius 10 K rule (capacitor makers' application notes, common practice)", () => {
  it('when the bank runs 10 K cooler than rated, then its life doubles; 20 K cooler, four times', () => {
    const rated = { ratedLifeHours: 5000, ratedTempC: 105 };
    expect(estimateArrheniusLife({ ...rated, operatingTempC: 95 }).expectedLifeHours).toBeCloseTo(
      10_000,
      6,
    );
    expect(estimateArrheniusLife({ ...rated, operatingTempC: 85 }).expectedLifeHours).toBeCloseTo(
      20_000,
      6,
    );
  });

  it('when the bank runs 10 K hotter than rated, then its life halves', () => {
    expect(
      estimateArrheniusLife({ ratedLifeHours: 2000, ratedTempC: 85, operatingTempC: 95 })
        .expectedLifeHours,
    ).toBeCloseTo(1000, 6);
  });
});
