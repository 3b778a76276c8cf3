import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Field, TextInput } from '../../../components/ui/field';
import { Modal } from '../../../components/ui/modal';
import { ApiError } from '../../../lib/api-client';
import type { PlanningWarning, PlanningWarningKind, Visit } from '../api/shapes';
import { useChangeVisit, useVisitCheck } from '../api/visits';
import { isReasonGiven, kindsMissingReason, MIN_REASON_LENGTH, overridesFor, warningsFromIssues } from '../utils/warnings';
import { formatZonedRange } from '../utils/zoned-time';
import { WarningOverrides } from './warning-overrides';

export interface ProposedTimes {
  plannedStartAt: string;
  plannedEndAt: string;
}

/**
 * A visit dragged or resized to new times: asks the reason, shows the planning warnings of the
 * new times, and replans it. Closing without saving (or a refusal) puts it back.
 */
export function MoveVisitDialog({ visit, proposed, onClose }: { visit: Visit; proposed: ProposedTimes; onClose: (saved: boolean) => void }) {
  const [reason, setReason] = useState('');
  const [reasons, setReasons] = useState<Partial<Record<PlanningWarningKind, string>>>({});
  const [serverWarnings, setServerWarnings] = useState<PlanningWarning[] | null>(null);
  const check = useVisitCheck({
    visitId: visit.id,
    cabinetId: visit.cabinetId,
    bankIds: visit.banks.map((b) => b.id),
    technicianIds: visit.technicians.map((t) => t.id),
    ...proposed,
  });
  const change = useChangeVisit();
  const warnings = serverWarnings ?? check.data?.warnings ?? [];
  const missing = kindsMissingReason(warnings, reasons);
  const ready = isReasonGiven(reason) && missing.length === 0 && !check.isPending;

  function save() {
    change.mutate(
      {
        visitId: visit.id,
        change: { version: visit.version, reason: reason.trim(), ...proposed, overrides: overridesFor(warnings, reasons) },
      },
      {
        onSuccess: () => onClose(true),
        onError: (error) => {
          if (error instanceof ApiError && error.code === 'override-needed') setServerWarnings(warningsFromIssues(error.issues));
        },
      },
    );
  }

  const refusal = change.error instanceof ApiError && change.error.code !== 'override-needed' ? change.error : null;
  return (
    <Modal title={`Move ${visit.cabinetTag}`} onClose={() => onClose(false)}>
      <dl className="grid gap-1 text-sm sm:grid-cols-[5rem_1fr]">
        <dt className="font-medium text-tide-600">From</dt>
        <dd>{formatZonedRange(visit.plannedStartAt, visit.plannedEndAt, visit.timeZone)}</dd>
        <dt className="font-medium text-tide-600">To</dt>
        <dd className="font-bold text-tide-900">{formatZonedRange(proposed.plannedStartAt, proposed.plannedEndAt, visit.timeZone)}</dd>
      </dl>
      <form
        className="mt-4 space-y-4"
        onSubmit={(event) => {
          event.preventDefault();
          if (ready) save();
        }}
      >
        <Field id="move-reason" label="Why does it move?" required hint={`At least ${MIN_REASON_LENGTH} characters; kept in the visit's audit trail.`}>
          <TextInput id="move-reason" value={reason} onChange={(e) => setReason(e.target.value)} autoFocus placeholder="e.g. shutdown moved by a day" />
        </Field>
        {check.isError ? (
          <p className="text-sm font-medium text-eol-600">The warnings could not be checked: {check.error.message}</p>
        ) : (
          <WarningOverrides
            idPrefix="move"
            warnings={warnings}
            reasons={reasons}
            checking={check.isPending}
            onReason={(kind, value) => setReasons((r) => ({ ...r, [kind]: value }))}
          />
        )}
        {refusal ? (
          <p role="alert" className="text-sm font-medium text-eol-600">
            Not moved: {refusal.message}
            {refusal.code === 'stale-version' ? ' Close this and try again on the fresh calendar.' : ''}
          </p>
        ) : null}
        <div className="flex flex-wrap gap-2">
          <Button type="submit" variant="primary" disabled={!ready || change.isPending}>
            {change.isPending ? 'Moving…' : 'Move visit'}
          </Button>
          <Button onClick={() => onClose(false)} disabled={change.isPending}>
            Keep it where it was
          </Button>
        </div>
      </form>
    </Modal>
  );
}
