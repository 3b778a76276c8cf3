import {
  EngineInputError,
  judgeDecayRun,
  type BankEngineInputs,
  type DecayVerdict,
  type RunConditions,
} from '../../../../../shared/domain';
import type { ReadRows } from './readings';

/** What the panel shows for the readings typed so far. */
export type DecayCheckOutcome =
  /** No readings yet. */
  | { kind: 'empty' }
  /** The readings cannot be judged; `reason` in plain words (e.g. fewer than 3 readings). */
  | { kind: 'unusable'; reason: string }
  /** The verdict; `rowNumbers[i]` is the screen row of the engine's sample i. */
  | { kind: 'verdict'; verdict: DecayVerdict; rowNumbers: number[] };

/**
 * Judges the readings typed so far on one bank with Ebbline's engine ({@link judgeDecayRun}).
 *
 * @param facts - the bank's design, baseline and cabinet (see bankDecayFacts)
 * @param readings - the readable rows (see readReadingRows)
 * @param conditions - meter, bank temperature, measured bleeder (see readConditions)
 * @example
 * runDecayCheck(facts, readReadingRows(rows), {})
 * // { kind: 'verdict', verdict: { tauSeconds: 331, health: 'healthy', ... }, rowNumbers: [1, 2, ...] }
 */
export function runDecayCheck(facts: BankEngineInputs, readings: ReadRows, conditions: RunConditions): DecayCheckOutcome {
  if (readings.samples.length === 0) return { kind: 'empty' };
  try {
    const result = judgeDecayRun({ samples: readings.samples, ...facts, conditions });
    if (result.status !== 'ok') return { kind: 'unusable', reason: result.reason };
    return { kind: 'verdict', verdict: result, rowNumbers: readings.rowNumbers };
  } catch (error) {
    // readings and conditions are checked before; what is left is a fact of the bank itself
    if (error instanceof EngineInputError) return { kind: 'unusable', reason: error.message };
    throw error;
  }
}
