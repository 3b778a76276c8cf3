/**
 * The engine's two ways of saying no.
 *
 * - Bad input (a voltage at or below zero, times that do not increase, a missing resistance, a
 *   malformed CSV cell) throws {@link EngineInputError}: the caller sent something that is not a
 *   decay run. Its `issues` name the sample, row or field so a form or a CLI can point at it.
 * - Well-formed data that cannot give an answer (too few usable readings, no decay, a fit too poor
 *   to trust, too short a history) is returned as an {@link Unusable} or {@link NotEnoughData}
 *   result with a reason in plain words, because callers must branch on it (live preview, API).
 */

/** One problem with one place in the input. The shape matches the API's field issues. */
export interface InputIssue {
  /** Where: a dotted field path ("samples.3.volts", "bleederOhms") or "row 7, column volts". */
  path: string;
  /** What is wrong, in words a technician can act on. */
  message: string;
}

/** Stable kebab-case codes of {@link EngineInputError}. */
export type EngineInputErrorCode =
  | 'invalid-number'
  | 'non-positive-voltage'
  | 'times-not-increasing'
  | 'invalid-resistance'
  | 'invalid-option'
  | 'invalid-csv'
  | 'invalid-date'
  | 'invalid-ratio';

/**
 * Thrown by engine functions when the input is not valid (never for data that is merely
 * unusable). `message` is one sentence naming the first problem; `issues` lists them all.
 *
 * @example
 * try { fitDecay([{ tSeconds: 0, volts: -5 }]) }
 * catch (error) { if (error instanceof EngineInputError) console.log(error.code) } // 'non-positive-voltage'
 */
export class EngineInputError extends Error {
  override name = 'EngineInputError';
  constructor(
    /** Stable kebab-case code, e.g. "non-positive-voltage". */
    readonly code: EngineInputErrorCode,
    message: string,
    /** Every problem found, each with its place. */
    readonly issues: readonly InputIssue[] = [],
  ) {
    super(message);
  }
}

/** Why a decay run could not be judged. */
export type UnusableCode = 'too-few-points' | 'no-decay' | 'poor-fit' | 'too-many-outliers';

/**
 * A decay run that is well-formed but cannot give a trustworthy τ.
 *
 * @example
 * { status: 'unusable', code: 'too-few-points', reason: 'Only 2 readings; at least 3 are needed to fit a decay.' }
 */
export interface Unusable {
  status: 'unusable';
  code: UnusableCode;
  /** Plain-words reason, one or two sentences. */
  reason: string;
}

/**
 * A history too short to fit a trend.
 *
 * @example
 * { status: 'not-enough-data', reason: 'Only 2 decay runs; a trend needs at least 3.' }
 */
export interface NotEnoughData {
  status: 'not-enough-data';
  /** Plain-words reason. */
  reason: string;
}

/**
 * Builds an {@link Unusable} result.
 *
 * @example
 * unusable('no-decay', 'The voltage does not fall.') // { status: 'unusable', code: 'no-decay', reason: '...' }
 */
export function unusable(code: UnusableCode, reason: string): Unusable {
  return { status: 'unusable', code, reason };
}

/**
 * Builds a {@link NotEnoughData} result.
 *
 * @example
 * notEnoughData('Only 2 decay runs.') // { status: 'not-enough-data', reason: 'Only 2 decay runs.' }
 */
export function notEnoughData(reason: string): NotEnoughData {
  return { status: 'not-enough-data', reason };
}
