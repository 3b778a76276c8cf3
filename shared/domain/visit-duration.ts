/**
 * How long a visit takes, estimated from its banks: per bank the setup minutes, about 5 τ of
 * capture from the bank's baseline τ, and the cabinet's marked wait before it is opened again.
 * Pure arithmetic, no clock.
 */
import {
  BANK_SETUP_MINUTES,
  CAPTURE_TIME_CONSTANTS,
  UNKNOWN_MARKED_WAIT_MINUTES,
} from '../constants/planning-estimates';

/** What the estimate of one bank needs. */
export interface BankDurationFacts {
  /** The bank's baseline τ, seconds (> 0). */
  baselineTauSeconds: number;
}

/** What the estimate needs of the cabinet the banks are in. */
export interface CabinetDurationFacts {
  /** The drive maker's marked wait time, minutes; null when the register does not know it. */
  markedWaitMinutes: number | null;
}

/** Settings of the estimate; the defaults are the constants of shared/constants/planning-estimates. */
export interface DurationOptions {
  /** Minutes of setup per bank (default {@link BANK_SETUP_MINUTES}). */
  setupMinutes?: number;
}

/**
 * The wait planned for a cabinet: its marked wait, or {@link UNKNOWN_MARKED_WAIT_MINUTES} when
 * the register has none (or a value that is not a number of minutes ≥ 0).
 *
 * @example plannedWaitMinutes({ markedWaitMinutes: null }) // 15
 */
export function plannedWaitMinutes(cabinet: CabinetDurationFacts): number {
  const marked = cabinet.markedWaitMinutes;
  return marked !== null && Number.isFinite(marked) && marked >= 0
    ? marked
    : UNKNOWN_MARKED_WAIT_MINUTES;
}

/**
 * Estimated minutes for one bank: setup + 5 · τ_baseline (in minutes) + the cabinet's wait.
 * Not rounded; a visit rounds its sum (see {@link estimateVisitMinutes}).
 *
 * @param bank - its baseline τ, seconds
 * @param cabinet - its marked wait, minutes (null: unknown)
 * @returns minutes
 * @throws RangeError when τ is not a positive number of seconds
 * @example
 * // 15 min setup + 5 × 120 s = 10 min + 5 min marked wait
 * estimateBankMinutes({ baselineTauSeconds: 120 }, { markedWaitMinutes: 5 }) // 30
 */
export function estimateBankMinutes(
  bank: BankDurationFacts,
  cabinet: CabinetDurationFacts,
  options: DurationOptions = {},
): number {
  const tau = bank.baselineTauSeconds;
  if (!(tau > 0) || !Number.isFinite(tau)) {
    throw new RangeError(
      `A bank's baseline τ must be a positive number of seconds, got ${String(tau)}.`,
    );
  }
  const setup = options.setupMinutes ?? BANK_SETUP_MINUTES;
  return setup + (CAPTURE_TIME_CONSTANTS * tau) / 60 + plannedWaitMinutes(cabinet);
}

/**
 * Estimated whole minutes for a visit to some banks of one cabinet: the sum of
 * {@link estimateBankMinutes}, rounded up to the minute (a plan never runs short by a fraction).
 * No banks: 0.
 *
 * @returns whole minutes
 * @example
 * // two banks of τ = 100 s (8⅓ min of capture each), marked wait 5 min:
 * // 2 × (15 + 8.33 + 5) = 56.67 → 57
 * estimateVisitMinutes([{ baselineTauSeconds: 100 }, { baselineTauSeconds: 100 }], { markedWaitMinutes: 5 }) // 57
 */
export function estimateVisitMinutes(
  banks: readonly BankDurationFacts[],
  cabinet: CabinetDurationFacts,
  options: DurationOptions = {},
): number {
  const sum = banks.reduce((total, bank) => total + estimateBankMinutes(bank, cabinet, options), 0);
  // a sum like 56.000000001 from float arithmetic is 56, not 57
  return Math.max(0, Math.ceil(sum - 1e-9));
}
