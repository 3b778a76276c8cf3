import { describe, expect, it } from 'vitest';
import { bankEngineInputs } from '../../../../../shared/domain/bank-engine-inputs';
import { readReadingRows } from '../../../../../web/src/features/decay-runs/utils/readings';
import { runDecayCheck } from '../../../../../web/src/features/decay-runs/utils/run-check';
import { bankJson } from '../bank-json';

const facts = bankEngineInputs(bankJson())!;
const NAMEPLATE_TAU = 44_000 * 7050e-6; // 310.2 s, the bus on its own
const TIMES = [0, 30, 60, 90, 120, 180, 240, 300, 360, 420];
const decay = (tau: number) => TIMES.map((t) => ({ time: String(t), volts: (560 * Math.exp(-t / tau)).toFixed(1) }));

describe('runDecayCheck', () => {
  it('when nothing is typed, then empty', () => {
    expect(runDecayCheck(facts, readReadingRows([{ time: '', volts: '' }]), {})).toEqual({ kind: 'empty' });
  });

  it('when fewer than 3 readings are typed, then unusable with the engine’s reason', () => {
    const outcome = runDecayCheck(facts, readReadingRows(decay(NAMEPLATE_TAU).slice(0, 2)), {});
    expect(outcome).toEqual({ kind: 'unusable', reason: expect.stringMatching(/at least 3/) });
  });

  it('when the readings decay with the nameplate τ, then healthy', () => {
    const outcome = runDecayCheck(facts, readReadingRows(decay(NAMEPLATE_TAU)), {});
    expect(outcome.kind).toBe('verdict');
    if (outcome.kind !== 'verdict') return;
    expect(outcome.verdict.health).toBe('healthy');
    expect(outcome.verdict.tauSeconds).toBeCloseTo(NAMEPLATE_TAU, 0);
    expect(outcome.verdict.discharge.fromSource).toBe('nominal-bus');
  });

  it('when τ is 25 % shorter, then end of life below the design’s 0.80', () => {
    const outcome = runDecayCheck(facts, readReadingRows(decay(NAMEPLATE_TAU * 0.75)), {});
    expect(outcome.kind === 'verdict' && outcome.verdict.health).toBe('end-of-life');
  });

  it('when a reading has a dropped digit, then it is left out and its screen row kept', () => {
    const rows = decay(NAMEPLATE_TAU);
    rows.splice(1, 0, { time: '', volts: '' }); // a blank row 2 shifts the rest down
    rows[4] = { ...rows[4]!, volts: rows[4]!.volts.slice(1) }; // row 5: "45x.x" typed as "5x.x"
    const outcome = runDecayCheck(facts, readReadingRows(rows), {});
    expect(outcome.kind).toBe('verdict');
    if (outcome.kind !== 'verdict') return;
    const left = outcome.verdict.fit.excluded;
    expect(left).toHaveLength(1);
    expect(outcome.rowNumbers[left[0]!.index]).toBe(5);
    expect(outcome.verdict.health).toBe('healthy');
  });
});
