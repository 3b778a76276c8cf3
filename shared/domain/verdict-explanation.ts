/**
 * A recorded run's verdict in plain sentences, the words a technician at the cabinet uses: what
 * τ means (how fast the voltage falls), the capacitance against the baseline and the nameplate,
 * what the health word means, any safety finding, when the bus may be approached (never sooner
 * than the drive maker's marked wait) and what to do next. The same sentences serve the verdict
 * screen after a capture, a stored run's page and the review.
 */

import { HEALTH_LABELS, type HealthLimits } from '../constants/health';
import { VISUAL_FINDING_LABELS, type VisualFinding } from '../constants/decay-runs';
import { formatFigure, formatInterval, formatPercentFigure } from './format';
import { nextStepAfterVerdict, type NextStep } from './next-step';
import type { RecordedRunOkVerdict, RecordedRunVerdict } from './recorded-run';
import type { DecayVerdict, VerdictFindingCode } from './verdict';

/** What besides the verdict the sentences need. */
export interface VerdictExplanationContext {
  /**
   * The day the run was taken (ISO date, `2026-12-02`): the next check counts from it. For a
   * run just captured, today.
   */
  asOfOn: string;
  /**
   * The cabinet's marked wait time, seconds, when known. An ok verdict carries its own (from
   * the cabinet at the time of the run); this one is used when the verdict has none, and for
   * an unusable run, which has no estimate of its own.
   */
  markedWaitSeconds?: number | null;
}

/** Each part of a verdict in one plain sentence; null where the part does not apply. */
export interface VerdictExplanation {
  /** How fast the voltage fell (τ with its 95 % interval), or why the readings cannot be judged. */
  tau: string;
  /** The capacitance against the baseline and the nameplate; null for an unusable run. */
  capacitance: string | null;
  /** The health word and what it means for the bank. */
  health: string;
  /** The safety finding in plain words; null when there is none. */
  safety: string | null;
  /** When the bus may be approached (with a meter), never before the marked wait. */
  safeAfter: string;
  /** What to do next. */
  nextStep: string;
}

/** When the bus may be approached after isolation, and what that time rests on. */
export interface SafeAfter {
  /**
   * Seconds after isolation: the longer of the marked wait and this run's cautious estimate to
   * 50 V (the upper end of its 95 % interval); null when neither is known.
   */
  seconds: number | null;
  /** 'marked-wait' when the marked wait is the longer; 'estimate' when the run's estimate is. */
  basis: 'marked-wait' | 'estimate' | null;
  /** The marked wait, seconds, or null when the register has none. */
  markedWaitSeconds: number | null;
  /** This run's cautious time to 50 V, seconds, or null for an unusable run. */
  estimateSeconds: number | null;
}

/**
 * A span of time as people say it: seconds up to 90 s, then minutes to two figures, then hours.
 * `roundUp` rounds up instead (whole seconds, then whole minutes), for waits that must never be
 * understated.
 *
 * @param seconds - the span, seconds (≥ 0)
 * @param options.roundUp - round up rather than to nearest (for safe-after times)
 * @example
 * plainDuration(326) // '5.4 minutes'
 * plainDuration(45.2) // '45 seconds'
 * plainDuration(534.1, { roundUp: true }) // '9 minutes'
 */
export function plainDuration(seconds: number, options: { roundUp?: boolean } = {}): string {
  const plural = (value: string, unit: string) => `${value} ${unit}${value === '1' ? '' : 's'}`;
  if (options.roundUp) {
    if (seconds <= 90) return plural(String(Math.max(1, Math.ceil(seconds))), 'second');
    const minutes = Math.ceil(seconds / 60 - 1e-9);
    if (minutes < 120) return plural(String(minutes), 'minute');
    const hours = Math.floor(minutes / 60);
    const rest = minutes % 60;
    return rest === 0
      ? plural(String(hours), 'hour')
      : `${plural(String(hours), 'hour')} ${plural(String(rest), 'minute')}`;
  }
  if (seconds < 90) return plural(formatFigure(seconds, 2), 'second');
  if (seconds < 2 * 3600) return plural(formatFigure(seconds / 60, 2), 'minute');
  return plural(formatFigure(seconds / 3600, 2), 'hour');
}

/**
 * When the bus may be approached: never before the cabinet's marked wait, and later when this
 * run's cautious estimate to 50 V (upper end of its 95 % interval) is longer.
 *
 * @example
 * safeAfterOf(verdict, { asOfOn: '2026-12-02' })
 * // { seconds: 900, basis: 'marked-wait', markedWaitSeconds: 900, estimateSeconds: 548 }
 */
export function safeAfterOf(
  verdict: RecordedRunVerdict,
  context: VerdictExplanationContext,
): SafeAfter {
  const ok = verdict.status === 'ok' ? verdict : null;
  const markedWaitSeconds = ok?.discharge.markedWaitSeconds ?? context.markedWaitSeconds ?? null;
  const estimateSeconds = ok
    ? (ok.discharge.safeAfterSecondsHigh95 ?? ok.discharge.safeAfterSeconds)['50']
    : null;
  if (markedWaitSeconds === null && estimateSeconds === null)
    return { seconds: null, basis: null, markedWaitSeconds, estimateSeconds };
  if (
    estimateSeconds === null ||
    (markedWaitSeconds !== null && markedWaitSeconds >= estimateSeconds)
  )
    return { seconds: markedWaitSeconds, basis: 'marked-wait', markedWaitSeconds, estimateSeconds };
  return { seconds: estimateSeconds, basis: 'estimate', markedWaitSeconds, estimateSeconds };
}

/**
 * The verdict of a recorded run, each part in one plain sentence.
 *
 * @param verdict - the run's verdict ({@link judgeRecordedRun}'s answer)
 * @param context - the day of the run and the cabinet's marked wait
 * @returns one sentence per part; `capacitance` and `safety` are null where they do not apply
 * @example
 * explainVerdict(verdict, { asOfOn: '2026-12-02' }).tau
 * // 'The voltage fell to about a third every 5.4 minutes (τ = 326 s, between 318 and 334 s).'
 */
export function explainVerdict(
  verdict: RecordedRunVerdict,
  context: VerdictExplanationContext,
): VerdictExplanation {
  const visual = visualFindingsText(verdict.visualFindings);
  if (verdict.status !== 'ok') {
    return {
      tau: `These readings could not be judged: ${sentenceBody(verdict.reason)}.`,
      capacitance: null,
      health:
        visual !== null
          ? `End of life: ${visual} ${verdict.visualFindings.length === 1 ? 'was' : 'were'} seen, and a damaged capacitor can fail at any time, so the bank is at end of life whatever the readings say.`
          : "Not judged: without a usable decay the bank's health cannot be told from this run.",
      safety: visual !== null ? visualSafetySentence(visual, verdict.visualFindings.length) : null,
      safeAfter: safeAfterSentence(verdict, context),
      nextStep:
        visual !== null
          ? 'Replace this bank at the next shutdown, and tell the reliability engineer and the maintenance planner so the replacement is planned and the parts are ordered.'
          : 'Correct the readings if one was mistyped (Correct this run), or repeat the run with at least five readings over two to three time constants.',
    };
  }
  return {
    tau: tauSentence(verdict),
    capacitance: capacitanceSentence(verdict),
    health: healthSentence(verdict, visual),
    safety: safetySentence(verdict, visual),
    safeAfter: safeAfterSentence(verdict, context),
    nextStep: nextStepOf(verdict, context).sentence,
  };
}

/**
 * The next step of an ok verdict: a visual finding alone is a replacement (its safety finding
 * is the can itself, not a slow discharge); a slow discharge comes first as the engine says.
 */
export function nextStepOf(
  verdict: RecordedRunOkVerdict,
  context: VerdictExplanationContext,
): NextStep {
  const dischargeSafety = verdict.findings.some(
    (f) => f.severity === 'safety' && f.code !== 'visual-finding',
  );
  return nextStepAfterVerdict(
    {
      health: verdict.health,
      notJudgedBecause: verdict.notJudgedBecause,
      safetyFinding: dischargeSafety,
    },
    context.asOfOn,
  );
}

/** "The voltage fell to about a third every 5.4 minutes (τ = 326 s, between 318 and 334 s)." */
function tauSentence(verdict: DecayVerdict): string {
  const { tauSeconds, fit } = verdict;
  const interval = formatInterval(fit.tauCi95[0], fit.tauCi95[1], { like: tauSeconds, unit: 's' });
  const spread = interval.includes(' (narrower than ')
    ? `to better than ${interval.slice(interval.indexOf(' (narrower than ') + 16, -1)}`
    : `between ${interval.replace(' to ', ' and ')}`;
  // after one τ, e^−1 = 36.8 % remains (DOMAIN.md): "about a third"
  return `The voltage fell to about a third every ${plainDuration(tauSeconds)} (τ = ${formatFigure(tauSeconds)} s, ${spread}).`;
}

/** The capacitance against the baseline and the nameplate. */
function capacitanceSentence(verdict: DecayVerdict): string {
  const { capacitance, baseline } = verdict;
  const at20 = capacitance.at20CMicrofarads !== null;
  const value = `${microfarads(capacitance.comparedMicrofarads)}${at20 ? ' (corrected to 20 °C)' : ''}`;
  const nominal = capacitance.nominalMicrofarads;
  const ofNominal =
    nominal !== null
      ? `${formatPercentFigure(capacitance.comparedMicrofarads / nominal)} of the nameplate's ${microfarads(nominal)}`
      : null;
  if (baseline === null) {
    return `The bank holds ${value}; there is no baseline and no nameplate value to compare it with yet.`;
  }
  if (baseline.source === 'nameplate') {
    return `The bank holds ${value}, ${formatPercentFigure(baseline.ratio)} of the nameplate's ${microfarads(baseline.capacitanceMicrofarads)}, which serves as its baseline (the reference it is judged against) until a trusted run is recorded.`;
  }
  return `The bank holds ${value}, ${formatPercentFigure(baseline.ratio)} of its baseline of ${microfarads(baseline.capacitanceMicrofarads)} (the reference from its first trusted run)${ofNominal !== null ? ` and ${ofNominal}` : ''}.`;
}

/** The health word and what it means. */
function healthSentence(verdict: RecordedRunOkVerdict, visual: string | null): string {
  const limits: HealthLimits = verdict.limits;
  const watchAt = formatPercentFigure(limits.watchRatio);
  const endAt = formatPercentFigure(limits.endOfLifeRatio);
  if (visual !== null) {
    return `End of life: ${visual} ${verdict.visualFindings.length === 1 ? 'was' : 'were'} seen, and a damaged capacitor can fail at any time, so the bank is at end of life whatever τ says.`;
  }
  if (verdict.health === null) {
    if (verdict.notJudgedBecause === 'implausible-ratio' && verdict.baseline) {
      return `Not judged: ${formatPercentFigure(verdict.baseline.ratio)} of the baseline is far outside what ageing does, so the bleeder value in the register or the readings are in doubt.`;
    }
    return 'Not judged: the bank has no baseline and no nameplate capacitance to compare this run with.';
  }
  const label = capitalise(HEALTH_LABELS[verdict.health]);
  const tauRise = verdict.findings.some((f) => f.code === 'tau-rise');
  switch (verdict.health) {
    case 'healthy':
      return `${label}: the bank keeps at least ${watchAt} of its baseline capacitance, so it smooths the DC bus as it should.`;
    case 'watch':
      if (tauRise && verdict.baseline !== null && verdict.baseline.ratio >= limits.watchRatio) {
        return `${label}: τ is longer than the baseline, which points at the bleeder rather than the capacitors, so the bank is watched until the bleeder is measured.`;
      }
      return `${label}: the bank has lost some capacitance (below ${watchAt} of its baseline); it still works, but it is ageing and its replacement should be planned before it reaches ${endAt}.`;
    case 'end-of-life':
      return `${label}: the bank is below ${endAt} of its baseline capacitance, past the point where it can be relied on to smooth the DC bus; it should be replaced.`;
  }
}

/** The safety finding, most serious first, in one sentence; null without one. */
function safetySentence(verdict: RecordedRunOkVerdict, visual: string | null): string | null {
  if (!verdict.safetyFinding && visual === null) return null;
  const has = (code: VerdictFindingCode) =>
    verdict.findings.some((f) => f.code === code && f.severity === 'safety');
  const clauses: string[] = [];
  if (visual !== null)
    clauses.push(
      visualSafetySentence(visual, verdict.visualFindings.length)
        .replace(/^Safety: /, '')
        .replace(/\.$/, ''),
    );
  if (has('tau-rise') || has('discharge-grown')) {
    const growth = verdict.baseline ? verdict.baseline.tauRatio - 1 : null;
    clauses.push(
      `τ is ${growth !== null && growth > 0 ? `${formatPercentFigure(growth, 2)} ` : ''}longer than at the baseline, so the bus stays dangerous for longer after isolation (most likely the bleeder's resistance has risen or a resistor has opened)`,
    );
  }
  if (has('bleeder-drift') && !has('tau-rise')) {
    clauses.push(
      'the measured bleeder resistance is above its design value, so the bus discharges more slowly than designed',
    );
  }
  if (has('discharge-exceeds-marked-wait')) {
    const d = verdict.discharge;
    const cautious = (d.safeAfterSecondsHigh95 ?? d.safeAfterSeconds)['50'];
    clauses.push(
      `the bus may need up to ${plainDuration(cautious, { roundUp: true })} to fall below 50 V, longer than the marked wait of ${plainDuration(d.markedWaitSeconds ?? 0, { roundUp: true })}`,
    );
  }
  if (clauses.length === 0) {
    const first = verdict.findings.find((f) => f.severity === 'safety');
    return first ? `Safety: ${first.message}` : null;
  }
  return `Safety: ${clauses.join('; and ')}.`;
}

function visualSafetySentence(visual: string, count: number): string {
  return `Safety: ${visual} ${count === 1 ? 'was' : 'were'} seen on the bank; a damaged capacitor can vent or burst, so keep clear of it while the drive is energised.`;
}

/** When the bus may be approached: the longer of the marked wait and the cautious estimate, rounded up. */
function safeAfterSentence(
  verdict: RecordedRunVerdict,
  context: VerdictExplanationContext,
): string {
  const safe = safeAfterOf(verdict, context);
  const meter = 'and only once the meter shows no voltage';
  if (safe.estimateSeconds === null) {
    return safe.markedWaitSeconds !== null
      ? `This run gives no discharge estimate: wait at least the cabinet's marked wait of ${plainDuration(safe.markedWaitSeconds, { roundUp: true })} after isolation, ${meter}.`
      : `This run gives no discharge estimate and the register has no marked wait: wait at least the time the drive maker marks on the cabinet, ${meter}.`;
  }
  const estimate = plainDuration(safe.estimateSeconds, { roundUp: true });
  if (safe.markedWaitSeconds === null) {
    return `Approach the DC bus no sooner than ${estimate} after isolation (this run's estimate to fall below 50 V; the register has no marked wait, so also keep to the time the drive maker marks on the cabinet), ${meter}.`;
  }
  const marked = plainDuration(safe.markedWaitSeconds, { roundUp: true });
  if (safe.basis === 'marked-wait') {
    return `Approach the DC bus no sooner than ${marked} after isolation, the cabinet's marked wait (this run says it falls below 50 V within ${estimate}), ${meter}.`;
  }
  return `Approach the DC bus no sooner than ${estimate} after isolation, longer than the cabinet's marked wait of ${marked}, because this run says the bus needs that long to fall below 50 V, ${meter}.`;
}

/** The article each visual finding takes in a sentence ("a bulged can", "leaking electrolyte"). */
const VISUAL_FINDING_ARTICLES: Record<VisualFinding, string> = {
  'bulged-can': 'a ',
  'open-vent': 'an ',
  leak: '',
  discoloration: 'a ',
};

/** "a bulged can and leaking electrolyte"; null when none. */
function visualFindingsText(findings: readonly VisualFinding[]): string | null {
  if (findings.length === 0) return null;
  const words = findings.map(
    (finding) => `${VISUAL_FINDING_ARTICLES[finding]}${VISUAL_FINDING_LABELS[finding]}`,
  );
  return words.length === 1
    ? words[0]!
    : `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]!}`;
}

function microfarads(value: number): string {
  return `${formatFigure(value)} µF`;
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** A reason without its final full stop and with a small first letter, to follow a colon. */
function sentenceBody(reason: string): string {
  const body = reason.trim().replace(/[.\s]+$/, '');
  return /^[A-Z][a-z]/.test(body) ? body.charAt(0).toLowerCase() + body.slice(1) : body;
}
