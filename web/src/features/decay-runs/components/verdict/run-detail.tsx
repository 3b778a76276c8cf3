import { useState, type ReactNode } from 'react';
import { Link } from 'react-router';
import {
  REVIEW_STATE_LABELS,
  RUN_SOURCE_LABELS,
  SAFETY_CHECKS,
  VISUAL_FINDING_LABELS,
} from '../../../../../../shared/constants/decay-runs';
import { hasAnyRole, type Role } from '../../../../../../shared/constants/roles';
import type { DecayRun } from '../../../../../../shared/schemas/decay-run';
import { Badge } from '../../../../components/ui/badge';
import { Button } from '../../../../components/ui/button';
import { Card } from '../../../../components/ui/card';
import { DetailList } from '../../../../components/ui/detail-list';
import { formatInstant } from '../../../../lib/dates';
import { useBankDecayRuns } from '../../api/get-decay-runs';
import { ohms, seconds } from '../../utils/figures';
import { plottedSamples } from '../../utils/plotted-samples';
import { DecayPlot } from '../decay-plot';
import { CorrectionForm } from './correction-form';
import { HealthMark, RunVerdict, verdictLook, verdictWord } from './run-verdict';

/** Who is reading a run: the correction is offered to its recorder and to reliability engineers and admins. */
export interface RunViewer {
  id: string;
  roles: readonly Role[];
}

/** True when `viewer` may correct `run`: its current version, by its recorder or a reliability engineer or admin. */
export function mayCorrectRun(run: DecayRun, viewer: RunViewer | undefined): boolean {
  if (!viewer || run.supersededById !== null) return false;
  return viewer.id === run.recordedBy.id || hasAnyRole(viewer.roles, ['reliability', 'admin']);
}

const REVIEW_TONE = { pending: 'muted', accepted: 'ok', queried: 'warn' } as const;

/** The review state as a badge with a sign beside its colour. */
export function ReviewBadge({
  state,
  short = false,
}: {
  state: DecayRun['review']['state'];
  short?: boolean;
}) {
  const sign = state === 'accepted' ? '✓ ' : state === 'queried' ? '? ' : '○ ';
  return (
    <Badge tone={REVIEW_TONE[state]}>
      <span aria-hidden="true" className="mr-1">
        {sign.trim()}
      </span>
      <span className="whitespace-nowrap">
        {short && state === 'pending' ? 'waiting' : REVIEW_STATE_LABELS[state]}
      </span>
    </Badge>
  );
}

/** The reviewer's word on a run: a query stands out (the technician acts on it), an acceptance is a line. */
export function ReviewNote({ run }: { run: DecayRun }) {
  const { review } = run;
  if (review.state === 'pending') {
    return (
      <p className="text-sm text-tide-800" data-testid="run-review" data-state="pending">
        Waiting for review by a reliability engineer.
      </p>
    );
  }
  const who = review.reviewedBy
    ? `${review.reviewedBy.name}${review.reviewedAt ? `, ${formatInstant(review.reviewedAt)}` : ''}`
    : null;
  if (review.state === 'queried') {
    return (
      <div
        className="rounded-lg border-2 border-watch-600/60 bg-watch-600/10 px-4 py-3"
        data-testid="run-review"
        data-state="queried"
      >
        <p className="text-sm font-bold text-watch-600">
          ? Queried by the reviewer{who ? ` (${who})` : ''}
        </p>
        <p
          className="mt-1 whitespace-pre-line text-base font-medium text-tide-950"
          data-testid="run-review-comment"
        >
          {review.comment}
        </p>
      </div>
    );
  }
  return (
    <div className="text-sm text-tide-800" data-testid="run-review" data-state="accepted">
      <p>
        <b className="text-ok-600">✓ Accepted</b>
        {who ? ` by ${who}` : ''}
        {run.usedAsBaseline ? ', and used as the bank’s baseline' : ''}.
      </p>
      {review.comment ? (
        <p className="mt-1 whitespace-pre-line" data-testid="run-review-comment">
          {review.comment}
        </p>
      ) : null}
    </div>
  );
}

/** Every version of the run's chain, oldest first, from the bank's runs (which hold every version). */
function versionChain(run: DecayRun, bankRuns: readonly DecayRun[] | undefined): DecayRun[] {
  const byId = new Map((bankRuns ?? []).map((r) => [r.id, r]));
  byId.set(run.id, run);
  const chain = [run];
  for (let r = run; r.supersedesId && byId.has(r.supersedesId);) {
    r = byId.get(r.supersedesId)!;
    chain.unshift(r);
  }
  for (let r = run; r.supersededById && byId.has(r.supersededById);) {
    r = byId.get(r.supersededById)!;
    chain.push(r);
  }
  return chain;
}

function Versions({ run }: { run: DecayRun }) {
  const bankRuns = useBankDecayRuns(run.bankId);
  const chain = versionChain(run, bankRuns.data);
  if (chain.length <= 1 && run.version === 1) return null;
  return (
    <Card title="Versions">
      <ol className="space-y-2" data-testid="run-versions">
        {chain.map((version) => {
          const look = verdictLook(version.verdict);
          const here = version.id === run.id;
          return (
            <li
              key={version.id}
              className={`rounded-lg border px-3 py-2 text-sm ${here ? 'border-tide-600 bg-tide-50' : 'border-tide-100'}`}
              data-testid={`run-version-${version.version}`}
            >
              <p className="flex flex-wrap items-center gap-x-2 gap-y-1">
                <b>Version {version.version}</b>
                {version.supersededById === null ? (
                  <Badge tone="tide">current</Badge>
                ) : (
                  <Badge tone="muted">corrected</Badge>
                )}
                <span className="inline-flex items-center gap-1">
                  <HealthMark look={look} size={16} /> {verdictWord(look)}
                </span>
                {version.tauSeconds !== null ? <span>τ {seconds(version.tauSeconds)}</span> : null}
                {here ? (
                  <span className="text-tide-600">(shown)</span>
                ) : (
                  <Link className="font-medium text-tide-800 underline" to={`/runs/${version.id}`}>
                    Open version {version.version}
                  </Link>
                )}
              </p>
              {version.supersedesId ? (
                <p className="mt-1 text-tide-950">
                  Version {version.version} corrects version {version.version - 1}:{' '}
                  {version.correctionReason}
                </p>
              ) : (
                <p className="mt-1 text-tide-800">As recorded at the cabinet.</p>
              )}
              <p className="text-xs text-tide-600">
                {version.recordedBy.name}, {formatInstant(version.recordedAt)}
              </p>
            </li>
          );
        })}
      </ol>
    </Card>
  );
}

function Yes({ children }: { children: ReactNode }) {
  return (
    <li className="flex gap-2">
      <span aria-hidden="true" className="font-bold text-ok-600">
        ✓
      </span>
      <span>{children}</span>
    </li>
  );
}

/**
 * One stored run: who, where and when; the reviewer's word (a query first, prominent); for a
 * correction, what it corrects and why; the readings against the fit; the verdict in plain
 * sentences (RunVerdict); the observations; the safety checklist as confirmed, with its time;
 * where the readings came from; and every version. Its recorder, reliability engineers and
 * admins may correct the current version (a new version with a reason).
 *
 * @param viewer - who is reading: offers "Correct this run" when they may
 * @param onCorrected - gets the new version after a correction (e.g. to open it)
 */
export function RunDetail({
  run,
  viewer,
  onCorrected,
}: {
  run: DecayRun;
  viewer?: RunViewer;
  onCorrected?: (next: DecayRun) => void;
}) {
  const [correcting, setCorrecting] = useState(false);
  const [stored, setStored] = useState<DecayRun | null>(null);
  const ok = run.verdict.status === 'ok' ? run.verdict : null;
  const observations = run.observations;
  const { safety } = run;
  return (
    <article
      className="space-y-4"
      data-testid="run-detail"
      data-run-id={run.id}
      data-version={run.version}
    >
      <header className="space-y-1">
        <p className="text-sm text-tide-600">
          {run.siteName} · cabinet{' '}
          <Link className="underline" to={`/register/cabinets/${run.cabinetId}`}>
            {run.cabinetTag}
          </Link>{' '}
          · bank{' '}
          <Link className="underline" to={`/register/banks/${run.bankId}`}>
            {run.bankPosition}
          </Link>
        </p>
        <h1 className="text-2xl font-bold tracking-tight text-tide-900">
          Decay run of {formatInstant(run.isolatedAt)}
        </h1>
        <p className="flex flex-wrap items-center gap-2 text-sm">
          <Badge tone="tide">Version {run.version}</Badge>
          <ReviewBadge state={run.review.state} />
          {run.supersededById ? <Badge tone="muted">corrected by a later version</Badge> : null}
        </p>
      </header>

      {run.supersededById ? (
        <p
          className="rounded-lg border border-tide-200 bg-tide-50 px-3 py-2 text-sm text-tide-950"
          data-testid="run-superseded"
        >
          This version has been corrected.{' '}
          <Link className="font-medium underline" to={`/runs/${run.supersededById}`}>
            Open the newer version
          </Link>
          ; this one stays as it was recorded.
        </p>
      ) : null}
      {run.supersedesId && run.correctionReason ? (
        <p
          className="rounded-lg border-l-4 border-tide-600 bg-tide-50 px-3 py-2 text-sm text-tide-950"
          data-testid="run-correction-reason"
        >
          <b>
            Version {run.version} corrects version {run.version - 1}:
          </b>{' '}
          {run.correctionReason}
        </p>
      ) : null}

      <ReviewNote run={run} />

      {stored ? (
        <p
          role="status"
          className="rounded-lg border border-ok-600/40 bg-ok-600/10 px-3 py-2 text-sm text-tide-950"
          data-testid="run-correction-stored"
        >
          Version {stored.version} is stored.{' '}
          <Link className="font-medium underline" to={`/runs/${stored.id}`}>
            Open version {stored.version}
          </Link>
        </p>
      ) : null}

      {(mayCorrectRun(run, viewer) || correcting) && !stored ? (
        correcting ? (
          <Card title={`Correct version ${run.version}`}>
            <CorrectionForm
              run={run}
              onCancel={() => setCorrecting(false)}
              onCorrected={(next) => {
                setCorrecting(false);
                setStored(next);
                onCorrected?.(next);
              }}
            />
          </Card>
        ) : (
          <Button className="min-h-12 w-full sm:w-auto" onClick={() => setCorrecting(true)}>
            Correct this run
          </Button>
        )
      ) : null}

      <RunVerdict verdict={run.verdict} context={{ asOfOn: run.isolatedAt.slice(0, 10) }} />

      <Card title="Readings">
        <DecayPlot samples={plottedSamples(run.samples)} verdict={ok} />
        <p className="mt-2 text-sm text-tide-800" data-testid="run-source">
          {run.samples.length} readings, {RUN_SOURCE_LABELS[run.source]}
          {run.loggerFileName ? (
            <>
              : <span className="font-mono">{run.loggerFileName}</span>
            </>
          ) : null}
          .
        </p>
      </Card>

      <Card title="Observations">
        <DetailList
          items={[
            {
              id: 'visual',
              wide: true,
              label: 'What was seen on the cans',
              value:
                observations.visualFindings.length > 0 ? (
                  <b className="text-eol-600">
                    ⚠ {observations.visualFindings.map((f) => VISUAL_FINDING_LABELS[f]).join(', ')}
                  </b>
                ) : (
                  'nothing unusual'
                ),
            },
            {
              id: 'temp',
              label: 'Bank temperature',
              value: observations.bankTempC != null ? `${observations.bankTempC} °C` : null,
            },
            {
              id: 'bleeder',
              label: 'Measured bleeder',
              value:
                observations.measuredBleederOhms != null
                  ? ohms(observations.measuredBleederOhms)
                  : null,
            },
            { id: 'meter', label: 'Meter', value: observations.meterName ?? null },
            {
              id: 'meter-input',
              label: 'Meter input resistance',
              value:
                observations.meterInputOhms != null
                  ? ohms(observations.meterInputOhms)
                  : '10 MΩ (usual, not stated)',
            },
            {
              id: 'notes',
              wide: true,
              label: 'Notes',
              value: observations.notes ? (
                <span className="whitespace-pre-line">{observations.notes}</span>
              ) : null,
            },
          ]}
        />
      </Card>

      <Card title="Safety checklist">
        <ul className="space-y-1.5 text-sm text-tide-950" data-testid="run-safety-record">
          {SAFETY_CHECKS.map((check) =>
            safety[check.key] ? <Yes key={check.key}>{check.sentence}</Yes> : null,
          )}
        </ul>
        <p className="mt-2 text-sm text-tide-800">
          Isolated at {formatInstant(run.isolatedAt)}; checks confirmed at{' '}
          {formatInstant(safety.confirmedAt)}.
        </p>
      </Card>

      <Card title="Recorded">
        <p className="text-sm text-tide-950" data-testid="run-recorded-by">
          By {run.recordedBy.name}, {formatInstant(run.recordedAt)}
          {run.supersedesId ? ' (this correction)' : ''}.
        </p>
      </Card>

      <Versions run={run} />
    </article>
  );
}
