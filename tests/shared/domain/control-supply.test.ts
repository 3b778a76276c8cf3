import { describe, expect, it } from 'vitest';
import {
  controlSupplyDecayVolts,
  controlSupplyKneeSeconds,
  countSteepStart,
  estimateControlSupplyWatts,
  type ControlSupplyDecay,
} from '../../../shared/domain/control-supply';
import { fitDecay } from '../../../shared/domain/decay-fit';
import { gaussian, seededRandom } from './support/synthetic-decay';

const bank: ControlSupplyDecay = {
  v0Volts: 560,
  tauSeconds: 220.9,
  controlSupplyWatts: 30,
  effectiveOhms: 94_000,
  dropoutVolts: 300,
};

/** Integrates C·dV/dt = −V/R − P/V (P only above the dropout) with small RK4 steps, independently of the closed form. */
function integrate(decay: ControlSupplyDecay, untilSeconds: number, stepSeconds = 0.001): number {
  const capacitanceFarads = decay.tauSeconds / decay.effectiveOhms;
  const slope = (v: number): number =>
    -(v / decay.effectiveOhms + (v > decay.dropoutVolts ? decay.controlSupplyWatts / v : 0)) /
    capacitanceFarads;
  let v = decay.v0Volts;
  for (let t = 0; t < untilSeconds - 1e-12; t += stepSeconds) {
    const h = Math.min(stepSeconds, untilSeconds - t);
    const k1 = slope(v);
    const k2 = slope(v + (h / 2) * k1);
    const k3 = slope(v + (h / 2) * k2);
    const k4 = slope(v + h * k3);
    v += (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
  }
  return v;
}

describe('controlSupplyDecayVolts', () => {
  it('when compared with a numerical integration of C·dV/dt = −V/R − P/V, then the closed form agrees before and after the knee', () => {
    for (const t of [1, 4, 7, 9, 30, 200]) {
      expect(controlSupplyDecayVolts(bank, t)).toBeCloseTo(integrate(bank, t), 1);
    }
  });

  it('when the supply draws nothing, then the decay is plain RC from the start', () => {
    const plain = { ...bank, controlSupplyWatts: 0 };
    expect(controlSupplyDecayVolts(plain, 220.9)).toBeCloseTo(560 * Math.exp(-1), 9);
  });

  it('when the knee time is asked, then the voltage there equals the dropout voltage', () => {
    const knee = controlSupplyKneeSeconds(bank);
    expect(knee).toBeGreaterThan(0);
    expect(controlSupplyDecayVolts(bank, knee - 1e-9)).toBeCloseTo(bank.dropoutVolts, 4);
    expect(controlSupplyDecayVolts(bank, knee)).toBeCloseTo(bank.dropoutVolts, 6);
  });

  it('when the bus starts below the dropout voltage, then the knee is at t = 0', () => {
    expect(controlSupplyKneeSeconds({ ...bank, v0Volts: 250 })).toBe(0);
  });
});

describe('countSteepStart', () => {
  it('when leading readings are clearly above the line in volts and log volts, then they are counted', () => {
    expect(
      countSteepStart(
        { zVolts: [40, 9, 0.3, -0.5, 1], zLog: [30, 8, 0.2, -0.4, 1], ratio: [1.8, 1.1, 1, 1, 1] },
        4,
        3,
      ),
    ).toBe(2);
  });

  it('when a leading reading is high only in volts, then it does not count', () => {
    expect(
      countSteepStart({ zVolts: [40, 0, 0, 0], zLog: [2, 0, 0, 0], ratio: [1.01, 1, 1, 1] }, 4, 3),
    ).toBe(0);
  });

  it('when a leading reading is ten times the line, then it is a typing slip and does not count', () => {
    expect(
      countSteepStart({ zVolts: [900, 0, 0, 0], zLog: [900, 0, 0, 0], ratio: [10, 1, 1, 1] }, 4, 3),
    ).toBe(0);
  });

  it('when counting would leave fewer than the minimum, then it stops', () => {
    expect(
      countSteepStart({ zVolts: [9, 9, 9, 9], zLog: [9, 9, 9, 9], ratio: [2, 2, 2, 2] }, 4, 3),
    ).toBe(1);
  });
});

describe('fitDecay with a control-supply phase', () => {
  it('when a logger records the steep start at 10 Hz, then τ is right to 0.1 %, the knee is found and P is estimated', () => {
    const random = seededRandom(21);
    const samples = Array.from({ length: 6000 }, (_, i) => ({
      tSeconds: i * 0.1,
      volts: controlSupplyDecayVolts(bank, i * 0.1) + 0.2 * gaussian(random),
    }));
    const fit = fitDecay(samples, { effectiveOhms: bank.effectiveOhms });
    if (fit.status !== 'ok') throw new Error(fit.reason);
    expect(Math.abs(fit.tauSeconds / bank.tauSeconds - 1)).toBeLessThan(0.001);
    const knee = controlSupplyKneeSeconds(bank);
    expect(fit.controlSupply).not.toBeNull();
    expect(Math.abs(fit.controlSupply!.kneeSeconds - knee)).toBeLessThan(0.5);
    expect(fit.controlSupply!.kneeVolts).toBeGreaterThan(bank.dropoutVolts - 10);
    expect(fit.controlSupply!.powerWatts! / bank.controlSupplyWatts).toBeCloseTo(1, 1);
    expect(fit.excluded.every((reading) => reading.code === 'control-supply-phase')).toBe(true);
    expect(fit.warnings.join(' ')).toMatch(/control supply/);
  });

  it('when a technician reads every 15 s, then the single steep first reading is left out and τ is still right', () => {
    const samples = [0, 15, 30, 60, 90, 120, 180, 240, 300, 360, 420, 480, 600].map((t) => ({
      tSeconds: t,
      volts: Math.round(controlSupplyDecayVolts(bank, t)),
    }));
    const fit = fitDecay(samples);
    if (fit.status !== 'ok') throw new Error(fit.reason);
    expect(Math.abs(fit.tauSeconds / bank.tauSeconds - 1)).toBeLessThan(0.01);
    expect(fit.controlSupply).toMatchObject({ kneeSeconds: 15, readingsBefore: 1 });
    expect(fit.excluded).toEqual([
      expect.objectContaining({ index: 0, code: 'control-supply-phase' }),
    ]);
  });

  it('when the detection is switched off, then the steep start biases τ (which is why it is on by default)', () => {
    const samples = Array.from({ length: 300 }, (_, i) => ({
      tSeconds: i * 2,
      volts: controlSupplyDecayVolts(bank, i * 2),
    }));
    const withPhase = fitDecay(samples, { leaveOutControlSupply: false, leaveOutOffCurve: false });
    const detected = fitDecay(samples);
    if (withPhase.status !== 'ok' || detected.status !== 'ok') throw new Error('expected fits');
    expect(Math.abs(detected.tauSeconds / bank.tauSeconds - 1)).toBeLessThan(1e-3);
    expect(Math.abs(withPhase.tauSeconds / bank.tauSeconds - 1)).toBeGreaterThan(0.01);
  });

  it('when the decay has no control-supply phase, then none is reported', () => {
    const samples = Array.from({ length: 40 }, (_, i) => ({
      tSeconds: i * 15,
      volts: 560 * Math.exp(-(i * 15) / 220.9),
    }));
    const fit = fitDecay(samples);
    expect(fit.status === 'ok' && fit.controlSupply).toBeNull();
  });
});

describe('estimateControlSupplyWatts', () => {
  it('when given exact readings before the knee, then P comes back', () => {
    const times = [0, 1, 2, 3, 4, 5, 6];
    const volts = times.map((t) => controlSupplyDecayVolts(bank, t));
    expect(
      estimateControlSupplyWatts(times, volts, bank.tauSeconds, bank.effectiveOhms),
    ).toBeCloseTo(30, 6);
  });

  it('when there are fewer than 3 readings, then there is no estimate', () => {
    expect(estimateControlSupplyWatts([0, 1], [560, 500], 220.9, 94_000)).toBeNull();
  });

  it('when the readings are plain RC, then there is no constant-power draw to report', () => {
    const times = [0, 10, 20, 30];
    const volts = times.map((t) => 560 * Math.exp(-t / 220.9) + 0.0);
    const watts = estimateControlSupplyWatts(times, volts, 220.9, 94_000);
    expect(watts === null || Math.abs(watts) < 1e-6).toBe(true);
  });
});
