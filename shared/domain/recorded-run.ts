/**
 * The verdict of a decay run as it is recorded at the cabinet: the engine's verdict
 * ({@link judgeDecayRun}) under the conditions the technician noted, then the visual findings.
 * The browser (live fit, verdict screen) and the API (which stores the verdict) call the same
 * function, so a run reads the same on the phone and in the record.
 *
 * The visual-finding rule (DOMAIN.md, "Limits and life": field end of life is "any bulged can,
 * opened vent or leak"): any visual finding makes the bank end of life whatever τ says, and is a
 * safety finding.
 */

import { HEALTH_LABELS, type HealthName } from '../constants/health';
import { VISUAL_FINDING_LABELS, type VisualFinding } from '../constants/decay-runs';
import type { BankEngineInputs } from './bank-engine-inputs';
import { validateDecaySamples, type DecaySample } from './decay-fit';
import { EngineInputError, type UnusableCode } from './errors';
import { formatNumber } from './format';
import {
  judgeDecayRun,
  type DecayVerdict,
  type RunConditions,
  type VerdictFinding,
} from './verdict';

/** What the technician noted beside the readings (the run's observations, as the API takes them). */
export interface RecordedRunObservations {
  /** Bank temperature during the run, °C; null or absent when not measured. */
  bankTempC?: number | null;
  /** Bleeder resistance measured with the bus discharged, ohms; null or absent when not measured. */
  measuredBleederOhms?: number | null;
  /** Meter input resistance, ohms; null or absent = the engine's default (10 MΩ). */
  meterInputOhms?: number | null;
  /** Visual findings (bulged can, opened vent, leak, discoloration). */
  visualFindings?: readonly VisualFinding[];
}

/** Everything {@link judgeRecordedRun} needs. */
export interface RecordedRunFacts {
  /** The readings as recorded: t from the moment of isolation, seconds; volts. */
  samples: readonly DecaySample[];
  /** The bank's design, baseline and cabinet ({@link bankEngineInputs}). */
  engine: BankEngineInputs;
  observations: RecordedRunObservations;
}

/** A reading set aside before the fit (at or below 0 V: the meter's zero or a sign slip). */
export interface ReadingSetAside {
  /** Position in the samples as recorded (0-based). */
  index: number;
  tSeconds: number;
  volts: number;
  reason: string;
}

/** What was done to the recorded readings before the fit (the stored samples stay as sent). */
export interface ReadingsPrepared {
  /** True when the readings were put in time order (typed out of order). */
  sorted: boolean;
  /** Readings left out before the fit. */
  setAside: ReadingSetAside[];
}

/** An ok verdict of a recorded run: the engine's verdict after the visual-finding rule. */
export type RecordedRunOkVerdict = DecayVerdict & {
  visualFindings: VisualFinding[];
  /** How the readings were prepared; the fit's indices count in the prepared (time-ordered) list. */
  prepared: ReadingsPrepared;
};

/** A recorded run whose readings give no trustworthy τ; the visual findings still count. */
export interface RecordedRunUnusableVerdict {
  status: 'unusable';
  /** The engine's code, or 'readings-refused' when the readings are not a decay (e.g. a repeated time). */
  code: UnusableCode | 'readings-refused';
  /** Plain-words reason. */
  reason: string;
  visualFindings: VisualFinding[];
  /** 'end-of-life' when a visual finding was recorded, else null (not judged). */
  health: 'end-of-life' | null;
  /** True when a visual finding was recorded. */
  safetyFinding: boolean;
  /** The visual finding, when any (safety first). */
  findings: VerdictFinding[];
  prepared: ReadingsPrepared;
}

/** {@link judgeRecordedRun}'s answer. */
export type RecordedRunVerdict = RecordedRunOkVerdict | RecordedRunUnusableVerdict;

/**
 * Judges a recorded decay run: the readings in time order (readings at or below 0 V set aside),
 * {@link judgeDecayRun} with the conditions of the observations (bank temperature, measured
 * bleeder, meter input resistance), then the visual-finding rule: any visual finding makes the
 * health 'end-of-life' whatever τ says and adds a safety finding, first among the findings.
 *
 * Readings that are no decay at all (fewer than needed, a repeated time) give an unusable
 * verdict with the reason, never an error: a run is stored whatever its physics.
 *
 * @param facts - see {@link RecordedRunFacts}
 * @returns the verdict; health, τ and capacitance on `status: 'ok'`
 * @throws EngineInputError only when the bank's facts are malformed (not for readings)
 * @example
 * judgeRecordedRun({
 *   samples: [{ tSeconds: 0, volts: 560 }, { tSeconds: 60, volts: 428 }, ...],
 *   engine: bankEngineInputs(bank)!,
 *   observations: { bankTempC: 25, meterInputOhms: null, visualFindings: ['bulged-can'] },
 * }) // { status: 'ok', tauSeconds: 223, health: 'end-of-life', safetyFinding: true, findings: [{ code: 'visual-finding', ... }, ...] }
 */
export function judgeRecordedRun(facts: RecordedRunFacts): RecordedRunVerdict {
  const visualFindings = uniqueFindings(facts.observations.visualFindings ?? []);
  const visualFinding = visualFindingOf(visualFindings);
  const { samples, prepared } = prepareReadings(facts.samples);

  const unusableVerdict = (
    code: RecordedRunUnusableVerdict['code'],
    reason: string,
  ): RecordedRunUnusableVerdict => ({
    status: 'unusable',
    code,
    reason,
    visualFindings,
    health: visualFinding ? 'end-of-life' : null,
    safetyFinding: visualFinding !== null,
    findings: visualFinding ? [visualFinding] : [],
    prepared,
  });

  try {
    validateDecaySamples(samples);
  } catch (error) {
    if (error instanceof EngineInputError) return unusableVerdict('readings-refused', error.message);
    throw error;
  }
  if (samples.length === 0) {
    return unusableVerdict(
      'too-few-points',
      'No reading is above 0 V, so there is no decay to fit. Record the readings from the moment of isolation.',
    );
  }

  const verdict = judgeDecayRun({
    samples,
    design: facts.engine.design,
    baseline: facts.engine.baseline,
    cabinet: facts.engine.cabinet,
    conditions: runConditionsOf(facts.observations),
  });
  if (verdict.status !== 'ok') return unusableVerdict(verdict.code, verdict.reason);

  const warnings = [...preparedWarnings(prepared), ...verdict.warnings];
  if (!visualFinding) return { ...verdict, warnings, visualFindings, prepared };
  const health: HealthName = 'end-of-life';
  return {
    ...verdict,
    health,
    healthLabel: HEALTH_LABELS[health],
    notJudgedBecause: null,
    findings: [visualFinding, ...verdict.findings],
    safetyFinding: true,
    warnings,
    visualFindings,
    prepared,
  };
}

/**
 * The engine's run conditions from the technician's observations: null and absent alike mean
 * "not measured" (for the meter: the engine's default 10 MΩ).
 *
 * @example runConditionsOf({ bankTempC: 31, meterInputOhms: null }) // { bankTempC: 31 }
 */
export function runConditionsOf(observations: RecordedRunObservations): RunConditions {
  const conditions: RunConditions = {};
  if (observations.bankTempC !== undefined && observations.bankTempC !== null)
    conditions.bankTempC = observations.bankTempC;
  if (observations.measuredBleederOhms !== undefined && observations.measuredBleederOhms !== null)
    conditions.measuredBleederOhms = observations.measuredBleederOhms;
  if (observations.meterInputOhms !== undefined && observations.meterInputOhms !== null)
    conditions.meterInputOhms = observations.meterInputOhms;
  return conditions;
}

/**
 * The sentence of a safety finding for visual findings, e.g. "A bulged can was seen: …".
 *
 * @example visualFindingSentence(['leak']) // 'Leaking electrolyte was seen: the bank is at end of life ...'
 */
export function visualFindingSentence(findings: readonly VisualFinding[]): string {
  const words = findings.map((finding) => VISUAL_FINDING_LABELS[finding]);
  const list =
    words.length <= 1
      ? (words[0] ?? '')
      : `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]!}`;
  const article = findings.length === 1 && findings[0] !== 'leak' ? 'A ' : '';
  const seen = `${article}${list}`;
  return `${seen.charAt(0).toUpperCase()}${seen.slice(1)} ${findings.length === 1 ? 'was' : 'were'} seen: the bank is at end of life whatever τ says, and it is a safety finding. Plan its replacement, keep the cabinet closed until a qualified person has judged it, and photograph what you saw.`;
}

function visualFindingOf(findings: readonly VisualFinding[]): VerdictFinding | null {
  if (findings.length === 0) return null;
  return { code: 'visual-finding', severity: 'safety', message: visualFindingSentence(findings) };
}

function uniqueFindings(findings: readonly VisualFinding[]): VisualFinding[] {
  return [...new Set(findings)];
}

/** The readings in time order, readings at or below 0 V set aside (the stored samples stay as sent). */
function prepareReadings(recorded: readonly DecaySample[]): {
  samples: DecaySample[];
  prepared: ReadingsPrepared;
} {
  const indexed = recorded.map((sample, index) => ({ sample, index }));
  let sorted = false;
  for (let i = 1; i < indexed.length; i++) {
    if (indexed[i]!.sample.tSeconds < indexed[i - 1]!.sample.tSeconds) {
      sorted = true;
      break;
    }
  }
  // a stable sort: readings typed out of order are put back in time order
  if (sorted) indexed.sort((a, b) => a.sample.tSeconds - b.sample.tSeconds);
  const setAside: ReadingSetAside[] = [];
  const samples: DecaySample[] = [];
  for (const { sample, index } of indexed) {
    if (Number.isFinite(sample.volts) && sample.volts <= 0) {
      setAside.push({
        index,
        tSeconds: sample.tSeconds,
        volts: sample.volts,
        reason: `The reading of ${formatNumber(sample.volts, 4)} V at ${formatNumber(sample.tSeconds, 6)} s is not above 0 V (the meter's zero, or a sign slip) and was left out of the fit.`,
      });
      continue;
    }
    samples.push({ tSeconds: sample.tSeconds, volts: sample.volts });
  }
  return { samples, prepared: { sorted, setAside } };
}

function preparedWarnings(prepared: ReadingsPrepared): string[] {
  const warnings: string[] = [];
  if (prepared.sorted) warnings.push('The readings were not in time order; they were put in order of time for the fit.');
  if (prepared.setAside.length === 1) warnings.push(prepared.setAside[0]!.reason);
  else if (prepared.setAside.length > 1)
    warnings.push(`${prepared.setAside.length} readings at or below 0 V were left out of the fit (the meter's zero, or sign slips).`);
  return warnings;
}
