import type { ReactNode } from 'react';
import type { DecaySample, DecayVerdict, VerdictFinding } from '../../../../../shared/domain';
import type { HealthName } from '../../../../../shared/constants/health';
import { Badge } from '../../../components/ui/badge';
import { DetailList } from '../../../components/ui/detail-list';
import { DischargeCaution } from '../../../components/ui/discharge-caution';
import { formatMicrofarads, formatOhms, formatRatio, formatSeconds, formatVolts } from '../../../lib/units';
import type { ReadingIssue } from '../utils/readings';
import { DecayPlot } from './decay-plot';

const HEALTH_TONE: Record<HealthName, { badge: 'ok' | 'warn' | 'danger'; box: string }> = {
  healthy: { badge: 'ok', box: 'border-ok-600/40 bg-ok-600/5' },
  watch: { badge: 'warn', box: 'border-watch-600/40 bg-watch-600/5' },
  'end-of-life': { badge: 'danger', box: 'border-eol-600/40 bg-eol-600/5' },
};

const SEVERITY: Record<VerdictFinding['severity'], { label: string; tone: 'danger' | 'warn' | 'muted'; box: string }> = {
  safety: { label: 'Safety', tone: 'danger', box: 'border-l-4 border-eol-600 bg-eol-600/5' },
  attention: { label: 'Attention', tone: 'warn', box: 'border-l-4 border-watch-600 bg-watch-600/5' },
  info: { label: 'Note', tone: 'muted', box: 'border-l-4 border-tide-100' },
};

const number = (value: number, digits: number) => value.toLocaleString('en-GB', { maximumFractionDigits: digits });

/** Decimals that keep the two ends of an interval apart: 1 for a width of 1 to 10, 2 below. */
function decimalsFor(low: number, high: number): number {
  const width = Math.abs(high - low);
  return width > 0 ? Math.min(3, Math.max(0, 1 - Math.floor(Math.log10(width)))) : 1;
}

/** "329.4 to 332.8 s": as many decimals as the interval needs to show its width. */
function range([low, high]: readonly [number, number], unit: string): string {
  const digits = decimalsFor(low, high);
  return `${number(low, digits)} to ${number(high, digits)} ${unit}`;
}

/** A ratio's interval in per cent, e.g. "101.46 % to 101.52 %". */
function percentRange([low, high]: readonly [number, number]): string {
  const digits = decimalsFor(low * 100, high * 100);
  return `${number(low * 100, digits)} % to ${number(high * 100, digits)} %`;
}

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

/** The engine's verdict on the readings: health, τ, capacitance, findings, left-out readings, discharge. */
export function DecayVerdictView({
  verdict,
  samples,
  rowNumbers,
  rowIssues,
}: {
  verdict: DecayVerdict;
  samples: readonly DecaySample[];
  rowNumbers: readonly number[];
  rowIssues: readonly ReadingIssue[];
}) {
  const { fit, baseline, capacitance, resistance, discharge, limits } = verdict;
  const tone = verdict.health ? HEALTH_TONE[verdict.health] : null;
  const rowOf = (index: number) => rowNumbers[index] ?? index + 1;
  const high = discharge.safeAfterSecondsHigh95;
  return (
    <div className="space-y-5" data-testid="decay-verdict">
      <div className={`rounded-lg border px-4 py-3 ${tone?.box ?? 'border-tide-100'}`} data-testid="decay-health" aria-live="polite">
        <p className="text-lg text-tide-950">
          Health: <b>{verdict.healthLabel ?? 'not judged (no baseline)'}</b>{' '}
          {tone && verdict.healthLabel ? <Badge tone={tone.badge}>{verdict.healthLabel}</Badge> : null}
        </p>
        {baseline ? (
          <p className="mt-1 text-sm text-tide-800">
            Capacitance {formatRatio(baseline.ratio)} of the baseline (95 %: {percentRange(baseline.ratioCi95)}). This
            design is on watch below {formatRatio(limits.watchRatio)} and at end of life below {formatRatio(limits.endOfLifeRatio)}.
          </p>
        ) : null}
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
                <b className="text-lg" data-testid="decay-tau">{formatSeconds(fit.tauSeconds)}</b>
                <span className="block text-sm text-tide-600">95 %: {range(fit.tauCi95, 's')}</span>
              </span>
            ),
          },
          {
            id: 'expected-tau',
            label: <>{tau} expected from the baseline</>,
            value: baseline ? (
              <span>
                {formatSeconds(baseline.expectedTauSeconds)}
                <span className="block text-sm text-tide-600">measured τ is {formatRatio(baseline.tauRatio)} of it</span>
              </span>
            ) : null,
          },
          {
            id: 'capacitance',
            label: 'Capacitance',
            value: (
              <span>
                <b className="text-lg">{formatMicrofarads(capacitance.measuredMicrofarads)}</b>
                <span className="block text-sm text-tide-600">95 %: {range(capacitance.measuredCi95Microfarads, 'µF')}</span>
                {capacitance.at20CMicrofarads !== null ? (
                  <span className="block text-sm text-tide-600">{formatMicrofarads(capacitance.at20CMicrofarads)} at 20 °C</span>
                ) : null}
              </span>
            ),
          },
          {
            id: 'baseline',
            label: 'Baseline capacitance',
            value: baseline ? (
              <span>
                {formatMicrofarads(baseline.capacitanceMicrofarads)}
                {capacitance.nominalMicrofarads !== null ? (
                  <span className="block text-sm text-tide-600">nameplate {formatMicrofarads(capacitance.nominalMicrofarads)}</span>
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
                bleeder {formatOhms(resistance.bleederOhms)} ({resistance.bleederSource === 'measured' ? 'measured' : 'design'}) ∥ meter{' '}
                {resistance.meterInputOhms === null ? 'none' : formatOhms(resistance.meterInputOhms)} = {formatOhms(resistance.effectiveOhms)}
              </span>
            ),
          },
          {
            id: 'used',
            label: 'Readings used',
            value: `${fit.pointsUsed} of ${fit.pointsTotal}, over ${number(fit.spanTimeConstants, 1)} τ`,
          },
        ]}
      />

      <DecayPlot samples={samples} verdict={verdict} />

      <Section title="Findings">
        <ul className="space-y-2" data-testid="decay-findings">
          {verdict.findings.map((finding, i) => {
            const s = SEVERITY[finding.severity];
            return (
              <li key={`${finding.code}-${i}`} className={`rounded-r-lg px-3 py-2 text-sm text-tide-950 ${s.box}`} data-severity={finding.severity}>
                <Badge tone={s.tone}>{s.label}</Badge> <span className={finding.severity === 'safety' ? 'font-bold' : ''}>{finding.message}</span>
              </li>
            );
          })}
        </ul>
        {verdict.warnings.length > 0 ? (
          <ul className="list-disc space-y-1 pl-5 text-sm text-tide-800">
            {verdict.warnings.map((w) => (
              <li key={w}>{w}</li>
            ))}
          </ul>
        ) : null}
      </Section>

      <Section title="Readings left out">
        {fit.excluded.length === 0 && rowIssues.length === 0 ? (
          <p className="text-sm text-tide-600">None: every reading typed is on the curve.</p>
        ) : (
          <ul className="space-y-1 text-sm text-tide-950" data-testid="decay-left-out">
            {fit.excluded.map((e) => (
              <li key={`fit-${e.index}`}>
                <b>Row {rowOf(e.index)}</b>
                {e.code === 'control-supply-phase' ? ` (${formatSeconds(e.tSeconds)}, ${formatVolts(e.volts)}), control-supply phase` : ''}: {e.reason}
              </li>
            ))}
            {rowIssues.map((issue) => (
              <li key={`row-${issue.row}-${issue.field}`}>
                <b>Row {issue.row}</b> not read: {issue.message.replace(/^Row \d+: /, '')}
              </li>
            ))}
          </ul>
        )}
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
              <dd className="text-lg font-bold text-tide-950">{formatSeconds(discharge.safeAfterSeconds[v])}</dd>
              {high ? <dd className="text-xs text-tide-600">up to {formatSeconds(high[v])} within the 95 % interval</dd> : null}
            </div>
          ))}
        </dl>
        <p className="text-sm text-tide-800">
          {discharge.markedWaitSeconds !== null
            ? `Marked wait time of the cabinet: ${formatSeconds(discharge.markedWaitSeconds)}${discharge.exceedsMarkedWait ? ' — the estimate is longer: see the safety finding.' : '.'}`
            : 'The cabinet has no marked wait time in the register.'}
        </p>
        <DischargeCaution />
      </Section>
    </div>
  );
}
