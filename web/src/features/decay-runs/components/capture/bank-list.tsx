/** The banks of a visit at the cabinet, each with the state of its run (stored, on this phone, or not measured). */
import { HEALTH_LABELS } from '../../../../../../shared/constants/health';
import { REVIEW_STATE_LABELS } from '../../../../../../shared/constants/decay-runs';
import type { DecayRun } from '../../../../../../shared/schemas/decay-run';
import type { Visit, VisitBankRef } from '../../../../../../shared/schemas/visit';
import { Badge } from '../../../../components/ui/badge';
import { Button } from '../../../../components/ui/button';
import type { RunDraft } from '../../drafts/draft-store';

/** The run a bank has on this visit: its newest current stored run, and this phone's drafts. */
export interface BankState {
  bank: VisitBankRef;
  run: DecayRun | undefined;
  /** The newest draft not yet sent (capturing, ready, sending or refused). */
  draft: RunDraft | undefined;
}

/** Each bank of the visit with its newest current stored run and its newest draft not yet sent. */
export function bankStates(
  visit: Visit,
  drafts: readonly RunDraft[],
  runs: readonly DecayRun[] | undefined,
): BankState[] {
  return visit.banks.map((bank) => {
    const current = (runs ?? []).filter((r) => r.bankId === bank.id && r.supersededById === null);
    const sentIds = new Set((runs ?? []).map((r) => r.clientId));
    const unsent = drafts.filter(
      (d) => d.bankId === bank.id && d.status !== 'sent' && !sentIds.has(d.clientId),
    );
    return {
      bank,
      run: current.sort((a, b) => b.recordedAt.localeCompare(a.recordedAt))[0],
      draft: unsent.at(-1),
    };
  });
}

/** One bank in the visit's list: its position, design, the state of its run, and what can be done next. */
export function BankRow({
  state,
  onMeasure,
  onOpenDraft,
}: {
  state: BankState;
  onMeasure: () => void;
  onOpenDraft: () => void;
}) {
  const { bank, run, draft } = state;
  const position = bank.position;
  return (
    <li className="space-y-2 py-3" data-testid={`capture-bank-${position}`}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span className="min-w-0">
          <span className="block text-lg font-bold text-tide-900">{position}</span>
          <span className="block text-sm text-tide-600">{bank.bankDesignCode}</span>
        </span>
        <BankStateBadge state={state} />
      </div>
      {draft?.status === 'refused' ? (
        <p className="rounded-lg border border-eol-600/40 bg-eol-600/5 px-3 py-2 text-sm text-tide-950">
          The server refused the run saved on this phone: {draft.refusal ?? 'no reason given'}. The
          readings are kept here.
        </p>
      ) : null}
      {run?.review.state === 'queried' ? (
        <p
          className="rounded-lg border border-watch-600/40 bg-watch-600/5 px-3 py-2 text-sm text-tide-950"
          data-testid={`queried-${position}`}
        >
          <b>Queried{run.review.reviewedBy ? ` by ${run.review.reviewedBy.name}` : ''}:</b> “
          {run.review.comment}”
        </p>
      ) : null}
      {draft?.status === 'capturing' ? (
        <Button variant="primary" className="min-h-12 w-full text-base" onClick={onMeasure}>
          Go on with {position}
        </Button>
      ) : draft &&
        (draft.status === 'ready' || draft.status === 'sending' || draft.status === 'refused') ? (
        <Button className="min-h-12 w-full text-base" onClick={onOpenDraft}>
          Open the run of {position}
        </Button>
      ) : (
        <Button
          variant={run ? 'secondary' : 'primary'}
          className="min-h-12 w-full text-base"
          onClick={onMeasure}
        >
          {run ? `Measure bank ${position} again` : `Measure bank ${position}`}
        </Button>
      )}
    </li>
  );
}

function BankStateBadge({ state }: { state: BankState }) {
  const { run, draft } = state;
  if (draft?.status === 'capturing') return <Badge tone="spark">in progress on this phone</Badge>;
  if (draft?.status === 'ready' || draft?.status === 'sending')
    return <Badge tone="warn">saved on this phone, not sent yet</Badge>;
  if (draft?.status === 'refused') return <Badge tone="danger">refused: kept on this phone</Badge>;
  if (!run) return <Badge tone="muted">not measured</Badge>;
  const health = run.health ? HEALTH_LABELS[run.health] : 'not judged';
  const tone =
    run.safetyFinding || run.health === 'end-of-life'
      ? 'danger'
      : run.health === 'watch'
        ? 'warn'
        : run.health === 'healthy'
          ? 'ok'
          : 'muted';
  return (
    <span className="flex flex-wrap gap-1">
      <Badge tone={tone}>sent: {health}</Badge>
      <Badge tone={run.review.state === 'queried' ? 'warn' : 'muted'}>
        {REVIEW_STATE_LABELS[run.review.state]}
      </Badge>
    </span>
  );
}
