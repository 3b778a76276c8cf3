import type { ReactNode } from 'react';
import {
  formatFigure,
  formatInterval,
  formatPercentFigure,
  nextStepAfterVerdict,
  type DecaySample,
  type DecayVerdict,
  type VerdictFinding,
} from '../../../../../shared/domain';
import type { HealthName } from '../../../../../shared/constants/health';
import { explainVerdict } from '../../../../../shared/domain/verdict-explanation';
import { Badge } from '../../../components/ui/badge';
import { DetailList } from '../../../components/ui/detail-list';
import { DischargeCaution } from '../../../components/ui/discharge-caution';
import { formatVolts } from '../../../lib/units';
import { microfarads, ohms, seconds, todayOn } from '../utils/figures';
import { DecayPlot } from './decay-plot';

const HEALTH_TONE: Record<HealthName, { badge: 'ok' | 'warn' | 'danger'; box: string }> = {
  healthy: { badge: 'ok', box: 'border-ok-600/40 bg-ok-600/5' },
  watch: { badge: 'warn', box: 'border-watch-600/40 bg-watch-600/5' },
  'end-of-life': { badge: 'danger', box: 'border-eol-600/40 bg-eol-600/5' },
};

/** The health word's own colours (the word carries the meaning; the colour only helps). */
const TONE_TEXT = { ok: 'bg-ok-600/10 text-ok-600', warn: 'bg-watch-600/10 text-watch-600', danger: 'bg-eol-600/10 text-eol-600' } as const;

const SEVERITY: Record<VerdictFinding['severity'], { label: string; tone: 'danger' | 'warn' | 'muted'; box: string }> = {
  safety: { label: 'Safety', tone: 'danger', box: 'border-l-4 border-eol-600 bg-eol-600/5' },
  attention: { label: 'Attention', tone: 'warn', box: 'border-l-4 border-watch-600 bg-watch-600/5' },
  info: { label: 'Note', tone: 'muted', box: 'border-l-4 border-tide-100' },
};

/** τ stays a small tau inside upper-case labels (a capital Τ reads as T). */
const tau = <span className="normal-case">τ</span>;

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="space-y-2">
      <h3 className="text-sm font-bold text-tide-900">{title}</h3>
      {children}
    </section>
  );
}

/** The engine's findings, safety first, each with its severity in words (not colour alone). */
export function FindingList({ findings, testId = 'decay-findings' }: { findings: readonly VerdictFinding[]; testId?: string }) {
  return (
    <ul className="space-y-2" data-testid={testId}>
      {findings.map((finding, i) => {
        const s = SEVERITY[finding.severity];
        return (
          <li key={`${finding.code}-${i}`} className={`rounded-r-lg px-3 py-2 text-sm text-tide-950 ${s.box}`} data-severity={finding.severity}>
            <Badge tone={s.tone}>{s.label}</Badge> <span className={finding.severity === 'safety' ? 'font-bold' : ''}>{finding.message}</span>
          </li>
        );
      })}
    </ul>
  );
}

/** What the health line says when the engine gives no health word. */
const NOT_JUDGED: Record<NonNullable<DecayVerdict['notJudgedBecause']>, string> = {
  'no-baseline': 'not judged: no baseline',
  'implausible-ratio': 'not judged: check the bleeder value and the readings',
};

/**
 * The engine's verdict on the readings: one health word and the next step first, then τ,
 * capacitance, findings and the discharge estimate with its full caution. Readings left out are
 * marked and explained in the readings table, so the verdict only counts them.
 */
export function DecayVerdictView({
  verdict,
  samples,
  rowNumbers,
}: {
  verdict: DecayVerdict;
  samples: readonly DecaySample[];
  rowNumbers: readonly number[];
}) {
  const { fit, baseline, capacitance, resistance, discharge, limits } = verdict;
  const tone = verdict.health ? HEALTH_TONE[verdict.health] : null;
  const high = discharge.safeAfterSecondsHigh95;
  const next = nextStepAfterVerdict(verdict, todayOn());
  const leftOutRows = fit.excluded.map((e) => rowNumbers[e.index] ?? e.index + 1);
  // the readings table explains each left-out reading; the verdict does not say it again
  const explainedThere = new Set(fit.excluded.map((e) => `Left out: ${e.reason}`));
  const findings = verdict.findings.filter((f) => f.code !== 'readings-left-out');
  const warnings = verdict.warnings.filter((w) => !explainedThere.has(w));
  return (
    <div className="space-y-5" data-testid="decay-verdict">
      <div className={`rounded-lg border px-4 py-3 ${tone?.box ?? 'border-watch-600/40 bg-watch-600/5'}`} data-testid="decay-health" aria-live="polite">
        <p className="text-lg text-tide-950">
          Health:{' '}
          {tone && verdict.healthLabel ? (
            <b className={`rounded-full px-2 py-0.5 ${TONE_TEXT[tone.badge]}`} data-testid="decay-health-word">
              {verdict.healthLabel}
            </b>
          ) : (
            <b data-testid="decay-health-word">{NOT_JUDGED[verdict.notJudgedBecause ?? 'no-baseline']}</b>
          )}
        </p>
        {baseline ? (
          <p className="mt-1 text-sm text-tide-800" data-testid="decay-ratio">
            Capacitance {formatPercentFigure(baseline.ratio)} of the baseline (95 %:{' '}
            {formatInterval(baseline.ratioCi95[0] * 100, baseline.ratioCi95[1] * 100, { like: baseline.ratio * 100, unit: '%' })}). This design is on
            watch below {formatPercentFigure(limits.watchRatio)} and at end of life below {formatPercentFigure(limits.endOfLifeRatio)}.
          </p>
        ) : null}
        <p className="mt-2 text-sm font-medium text-tide-950" data-testid="decay-next-step" data-kind={next.kind}>
          <b>Next step:</b> {next.sentence}
        </p>
        {verdict.safetyFinding ? (
          <p className="mt-2 font-bold text-eol-600" data-testid="decay-safety-flag">
            ⚠ Safety finding: read the findings below before anyone opens the cabinet.
          </p>
        ) : null}
      </div>

      <DetailList
        items={[
          {
            id: 'tau',
            label: <>{tau} (time constant)</>,
            value: (
              <span>
                <b className="text-lg" data-testid="decay-tau">
                  {seconds(fit.tauSeconds)}
                </b>
                <span className="block text-sm text-tide-600">95 %: {formatInterval(fit.tauCi95[0], fit.tauCi95[1], { like: fit.tauSeconds, unit: 's' })}</span>
              </span>
            ),
          },
          {
            id: 'expected-tau',
            label: <>{tau} expected from the baseline</>,
            value: baseline ? (
              <span>
                {seconds(baseline.expectedTauSeconds)}
                <span className="block text-sm text-tide-600">measured τ is {formatPercentFigure(baseline.tauRatio)} of it</span>
              </span>
            ) : null,
          },
          {
            id: 'capacitance',
            label: 'Capacitance',
            value: (
              <span>
                <b className="text-lg">{microfarads(capacitance.measuredMicrofarads)}</b>
                <span className="block text-sm text-tide-600">
                  95 %:{' '}
                  {formatInterval(capacitance.measuredCi95Microfarads[0], capacitance.measuredCi95Microfarads[1], {
                    like: capacitance.measuredMicrofarads,
                    unit: 'µF',
                  })}
                </span>
                {capacitance.at20CMicrofarads !== null ? (
                  <span className="block text-sm text-tide-600">{microfarads(capacitance.at20CMicrofarads)} at 20 °C</span>
                ) : null}
              </span>
            ),
          },
          {
            id: 'baseline',
            label: 'Baseline capacitance',
            value: baseline ? (
              <span>
                {microfarads(baseline.capacitanceMicrofarads)}
                {capacitance.nominalMicrofarads !== null ? (
                  <span className="block text-sm text-tide-600">nameplate {microfarads(capacitance.nominalMicrofarads)}</span>
                ) : null}
              </span>
            ) : null,
          },
          {
            id: 'resistance',
            wide: true,
            label: 'Discharge resistance',
            value: (
              <span className="text-sm">
                bleeder {ohms(resistance.bleederOhms)} ({resistance.bleederSource === 'measured' ? 'measured' : 'design'}) ∥ meter{' '}
                {resistance.meterInputOhms === null ? 'none' : ohms(resistance.meterInputOhms)} = {ohms(resistance.effectiveOhms)}
              </span>
            ),
          },
          {
            id: 'used',
            label: 'Readings used',
            value: (
              <span data-testid="decay-readings-used">
                {fit.pointsUsed} of {fit.pointsTotal}, over {formatFigure(fit.spanTimeConstants, 2)} τ
                {leftOutRows.length ? (
                  <span className="block text-sm text-tide-600">
                    {leftOutRows.length === 1 ? `row ${leftOutRows[0]}` : `rows ${leftOutRows.join(', ')}`} left out: marked in the readings
                  </span>
                ) : null}
              </span>
            ),
          },
        ]}
      />

      <DecayPlot samples={samples} verdict={verdict} />

      <Section title="Findings">
        <FindingList findings={findings} />
        {warnings.length > 0 ? (
          <ul className="list-disc space-y-1 pl-5 text-sm text-tide-800" data-testid="decay-warnings">
            {warnings.map((w) => (
              <li key={w}>{w}</li>
            ))}
          </ul>
        ) : null}
      </Section>

      <Section title="Discharge after isolation">
        <p className="text-sm text-tide-800">
          From {formatVolts(discharge.fromVolts)} ({discharge.fromSource === 'nominal-bus' ? "the cabinet's nominal DC bus" : 'the first reading; the cabinet has no nominal DC-bus voltage'}), the bus on its own,
          without the meter:
        </p>
        <dl className="grid grid-cols-2 gap-3 text-sm" data-testid="decay-discharge">
          {(['60', '50'] as const).map((v) => (
            <div key={v} className="rounded-lg bg-tide-50 px-3 py-2">
              <dt className="text-xs font-bold uppercase tracking-wide text-tide-600">Time to {v} V</dt>
              <dd className="text-lg font-bold text-tide-950">{seconds(discharge.safeAfterSeconds[v])}</dd>
              {high ? <dd className="text-xs text-tide-600">up to {seconds(high[v])} within the 95 % interval</dd> : null}
            </div>
          ))}
        </dl>
        <p className="text-sm font-medium text-tide-950" data-testid="decay-safe-after">
          {explainVerdict({ ...verdict, visualFindings: [], prepared: { sorted: false, setAside: [] } }, { asOfOn: todayOn() }).safeAfter}
        </p>
        <DischargeCaution />
      </Section>
    </div>
  );
}
