import { describe, expect, it } from 'vitest';
import { nextStepAfterVerdict, type NextStepFacts } from '../../../shared/domain/next-step';

const judged = (health: NextStepFacts['health'], safetyFinding = false): NextStepFacts => ({
  health,
  notJudgedBecause: null,
  safetyFinding,
});
const today = '2026-12-02';

describe('nextStepAfterVerdict', () => {
  it('when healthy, then no action now and the next check within a year, by its date', () => {
    const step = nextStepAfterVerdict(judged('healthy'), today);
    expect(step).toEqual({
      kind: 'check-again',
      byOn: '2027-12-02',
      sentence: 'No action now: check this bank again by 2 Dec 2027.',
    });
  });

  it('when on watch, then re-test at the next shutdown within six months and plan the replacement', () => {
    const step = nextStepAfterVerdict(judged('watch'), today);
    expect(step.kind).toBe('retest-and-plan');
    expect(step.byOn).toBe('2027-06-02');
    expect(step.sentence).toBe(
      'Re-test this bank at the next shutdown (by 2 Jun 2027 at the latest) and plan its replacement with the maintenance planner.',
    );
  });

  it('when at end of life, then replace it and tell the reliability engineer and the planner', () => {
    const step = nextStepAfterVerdict(judged('end-of-life'), today);
    expect(step.kind).toBe('replace');
    expect(step.byOn).toBeNull();
    expect(step.sentence).toMatch(
      /^Replace this bank at the next shutdown, and tell the reliability engineer and the maintenance planner/,
    );
  });

  it('when there is a safety finding, then treat the bus as live longer than marked and measure the bleeder, before any health step', () => {
    for (const health of ['healthy', 'watch'] as const) {
      const step = nextStepAfterVerdict(judged(health, true), today);
      expect(step.kind).toBe('treat-as-live');
      expect(step.sentence).toMatch(
        /^Treat the DC bus as live for longer than its marked wait, and measure the bleeder resistance with the bus discharged/,
      );
      expect(step.sentence).not.toMatch(/replace/);
    }
  });

  it('when there is a safety finding on a bank at end of life, then the one sentence says to replace it too', () => {
    const step = nextStepAfterVerdict(judged('end-of-life', true), today);
    expect(step.kind).toBe('treat-as-live');
    expect(step.sentence).toMatch(
      /Treat the DC bus as live.*also at end of life: replace it at the next shutdown and tell the reliability engineer/,
    );
    expect(step.sentence.match(/\./g)).toHaveLength(1);
  });

  it('when the ratio is far outside any ageing, then check the bleeder value and the readings', () => {
    const step = nextStepAfterVerdict(
      { health: null, notJudgedBecause: 'implausible-ratio', safetyFinding: false },
      today,
    );
    expect(step.kind).toBe('check-inputs');
    expect(step.sentence).toMatch(/^Check the bleeder value and the readings/);
  });

  it('when there is no baseline, then record one', () => {
    const step = nextStepAfterVerdict(
      { health: null, notJudgedBecause: 'no-baseline', safetyFinding: false },
      today,
    );
    expect(step.kind).toBe('set-baseline');
  });

  it('when any verdict is given, then the answer is one sentence', () => {
    const all: NextStepFacts[] = [
      judged('healthy'),
      judged('watch'),
      judged('end-of-life'),
      judged('watch', true),
      judged('end-of-life', true),
    ];
    for (const facts of all)
      expect(nextStepAfterVerdict(facts, today).sentence).toMatch(/^[A-Z][^.]*\.$/);
  });
});
