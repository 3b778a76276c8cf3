/**
 * The review screen's choices: which runs are current, when a run is offered as its bank's
 * baseline (and why not otherwise), the figures it would set, and the readings its chart draws.
 */
import { describe, expect, it } from 'vitest';
import { bankEngineInputs } from '../../../../../shared/domain/bank-engine-inputs';
import {
  judgeRecordedRun,
  type RecordedRunVerdict,
} from '../../../../../shared/domain/recorded-run';
import type { DecayRun } from '../../../../../shared/schemas/decay-run';
import { baselineFiguresOf } from '../../../../../web/src/features/decay-runs/components/review/review-run';
import {
  baselineChoiceFor,
  currentRuns,
} from '../../../../../web/src/features/decay-runs/components/review/review-visit';
import { plottedSamples } from '../../../../../web/src/features/decay-runs/utils/plotted-samples';
import { decaySamples } from '../../../../support/decay-runs';
import { bankJson } from '../bank-json';

const bank = bankJson();
const engine = bankEngineInputs(bank)!;
const samples = decaySamples({ tauSeconds: 310, v0Volts: 540 });

function verdictOf(
  options: {
    samples?: typeof samples;
    visualFindings?: ('leak' | 'bulged-can')[];
    bankTempC?: number;
  } = {},
): RecordedRunVerdict {
  return judgeRecordedRun({
    samples: options.samples ?? samples,
    engine,
    observations: {
      bankTempC: options.bankTempC ?? 20,
      meterInputOhms: 10e6,
      visualFindings: options.visualFindings ?? [],
    },
  });
}

/** A stored run as the API answers, with the parts the review reads. */
function run(overrides: Partial<DecayRun> = {}): DecayRun {
  return {
    id: 'r1',
    visitId: 'v1',
    bankId: bank.id,
    version: 1,
    supersedesId: null,
    supersededById: null,
    usedAsBaseline: false,
    verdict: verdictOf(),
    ...overrides,
  } as DecayRun;
}

describe('currentRuns', () => {
  it('when a run was corrected, then only its newest version is current', () => {
    const runs = [
      run({ id: 'r1', supersededById: 'r2' }),
      run({ id: 'r2', version: 2, supersedesId: 'r1' }),
      run({ id: 'r3' }),
    ];
    expect(currentRuns(runs).map((r) => r.id)).toEqual(['r2', 'r3']);
  });
});

describe('baselineChoiceFor', () => {
  it('when the bank has its nameplate baseline and the run is trustworthy, then the run is offered as the baseline', () => {
    expect(baselineChoiceFor(run(), bank)).toEqual({ offered: true });
  });

  it('when the bank already has a baseline from a decay run, then it is not offered, and the reason names the bank', () => {
    const withRunBaseline = bankJson({
      baseline: { ...bank.baseline, source: 'decay-run', decayRunId: 'r0' },
    });
    const choice = baselineChoiceFor(run(), withRunBaseline);
    expect(choice.offered).toBe(false);
    expect(choice.offered === false && choice.reason).toMatch(
      /Drive 1 DC link already has a baseline from a decay run/,
    );
    // the run that is the baseline says so itself: no reason beside it
    expect(baselineChoiceFor(run({ usedAsBaseline: true }), withRunBaseline)).toEqual({
      offered: false,
      reason: null,
    });
  });

  it('when the readings gave no trustworthy τ, then the run is not offered', () => {
    const flat = Array.from({ length: 6 }, (_, i) => ({ tSeconds: i * 30, volts: 540 }));
    const unusable = run({ verdict: verdictOf({ samples: flat }) });
    expect(unusable.verdict.status).toBe('unusable');
    expect(baselineChoiceFor(unusable, bank)).toEqual({
      offered: false,
      reason: 'A run without a trustworthy τ cannot be the baseline.',
    });
  });

  it('when something was seen wrong at the cabinet, then the run is not offered', () => {
    expect(
      baselineChoiceFor(run({ verdict: verdictOf({ visualFindings: ['leak'] }) }), bank).offered,
    ).toBe(false);
  });

  it('when the bank is out of service or not loaded yet, then the run is not offered', () => {
    expect(baselineChoiceFor(run(), bankJson({ status: 'replaced' })).offered).toBe(false);
    expect(baselineChoiceFor(run(), undefined)).toEqual({ offered: false, reason: null });
  });
});

describe('baselineFiguresOf', () => {
  it('when the run was read at 20 °C, then τ and the capacitance at 20 °C are what it would set', () => {
    const figures = baselineFiguresOf(run());
    const verdict = run().verdict;
    if (verdict.status !== 'ok') throw new Error('a trustworthy run was expected');
    expect(figures).toEqual({
      tauSeconds: verdict.tauSeconds,
      capacitanceMicrofarads: verdict.capacitance.at20CMicrofarads,
    });
    expect(figures!.tauSeconds).toBeCloseTo(310, 0);
  });

  it('when the run gave no trustworthy τ, then it sets nothing', () => {
    const flat = Array.from({ length: 6 }, (_, i) => ({ tSeconds: i * 30, volts: 540 }));
    expect(baselineFiguresOf(run({ verdict: verdictOf({ samples: flat }) }))).toBeNull();
  });
});

describe('plottedSamples', () => {
  it('when readings were typed out of order, then they are drawn in time order (a stable sort)', () => {
    expect(
      plottedSamples([
        { tSeconds: 10, volts: 300 },
        { tSeconds: 0, volts: 540 },
        { tSeconds: 10, volts: 299 },
      ]),
    ).toEqual([
      { tSeconds: 0, volts: 540 },
      { tSeconds: 10, volts: 300 },
      { tSeconds: 10, volts: 299 },
    ]);
  });

  it('when a reading is at or below 0 V, then it is left out, as the judge sets it aside', () => {
    expect(
      plottedSamples([
        { tSeconds: 0, volts: 540 },
        { tSeconds: 900, volts: 0 },
        { tSeconds: 950, volts: -0.4 },
      ]),
    ).toEqual([{ tSeconds: 0, volts: 540 }]);
  });
});
