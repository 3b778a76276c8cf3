/**
 * The decay fit against simulated runs of the physics (./support/decay-simulation.ts): the
 * simulation is first checked against the closed-form RC law and a general-purpose ODE
 * integrator, then the fit's targets are asserted as bands over a few thousand runs of every kind.
 *
 * The seed is fixed so that every run of the suite sees the same runs; the bands hold for other
 * seeds too (tried by hand with seeds 1 to 5 while the engine was built: every kind's coverage
 * stayed within 92–98 %).
 */

import { describe, expect, it } from 'vitest';
import numeric from 'numeric';
import {
  busVoltsAt,
  effectiveOhmsOf,
  kneeSecondsOf,
  simulateRun,
  SIMULATED_RUN_KINDS,
  trueTauSeconds,
  type DischargePhysics,
  type SimulatedRunKind,
} from './support/decay-simulation';
import { quantile, scoreRuns, type KindScore } from './support/decay-scoring';
import { seededRandom } from './support/synthetic-decay';

const SEED = 20_261_202;

const bank: DischargePhysics = {
  v0Volts: 560,
  capacitanceFarads: 2350e-6,
  bleederOhms: 94_000,
  instrumentOhms: 10e6,
  controlSupplyWatts: 25,
  dropoutVolts: 330,
};

describe('the simulation against the physics', () => {
  it('when the supply draws nothing, then the bus follows V0·e^(−t/τ) with τ = C·(R_bleed ∥ R_meter) (the closed-form RC law; common practice)', () => {
    const plain = { ...bank, controlSupplyWatts: 0 };
    const tau = 2350e-6 / (1 / 94_000 + 1 / 10e6);
    expect(trueTauSeconds(plain)).toBeCloseTo(tau, 9);
    expect(effectiveOhmsOf(plain)).toBeCloseTo(93_124.6, 0);
    for (const t of [0, 10, tau, 2 * tau, 5 * tau]) {
      expect(busVoltsAt(plain, t)).toBeCloseTo(560 * Math.exp(-t / tau), 9);
    }
    // After one time constant 36.8 % remains, after five under 1 % (a handbook table).
    expect(busVoltsAt(plain, tau) / 560).toBeCloseTo(0.368, 3);
    expect(busVoltsAt(plain, 5 * tau) / 560).toBeLessThan(0.01);
  });

  it('when the supply draws constant power above its dropout, then the bus follows C·dV/dt = −V/R − P/V integrated by numeric.dopri (the npm package numeric, a general-purpose Dormand–Prince ODE solver)', () => {
    const ohms = effectiveOhmsOf(bank);
    // The state is a one-element vector [V]; at([t]) answers [[V(t)]].
    const slope = (_t: number | number[], state: number | number[]): number[] => {
      const v = (state as number[])[0]!;
      const supply = v > bank.dropoutVolts ? bank.controlSupplyWatts / v : 0;
      return [-(v / ohms + supply) / bank.capacitanceFarads];
    };
    const voltsAt = (solution: ReturnType<typeof numeric.dopri>, t: number): number =>
      (solution.at([t]) as number[][])[0]![0]!;
    const knee = kneeSecondsOf(bank);
    expect(knee).toBeGreaterThan(5);
    // Integrated in two legs so the solver does not step across the switch-off of the supply.
    const before = numeric.dopri(0, knee, [bank.v0Volts] as never, slope as never, 1e-10, 100_000);
    const kneeVolts = voltsAt(before, knee);
    expect(kneeVolts).toBeCloseTo(bank.dropoutVolts, 4);
    const after = numeric.dopri(
      knee,
      knee + 600,
      [kneeVolts] as never,
      slope as never,
      1e-10,
      100_000,
    );
    for (const t of [0.5, 2, knee / 2, knee - 0.01]) {
      expect(busVoltsAt(bank, t)).toBeCloseTo(voltsAt(before, t), 4);
    }
    for (const t of [knee + 1, knee + 60, knee + 300, knee + 600]) {
      expect(busVoltsAt(bank, t)).toBeCloseTo(voltsAt(after, t), 4);
    }
  });

  it('when runs are made, then each kind has its shape: handheld 10–25 readings, loggers hundreds to thousands, control-supply runs with readings before the knee, typo runs with one slip', () => {
    const random = seededRandom(SEED);
    for (let i = 0; i < 50; i++) {
      const handheld = simulateRun('clean', random);
      expect(handheld.samples.length).toBeGreaterThanOrEqual(10);
      expect(handheld.samples.length).toBeLessThanOrEqual(25);
      expect(handheld.kneeSeconds).toBe(0);
      const withSupply = simulateRun('control-supply', random);
      expect(withSupply.readingsBeforeKnee).toBeGreaterThanOrEqual(1);
      const logger = simulateRun('logger-control-supply', random);
      expect(logger.samples.length).toBeGreaterThanOrEqual(200);
      expect(logger.readingsBeforeKnee).toBeGreaterThan(0);
      const typo = simulateRun('typo', random);
      expect(typo.slipIndex).not.toBeNull();
    }
  });
});

const RUNS: Record<SimulatedRunKind, number> = {
  clean: 600,
  typo: 600,
  short: 600,
  'control-supply': 800,
  logger: 350,
  'logger-control-supply': 350,
};

describe('the decay fit on simulated runs', () => {
  const scores = new Map<SimulatedRunKind, KindScore>();
  const scoreOf = (kind: SimulatedRunKind): KindScore => {
    let known = scores.get(kind);
    if (!known) {
      known = scoreRuns(kind, RUNS[kind], SEED + SIMULATED_RUN_KINDS.indexOf(kind));
      scores.set(kind, known);
    }
    return known;
  };

  for (const kind of SIMULATED_RUN_KINDS) {
    it(`when ${kind} runs are fitted, then the 95 % interval covers the true τ in 92–98 % of them and no error over 10 % goes without a warning`, () => {
      const result = scoreOf(kind);
      const coverage = result.covered / result.judged;
      expect(result.judged).toBeGreaterThan(0.95 * result.runs);
      expect(coverage).toBeGreaterThanOrEqual(0.92);
      expect(coverage).toBeLessThanOrEqual(0.98);
      expect(result.silentMisses).toBe(0);
    }, 120_000);
  }

  it('when handheld runs have a control-supply phase, then the p95 τ error is within 1 point of a fit on the readings after the knee alone, and a phase of 4 or more readings is found', () => {
    const result = scoreOf('control-supply');
    const ours = quantile(result.errors, 0.95);
    const afterKneeAlone = quantile(result.postKneeErrors, 0.95);
    expect(ours).toBeLessThanOrEqual(afterKneeAlone + 0.01);
    expect(result.longPhases).toBeGreaterThan(50);
    expect(result.longPhasesFound / result.longPhases).toBeGreaterThan(0.85);
  }, 120_000);

  it('when logger runs have a control-supply phase, then the p95 τ error is under 0.2 % and the knee is found to within a sample in most runs', () => {
    const result = scoreOf('logger-control-supply');
    expect(quantile(result.errors, 0.95)).toBeLessThan(0.002);
    expect(quantile(result.kneeMisplacements, 0.5)).toBeLessThanOrEqual(1);
    expect(quantile(result.kneeMisplacements, 0.95)).toBeLessThanOrEqual(5);
  }, 120_000);
});
