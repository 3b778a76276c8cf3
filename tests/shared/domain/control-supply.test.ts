import { describe, expect, it } from 'vitest';
import {
  controlSupplyDecayVolts,
  controlSupplyKneeSeconds,
  findControlSupplyKnee,
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

describe('findControlSupplyKnee', () => {
  /** ln V less the RC line, weights for 0.5 V of scatter, everything usable. */
  function scan(samples: { tSeconds: number; volts: number }[]): number {
    const t = samples.map((s) => s.tSeconds);
    const v = samples.map((s) => s.volts);
    const lnRelative = v.map((volts, i) => Math.log(volts) - (Math.log(560) - t[i]! / 220.9));
    const weights = v.map((volts) => (volts * volts) / 0.25);
    return findControlSupplyKnee(t, lnRelative, weights, v, new Uint8Array(v.length).fill(1));
  }
  const random = seededRandom(31);
  const noisy = (t: number, volts: number) => ({
    tSeconds: t,
    volts: volts + 0.5 * gaussian(random),
  });

  it('when six readings come before the knee, then the scan from the end finds all six', () => {
    const slow = { ...bank, controlSupplyWatts: 1.5, dropoutVolts: 380 };
    const knee = controlSupplyKneeSeconds(slow);
    const samples = Array.from({ length: 20 }, (_, i) =>
      noisy(i * 10, controlSupplyDecayVolts(slow, i * 10)),
    );
    expect(scan(samples)).toBe(samples.filter((s) => s.tSeconds < knee).length);
    expect(scan(samples)).toBe(6);
  });

  it('when the decay is plain RC, then there is no knee', () => {
    const samples = Array.from({ length: 20 }, (_, i) =>
      noisy(i * 20, 560 * Math.exp(-(i * 20) / 220.9)),
    );
    expect(scan(samples)).toBe(0);
  });

  it('when only a reading in the middle is high (a typing slip), then there is no knee', () => {
    const samples = Array.from({ length: 20 }, (_, i) =>
      noisy(i * 20, 560 * Math.exp(-(i * 20) / 220.9)),
    );
    samples[6] = { ...samples[6]!, volts: samples[6]!.volts * 1.2 };
    expect(scan(samples)).toBe(0);
  });

  it('when the first reading is ten times the line, then it is a typing slip and no knee', () => {
    const samples = Array.from({ length: 12 }, (_, i) =>
      noisy(i * 20, 560 * Math.exp(-(i * 20) / 220.9)),
    );
    samples[0] = { ...samples[0]!, volts: samples[0]!.volts * 10 };
    expect(scan(samples)).toBe(0);
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

  it('when the detection is switched off, then the steep start spoils the fit (which is why it is on by default)', () => {
    const samples = Array.from({ length: 300 }, (_, i) => ({
      tSeconds: i * 2,
      volts: controlSupplyDecayVolts(bank, i * 2),
    }));
    const withPhase = fitDecay(samples, { leaveOutControlSupply: false, leaveOutOffCurve: false });
    const detected = fitDecay(samples);
    if (detected.status !== 'ok') throw new Error(detected.reason);
    expect(Math.abs(detected.tauSeconds / bank.tauSeconds - 1)).toBeLessThan(1e-3);
    // Weighted by the scatter the misfit leaves, the phase either biases τ or makes the run unusable.
    if (withPhase.status === 'ok') {
      expect(Math.abs(withPhase.tauSeconds / bank.tauSeconds - 1)).toBeGreaterThan(0.01);
    } else {
      expect(withPhase.code).toBe('poor-fit');
    }
  });

  it('when exact readings show the phase, then P and the dropout voltage come back from the constant-power model', () => {
    const samples = Array.from({ length: 300 }, (_, i) => ({
      tSeconds: i * 0.5,
      volts: controlSupplyDecayVolts(bank, i * 0.5),
    }));
    const fit = fitDecay(samples, { effectiveOhms: bank.effectiveOhms });
    if (fit.status !== 'ok') throw new Error(fit.reason);
    expect(fit.controlSupply).toMatchObject({ explained: 'yes' });
    expect(fit.controlSupply!.powerWatts! / bank.controlSupplyWatts).toBeCloseTo(1, 4);
    expect(fit.controlSupply!.dropoutVolts! / bank.dropoutVolts).toBeCloseTo(1, 4);
    expect(fit.controlSupply!.dropoutSeconds!).toBeCloseTo(controlSupplyKneeSeconds(bank), 2);
    expect(fit.warnings.join(' ')).toMatch(/drew about 30 W and dropped out near 300 V/);
  });

  it('when the readings before the knee fall in a way no constant-power supply explains, then the fit says so', () => {
    // A straight drop of 10 V a second for 12 s, then the RC decay from 440 V.
    const samples = [
      ...[0, 2, 4, 6, 8, 10].map((t) => ({ tSeconds: t, volts: 560 - 10 * t })),
      ...Array.from({ length: 20 }, (_, i) => ({
        tSeconds: 12 + i * 20,
        volts: 440 * Math.exp(-(i * 20) / 220.9),
      })),
    ];
    const fit = fitDecay(samples, { effectiveOhms: bank.effectiveOhms });
    if (fit.status !== 'ok') throw new Error(fit.reason);
    expect(fit.controlSupply).toMatchObject({
      readingsBefore: 6,
      explained: 'no',
      powerWatts: null,
    });
    expect(fit.warnings.join(' ')).toMatch(/do not follow a control supply drawing constant power/);
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
