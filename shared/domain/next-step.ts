/**
 * What to do next after a decay run, in one plain sentence a technician or planner can act on.
 */

import {
  DEFAULT_INSPECTION_INTERVAL_DAYS,
  NEAR_END_OF_LIFE_INTERVAL_DAYS,
  type HealthName,
} from '../constants/health';
import { addDays } from './calendar-dates';
import { formatDateOn } from './format';

/** Kinds of next step, most urgent first. */
export type NextStepKind =
  'treat-as-live' | 'check-inputs' | 'replace' | 'retest-and-plan' | 'check-again' | 'set-baseline';

/** The next step: its kind, the sentence, and the date it is due by when it has one. */
export interface NextStep {
  kind: NextStepKind;
  sentence: string;
  /** ISO date the step is due by (the next check, the re-test); null when it is due now. */
  byOn: string | null;
}

/** What of a verdict decides the next step (a {@link DecayVerdict} has all of it). */
export interface NextStepFacts {
  health: HealthName | null;
  notJudgedBecause: 'no-baseline' | 'implausible-ratio' | null;
  /** True when the verdict has a safety finding (a rising τ, a discharge longer than marked). */
  safetyFinding: boolean;
}

const TELL = 'tell the reliability engineer and the maintenance planner';

/**
 * One sentence of what to do next after a verdict. A safety finding comes first (the bus
 * stays live longer than marked), then doubtful inputs, then health: end of life is replaced
 * (and the people who plan it told), watch is re-tested at the next shutdown within six months
 * while the replacement is planned, healthy is checked again within a year (intervals:
 * DOMAIN.md, common practice; NFPA 70B at least yearly).
 *
 * @param facts - the verdict's health, why it is not judged, and whether it has a safety finding
 * @param asOfOn - today, ISO date; the dates of the next check count from it
 * @example
 * nextStepAfterVerdict({ health: 'healthy', notJudgedBecause: null, safetyFinding: false }, '2026-12-02')
 * // { kind: 'check-again', byOn: '2027-12-02', sentence: 'No action now: check this bank again by 2 Dec 2027.' }
 */
export function nextStepAfterVerdict(facts: NextStepFacts, asOfOn: string): NextStep {
  if (facts.safetyFinding) {
    const alsoEndOfLife =
      facts.health === 'end-of-life'
        ? `; the bank is also at end of life: replace it at the next shutdown and ${TELL}`
        : '';
    return {
      kind: 'treat-as-live',
      byOn: null,
      sentence: `Treat the DC bus as live for longer than its marked wait, and measure the bleeder resistance with the bus discharged before anyone relies on the marked time${alsoEndOfLife}.`,
    };
  }
  if (facts.notJudgedBecause === 'implausible-ratio') {
    return {
      kind: 'check-inputs',
      byOn: null,
      sentence:
        "Check the bleeder value and the readings: a capacitance this far from the baseline is not ageing, so correct the register or repeat the run before the bank's health is judged.",
    };
  }
  switch (facts.health) {
    case 'end-of-life':
      return {
        kind: 'replace',
        byOn: null,
        sentence: `Replace this bank at the next shutdown, and ${TELL} so the replacement is planned and the parts are ordered.`,
      };
    case 'watch': {
      const byOn = addDays(asOfOn, NEAR_END_OF_LIFE_INTERVAL_DAYS);
      return {
        kind: 'retest-and-plan',
        byOn,
        sentence: `Re-test this bank at the next shutdown (by ${formatDateOn(byOn)} at the latest) and plan its replacement with the maintenance planner.`,
      };
    }
    case 'healthy': {
      const byOn = addDays(asOfOn, DEFAULT_INSPECTION_INTERVAL_DAYS);
      return {
        kind: 'check-again',
        byOn,
        sentence: `No action now: check this bank again by ${formatDateOn(byOn)}.`,
      };
    }
    default:
      return {
        kind: 'set-baseline',
        byOn: null,
        sentence:
          "Record a trusted decay run as this bank's baseline, so that its health can be judged.",
      };
  }
}
