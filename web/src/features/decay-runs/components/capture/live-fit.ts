import {
  fitDecay,
  type BankEngineInputs,
  type DecayFit,
  type DecaySample,
} from '../../../../../../shared/domain';
import {
  judgeRecordedRun,
  type RecordedRunObservations,
  type RecordedRunVerdict,
} from '../../../../../../shared/domain/recorded-run';
import { plottedSamples } from '../../utils/plotted-samples';

/**
 * When a live fit is trustworthy enough to say a verdict in words: at least 5 readings used,
 * spanning at least one time constant, and τ's 95 % interval within ±15 % of τ. Before that the
 * chart shows the fit, but the verdict line says what is still missing (a verdict on 3 readings
 * over half a τ would often change its mind).
 */
export const TRUSTWORTHY_FIT = {
  minReadings: 5,
  minSpanTimeConstants: 1,
  maxHalfWidth: 0.15,
} as const;

/** The live fit of a capture's readings so far. */
export interface LiveFit {
  /** The readings as fitted: in time order, readings at or below 0 V set aside. */
  plotted: DecaySample[];
  /** The verdict with the bank's figures (the server's own judge), or null without them or before 3 readings. */
  verdict: RecordedRunVerdict | null;
  /** The fit to draw, or null when there is none yet. */
  fit: DecayFit | null;
  /** True when the fit meets {@link TRUSTWORTHY_FIT}. */
  trustworthy: boolean;
  /** What the fit is still waiting for, in words; null when trustworthy. */
  waitingFor: string | null;
}

/**
 * Fits the readings so far: the bank's verdict ({@link judgeRecordedRun}, the code the server
 * runs) when its figures are at hand, else the fit alone (offline, before the bank was loaded).
 *
 * @example
 * liveFit([{ tSeconds: 5, volts: 538 }, { tSeconds: 10, volts: 516 }, ...], engine)
 * // { verdict: { status: 'ok', tauSeconds: 120.4, health: 'healthy', ... }, trustworthy: true, waitingFor: null, ... }
 */
export function liveFit(
  samples: readonly DecaySample[],
  engine: BankEngineInputs | null,
  observations: RecordedRunObservations = {},
): LiveFit {
  const plotted = plottedSamples(samples);
  if (plotted.length < 3) {
    const more = 3 - plotted.length;
    return {
      plotted,
      verdict: null,
      fit: null,
      trustworthy: false,
      waitingFor: `${more} more reading${more === 1 ? '' : 's'} for a first fit`,
    };
  }
  let verdict: RecordedRunVerdict | null = null;
  let fit: DecayFit | null = null;
  if (engine) {
    verdict = judgeRecordedRun({ samples, engine, observations });
    fit = verdict.status === 'ok' ? verdict.fit : null;
  } else {
    try {
      const result = fitDecay(plotted);
      fit = result.status === 'ok' ? result : null;
    } catch {
      fit = null;
    }
  }
  return { plotted, verdict, fit, ...trust(fit) };
}

function trust(fit: DecayFit | null): { trustworthy: boolean; waitingFor: string | null } {
  if (!fit) return { trustworthy: false, waitingFor: 'readings that fit a decay' };
  const missing: string[] = [];
  if (fit.pointsUsed < TRUSTWORTHY_FIT.minReadings) {
    const more = TRUSTWORTHY_FIT.minReadings - fit.pointsUsed;
    missing.push(`${more} more reading${more === 1 ? '' : 's'}`);
  }
  if (fit.spanTimeConstants < TRUSTWORTHY_FIT.minSpanTimeConstants) {
    const until = Math.ceil(fit.tauSeconds * TRUSTWORTHY_FIT.minSpanTimeConstants);
    missing.push(
      `readings up to about ${Math.floor(until / 60)}:${String(until % 60).padStart(2, '0')} (one time constant)`,
    );
  }
  const [low, high] = fit.tauCi95;
  const halfWidth = (high - low) / 2 / fit.tauSeconds;
  if (missing.length === 0 && !(halfWidth <= TRUSTWORTHY_FIT.maxHalfWidth))
    missing.push('a few more readings to steady the fit');
  return missing.length === 0
    ? { trustworthy: true, waitingFor: null }
    : { trustworthy: false, waitingFor: missing.join(' and ') };
}
