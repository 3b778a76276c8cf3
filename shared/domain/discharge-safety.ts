/**
 * Discharge safety estimate: how long the DC link takes to fall from its nominal voltage to 60 V
 * (IEC 60204-1, 6.2.4) and to 50 V, t = τ · ln(V0 / V), and whether that is longer than the
 * cabinet's marked wait time or longer than it used to be.
 *
 * The τ to use is the bus's own, without the meter: the meter's input resistance speeds the decay
 * while it is connected, so the bus alone discharges more slowly (τ_bus = C · R_bleed). The
 * control-supply phase is ignored: it only speeds the start, and a dead control supply would not
 * help at all, so the plain RC figure is the cautious one.
 *
 * Every place that shows these figures must carry DISCHARGE_CAUTION (shared/constants/safety).
 */

import { EngineInputError } from './errors';
import {
  DISCHARGE_CAUTION,
  IEC_60204_SAFE_VOLTS,
  IEC_60204_SAFE_WITHIN_SECONDS,
} from '../constants/safety';
import { DEFAULT_TAU_RISE_TOLERANCE } from '../constants/health';
import { formatNumber, formatPercent, formatSeconds, formatVolts } from './format';

/** Times to the two thresholds, seconds, keyed by the threshold in volts. */
export interface SafeAfterSeconds {
  '60': number;
  '50': number;
}

/**
 * Time for an RC decay to fall from `fromVolts` to `toVolts`: t = τ · ln(V0 / V); 0 when it
 * starts at or below the threshold.
 *
 * @param tauSeconds - seconds (> 0)
 * @param fromVolts - start voltage, volts
 * @param toVolts - threshold, volts (> 0)
 * @returns seconds
 * @example
 * timeToVoltsSeconds(220.9, 560, 60) // ≈ 493
 */
export function timeToVoltsSeconds(tauSeconds: number, fromVolts: number, toVolts: number): number {
  if (!(tauSeconds > 0) || !Number.isFinite(tauSeconds)) {
    throw new EngineInputError(
      'invalid-option',
      `τ must be a positive number of seconds, got ${String(tauSeconds)}.`,
      [{ path: 'tauSeconds', message: 'must be positive' }],
    );
  }
  if (!(toVolts > 0) || !Number.isFinite(fromVolts)) {
    throw new EngineInputError(
      'invalid-option',
      'The start voltage must be a number and the threshold above zero.',
      [{ path: 'volts', message: 'invalid voltage' }],
    );
  }
  return fromVolts <= toVolts ? 0 : tauSeconds * Math.log(fromVolts / toVolts);
}

/** Inputs of {@link estimateDischargeSafety}. */
export interface DischargeSafetyInput {
  /** τ of the bus on its own (no meter), seconds. */
  busTauSeconds: number;
  /** Upper end of the 95 % interval of that τ, seconds (for the cautious figure). */
  busTauHigh95Seconds?: number;
  /** Voltage the discharge starts from, volts: the nominal bus voltage where known. */
  fromVolts: number;
  /** Where `fromVolts` came from, for the wording. */
  fromSource: 'nominal-bus' | 'first-reading';
  /** The wait time marked on the cabinet or in the drive manual, seconds. */
  markedWaitSeconds?: number;
  /** The baseline's bus τ, seconds, to see whether the discharge has grown longer. */
  baselineBusTauSeconds?: number;
  /** Fraction by which τ may exceed the baseline before it counts as grown (default 0.1). */
  riseTolerance?: number;
}

/** A discharge safety estimate. Show it only together with `caution`. */
export interface DischargeSafetyEstimate {
  /** Start voltage, volts. */
  fromVolts: number;
  fromSource: 'nominal-bus' | 'first-reading';
  /** Best-estimate times to 60 V and 50 V, seconds. */
  safeAfterSeconds: SafeAfterSeconds;
  /** Times with the upper 95 % τ, seconds (the cautious figure); null when not given. */
  safeAfterSecondsHigh95: SafeAfterSeconds | null;
  /** True when the bus reaches 60 V within 5 s (IEC 60204-1, 6.2.4); drives rarely do. */
  meetsIec60204Within5Seconds: boolean;
  /** Marked wait time, seconds, or null when not known. */
  markedWaitSeconds: number | null;
  /** True when the time to 50 V (cautious figure) is longer than the marked wait; null when unknown. */
  exceedsMarkedWait: boolean | null;
  /** Times to 60 V / 50 V with the baseline τ, seconds; null without a baseline. */
  baselineSafeAfterSeconds: SafeAfterSeconds | null;
  /** True when τ has grown beyond the tolerance against the baseline; null without a baseline. */
  grownAgainstBaseline: boolean | null;
  /** True when either check above failed: a safety finding. */
  flagged: boolean;
  /** Plain-words findings (each one a sentence). */
  findings: string[];
  /** The caution that must be shown with these figures. */
  caution: typeof DISCHARGE_CAUTION;
}

/**
 * Estimates the discharge times and checks them against the marked wait time and the baseline.
 *
 * @example
 * estimateDischargeSafety({ busTauSeconds: 220.9, fromVolts: 560, fromSource: 'nominal-bus', markedWaitSeconds: 900 })
 * // { safeAfterSeconds: { '60': ≈493, '50': ≈534 }, exceedsMarkedWait: false, flagged: false, ... }
 */
export function estimateDischargeSafety(input: DischargeSafetyInput): DischargeSafetyEstimate {
  const tolerance = input.riseTolerance ?? DEFAULT_TAU_RISE_TOLERANCE;
  const times = (tau: number): SafeAfterSeconds => ({
    '60': timeToVoltsSeconds(tau, input.fromVolts, 60),
    '50': timeToVoltsSeconds(tau, input.fromVolts, 50),
  });
  const safeAfterSeconds = times(input.busTauSeconds);
  const high =
    input.busTauHigh95Seconds !== undefined && input.busTauHigh95Seconds >= input.busTauSeconds
      ? times(input.busTauHigh95Seconds)
      : null;
  const cautious = high ?? safeAfterSeconds;
  const findings: string[] = [];
  const from = `from ${formatVolts(input.fromVolts)} (${input.fromSource === 'nominal-bus' ? 'the nominal bus voltage' : 'the first reading; no nominal bus voltage was given'})`;

  const marked = input.markedWaitSeconds;
  if (marked !== undefined && !(marked > 0 && Number.isFinite(marked))) {
    throw new EngineInputError(
      'invalid-option',
      `The marked wait time must be a positive number of seconds, got ${String(marked)}.`,
      [{ path: 'markedWaitSeconds', message: 'must be positive' }],
    );
  }
  let exceedsMarkedWait: boolean | null = null;
  if (marked !== undefined) {
    exceedsMarkedWait = cautious['50'] > marked;
    if (safeAfterSeconds['50'] > marked) {
      findings.push(
        `The bus is estimated to need ${formatSeconds(safeAfterSeconds['50'])} to fall ${from} to 50 V, longer than the marked wait time of ${formatSeconds(marked)}. The marked wait time is not enough for this bank: measure before touching, and have the bleeder checked.`,
      );
    } else if (exceedsMarkedWait) {
      findings.push(
        `Within its uncertainty the bus may need up to ${formatSeconds(cautious['50'])} to fall ${from} to 50 V, longer than the marked wait time of ${formatSeconds(marked)}.`,
      );
    }
  }

  let baselineSafeAfterSeconds: SafeAfterSeconds | null = null;
  let grownAgainstBaseline: boolean | null = null;
  if (input.baselineBusTauSeconds !== undefined) {
    baselineSafeAfterSeconds = times(input.baselineBusTauSeconds);
    const growth = input.busTauSeconds / input.baselineBusTauSeconds - 1;
    grownAgainstBaseline = growth > tolerance;
    if (grownAgainstBaseline) {
      findings.push(
        `The discharge now takes ${formatPercent(growth)} longer than at the baseline (${formatSeconds(safeAfterSeconds['60'])} instead of ${formatSeconds(baselineSafeAfterSeconds['60'])} to 60 V): the bus stays dangerous for longer.`,
      );
    }
  }

  const meetsIec60204Within5Seconds = safeAfterSeconds['60'] <= IEC_60204_SAFE_WITHIN_SECONDS;
  return {
    fromVolts: input.fromVolts,
    fromSource: input.fromSource,
    safeAfterSeconds,
    safeAfterSecondsHigh95: high,
    meetsIec60204Within5Seconds,
    markedWaitSeconds: marked ?? null,
    exceedsMarkedWait,
    baselineSafeAfterSeconds,
    grownAgainstBaseline,
    flagged: exceedsMarkedWait === true || grownAgainstBaseline === true,
    findings,
    caution: DISCHARGE_CAUTION,
  };
}

/**
 * One sentence on IEC 60204-1, 6.2.4 for a time to 60 V: within 5 s, or a durable warning with
 * the delay is required.
 *
 * @example
 * iec60204Sentence(493) // 'The bus needs about 493 s to reach 60 V, more than the 5 s of IEC 60204-1, 6.2.4: ...'
 */
export function iec60204Sentence(secondsTo60Volts: number): string {
  if (secondsTo60Volts <= IEC_60204_SAFE_WITHIN_SECONDS) {
    return `The bus reaches ${IEC_60204_SAFE_VOLTS} V within ${IEC_60204_SAFE_WITHIN_SECONDS} s (IEC 60204-1, 6.2.4).`;
  }
  return `The bus needs about ${formatNumber(secondsTo60Volts, 3)} s to reach ${IEC_60204_SAFE_VOLTS} V, more than the ${IEC_60204_SAFE_WITHIN_SECONDS} s of IEC 60204-1, 6.2.4: the cabinet must carry a durable warning stating the hazard and the wait before opening.`;
}
