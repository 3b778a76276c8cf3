import { describe, expect, it } from 'vitest';
import {
  judgeDecayRun,
  type DecayRunFacts,
  type DecayVerdict,
  type DecayVerdictResult,
} from '../../../shared/domain/verdict';
import { effectiveDischargeOhms, tauSecondsOf } from '../../../shared/domain/capacitance';
import { controlSupplyDecayVolts } from '../../../shared/domain/control-supply';
import { EngineInputError } from '../../../shared/domain/errors';
import { DISCHARGE_CAUTION } from '../../../shared/constants/safety';
import { evenTimes, exponentialDecay, withReading } from './support/synthetic-decay';

/** The worked bank: 2 × 4700 µF in series (2350 µF), 2 × 47 kΩ balancing resistors (94 kΩ). */
const nominalMicrofarads = 2350;
const designBleederOhms = 94_000;
const design = {
  technology: 'electrolytic' as const,
  bleederOhms: designBleederOhms,
  construction: { unitCapacitanceMicrofarads: 4700, seriesCount: 2, parallelCount: 1 },
};

/** A run on that bank with `capacitanceMicrofarads` left and a true bleeder of `bleederOhms`, read with a 10 MΩ meter. */
function run(
  capacitanceMicrofarads: number,
  bleederOhms = designBleederOhms,
): DecayRunFacts['samples'] {
  const tau = tauSecondsOf(effectiveDischargeOhms(bleederOhms), capacitanceMicrofarads);
  return exponentialDecay({ v0Volts: 562, tauSeconds: tau, times: evenTimes(20, 30) });
}

function ok(result: DecayVerdictResult): DecayVerdict {
  if (result.status !== 'ok') throw new Error(`expected a verdict, got: ${result.reason}`);
  return result;
}

function everyNumberFinite(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (Array.isArray(value)) return value.every(everyNumberFinite);
  if (value && typeof value === 'object') return Object.values(value).every(everyNumberFinite);
  return true;
}

describe('judgeDecayRun: capacitance and health', () => {
  it('when the bank has its full capacitance, then the ratio is 1, healthy, and C = τ / R_eff', () => {
    const verdict = ok(
      judgeDecayRun({
        samples: run(nominalMicrofarads),
        design,
        baseline: { capacitanceMicrofarads: 2350, source: 'decay-run' },
      }),
    );
    expect(verdict.capacitance.measuredMicrofarads).toBeCloseTo(nominalMicrofarads, 3);
    expect(verdict.capacitance.measuredMicrofarads).toBeCloseTo(
      (verdict.tauSeconds / verdict.resistance.effectiveOhms) * 1e6,
      9,
    );
    expect(verdict.baseline!.ratio).toBeCloseTo(1, 6);
    expect(verdict.health).toBe('healthy');
    expect(verdict.healthLabel).toBe('healthy');
    expect(verdict.safetyFinding).toBe(false);
  });

  it('when 15 % of the capacitance is gone, then watch, with a capacitance-loss finding suggesting to measure the bleeder', () => {
    const verdict = ok(
      judgeDecayRun({
        samples: run(0.85 * nominalMicrofarads),
        design,
        baseline: { capacitanceMicrofarads: 2350, source: 'decay-run' },
      }),
    );
    expect(verdict.baseline!.ratio).toBeCloseTo(0.85, 5);
    expect(verdict.health).toBe('watch');
    const finding = verdict.findings.find((f) => f.code === 'capacitance-loss');
    expect(finding?.message).toMatch(/bleeder whose resistance fell/);
    expect(finding?.message).toMatch(/Measure the bleeder/);
  });

  it('when 25 % is gone, then end of life, labelled "end of life"', () => {
    const verdict = ok(
      judgeDecayRun({
        samples: run(0.75 * nominalMicrofarads),
        design,
        baseline: { capacitanceMicrofarads: 2350, source: 'decay-run' },
      }),
    );
    expect(verdict.health).toBe('end-of-life');
    expect(verdict.healthLabel).toBe('end of life');
  });

  it("when the design has a drive manual's 85 % limit, then 83 % is end of life", () => {
    const verdict = ok(
      judgeDecayRun({
        samples: run(0.83 * nominalMicrofarads),
        design: { ...design, limits: { watchRatio: 0.92, endOfLifeRatio: 0.85 } },
      }),
    );
    expect(verdict.health).toBe('end-of-life');
  });

  it('when no baseline is given, then the nameplate serves, and a finding says so', () => {
    const verdict = ok(judgeDecayRun({ samples: run(0.95 * nominalMicrofarads), design }));
    expect(verdict.baseline).toMatchObject({
      source: 'nameplate',
      capacitanceMicrofarads: nominalMicrofarads,
    });
    expect(verdict.capacitance.nominalMicrofarads).toBe(nominalMicrofarads);
    expect(verdict.findings.map((f) => f.code)).toContain('baseline-from-nameplate');
  });

  it('when there is neither a baseline nor a construction, then health is null with a plain-words finding', () => {
    const verdict = ok(
      judgeDecayRun({
        samples: run(nominalMicrofarads),
        design: { technology: 'film', bleederOhms: designBleederOhms },
      }),
    );
    expect(verdict.health).toBeNull();
    expect(verdict.baseline).toBeNull();
    expect(verdict.findings.map((f) => f.code)).toContain('no-baseline');
  });

  it('when the bank is at 40 °C and the design has a coefficient, then the ratio uses the capacitance at 20 °C', () => {
    const coefficient = 0.0025;
    const warmMicrofarads = nominalMicrofarads * 0.9 * (1 + coefficient * 20);
    const verdict = ok(
      judgeDecayRun({
        samples: run(warmMicrofarads),
        design: {
          ...design,
          capacitanceTemperature: { kind: 'coefficient', perKelvin: coefficient },
        },
        baseline: { capacitanceMicrofarads: nominalMicrofarads, source: 'decay-run' },
        conditions: { bankTempC: 40 },
      }),
    );
    expect(verdict.capacitance.at20CMicrofarads).toBeCloseTo(0.9 * nominalMicrofarads, 3);
    expect(verdict.baseline!.ratio).toBeCloseTo(0.9, 5);
    // The expected τ is for the warm bank, so τ is not read as a rise.
    expect(verdict.baseline!.tauRatio).toBeCloseTo(0.9, 5);
  });

  it('when a temperature is given but the design has no model, then an info finding says the capacitance is not normalised', () => {
    const verdict = ok(
      judgeDecayRun({ samples: run(nominalMicrofarads), design, conditions: { bankTempC: 35 } }),
    );
    expect(verdict.capacitance.at20CMicrofarads).toBeNull();
    expect(verdict.findings.find((f) => f.code === 'not-normalised')?.severity).toBe('info');
  });

  it('when the ratio interval spans a limit, then a finding suggests a repeat run', () => {
    const samples = exponentialDecay({
      v0Volts: 562,
      tauSeconds: tauSecondsOf(effectiveDischargeOhms(designBleederOhms), 0.9 * nominalMicrofarads),
      times: [0, 100, 200, 300],
    }).map((s, i) => ({ ...s, volts: s.volts * (1 + (i % 2 ? 0.01 : -0.01)) }));
    const verdict = ok(
      judgeDecayRun({
        samples,
        design,
        baseline: { capacitanceMicrofarads: 2350, source: 'decay-run' },
      }),
    );
    expect(verdict.baseline!.ratioCi95[0]).toBeLessThan(0.9);
    expect(verdict.baseline!.ratioCi95[1]).toBeGreaterThan(0.9);
    expect(verdict.findings.map((f) => f.code)).toContain('ratio-near-limit');
  });
});

describe('judgeDecayRun: reading τ both ways', () => {
  it('when the bleeder has drifted 30 % up, then τ rises, a safety finding names the bleeder, and health is at least watch', () => {
    const verdict = ok(
      judgeDecayRun({
        samples: run(nominalMicrofarads, 1.3 * designBleederOhms),
        design,
        baseline: { capacitanceMicrofarads: 2350, source: 'decay-run' },
      }),
    );
    expect(verdict.baseline!.tauRatio).toBeGreaterThan(1.25);
    const finding = verdict.findings.find((f) => f.code === 'tau-rise');
    expect(finding?.severity).toBe('safety');
    expect(finding?.message).toMatch(/bleeder/);
    expect(finding?.message).toMatch(/dangerous for longer/);
    expect(verdict.safetyFinding).toBe(true);
    expect(verdict.findings[0]!.severity).toBe('safety');
    expect(verdict.health).toBe('watch');
  });

  it('when the drifted bleeder is measured, then C uses the measured value, the ratio is right and the drift is a safety finding', () => {
    const measured = 1.3 * designBleederOhms;
    const verdict = ok(
      judgeDecayRun({
        samples: run(0.97 * nominalMicrofarads, measured),
        design,
        baseline: { capacitanceMicrofarads: 2350, source: 'decay-run' },
        conditions: { measuredBleederOhms: measured },
      }),
    );
    expect(verdict.resistance).toMatchObject({ bleederOhms: measured, bleederSource: 'measured' });
    expect(verdict.baseline!.ratio).toBeCloseTo(0.97, 5);
    expect(verdict.health).toBe('healthy');
    expect(verdict.findings.map((f) => f.code)).toEqual(
      expect.arrayContaining(['measured-bleeder-used', 'bleeder-drift', 'tau-rise']),
    );
    expect(verdict.findings.find((f) => f.code === 'bleeder-drift')?.severity).toBe('safety');
  });

  it('when the bleeder fell and was measured, then the capacitance is right and the loss is not blamed on the bank', () => {
    const measured = 0.8 * designBleederOhms;
    const verdict = ok(
      judgeDecayRun({
        samples: run(nominalMicrofarads, measured),
        design,
        baseline: { capacitanceMicrofarads: 2350, source: 'decay-run' },
        conditions: { measuredBleederOhms: measured },
      }),
    );
    expect(verdict.baseline!.ratio).toBeCloseTo(1, 5);
    expect(verdict.health).toBe('healthy');
    expect(verdict.findings.find((f) => f.code === 'bleeder-drift')?.severity).toBe('attention');
  });
});

describe('judgeDecayRun: discharge safety', () => {
  it('when the cabinet has a nominal bus voltage, then the estimate starts there, uses the bus τ without the meter, and carries the caution', () => {
    const verdict = ok(
      judgeDecayRun({
        samples: run(nominalMicrofarads),
        design,
        cabinet: { nominalBusVolts: 565 },
      }),
    );
    const busTau = verdict.capacitance.measuredMicrofarads * 1e-6 * designBleederOhms;
    expect(busTau).toBeGreaterThan(verdict.tauSeconds);
    expect(verdict.discharge.fromSource).toBe('nominal-bus');
    expect(verdict.discharge.safeAfterSeconds['60']).toBeCloseTo(busTau * Math.log(565 / 60), 6);
    expect(verdict.discharge.caution).toBe(DISCHARGE_CAUTION);
  });

  it('when the marked wait is too short for the bank, then a safety finding says so', () => {
    const verdict = ok(
      judgeDecayRun({
        samples: run(nominalMicrofarads),
        design,
        cabinet: { nominalBusVolts: 565, markedWaitSeconds: 300 },
      }),
    );
    expect(verdict.discharge.exceedsMarkedWait).toBe(true);
    expect(verdict.findings.find((f) => f.code === 'discharge-exceeds-marked-wait')?.severity).toBe(
      'safety',
    );
  });

  it('when no nominal voltage is known, then the first reading is the start', () => {
    const samples = run(nominalMicrofarads);
    const verdict = ok(judgeDecayRun({ samples, design }));
    expect(verdict.discharge).toMatchObject({
      fromSource: 'first-reading',
      fromVolts: samples[0]!.volts,
    });
  });
});

describe('judgeDecayRun: passing on the fit', () => {
  it('when the run has a control-supply phase and a dropped digit, then both are reported and the ratio is unaffected', () => {
    const effective = effectiveDischargeOhms(designBleederOhms);
    const tau = tauSecondsOf(effective, nominalMicrofarads);
    const bank = {
      v0Volts: 565,
      tauSeconds: tau,
      controlSupplyWatts: 25,
      effectiveOhms: effective,
      dropoutVolts: 310,
    };
    const clean = [0, 20, 40, 60, 90, 120, 150, 180, 240, 300, 360, 420, 480, 540].map((t) => ({
      tSeconds: t,
      volts: Math.round(controlSupplyDecayVolts(bank, t)),
    }));
    const samples = withReading(clean, 6, Math.floor(clean[6]!.volts / 10));
    const verdict = ok(
      judgeDecayRun({
        samples,
        design,
        baseline: { capacitanceMicrofarads: 2350, source: 'decay-run' },
      }),
    );
    expect(verdict.baseline!.ratio).toBeCloseTo(1, 2);
    expect(verdict.findings.map((f) => f.code)).toEqual(
      expect.arrayContaining(['control-supply-phase', 'readings-left-out']),
    );
  });

  it('when the run is unusable, then the verdict is the unusable result', () => {
    expect(judgeDecayRun({ samples: [{ tSeconds: 0, volts: 500 }], design })).toMatchObject({
      status: 'unusable',
      code: 'too-few-points',
    });
  });

  it('when a verdict is made, then every number in it is finite', () => {
    const verdict = judgeDecayRun({
      samples: run(0.9 * nominalMicrofarads),
      design: { ...design, capacitanceTemperature: { kind: 'coefficient', perKelvin: 0.002 } },
      cabinet: { nominalBusVolts: 565, markedWaitSeconds: 600 },
      conditions: { bankTempC: 31, meterInputOhms: 1e7 },
    });
    expect(everyNumberFinite(verdict)).toBe(true);
  });

  it('when facts are malformed, then EngineInputError names the field', () => {
    expect(() =>
      judgeDecayRun({ samples: run(2350), design: { ...design, bleederOhms: -1 } }),
    ).toThrow(EngineInputError);
    expect(() =>
      judgeDecayRun({ samples: run(2350), design, cabinet: { nominalBusVolts: 0 } }),
    ).toThrow(/nominal bus voltage/);
    expect(() =>
      judgeDecayRun({
        samples: run(2350),
        design,
        baseline: { capacitanceMicrofarads: -5, source: 'nameplate' },
      }),
    ).toThrow(EngineInputError);
    expect(() =>
      judgeDecayRun({ samples: run(2350), design: { ...design, tauRiseTolerance: 2 } }),
    ).toThrow(EngineInputError);
  });
});

describe('judgeDecayRun: ratios far outside any ageing', () => {
  const baseline = { capacitanceMicrofarads: nominalMicrofarads, source: 'decay-run' as const };

  it('when the ratio is 140 % of the baseline, then it is never called healthy and says to check the bleeder value and the readings', () => {
    const verdict = ok(judgeDecayRun({ samples: run(1.4 * nominalMicrofarads), design, baseline }));
    expect(verdict.baseline!.ratio).toBeCloseTo(1.4, 4);
    expect(verdict.health).toBeNull();
    expect(verdict.healthLabel).toBeNull();
    expect(verdict.notJudgedBecause).toBe('implausible-ratio');
    const finding = verdict.findings.find((f) => f.code === 'implausible-ratio');
    expect(finding?.message).toMatch(
      /^The capacitance is 140 % of the baseline, far outside any physical ageing \(30 % to 130 %\): check the bleeder value and the readings\./,
    );
  });

  it('when the register holds a 1 µF baseline (the report’s 335,539 %), then not healthy and the same advice', () => {
    const verdict = ok(
      judgeDecayRun({
        samples: run(nominalMicrofarads),
        design,
        baseline: { capacitanceMicrofarads: 0.7, source: 'nameplate' },
      }),
    );
    expect(verdict.health).toBeNull();
    expect(verdict.findings.map((f) => f.code)).toContain('implausible-ratio');
  });

  it('when the ratio is 25 % of the baseline, then not judged end of life either, with the same advice', () => {
    const verdict = ok(
      judgeDecayRun({ samples: run(0.25 * nominalMicrofarads), design, baseline }),
    );
    expect(verdict.health).toBeNull();
    expect(verdict.notJudgedBecause).toBe('implausible-ratio');
    expect(verdict.findings.find((f) => f.code === 'implausible-ratio')?.message).toMatch(
      /25 % of the baseline.*check the bleeder value and the readings/,
    );
  });

  it('when the ratio is just inside the bounds, then health is judged as usual', () => {
    expect(
      ok(judgeDecayRun({ samples: run(0.32 * nominalMicrofarads), design, baseline })).health,
    ).toBe('end-of-life');
    const high = ok(judgeDecayRun({ samples: run(1.28 * nominalMicrofarads), design, baseline }));
    expect(high.health).not.toBeNull();
    expect(high.notJudgedBecause).toBeNull();
    expect(high.findings.map((f) => f.code)).not.toContain('implausible-ratio');
  });

  it('when there is no baseline and no construction, then the reason health is not judged is said', () => {
    const { construction: _none, ...bare } = design;
    expect(
      ok(judgeDecayRun({ samples: run(nominalMicrofarads), design: bare })).notJudgedBecause,
    ).toBe('no-baseline');
  });
});
