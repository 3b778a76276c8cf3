import { describe, expect, it } from 'vitest';
import type { BankEngineInputs } from '../../../shared/domain/bank-engine-inputs';
import {
  judgeRecordedRun,
  type RecordedRunOkVerdict,
  type RecordedRunObservations,
  type RecordedRunVerdict,
} from '../../../shared/domain/recorded-run';
import {
  explainVerdict,
  plainDuration,
  safeAfterOf,
} from '../../../shared/domain/verdict-explanation';
import { WORKED_BANK, WORKED_BANK_HEALTHY_TAU_SECONDS } from '../../support/test-bank';
import { evenTimes, exponentialDecay } from './support/synthetic-decay';

/** The worked bank (2350 µF, 94 kΩ bleeder, 560 V bus, 900 s marked wait) and its healthy τ ≈ 218.8 s. */
const engine: BankEngineInputs = WORKED_BANK;
const healthyTauSeconds = WORKED_BANK_HEALTHY_TAU_SECONDS;

/** The day of the run: the next check counts from it. */
const asOfOn = '2027-01-09';

function judged(
  tauSeconds: number,
  options: { engine?: BankEngineInputs; observations?: RecordedRunObservations } = {},
): RecordedRunVerdict {
  return judgeRecordedRun({
    samples: exponentialDecay({ v0Volts: 560, tauSeconds, times: evenTimes(20, 30) }),
    engine: options.engine ?? engine,
    observations: options.observations ?? {},
  });
}

function ok(verdict: RecordedRunVerdict): RecordedRunOkVerdict {
  if (verdict.status !== 'ok') throw new Error(`expected a verdict, got: ${verdict.reason}`);
  return verdict;
}

/** A verdict whose τ and interval are set by hand (the rest from the healthy run). */
function withTau(tauSeconds: number, ci95: [number, number]): RecordedRunOkVerdict {
  const verdict = ok(judged(healthyTauSeconds));
  return { ...verdict, tauSeconds, fit: { ...verdict.fit, tauSeconds, tauCi95: ci95 } };
}

const withEngine = (changes: Partial<BankEngineInputs>): BankEngineInputs => ({
  ...engine,
  ...changes,
});

/** The healthy run on a cabinet marked with a 5 min (300 s) wait, shorter than the bus needs. */
const withShortMarkedWait = (): RecordedRunVerdict =>
  judged(healthyTauSeconds, {
    engine: withEngine({ cabinet: { nominalBusVolts: 560, markedWaitSeconds: 300 } }),
  });

/** Two readings: too few to fit a decay. */
const twoReadings = [
  { tSeconds: 0, volts: 560 },
  { tSeconds: 30, volts: 490 },
];

/** A run that cannot be judged (two readings), with what was seen on the bank. */
const unusable = (observations: RecordedRunObservations = {}): RecordedRunVerdict =>
  judgeRecordedRun({ samples: twoReadings, engine, observations });

describe('explainVerdict: τ', () => {
  it('when τ is 326 s between 318 and 334 s, then it says the voltage fell to about a third every 5.4 minutes', () => {
    // DOMAIN.md: after 1 τ 36.8 % remains ("about a third"); 326 s / 60 = 5.43 min → 5.4
    expect(explainVerdict(withTau(326, [318, 334]), { asOfOn }).tau).toBe(
      'The voltage fell to about a third every 5.4 minutes (τ = 326 s, between 318 and 334 s).',
    );
  });

  it('when τ is under a minute and a half, then the time is said in seconds', () => {
    expect(explainVerdict(withTau(45.2, [44.1, 46.3]), { asOfOn }).tau).toBe(
      'The voltage fell to about a third every 45 seconds (τ = 45.2 s, between 44.1 and 46.3 s).',
    );
  });

  it('when the interval is narrower than the last figure shown, then it says τ is known to better than that', () => {
    // format.ts's own example: 224.983 to 225.03 around 225.0 reads "225 s (narrower than 1 s)"
    expect(explainVerdict(withTau(225.0, [224.983, 225.03]), { asOfOn }).tau).toBe(
      'The voltage fell to about a third every 3.8 minutes (τ = 225 s, to better than 1 s).',
    );
  });
});

describe('explainVerdict: capacitance', () => {
  it('when the baseline is a trusted run, then the capacitance is set against it and the nameplate', () => {
    // C = τ / R_eff = 218.8 s / 93,125 Ω = 2350 µF; 2350 / 2500 = 94 %; 2350 / 2350 = 100 %
    const verdict = judged(healthyTauSeconds, {
      engine: withEngine({ baseline: { capacitanceMicrofarads: 2500, source: 'decay-run' } }),
    });
    expect(explainVerdict(verdict, { asOfOn }).capacitance).toBe(
      "The bank holds 2,350 µF, 94 % of its baseline of 2,500 µF (the reference from its first trusted run) and 100 % of the nameplate's 2,350 µF.",
    );
  });

  it('when the nameplate serves as the baseline, then it says so and what a baseline is', () => {
    // τ = 0.85 × the healthy τ: 0.85 × 2350 µF = 1,997.5 µF → "2,000 µF" (three figures), 85 %
    const verdict = judged(0.85 * healthyTauSeconds);
    expect(explainVerdict(verdict, { asOfOn }).capacitance).toBe(
      "The bank holds 2,000 µF, 85 % of the nameplate's 2,350 µF, which serves as its baseline (the reference it is judged against) until a trusted run is recorded.",
    );
  });

  it('when the capacitance was corrected to 20 °C, then the sentence says so', () => {
    // +0.2 %/K at 30 °C: C(30 °C) = C20 × (1 + 0.002 × 10), so C20 = 2350 / 1.02 = 2,304 µF → "2,300 µF"
    const verdict = judged(healthyTauSeconds, {
      engine: withEngine({
        design: {
          ...engine.design,
          capacitanceTemperature: { kind: 'coefficient', perKelvin: 0.002 },
        },
      }),
      observations: { bankTempC: 30 },
    });
    expect(explainVerdict(verdict, { asOfOn }).capacitance).toMatch(
      /^The bank holds 2,300 µF \(corrected to 20 °C\), /,
    );
  });

  it('when there is neither a baseline nor a nameplate construction, then it says there is nothing to compare with', () => {
    const { construction: _construction, ...design } = engine.design;
    const verdict = judged(healthyTauSeconds, {
      engine: { design, baseline: undefined as never, cabinet: engine.cabinet },
    });
    expect(explainVerdict(verdict, { asOfOn }).capacitance).toBe(
      'The bank holds 2,350 µF; there is no baseline and no nameplate value to compare it with yet.',
    );
  });

  it('when the run is unusable, then there is no capacitance sentence', () => {
    const verdict = unusable();
    expect(explainVerdict(verdict, { asOfOn, markedWaitSeconds: 900 }).capacitance).toBeNull();
  });
});

describe('explainVerdict: health', () => {
  it('when the bank keeps its capacitance, then it is healthy and the sentence names the watch limit', () => {
    expect(explainVerdict(judged(healthyTauSeconds), { asOfOn }).health).toBe(
      'Healthy: the bank keeps at least 90 % of its baseline capacitance, so it smooths the DC bus as it should.',
    );
  });

  it('when the bank has lost capacitance below the watch limit, then it is on watch and its replacement is to be planned', () => {
    // 85 % of the baseline: below watch (90 %), above end of life (80 %) (DOMAIN.md defaults)
    expect(explainVerdict(judged(0.85 * healthyTauSeconds), { asOfOn }).health).toBe(
      'Watch: the bank has lost some capacitance (below 90 % of its baseline); it still works, but it is ageing and its replacement should be planned before it reaches 80 %.',
    );
  });

  it('when the bank is below the end-of-life limit, then it is at end of life and should be replaced', () => {
    expect(explainVerdict(judged(0.75 * healthyTauSeconds), { asOfOn }).health).toBe(
      'End of life: the bank is below 80 % of its baseline capacitance, past the point where it can be relied on to smooth the DC bus; it should be replaced.',
    );
  });

  it('when τ has risen above the baseline, then the watch points at the bleeder, not the capacitors', () => {
    // DOMAIN.md: τ rising is usually the bleeder's resistance rising; capacitance does not grow with age
    const verdict = ok(judged(1.2 * healthyTauSeconds));
    expect(verdict.health).toBe('watch');
    expect(explainVerdict(verdict, { asOfOn }).health).toBe(
      'Watch: τ is longer than the baseline, which points at the bleeder rather than the capacitors, so the bank is watched until the bleeder is measured.',
    );
  });

  it('when a visual finding was recorded, then the bank is at end of life whatever τ says', () => {
    const verdict = judged(healthyTauSeconds, { observations: { visualFindings: ['bulged-can'] } });
    expect(explainVerdict(verdict, { asOfOn }).health).toBe(
      'End of life: a bulged can was seen, and a damaged capacitor can fail at any time, so the bank is at end of life whatever τ says.',
    );
  });

  it('when the ratio is far outside any ageing, then the health is not judged and the inputs are in doubt', () => {
    // 25 % is outside PLAUSIBLE_RATIO (30 % to 130 % of the baseline, health-rules.ts)
    const verdict = judged(0.25 * healthyTauSeconds);
    expect(explainVerdict(verdict, { asOfOn }).health).toBe(
      'Not judged: 25 % of the baseline is far outside what ageing does, so the bleeder value in the register or the readings are in doubt.',
    );
  });
});

describe('explainVerdict: safety', () => {
  it('when there is no safety finding, then there is no safety sentence', () => {
    expect(explainVerdict(judged(healthyTauSeconds), { asOfOn }).safety).toBeNull();
  });

  it('when τ rose 20 % above the baseline, then the bus stays dangerous for longer', () => {
    // τ / expected τ = 1.2 by construction of the run
    expect(explainVerdict(judged(1.2 * healthyTauSeconds), { asOfOn }).safety).toBe(
      "Safety: τ is 20 % longer than at the baseline, so the bus stays dangerous for longer after isolation (most likely the bleeder's resistance has risen or a resistor has opened).",
    );
  });

  it('when a bulged can and a leak were seen, then the safety sentence names both', () => {
    const verdict = judged(healthyTauSeconds, {
      observations: { visualFindings: ['bulged-can', 'leak'] },
    });
    expect(explainVerdict(verdict, { asOfOn }).safety).toBe(
      'Safety: a bulged can and leaking electrolyte were seen on the bank; a damaged capacitor can vent or burst, so keep clear of it while the drive is energised.',
    );
  });

  it('when the discharge takes longer than the marked wait, then the safety sentence gives both times', () => {
    // bus τ = 2350 µF × 94 kΩ = 220.9 s; 560 V → 50 V: 220.9 × ln(11.2) = 533.7 s → 9 min (DOMAIN.md: t = τ ln(V0/V))
    const verdict = withShortMarkedWait();
    expect(explainVerdict(verdict, { asOfOn }).safety).toBe(
      'Safety: the bus may need up to 9 minutes to fall below 50 V, longer than the marked wait of 5 minutes.',
    );
  });
});

describe('explainVerdict: safe after', () => {
  it('when the marked wait is longer than the estimate, then the marked wait is the time, with the estimate beside it', () => {
    // estimate 533.7 s → "9 minutes" rounded up; marked 900 s = 15 min
    expect(explainVerdict(judged(healthyTauSeconds), { asOfOn }).safeAfter).toBe(
      "Approach the DC bus no sooner than 15 minutes after isolation, the cabinet's marked wait (this run says it falls below 50 V within 9 minutes), and only once the meter shows no voltage.",
    );
  });

  it('when the estimate is longer than the marked wait, then the estimate is the time', () => {
    const verdict = withShortMarkedWait();
    expect(explainVerdict(verdict, { asOfOn }).safeAfter).toBe(
      "Approach the DC bus no sooner than 9 minutes after isolation, longer than the cabinet's marked wait of 5 minutes, because this run says the bus needs that long to fall below 50 V, and only once the meter shows no voltage.",
    );
  });

  it('when the estimate is shorter, then the safe-after time is never shorter than the marked wait', () => {
    const safe = safeAfterOf(judged(healthyTauSeconds), { asOfOn });
    expect(safe).toMatchObject({ seconds: 900, basis: 'marked-wait', markedWaitSeconds: 900 });
    expect(safe.estimateSeconds).toBeCloseTo(2350e-6 * 94_000 * Math.log(560 / 50), 0);
  });

  it("when the register has no marked wait, then the estimate is given with the maker's marked time to keep to", () => {
    const verdict = judged(healthyTauSeconds, {
      engine: withEngine({ cabinet: { nominalBusVolts: 560 } }),
    });
    expect(explainVerdict(verdict, { asOfOn }).safeAfter).toBe(
      "Approach the DC bus no sooner than 9 minutes after isolation (this run's estimate to fall below 50 V; the register has no marked wait, so also keep to the time the drive maker marks on the cabinet), and only once the meter shows no voltage.",
    );
  });

  it('when the run is unusable, then the marked wait of the context is the time', () => {
    const verdict = unusable();
    expect(explainVerdict(verdict, { asOfOn, markedWaitSeconds: 900 }).safeAfter).toBe(
      "This run gives no discharge estimate: wait at least the cabinet's marked wait of 15 minutes after isolation, and only once the meter shows no voltage.",
    );
  });
});

describe('explainVerdict: next step', () => {
  it('when the bank is healthy, then it is checked again a year after the run', () => {
    // health.ts: DEFAULT_INSPECTION_INTERVAL_DAYS = 365; 9 Jan 2027 + 365 days = 9 Jan 2028
    expect(explainVerdict(judged(healthyTauSeconds), { asOfOn }).nextStep).toBe(
      'No action now: check this bank again by 9 Jan 2028.',
    );
  });

  it('when τ rose, then the bus is treated as live for longer and the bleeder measured', () => {
    expect(explainVerdict(judged(1.2 * healthyTauSeconds), { asOfOn }).nextStep).toMatch(
      /^Treat the DC bus as live for longer than its marked wait, and measure the bleeder resistance/,
    );
  });

  it('when the only safety finding is a visual one, then the next step is the replacement, not a longer wait', () => {
    const verdict = judged(healthyTauSeconds, { observations: { visualFindings: ['open-vent'] } });
    expect(explainVerdict(verdict, { asOfOn }).nextStep).toBe(
      'Replace this bank at the next shutdown, and tell the reliability engineer and the maintenance planner so the replacement is planned and the parts are ordered.',
    );
  });
});

describe('explainVerdict: unusable runs', () => {
  it('when the readings cannot be fitted, then the τ sentence says what went wrong', () => {
    const verdict = unusable();
    expect(explainVerdict(verdict, { asOfOn }).tau).toBe(
      'These readings could not be judged: only 2 readings; at least 3 are needed to fit a decay (5 or more over two to three time constants is better).',
    );
  });

  it('when the readings cannot be fitted, then the next step is to correct or repeat the run', () => {
    const verdict = unusable();
    expect(explainVerdict(verdict, { asOfOn }).nextStep).toBe(
      'Correct the readings if one was mistyped (Correct this run), or repeat the run with at least five readings over two to three time constants.',
    );
  });

  it('when an unusable run has a visual finding, then the bank is still at end of life', () => {
    const verdict = unusable({ visualFindings: ['leak'] });
    const text = explainVerdict(verdict, { asOfOn });
    expect(text.health).toMatch(/^End of life: leaking electrolyte was seen/);
    expect(text.safety).toMatch(/^Safety: leaking electrolyte was seen on the bank/);
  });
});

describe('plainDuration', () => {
  it('when rounding up a wait, then 533.7 s reads 9 minutes', () => {
    expect(plainDuration(533.7, { roundUp: true })).toBe('9 minutes');
  });

  it('when rounding up a wait of exactly 15 minutes, then it stays 15 minutes', () => {
    expect(plainDuration(900, { roundUp: true })).toBe('15 minutes');
  });

  it('when a wait is past two hours, then it reads in hours and minutes', () => {
    expect(plainDuration(2 * 3600 + 61, { roundUp: true })).toBe('2 hours 2 minutes');
  });

  it('when a span is one second, then the unit is singular', () => {
    expect(plainDuration(1)).toBe('1 second');
  });
});
