/**
 * The demo history's physics: simulated readings fit back to the τ that was put in, within the
 * noise, with and without a control-supply phase and a mistyped reading; ageing paths fall.
 */
import { describe, expect, it } from 'vitest';
import { fitDecay } from '../../../shared/domain/decay-fit';
import {
  ageingPathOf,
  bleederOhmsAt,
  capacitanceAtMicrofarads,
  capacitanceRatioAt,
  simulateHistoryRun,
  type BankHistoryFacts,
  type RunPhysics,
} from '../../../infra/seed/decay-history-simulation';
import { seededRandom } from '../../../infra/seed/seeded-random';

/** Banks like the demo's designs: (µF, bleeder Ω, bus V). */
const BANKS: Array<[number, number, number]> = [
  [1500, 150_000, 310],
  [6600, 47_000, 310],
  [1100, 94_000, 540],
  [3300, 66_000, 648],
  [7050, 44_000, 540],
  [13_600, 30_000, 648],
  [280, 330_000, 540],
  [840, 200_000, 932],
];

function physicsOf(random: () => number, [microfarads, ohms, bus]: [number, number, number], controlSupplyWatts: number): RunPhysics {
  return {
    v0Volts: bus * (1 + 0.04 * random()),
    capacitanceMicrofarads: microfarads * (0.8 + 0.3 * random()),
    bleederOhms: ohms,
    meterInputOhms: random() < 0.25 ? 1e6 : 10e6,
    controlSupplyWatts,
    dropoutVolts: bus * 0.6,
  };
}

describe('simulated history runs', () => {
  it('when a clean run is fitted, then τ comes back within 2 % of the τ put in, on every demo design', () => {
    const random = seededRandom(11);
    for (const bank of BANKS) {
      for (let n = 0; n < 5; n++) {
        const physics = physicsOf(random, bank, 0);
        const expected = (bank[0] * 1e-6 * bank[1]);
        const run = simulateHistoryRun(physics, expected, { resolutionVolts: random() < 0.5 ? 0.1 : 1, mistyped: false }, random);
        expect(run.samples.length).toBeGreaterThanOrEqual(5);
        expect(run.samples[run.samples.length - 1]!.volts).toBeLessThan(50);
        const fit = fitDecay(run.samples);
        expect(fit.status, JSON.stringify(bank)).toBe('ok');
        if (fit.status === 'ok') expect(Math.abs(fit.tauSeconds / run.tauSeconds - 1), JSON.stringify(bank)).toBeLessThan(0.02);
      }
    }
  });

  it('when the drive’s control supply draws from the bus, or a reading is mistyped, then the engine’s fit still finds τ within 4 %', () => {
    const random = seededRandom(23);
    let slips = 0;
    for (const bank of BANKS) {
      for (let n = 0; n < 4; n++) {
        const physics = physicsOf(random, bank, n % 2 ? 25 + 20 * random() : 0);
        const run = simulateHistoryRun(physics, bank[0] * 1e-6 * bank[1], { resolutionVolts: 0.1, mistyped: n >= 2 }, random);
        if (run.slipIndex !== null) slips += 1;
        const fit = fitDecay(run.samples);
        expect(fit.status, JSON.stringify({ bank, n })).toBe('ok');
        if (fit.status === 'ok') expect(Math.abs(fit.tauSeconds / run.tauSeconds - 1), JSON.stringify({ bank, n })).toBeLessThan(0.04);
      }
    }
    expect(slips).toBeGreaterThan(8);
  });

  it('when the same seed is used, then the same readings come out', () => {
    const physics = physicsOf(seededRandom(5), BANKS[2]!, 0);
    const a = simulateHistoryRun(physics, 100, { resolutionVolts: 0.1, mistyped: true }, seededRandom(9));
    const b = simulateHistoryRun(physics, 100, { resolutionVolts: 0.1, mistyped: true }, seededRandom(9));
    expect(a).toEqual(b);
  });
});

describe('ageing paths', () => {
  const facts = (technology: 'electrolytic' | 'film', cabinetTempC: number): BankHistoryFacts => ({
    technology,
    nominalMicrofarads: 2200,
    bleederOhms: 94_000,
    tempCoefficientPercentPerKelvin: 0.25,
    busVolts: 540,
    cabinetTempC,
    controlSupplyWatts: 0,
  });

  it('when a bank ages, then its capacitance never rises; warm cabinets lose more; some banks reach watch or end of life within ten years; film barely moves', () => {
    const random = seededRandom(3);
    const lossAfter10 = (tech: 'electrolytic' | 'film', temp: number) =>
      Array.from({ length: 300 }, () => {
        const path = ageingPathOf(facts(tech, temp), 10, random);
        for (let y = 0; y < 10; y += 0.5) expect(capacitanceRatioAt(path, y + 0.5)).toBeLessThanOrEqual(capacitanceRatioAt(path, y));
        return capacitanceRatioAt(path, 10) / path.initialRatio;
      });
    const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;
    const cool = lossAfter10('electrolytic', 28);
    const warm = lossAfter10('electrolytic', 45);
    expect(mean(warm)).toBeLessThan(mean(cool));
    expect(cool.some((r) => r < 0.9)).toBe(true);
    expect(warm.some((r) => r < 0.8)).toBe(true);
    // none far past end of life: a plant replaces such a bank
    expect(Math.min(...warm)).toBeGreaterThanOrEqual(0.72 - 1e-9);
    expect(Math.min(...lossAfter10('film', 35))).toBeGreaterThan(0.95);
  });

  it('when a bleeder fault is drawn, then R is raised only during it', () => {
    const random = seededRandom(8);
    const paths = Array.from({ length: 200 }, () => ageingPathOf(facts('electrolytic', 35), 9, random)).filter((p) => p.bleederFault);
    expect(paths.length).toBeGreaterThan(3);
    for (const path of paths) {
      const fault = path.bleederFault!;
      expect(bleederOhmsAt(path, 94_000, fault.fromYears - 0.01)).toBe(94_000);
      expect(bleederOhmsAt(path, 94_000, (fault.fromYears + fault.toYears) / 2)).toBeGreaterThan(94_000 * 1.19);
      expect(bleederOhmsAt(path, 94_000, fault.toYears)).toBe(94_000);
    }
  });

  it('when the bank is warm, then its capacitance reads higher by the design’s coefficient', () => {
    expect(capacitanceAtMicrofarads(2200, 0.25, 40)).toBeCloseTo(2310, 6);
    expect(capacitanceAtMicrofarads(840, -0.02, 20)).toBe(840);
  });
});
