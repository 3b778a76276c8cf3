import { describe, expect, it } from 'vitest';
import { readReadingRows } from '../../../../../web/src/features/decay-runs/utils/readings';
import { runDecayCheck } from '../../../../../web/src/features/decay-runs/utils/run-check';
import { electrolyticBank } from '../../../../support/test-bank';

/** A 2S3P bank of 4700 µF cans (7050 µF) on a 31.2 kΩ bleeder: τ = 220 s on its own, 219.3 s with a 10 MΩ meter. */
const facts = electrolyticBank({
  unitCapacitanceMicrofarads: 4700,
  seriesCount: 2,
  parallelCount: 3,
  bleederOhms: 31_200,
  busVolts: 565,
});
const TAU_WITH_METER = 7050e-6 / (1 / 31_200 + 1 / 10e6);

describe('runDecayCheck on a run with a control-supply phase', () => {
  it('when the bus drops 565 → 400 V in the first 30 s and then decays cleanly with τ = 220 s, then the first reading is left out as the control-supply phase and τ is the clean τ (it was judged "watch, τ 187 s, every reading on the curve")', () => {
    const times = [0, 30, 60, 90, 120, 180, 240, 300, 360, 420];
    const rows = times.map((t) => ({
      time: String(t),
      volts: t === 0 ? '565' : (400 * Math.exp(-(t - 30) / TAU_WITH_METER)).toFixed(1),
    }));
    const outcome = runDecayCheck(facts, readReadingRows(rows), {});
    if (outcome.kind !== 'verdict')
      throw new Error(`expected a verdict, got ${JSON.stringify(outcome)}`);
    const { verdict } = outcome;
    expect(Math.abs(verdict.tauSeconds / TAU_WITH_METER - 1)).toBeLessThan(0.01);
    expect(verdict.health).toBe('healthy');
    expect(verdict.fit.excluded).toEqual([
      expect.objectContaining({ index: 0, code: 'control-supply-phase' }),
    ]);
    expect(outcome.rowNumbers[verdict.fit.excluded[0]!.index]).toBe(1);
    expect(verdict.fit.controlSupply).toMatchObject({ readingsBefore: 1, kneeSeconds: 30 });
    expect(verdict.warnings.join(' ')).toMatch(/control supply/);
  });

  it('when six readings fall steeply before the knee, then all six are left out, the power and the dropout voltage are reported, and τ is the clean τ', () => {
    // 5 W drawn down to 363 V: the phase lasts about 55 s (exact arithmetic of C·dV/dt = −V/R − P/V).
    const ohms = 1 / (1 / 31_200 + 1 / 10e6);
    const watts = 5;
    const dropout = 363;
    const knee =
      (TAU_WITH_METER / 2) * Math.log((565 ** 2 + watts * ohms) / (dropout ** 2 + watts * ohms));
    const volts = (t: number): number =>
      t < knee
        ? Math.sqrt((565 ** 2 + watts * ohms) * Math.exp((-2 * t) / TAU_WITH_METER) - watts * ohms)
        : dropout * Math.exp(-(t - knee) / TAU_WITH_METER);
    const times = [0, 10, 20, 30, 40, 50, 60, 90, 120, 150, 180, 240, 300, 360, 420, 480];
    const rows = times.map((t) => ({ time: String(t), volts: volts(t).toFixed(1) }));
    const outcome = runDecayCheck(facts, readReadingRows(rows), {});
    if (outcome.kind !== 'verdict')
      throw new Error(`expected a verdict, got ${JSON.stringify(outcome)}`);
    const phase = outcome.verdict.fit.controlSupply!;
    expect(phase.readingsBefore).toBe(times.filter((t) => t < knee).length);
    expect(phase.readingsBefore).toBe(6);
    expect(phase.explained).toBe('yes');
    expect(phase.powerWatts! / watts).toBeCloseTo(1, 1);
    expect(phase.dropoutVolts! / dropout).toBeCloseTo(1, 1);
    expect(Math.abs(outcome.verdict.tauSeconds / TAU_WITH_METER - 1)).toBeLessThan(0.01);
    expect(outcome.verdict.health).toBe('healthy');
    // the finding a person reads names both figures
    const finding = outcome.verdict.findings.find((f) => f.code === 'control-supply-phase')!;
    expect(finding.message).toMatch(
      /about \d+(\.\d)? W drawn, the supply dropping out near 3\d\d V/,
    );
  });
});
