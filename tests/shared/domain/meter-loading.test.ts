import { describe, expect, it } from 'vitest';
import {
  assumedMeterWarning,
  ASSUMED_METER_WARNING_BLEEDER_OHMS,
} from '../../../shared/domain/meter-loading';
import { judgeDecayRun, type DecayVerdict } from '../../../shared/domain/verdict';
import { effectiveDischargeOhms, tauSecondsOf } from '../../../shared/domain/capacitance';
import { evenTimes, exponentialDecay } from './support/synthetic-decay';

describe('assumedMeterWarning', () => {
  it('when a 470 kΩ bleeder is judged with the meter not given, then the warning gives the meter share and the doubt', () => {
    // DOMAIN.md's worked figure: ignoring a 10 MΩ meter beside 470 kΩ is about a 4.5 % error.
    // 470 kΩ ∥ 10 MΩ = 448.9 kΩ and 470 kΩ ∥ 1 MΩ = 319.7 kΩ: a 1 MΩ input reads C 40 % higher.
    expect(assumedMeterWarning(470_000, undefined)).toBe(
      "The meter's input resistance was not given, so 10 MΩ was assumed. Beside the 470 kΩ bleeder that is a guess that matters: the meter carries 4.5 % of the discharge current, and with a 1 MΩ input (some loggers and scope probes) the capacitance would be 40 % higher. State the meter's or logger's input resistance.",
    );
  });

  it('when the meter is stated (even as none), then there is no warning', () => {
    expect(assumedMeterWarning(470_000, 10e6)).toBeNull();
    expect(assumedMeterWarning(470_000, 1e9)).toBeNull();
    expect(assumedMeterWarning(470_000, null)).toBeNull();
    expect(assumedMeterWarning(470_000, 0)).toBeNull();
  });

  it('when the bleeder is 200 kΩ or less, then the assumed 10 MΩ is no warning', () => {
    expect(assumedMeterWarning(ASSUMED_METER_WARNING_BLEEDER_OHMS, undefined)).toBeNull();
    expect(assumedMeterWarning(94_000, undefined)).toBeNull();
    expect(assumedMeterWarning(ASSUMED_METER_WARNING_BLEEDER_OHMS + 1, undefined)).not.toBeNull();
  });
});

describe('judgeDecayRun: meter loading stated, not assumed', () => {
  /** 2350 µF behind a 470 kΩ bleeder, read by a 10 MΩ logger. */
  const bleederOhms = 470_000;
  const samples = exponentialDecay({
    v0Volts: 560,
    tauSeconds: tauSecondsOf(effectiveDischargeOhms(bleederOhms, 10e6), 2350),
    times: evenTimes(30, 60),
  });
  const judge = (meterInputOhms?: number | null): DecayVerdict => {
    const verdict = judgeDecayRun({
      samples,
      design: { technology: 'electrolytic', bleederOhms },
      ...(meterInputOhms === undefined ? {} : { conditions: { meterInputOhms } }),
    });
    if (verdict.status !== 'ok') throw new Error(verdict.reason);
    return verdict;
  };

  it('when the meter is not given beside a 470 kΩ bleeder, then the verdict carries an attention finding', () => {
    const findings = judge().findings.filter((f) => f.code === 'meter-input-assumed');
    expect(findings).toHaveLength(1);
    expect(findings[0]!.severity).toBe('attention');
    expect(findings[0]!.message).toMatch(/was not given, so 10 MΩ was assumed/);
  });

  it('when the same meter is stated, then the same capacitance comes out and there is no such finding', () => {
    const stated = judge(10e6);
    expect(stated.findings.map((f) => f.code)).not.toContain('meter-input-assumed');
    expect(stated.capacitance.measuredMicrofarads).toBeCloseTo(
      judge().capacitance.measuredMicrofarads,
      9,
    );
    expect(stated.capacitance.measuredMicrofarads).toBeCloseTo(2350, 3);
  });

  it('when a 1 GΩ logger is stated, then the capacitance is computed with it, without the warning', () => {
    const verdict = judge(1e9);
    expect(verdict.resistance.meterInputOhms).toBe(1e9);
    expect(verdict.findings.map((f) => f.code)).not.toContain('meter-input-assumed');
  });
});
