import { describe, expect, it } from 'vitest';
import {
  judgeRecordedRun,
  runConditionsOf,
  type RecordedRunOkVerdict,
  type RecordedRunVerdict,
} from '../../../shared/domain/recorded-run';
import { judgeDecayRun } from '../../../shared/domain/verdict';
import type { BankEngineInputs } from '../../../shared/domain/bank-engine-inputs';
import { VISUAL_FINDINGS } from '../../../shared/constants/decay-runs';
import { WORKED_BANK, WORKED_BANK_HEALTHY_TAU_SECONDS } from '../../support/test-bank';
import { evenTimes, exponentialDecay } from './support/synthetic-decay';

/** The worked bank: 2 × 4700 µF in series (2350 µF), a 94 kΩ bleeder, a 560 V bus, a 15 min marked wait. */
const engine = WORKED_BANK;

/** A clean run of τ = `tauSeconds` from 560 V, 20 readings 30 s apart. */
function samplesOf(tauSeconds: number) {
  return exponentialDecay({ v0Volts: 560, tauSeconds, times: evenTimes(20, 30) });
}

/** τ of the healthy bank read with the default 10 MΩ meter: 2350 µF × (94 kΩ ∥ 10 MΩ) ≈ 218.8 s. */
const healthyTauSeconds = WORKED_BANK_HEALTHY_TAU_SECONDS;

function ok(verdict: RecordedRunVerdict): RecordedRunOkVerdict {
  if (verdict.status !== 'ok') throw new Error(`expected a verdict, got: ${verdict.reason}`);
  return verdict;
}

describe('judgeRecordedRun: the visual-finding rule', () => {
  it('when a healthy run has no visual finding, then the engine verdict stands', () => {
    const verdict = ok(judgeRecordedRun({ samples: samplesOf(healthyTauSeconds), engine, observations: {} }));
    expect(verdict.health).toBe('healthy');
    expect(verdict.safetyFinding).toBe(false);
    expect(verdict.visualFindings).toEqual([]);
    expect(verdict.findings.some((finding) => finding.code === 'visual-finding')).toBe(false);
  });

  it.each(VISUAL_FINDINGS)(
    'when the technician saw "%s" on a healthy bank, then the verdict is end of life with a safety finding first',
    (visualFinding) => {
      const verdict = ok(
        judgeRecordedRun({
          samples: samplesOf(healthyTauSeconds),
          engine,
          observations: { visualFindings: [visualFinding] },
        }),
      );
      expect(verdict.tauSeconds).toBeCloseTo(healthyTauSeconds, 3);
      expect(verdict.health).toBe('end-of-life');
      expect(verdict.healthLabel).toBe('end of life');
      expect(verdict.safetyFinding).toBe(true);
      expect(verdict.findings[0]).toMatchObject({ code: 'visual-finding', severity: 'safety' });
      expect(verdict.findings[0]!.message).toMatch(/end of life whatever τ says/);
      expect(verdict.visualFindings).toEqual([visualFinding]);
      // τ and capacitance stay what the readings say
      expect(verdict.baseline!.ratio).toBeCloseTo(1, 3);
    },
  );

  it('when two visual findings are seen, then one safety finding names both in plain words', () => {
    const verdict = ok(
      judgeRecordedRun({
        samples: samplesOf(healthyTauSeconds),
        engine,
        observations: { visualFindings: ['bulged-can', 'leak'] },
      }),
    );
    const visual = verdict.findings.filter((finding) => finding.code === 'visual-finding');
    expect(visual).toHaveLength(1);
    expect(visual[0]!.message).toMatch(/^Bulged can and leaking electrolyte were seen/);
  });

  it('when the ratio is implausible and a can is bulged, then the health is still end of life', () => {
    const verdict = ok(
      judgeRecordedRun({
        samples: samplesOf(healthyTauSeconds * 0.2),
        engine,
        observations: { visualFindings: ['bulged-can'] },
      }),
    );
    expect(verdict.health).toBe('end-of-life');
    expect(verdict.notJudgedBecause).toBeNull();
  });

  it('when the readings give no usable fit, then the run is unusable with its reason and keeps its visual findings', () => {
    const samples = [
      { tSeconds: 0, volts: 560 },
      { tSeconds: 30, volts: 480 },
    ];
    const withFinding = judgeRecordedRun({ samples, engine, observations: { visualFindings: ['open-vent'] } });
    expect(withFinding.status).toBe('unusable');
    if (withFinding.status !== 'unusable') return;
    expect(withFinding.reason.length).toBeGreaterThan(10);
    expect(withFinding.visualFindings).toEqual(['open-vent']);
    expect(withFinding.health).toBe('end-of-life');
    expect(withFinding.safetyFinding).toBe(true);
    expect(withFinding.findings[0]).toMatchObject({ code: 'visual-finding', severity: 'safety' });

    const without = judgeRecordedRun({ samples, engine, observations: {} });
    expect(without).toMatchObject({ status: 'unusable', health: null, safetyFinding: false, visualFindings: [] });
  });

  it('when two readings share a time, then the run is unusable (readings refused) rather than an error', () => {
    const verdict = judgeRecordedRun({
      samples: [...samplesOf(healthyTauSeconds).slice(0, 5), { tSeconds: 120, volts: 330 }],
      engine,
      observations: {},
    });
    expect(verdict).toMatchObject({ status: 'unusable', code: 'readings-refused' });
  });

  it('when every reading is at or below 0 V, then the run is unusable with a reason', () => {
    const verdict = judgeRecordedRun({
      samples: [
        { tSeconds: 0, volts: 0 },
        { tSeconds: 10, volts: -1 },
      ],
      engine,
      observations: {},
    });
    expect(verdict).toMatchObject({ status: 'unusable', code: 'too-few-points' });
    expect(verdict.prepared.setAside).toHaveLength(2);
  });
});

describe('judgeRecordedRun: the readings as typed', () => {
  it('when readings were typed out of order, then they are judged in time order and it is said', () => {
    const inOrder = samplesOf(healthyTauSeconds);
    const shuffled = [inOrder[3]!, ...inOrder.slice(0, 3), ...inOrder.slice(4)];
    const verdict = ok(judgeRecordedRun({ samples: shuffled, engine, observations: {} }));
    const reference = ok(judgeRecordedRun({ samples: inOrder, engine, observations: {} }));
    expect(verdict.tauSeconds).toBeCloseTo(reference.tauSeconds, 9);
    expect(verdict.prepared.sorted).toBe(true);
    expect(verdict.warnings[0]).toMatch(/not in time order/);
    expect(reference.prepared).toEqual({ sorted: false, setAside: [] });
  });

  it("when the last reading is the meter's 0 V, then it is set aside and τ is that of the others", () => {
    const samples = [...samplesOf(healthyTauSeconds), { tSeconds: 2000, volts: 0 }];
    const verdict = ok(judgeRecordedRun({ samples, engine, observations: {} }));
    expect(verdict.tauSeconds).toBeCloseTo(healthyTauSeconds, 3);
    expect(verdict.prepared.setAside).toEqual([
      expect.objectContaining({ index: 20, tSeconds: 2000, volts: 0 }),
    ]);
  });
});

describe('judgeRecordedRun: the observations are the run conditions', () => {
  const tauSeconds = 200;

  it('when no meter is named, then C = τ / (94 kΩ ∥ 10 MΩ), the engine default', () => {
    // DOMAIN.md: C = τ / R_eff, R_eff = R_bleed ∥ R_meter. By hand: 94 kΩ ∥ 10 MΩ
    // = 94e3 × 10e6 / (94e3 + 10e6) = 93 124.6 Ω; C = 200 s / 93 124.6 Ω = 2147.66 µF.
    const verdict = ok(
      judgeRecordedRun({ samples: samplesOf(tauSeconds), engine, observations: { meterInputOhms: null } }),
    );
    expect(verdict.resistance.effectiveOhms).toBeCloseTo(93_124.6, 0);
    expect(verdict.capacitance.measuredMicrofarads).toBeCloseTo(2147.66, 1);
  });

  it("when the meter's input resistance is 1 MΩ, then C = τ / (94 kΩ ∥ 1 MΩ)", () => {
    // DOMAIN.md: C = τ / R_eff. By hand: 94 kΩ ∥ 1 MΩ = 94e9 / 1.094e6 = 85 923.2 Ω;
    // C = 200 s / 85 923.2 Ω = 2327.63 µF.
    const verdict = ok(
      judgeRecordedRun({ samples: samplesOf(tauSeconds), engine, observations: { meterInputOhms: 1e6 } }),
    );
    expect(verdict.resistance.meterInputOhms).toBe(1e6);
    expect(verdict.resistance.effectiveOhms).toBeCloseTo(85_923.2, 0);
    expect(verdict.capacitance.measuredMicrofarads).toBeCloseTo(2327.63, 1);
  });

  it('when the bleeder was measured at 80 kΩ, then it replaces the design value: C = τ / (80 kΩ ∥ 10 MΩ)', () => {
    // DOMAIN.md: a bleeder measured with the bus discharged separates capacitance loss from
    // bleeder drift. By hand: 80 kΩ ∥ 10 MΩ = 8e11 / 1.008e7 = 79 365.1 Ω; C = 200 / 79 365.1 = 2520.0 µF.
    const verdict = ok(
      judgeRecordedRun({ samples: samplesOf(tauSeconds), engine, observations: { measuredBleederOhms: 80_000 } }),
    );
    expect(verdict.resistance).toMatchObject({ bleederOhms: 80_000, bleederSource: 'measured' });
    expect(verdict.capacitance.measuredMicrofarads).toBeCloseTo(2520.0, 1);
  });

  it('when the bank temperature is noted, then the design normalises it to 20 °C', () => {
    const withCoefficient: BankEngineInputs = {
      ...engine,
      design: { ...engine.design, capacitanceTemperature: { kind: 'coefficient', perKelvin: 0.0025 } },
    };
    const verdict = ok(
      judgeRecordedRun({ samples: samplesOf(tauSeconds), engine: withCoefficient, observations: { bankTempC: 40 } }),
    );
    expect(verdict.capacitance.at20CMicrofarads).not.toBeNull();
    expect(verdict.capacitance.at20CMicrofarads).not.toBeCloseTo(verdict.capacitance.measuredMicrofarads, 0);
    const without = ok(
      judgeRecordedRun({ samples: samplesOf(tauSeconds), engine: withCoefficient, observations: { bankTempC: null } }),
    );
    expect(without.capacitance.at20CMicrofarads).toBeNull();
  });

  it('when the observations are passed, then the verdict equals judgeDecayRun with the same conditions', () => {
    const observations = { bankTempC: 31, measuredBleederOhms: 90_000, meterInputOhms: 2e6 };
    const recorded = ok(judgeRecordedRun({ samples: samplesOf(tauSeconds), engine, observations }));
    const direct = judgeDecayRun({ samples: samplesOf(tauSeconds), ...engine, conditions: observations });
    expect(direct.status).toBe('ok');
    if (direct.status !== 'ok') return;
    expect(recorded.tauSeconds).toBe(direct.tauSeconds);
    expect(recorded.capacitance).toEqual(direct.capacitance);
    expect(recorded.findings).toEqual(direct.findings);
    expect(recorded.health).toBe(direct.health);
  });

  it('when a figure is null or absent, then it is not a condition', () => {
    expect(runConditionsOf({ bankTempC: null, measuredBleederOhms: null, meterInputOhms: null })).toEqual({});
    expect(runConditionsOf({ bankTempC: 0, meterInputOhms: 1e6 })).toEqual({ bankTempC: 0, meterInputOhms: 1e6 });
  });
});
