/**
 * `PlanWindowDialog`: plan a shutdown window in one step.
 *
 * Props:
 * - `onClose(): void` — required; called by Close, Escape, Cancel, and after a confirmation.
 * - `windowId?: string` — offer only this window's occurrences (e.g. opened from a window on the calendar).
 * - `occurrenceStartsAt?: string` — with `windowId`, open straight on this occurrence's proposal (UTC ISO).
 * - `siteId?: string`, `areaId?: string` — offer only the windows of this site / area.
 * - `onConfirmed?(visits: Visit[]): void` — called with the visits planned, before `onClose`.
 *
 * The planner picks an occurrence (the next 90 days), sees the proposal's visits per technician
 * with times on the site's clock and estimated durations, removes a row or gives it to another
 * technician (each technician's rows are laid out again from the window's start), sees the banks
 * left out with the reason, and confirms all visits at once (POST /api/visits/batch, one
 * transaction). Warnings the server raises (override-needed) are shown and may be accepted with
 * one reason. Works at 390 px: rows stack, controls wrap.
 */
import { useId, useMemo, useState } from 'react';
import { PLANNING_REASON_MIN_CHARS } from '../../../../../shared/constants/planning';
import type { WindowProposal } from '../../../../../shared/schemas/plan-window';
import type { Visit } from '../../../../../shared/schemas/visit';
import { Button } from '../../../components/ui/button';
import { DischargeCaution } from '../../../components/ui/discharge-caution';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { Modal } from '../../../components/ui/modal';
import { Spinner } from '../../../components/ui/spinner';
import { ApiError } from '../../../lib/api-client';
import { useConfirmWindowPlan, useWindowOccurrences, useWindowProposal } from '../api/proposal';
import { occurrenceChoices } from '../utils/occurrences';
import {
  batchBody,
  canConfirm,
  layOutRows,
  overridesForWarnings,
  reassignRow,
  removeRow,
  rowsByTechnician,
  rowsFromProposal,
  rowWarningsOf,
  type ProposalRow,
  type RowWarning,
} from '../utils/proposal-rows';
import { minutesText, zonedRangeText, zonedTimesText } from '../utils/zoned-text';

export interface PlanWindowDialogProps {
  onClose: () => void;
  windowId?: string;
  occurrenceStartsAt?: string;
  siteId?: string;
  areaId?: string;
  onConfirmed?: (visits: Visit[]) => void;
}

const DAY_MS = 86_400_000;
/** How far ahead the picker offers occurrences. */
const PICK_AHEAD_DAYS = 90;

export function PlanWindowDialog({
  onClose,
  windowId,
  occurrenceStartsAt,
  siteId,
  areaId,
  onConfirmed,
}: PlanWindowDialogProps) {
  const [picked, setPicked] = useState<{ windowId: string; startsAt: string } | null>(
    windowId && occurrenceStartsAt ? { windowId, startsAt: occurrenceStartsAt } : null,
  );
  return (
    <Modal title="Plan a shutdown window" onClose={onClose} wide tall bodyClassName="space-y-4">
      <OccurrencePicker
        windowId={windowId}
        siteId={siteId}
        areaId={areaId}
        picked={picked}
        onPick={setPicked}
      />
      {picked ? (
        <ProposalSection
          key={`${picked.windowId}|${picked.startsAt}`}
          windowId={picked.windowId}
          occurrenceStartsAt={picked.startsAt}
          onCancel={onClose}
          onConfirmed={(visits) => {
            onConfirmed?.(visits);
            onClose();
          }}
        />
      ) : null}
    </Modal>
  );
}

function OccurrencePicker({
  windowId,
  siteId,
  areaId,
  picked,
  onPick,
}: {
  windowId?: string;
  siteId?: string;
  areaId?: string;
  picked: { windowId: string; startsAt: string } | null;
  onPick: (choice: { windowId: string; startsAt: string } | null) => void;
}) {
  // the range is fixed when the dialog opens: a re-render must not ask again for a moving range
  const [range] = useState(() => {
    const now = Date.now();
    return {
      nowAt: new Date(now).toISOString(),
      from: new Date(now - DAY_MS).toISOString(),
      to: new Date(now + PICK_AHEAD_DAYS * DAY_MS).toISOString(),
    };
  });
  const pickerId = useId();
  const windows = useWindowOccurrences({ from: range.from, to: range.to, siteId, areaId });
  const choices = useMemo(
    () => occurrenceChoices(windows.data?.items ?? [], range.nowAt, windowId),
    [windows.data, range.nowAt, windowId],
  );
  const value = picked ? `${picked.windowId}|${picked.startsAt}` : '';

  if (windows.isPending) return <Spinner label="Loading shutdown windows" />;
  if (windows.isError)
    return (
      <ErrorPanel title="The shutdown windows could not be loaded.">
        {windows.error.message}
      </ErrorPanel>
    );
  if (choices.length === 0 && !picked) {
    return (
      <p className="text-sm text-tide-800">
        No shutdown window falls in the next {PICK_AHEAD_DAYS} days{siteId || areaId ? ' here' : ''}
        . Add one on the calendar first.
      </p>
    );
  }
  return (
    <div>
      <label htmlFor={pickerId} className="mb-1 block text-sm font-medium text-tide-900">
        Window occurrence to plan
      </label>
      <select
        id={pickerId}
        value={value}
        onChange={(event) => {
          const choice = choices.find((c) => c.key === event.target.value);
          onPick(choice ? { windowId: choice.windowId, startsAt: choice.startsAt } : null);
        }}
        className="min-h-10 w-full rounded-lg border border-tide-200 bg-white px-3 py-2 text-sm"
      >
        <option value="">Choose an occurrence…</option>
        {choices.map((c) => (
          <option key={c.key} value={c.key}>
            {c.title} · {c.areaName}, {c.siteName} ·{' '}
            {zonedRangeText(c.startsAt, c.endsAt, c.timeZone)}
          </option>
        ))}
        {picked && !choices.some((c) => c.key === value) ? (
          <option value={value}>The occurrence asked for</option>
        ) : null}
      </select>
    </div>
  );
}

function ProposalSection({
  windowId,
  occurrenceStartsAt,
  onCancel,
  onConfirmed,
}: {
  windowId: string;
  occurrenceStartsAt: string;
  onCancel: () => void;
  onConfirmed: (visits: Visit[]) => void;
}) {
  const proposal = useWindowProposal(windowId, occurrenceStartsAt);
  if (proposal.isPending) return <Spinner label="Working out the proposal" />;
  if (proposal.isError)
    return <ErrorPanel title="No proposal could be made.">{proposal.error.message}</ErrorPanel>;
  return <ProposalEditor proposal={proposal.data} onCancel={onCancel} onConfirmed={onConfirmed} />;
}

function ProposalEditor({
  proposal,
  onCancel,
  onConfirmed,
}: {
  proposal: WindowProposal;
  onCancel: () => void;
  onConfirmed: (visits: Visit[]) => void;
}) {
  const { window: occurrence } = proposal;
  const zone = occurrence.timeZone;
  const [rows, setRows] = useState<ProposalRow[]>(() => rowsFromProposal(proposal));
  const [warnings, setWarnings] = useState<RowWarning[]>([]);
  const [overrideReason, setOverrideReason] = useState('');
  const confirm = useConfirmWindowPlan();
  const reasonId = useId();

  const laidOut = useMemo(
    () => layOutRows(rows, occurrence, proposal.technicians),
    [rows, occurrence, proposal.technicians],
  );
  const groups = useMemo(
    () => rowsByTechnician(laidOut, proposal.technicians),
    [laidOut, proposal.technicians],
  );
  const windowMinutes = Math.round(
    (Date.parse(occurrence.endsAt) - Date.parse(occurrence.startsAt)) / 60_000,
  );
  const overrideReady =
    warnings.length === 0 || overrideReason.trim().length >= PLANNING_REASON_MIN_CHARS;

  const edit = (next: ProposalRow[]) => {
    setRows(next);
    // the server's warnings were about the rows as they were
    setWarnings([]);
    confirm.reset();
  };

  const submit = () => {
    const overrides =
      warnings.length > 0 ? overridesForWarnings(warnings, overrideReason) : undefined;
    confirm.mutate(batchBody(laidOut, overrides), {
      onSuccess: (answer) => onConfirmed(answer.items),
      onError: (error) => {
        if (error instanceof ApiError && error.code === 'override-needed')
          setWarnings(rowWarningsOf(error.issues));
      },
    });
  };

  return (
    <div className="space-y-4">
      <div className="rounded-lg bg-tide-50 px-3 py-2 text-sm text-tide-900">
        <p className="font-semibold">
          {occurrence.title} · {occurrence.areaName}, {occurrence.siteName}
        </p>
        <p>{zonedRangeText(occurrence.startsAt, occurrence.endsAt, zone)}</p>
        <p className="text-tide-800">
          Banks due by {proposal.dueBy}. Estimate per bank: setup, about 5 τ of capture from its
          baseline, and the cabinet’s marked wait. Times are on the site’s clock ({zone}).
        </p>
      </div>

      <DischargeCaution compact />

      {proposal.technicianPool === 'all' ? (
        <p className="text-sm text-tide-800">
          Nobody is attached to {occurrence.siteName}, so every technician is offered.
        </p>
      ) : null}
      {proposal.busyTechnicians.length > 0 ? (
        <div className="text-sm text-tide-800">
          <p className="font-medium text-tide-900">
            Visits already planned in this window (planned around)
          </p>
          <ul className="list-disc pl-5">
            {proposal.busyTechnicians.map((t) => (
              <li key={t.id}>
                {t.name}: {t.reason}
              </li>
            ))}
          </ul>
        </div>
      ) : null}

      <section aria-label="Proposed visits" className="space-y-3">
        {groups.length === 0 ? (
          <p className="text-sm text-tide-800">
            {proposal.visits.length === 0
              ? 'No visit to propose for this occurrence.'
              : 'Every row has been removed.'}
          </p>
        ) : null}
        {groups.map((group) => (
          <div key={group.technicianId} className="rounded-lg border border-tide-100">
            <h3 className="flex flex-wrap items-baseline justify-between gap-2 border-b border-tide-100 px-3 py-2 text-sm font-semibold text-tide-900">
              <span>{group.name}</span>
              <span className="font-normal text-tide-800">
                {minutesText(group.plannedMinutes)} of {minutesText(windowMinutes)}
              </span>
            </h3>
            <ul className="divide-y divide-tide-100">
              {group.rows.map((row) => (
                <li
                  key={row.key}
                  className="flex flex-col gap-2 px-3 py-2 sm:flex-row sm:items-center sm:justify-between"
                >
                  <div className="text-sm">
                    <p className="font-medium text-tide-950">
                      {zonedTimesText(row.plannedStartAt, row.plannedEndAt, zone)} ·{' '}
                      {row.visit.cabinetTag}
                    </p>
                    <p className="text-tide-800">
                      Banks {row.visit.banks.map((b) => b.position).join(', ')} · about{' '}
                      {minutesText(row.estimatedMinutes)}
                      {row.visit.markedWaitMinutes === null
                        ? ' (no marked wait: 15 min planned)'
                        : ''}
                    </p>
                    {row.endsAfterWindow ? (
                      <p className="font-medium text-eol-600">
                        Ends after the window’s end: remove it or give it to someone with time left.
                      </p>
                    ) : null}
                  </div>
                  <div className="flex flex-wrap items-center gap-2">
                    <label className="sr-only" htmlFor={`tech-${row.key}`}>
                      Technician for {row.visit.cabinetTag}
                    </label>
                    <select
                      id={`tech-${row.key}`}
                      value={row.technicianIds[0] ?? ''}
                      onChange={(event) => edit(reassignRow(rows, row.key, event.target.value))}
                      className="min-h-9 rounded-lg border border-tide-200 bg-white px-2 py-1 text-sm"
                    >
                      {proposal.technicians.map((t) => (
                        <option key={t.id} value={t.id}>
                          {t.name}
                        </option>
                      ))}
                    </select>
                    <Button
                      size="sm"
                      variant="danger"
                      onClick={() => edit(removeRow(rows, row.key))}
                      aria-label={`Remove ${row.visit.cabinetTag}`}
                    >
                      Remove
                    </Button>
                  </div>
                </li>
              ))}
            </ul>
          </div>
        ))}
      </section>

      {proposal.leftOut.length > 0 ? (
        <section aria-label="Banks left out" className="text-sm">
          <h3 className="font-semibold text-tide-900">Left out ({proposal.leftOut.length})</h3>
          <ul className="mt-1 space-y-1">
            {proposal.leftOut.map((bank) => (
              <li key={bank.bankId} className="text-tide-800">
                <span className="font-medium text-tide-950">
                  {bank.cabinetTag} {bank.position}
                </span>{' '}
                (due {bank.dueOn}): {bank.reason}
              </li>
            ))}
          </ul>
        </section>
      ) : null}

      {warnings.length > 0 ? (
        <div role="alert" className="rounded-lg border border-watch-600/40 bg-white p-3 text-sm">
          <p className="font-semibold text-watch-600">The plan raised warnings</p>
          <ul className="mt-1 list-disc pl-5 text-tide-800">
            {warnings.map((w) => (
              <li key={`${w.index}-${w.kind}`}>
                {laidOut[w.index]?.visit.cabinetTag ?? `Row ${w.index + 1}`}: {w.message}
              </li>
            ))}
          </ul>
          <label htmlFor={reasonId} className="mt-2 block font-medium text-tide-900">
            Plan anyway because…
          </label>
          <input
            id={reasonId}
            value={overrideReason}
            onChange={(event) => setOverrideReason(event.target.value)}
            className="mt-1 min-h-10 w-full rounded-lg border border-tide-200 px-3 py-2"
          />
        </div>
      ) : null}
      {confirm.isError &&
      !(confirm.error instanceof ApiError && confirm.error.code === 'override-needed') ? (
        <ErrorPanel title="The visits were not planned.">{confirm.error.message}</ErrorPanel>
      ) : null}

      <div className="flex flex-wrap justify-end gap-2 border-t border-tide-100 pt-3">
        <Button onClick={onCancel}>Cancel</Button>
        <Button
          variant="primary"
          disabled={!canConfirm(laidOut) || !overrideReady || confirm.isPending}
          onClick={submit}
        >
          {confirm.isPending
            ? 'Planning…'
            : `Plan ${laidOut.length} visit${laidOut.length === 1 ? '' : 's'}`}
        </Button>
      </div>
    </div>
  );
}
