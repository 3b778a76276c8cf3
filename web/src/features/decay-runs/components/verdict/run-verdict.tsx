import type { ReactNode } from 'react';
import type { HealthName } from '../../../../../../shared/constants/health';
import { formatInterval, formatPercentFigure } from '../../../../../../shared/domain';
import type { RecordedRunVerdict } from '../../../../../../shared/domain/recorded-run';
import {
  explainVerdict,
  plainDuration,
  safeAfterOf,
} from '../../../../../../shared/domain/verdict-explanation';
import { DetailList } from '../../../../components/ui/detail-list';
import { DischargeCaution } from '../../../../components/ui/discharge-caution';
import { microfarads, seconds, todayOn } from '../../utils/figures';
import { FindingList } from '../decay-verdict';

/** What the verdict screen needs beside the verdict. */
export interface RunVerdictContext {
  /** The day of the run (ISO date); today when absent (a run just captured). */
  asOfOn?: string;
  /** The cabinet's marked wait time, seconds, when known (an unusable run has no estimate of its own). */
  markedWaitSeconds?: number | null;
}

/** The health of a verdict as the screen shows it: a judged health, not judged, or unusable readings. */
export type VerdictLook = HealthName | 'not-judged' | 'unusable';

const LOOKS: Record<VerdictLook, { word: string; box: string; text: string }> = {
  healthy: { word: 'Healthy', box: 'border-ok-600/50 bg-ok-600/10', text: 'text-ok-600' },
  watch: { word: 'Watch', box: 'border-watch-600/50 bg-watch-600/10', text: 'text-watch-600' },
  'end-of-life': {
    word: 'End of life',
    box: 'border-eol-600/50 bg-eol-600/10',
    text: 'text-eol-600',
  },
  'not-judged': { word: 'Not judged', box: 'border-tide-200 bg-tide-50', text: 'text-tide-800' },
  unusable: { word: 'Readings unusable', box: 'border-tide-200 bg-tide-50', text: 'text-tide-800' },
};

/** How a verdict looks: its health, else not judged, else unusable readings. */
export function verdictLook(verdict: Pick<RecordedRunVerdict, 'status' | 'health'>): VerdictLook {
  if (verdict.health) return verdict.health;
  return verdict.status === 'ok' ? 'not-judged' : 'unusable';
}

/** The health word of a verdict look, e.g. "End of life". */
export function verdictWord(look: VerdictLook): string {
  return LOOKS[look].word;
}

/**
 * A shape for each health, so it reads without colour: a circle with a tick (healthy), a
 * triangle with a bar (watch), an octagon with a cross (end of life), a circle with a question
 * mark (not judged or unusable).
 */
export function HealthMark({ look, size = 20 }: { look: VerdictLook; size?: number }) {
  const common = {
    width: size,
    height: size,
    viewBox: '0 0 24 24',
    'aria-hidden': true,
    className: `shrink-0 ${LOOKS[look].text}`,
  };
  switch (look) {
    case 'healthy':
      return (
        <svg {...common} data-mark="tick">
          <circle cx="12" cy="12" r="10.5" fill="currentColor" />
          <path
            d="M7 12.5l3.2 3.2L17.2 8.6"
            fill="none"
            stroke="white"
            strokeWidth="2.6"
            strokeLinecap="round"
            strokeLinejoin="round"
          />
        </svg>
      );
    case 'watch':
      return (
        <svg {...common} data-mark="triangle">
          <path d="M12 2L23 21.5H1z" fill="currentColor" />
          <path d="M12 9v6" stroke="white" strokeWidth="2.6" strokeLinecap="round" />
          <circle cx="12" cy="18.3" r="1.5" fill="white" />
        </svg>
      );
    case 'end-of-life':
      return (
        <svg {...common} data-mark="octagon">
          <path d="M7.4 1.5h9.2l5.9 5.9v9.2l-5.9 5.9H7.4l-5.9-5.9V7.4z" fill="currentColor" />
          <path
            d="M8.2 8.2l7.6 7.6M15.8 8.2l-7.6 7.6"
            stroke="white"
            strokeWidth="2.6"
            strokeLinecap="round"
          />
        </svg>
      );
    default:
      return (
        <svg {...common} data-mark="question">
          <circle cx="12" cy="12" r="10" fill="none" stroke="currentColor" strokeWidth="2.2" />
          <path
            d="M9.3 9.3a2.8 2.8 0 115 1.7c-1.1.9-2.3 1.5-2.3 3.1"
            fill="none"
            stroke="currentColor"
            strokeWidth="2.2"
            strokeLinecap="round"
          />
          <circle cx="12" cy="17.6" r="1.3" fill="currentColor" />
        </svg>
      );
  }
}

/** A sentence whose figures stay on one line with their units ("50 V", "15 minutes"). */
function keepUnits(sentence: string): string {
  return sentence.replace(
    /(\d) (?=(?:V|s|µF|%|°C|kΩ|MΩ|minutes?|seconds?|hours?)(?![A-Za-z]))/g,
    '$1\u00a0',
  );
}

/** A sentence without its lead word ("Healthy: ", "Safety: ") where a heading above already says it. */
function withoutLead(sentence: string): string {
  const body = sentence.replace(/^(Healthy|Watch|End of life|Not judged|Safety): /, '');
  return keepUnits(body.charAt(0).toUpperCase() + body.slice(1));
}

function Part({
  title,
  children,
  testId,
  tone = 'plain',
}: {
  title: string;
  children: ReactNode;
  testId: string;
  tone?: 'plain' | 'safety' | 'next';
}) {
  const box =
    tone === 'safety'
      ? 'border-l-4 border-eol-600 bg-eol-600/5'
      : tone === 'next'
        ? 'border-l-4 border-spark-400 bg-spark-300/20'
        : 'border border-tide-100 bg-white';
  return (
    <section className={`rounded-lg px-4 py-3 ${box}`} data-testid={testId}>
      <h3 className={`text-sm font-bold ${tone === 'safety' ? 'text-eol-600' : 'text-tide-900'}`}>
        {title}
      </h3>
      <div className="mt-1 space-y-2 text-base text-tide-950">{children}</div>
    </section>
  );
}

/**
 * The verdict screen of a recorded run: the health in big words (its colour, and a shape that
 * is not colour alone), then each part in one plain sentence (explainVerdict): any safety
 * finding, what to do next, when the bus may be approached (never before the marked wait), what
 * the readings say (τ with its interval, the capacitance against the baseline and the nameplate)
 * with the figures, the engine's findings, and the discharge caution.
 */
export function RunVerdict({
  verdict,
  context = {},
}: {
  verdict: RecordedRunVerdict;
  context?: RunVerdictContext;
}) {
  const explanationContext = {
    asOfOn: context.asOfOn ?? todayOn(),
    markedWaitSeconds: context.markedWaitSeconds ?? null,
  };
  const text = explainVerdict(verdict, explanationContext);
  const safe = safeAfterOf(verdict, explanationContext);
  const look = verdictLook(verdict);
  const ok = verdict.status === 'ok' ? verdict : null;
  return (
    <div className="space-y-3" data-testid="run-verdict" data-health={look}>
      <section
        className={`rounded-xl border-2 px-4 py-4 ${LOOKS[look].box}`}
        data-testid="verdict-health"
        aria-live="polite"
      >
        <p className="text-xs font-bold uppercase tracking-wide text-tide-600">
          Health of the bank
        </p>
        <p className={`mt-1 flex items-center gap-3 text-3xl font-bold ${LOOKS[look].text}`}>
          <HealthMark look={look} size={36} />
          <span data-testid="verdict-health-word">{LOOKS[look].word}</span>
        </p>
        <p className="mt-2 text-base text-tide-950" data-testid="verdict-health-sentence">
          {withoutLead(text.health)}
        </p>
      </section>

      {text.safety ? (
        <Part title="⚠ Safety finding" testId="verdict-safety" tone="safety">
          <p className="font-bold">{withoutLead(text.safety)}</p>
        </Part>
      ) : null}

      <Part title="What to do next" testId="verdict-next-step" tone="next">
        <p className="font-medium">{keepUnits(text.nextStep)}</p>
      </Part>

      <Part title="When the DC bus may be approached" testId="verdict-safe-after">
        {safe.seconds !== null ? (
          <p className="text-2xl font-bold text-tide-950">
            {plainDuration(safe.seconds, { roundUp: true })}{' '}
            <span className="text-base font-medium text-tide-800">
              after isolation, at the earliest
            </span>
          </p>
        ) : null}
        <p>{keepUnits(text.safeAfter)}</p>
      </Part>

      <Part title="What the readings say" testId="verdict-readings">
        <p data-testid="verdict-tau-sentence">{keepUnits(text.tau)}</p>
        {text.capacitance ? (
          <p data-testid="verdict-capacitance-sentence">{keepUnits(text.capacitance)}</p>
        ) : null}
        {ok ? (
          <div className="pt-1">
            <DetailList
              items={[
                {
                  id: 'tau',
                  label: (
                    <>
                      <span className="normal-case">τ</span> (time constant)
                    </>
                  ),
                  value: (
                    <span>
                      <b className="text-lg" data-testid="verdict-tau">
                        {seconds(ok.tauSeconds)}
                      </b>
                      <span className="block text-sm text-tide-600">
                        95 %:{' '}
                        {formatInterval(ok.fit.tauCi95[0], ok.fit.tauCi95[1], {
                          like: ok.tauSeconds,
                          unit: 's',
                        })}
                      </span>
                    </span>
                  ),
                },
                {
                  id: 'capacitance',
                  label:
                    ok.capacitance.at20CMicrofarads !== null
                      ? 'Capacitance at 20 °C'
                      : 'Capacitance',
                  value: (
                    <span>
                      <b className="text-lg">{microfarads(ok.capacitance.comparedMicrofarads)}</b>
                      {ok.baseline ? (
                        <span className="block text-sm text-tide-600" data-testid="verdict-ratio">
                          {formatPercentFigure(ok.baseline.ratio)} of the baseline
                        </span>
                      ) : null}
                    </span>
                  ),
                },
                {
                  id: 'baseline',
                  label: 'Baseline',
                  value: ok.baseline ? (
                    <span>
                      {microfarads(ok.baseline.capacitanceMicrofarads)}
                      <span className="block text-sm text-tide-600">
                        {ok.baseline.source === 'decay-run'
                          ? 'from a trusted run'
                          : 'from the nameplate'}
                      </span>
                    </span>
                  ) : null,
                },
                {
                  id: 'nominal',
                  label: 'Nameplate',
                  value:
                    ok.capacitance.nominalMicrofarads !== null
                      ? microfarads(ok.capacitance.nominalMicrofarads)
                      : null,
                },
              ]}
            />
            <p className="mt-2 text-xs text-tide-600">
              Limits of this design: watch below {formatPercentFigure(ok.limits.watchRatio)} of the
              baseline, end of life below {formatPercentFigure(ok.limits.endOfLifeRatio)}.
            </p>
          </div>
        ) : null}
      </Part>

      {verdict.findings.length > 0 ? (
        <details className="rounded-lg border border-tide-100 bg-white px-4 py-3">
          <summary className="min-h-8 cursor-pointer text-sm font-bold text-tide-900">
            All findings of the engine ({verdict.findings.length})
          </summary>
          <div className="mt-2">
            <FindingList findings={verdict.findings} testId="verdict-findings" />
            {ok && ok.warnings.length > 0 ? (
              <ul className="mt-2 list-disc space-y-1 pl-5 text-sm text-tide-800">
                {ok.warnings.map((warning) => (
                  <li key={warning}>{warning}</li>
                ))}
              </ul>
            ) : null}
          </div>
        </details>
      ) : null}

      <DischargeCaution />
    </div>
  );
}
