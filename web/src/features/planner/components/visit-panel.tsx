import { useState } from 'react';
import { Link } from 'react-router';
import { PLANNING_WARNING_LABELS } from '../../../../../shared/constants/planning';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { DetailList } from '../../../components/ui/detail-list';
import { DischargeCaution } from '../../../components/ui/discharge-caution';
import { Field, TextInput } from '../../../components/ui/field';
import { Modal } from '../../../components/ui/modal';
import { Spinner } from '../../../components/ui/spinner';
import { ApiError } from '../../../lib/api-client';
import { formatSeconds } from '../../../lib/units';
import { useTechnicians } from '../api/lookups';
import type { PlanningWarning, PlanningWarningKind, Visit } from '../api/shapes';
import { VISIT_STATE_LABELS } from '../api/shapes';
import { useChangeVisit, useTransitionVisit, useVisit, useVisitCheck } from '../api/visits';
import { VISIT_STATE_STYLES } from '../utils/calendar-events';
import { weekOnOf } from '../utils/visit-form';
import { visitActions, type PlannerPermissions } from '../utils/visit-rules';
import { isReasonGiven, kindsMissingReason, MIN_REASON_LENGTH, overridesFor, warningsFromIssues } from '../utils/warnings';
import { formatZonedInstant, formatZonedRange } from '../utils/zoned-time';
import { WarningOverrides } from './warning-overrides';

/** A visit's state as a pill in its calendar colour; the word carries the meaning. */
export function VisitStateBadge({ state }: { state: Visit['state'] }) {
  const style = VISIT_STATE_STYLES[state];
  return (
    <span
      className="inline-flex items-center rounded-full border px-2 py-0.5 text-xs font-medium"
      style={{ background: style.background, borderColor: style.border, color: style.text }}
    >
      {style.label}
    </span>
  );
}

/**
 * A visit's details with what the person may do to it: cancel (with a reason), review a logged
 * visit, and reassign its technicians (a replan: reason and warnings as for a move).
 */
export function VisitPanel({
  visitId,
  listed,
  can,
  onClose,
}: {
  visitId: string;
  /** The visit as the calendar listed it, shown until the fresh one arrives. */
  listed?: Visit;
  can: PlannerPermissions;
  onClose: () => void;
}) {
  const detail = useVisit(visitId);
  const visit = detail.data ?? listed;
  if (!visit) {
    return (
      <Modal title="Visit" onClose={onClose}>
        {detail.isError ? <p className="text-sm font-medium text-eol-600">The visit could not be loaded: {detail.error.message}</p> : <Spinner label="Loading the visit" />}
      </Modal>
    );
  }
  return <VisitDetails visit={visit} loading={detail.isFetching && !detail.data} can={can} onClose={onClose} />;
}

function VisitDetails({ visit, loading, can, onClose }: { visit: Visit; loading: boolean; can: PlannerPermissions; onClose: () => void }) {
  const actions = visitActions(visit, can);
  const [mode, setMode] = useState<'view' | 'cancel' | 'reassign'>('view');
  const review = useTransitionVisit();

  const when = formatZonedRange(visit.plannedStartAt, visit.plannedEndAt, visit.timeZone);
  const happened = (
    [
      ['Started', visit.startedAt],
      ['Logged', visit.loggedAt],
      ['Reviewed', visit.reviewedAt],
      ['Missed', visit.missedAt],
      ['Cancelled', visit.cancelledAt],
    ] as const
  ).filter(([, at]) => at !== null);

  return (
    <Modal title={`Visit to ${visit.cabinetTag}`} onClose={onClose} wide>
      <div className="space-y-4">
        <div className="flex flex-wrap items-center gap-2">
          <VisitStateBadge state={visit.state} />
          {visit.unplanned ? <Badge tone="muted">unplanned</Badge> : null}
          <span className="text-sm font-medium text-tide-900">{when}</span>
        </div>
        {loading ? <Spinner label="Loading the visit" /> : null}
        <DetailList
          items={[
            {
              label: 'Cabinet',
              value: (
                <Link className="font-medium text-tide-800 underline" to={`/register/cabinets/${visit.cabinetId}`}>
                  {visit.cabinetTag}
                </Link>
              ),
            },
            { label: 'Site · area', value: `${visit.siteName} · ${visit.areaName}` },
            {
              label: 'Banks',
              wide: true,
              value: (
                <ul className="space-y-0.5">
                  {visit.banks.map((bank) => (
                    <li key={bank.id}>
                      <Link className="text-tide-800 underline" to={`/register/banks/${bank.id}`}>
                        {bank.position}
                      </Link>{' '}
                      · {bank.bankDesignCode} · baseline τ {formatSeconds(bank.baselineTauSeconds)}
                    </li>
                  ))}
                </ul>
              ),
            },
            { label: 'Technicians', value: visit.technicians.map((t) => t.name).join(', ') },
            { label: 'Estimated', value: `${visit.estimatedMinutes} min` },
            { label: 'Marked wait', value: visit.cabinetMarkedWaitMinutes === null ? 'not marked' : `${visit.cabinetMarkedWaitMinutes} min` },
            { label: 'Notes', value: visit.notes, wide: true },
            ...(visit.overrides.length > 0
              ? [
                  {
                    label: 'Warnings accepted',
                    wide: true,
                    value: (
                      <ul className="space-y-0.5">
                        {visit.overrides.map((o) => (
                          <li key={o.kind}>
                            {PLANNING_WARNING_LABELS[o.kind]}: “{o.reason}”
                          </li>
                        ))}
                      </ul>
                    ),
                  },
                ]
              : []),
            ...(visit.stateReason ? [{ label: 'Last reason', value: visit.stateReason, wide: true }] : []),
            ...happened.map(([label, at]) => ({ label, value: formatZonedInstant(at!, visit.timeZone) })),
          ]}
        />
        <DischargeCaution compact />

        {mode === 'cancel' ? (
          <CancelForm visit={visit} onDone={() => setMode('view')} />
        ) : mode === 'reassign' ? (
          <ReassignForm visit={visit} onDone={() => setMode('view')} />
        ) : (
          <div className="flex flex-wrap gap-2 border-t border-tide-100 pt-4">
            {actions.replan ? <Button onClick={() => setMode('reassign')}>Reassign technicians</Button> : null}
            {actions.review ? (
              <Button
                variant="primary"
                disabled={review.isPending}
                onClick={() => review.mutate({ visitId: visit.id, action: 'review', version: visit.version })}
              >
                {review.isPending ? 'Reviewing…' : 'Mark reviewed'}
              </Button>
            ) : null}
            {actions.cancel ? (
              <Button variant="danger" onClick={() => setMode('cancel')}>
                Cancel visit
              </Button>
            ) : null}
            {!actions.replan && !actions.review && !actions.cancel ? (
              <p className="text-sm text-tide-600">
                {visit.state === 'reviewed' || visit.state === 'cancelled'
                  ? `This visit is ${VISIT_STATE_LABELS[visit.state]}: nothing more to do.`
                  : 'Planners change visits; technicians start and log their own from My visits.'}
              </p>
            ) : null}
          </div>
        )}
        {review.error ? (
          <p role="alert" className="text-sm font-medium text-eol-600">
            Not reviewed: {review.error.message}
          </p>
        ) : null}
      </div>
    </Modal>
  );
}

function CancelForm({ visit, onDone }: { visit: Visit; onDone: () => void }) {
  const [reason, setReason] = useState('');
  const cancel = useTransitionVisit();
  return (
    <form
      className="space-y-3 rounded-lg border border-eol-600/30 p-3"
      aria-label="Cancel the visit"
      onSubmit={(event) => {
        event.preventDefault();
        if (!isReasonGiven(reason)) return;
        cancel.mutate({ visitId: visit.id, action: 'cancel', version: visit.version, reason: reason.trim() }, { onSuccess: onDone });
      }}
    >
      <Field id="cancel-reason" label="Why is it cancelled?" required hint={`At least ${MIN_REASON_LENGTH} characters; kept in the audit trail.`}>
        <TextInput id="cancel-reason" value={reason} onChange={(e) => setReason(e.target.value)} autoFocus />
      </Field>
      {cancel.error ? (
        <p role="alert" className="text-sm font-medium text-eol-600">
          Not cancelled: {cancel.error.message}
        </p>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="danger" disabled={!isReasonGiven(reason) || cancel.isPending}>
          {cancel.isPending ? 'Cancelling…' : 'Cancel this visit'}
        </Button>
        <Button onClick={onDone}>Keep it</Button>
      </div>
    </form>
  );
}

function ReassignForm({ visit, onDone }: { visit: Visit; onDone: () => void }) {
  const [technicianIds, setTechnicianIds] = useState(visit.technicians.map((t) => t.id));
  const [reason, setReason] = useState('');
  const [reasons, setReasons] = useState<Partial<Record<PlanningWarningKind, string>>>({});
  const [serverWarnings, setServerWarnings] = useState<PlanningWarning[] | null>(null);
  const technicians = useTechnicians(weekOnOf(visit.plannedStartAt, visit.timeZone), visit.timeZone);
  const sorted = [...technicianIds].sort();
  const check = useVisitCheck(
    sorted.length === 0
      ? null
      : {
          visitId: visit.id,
          cabinetId: visit.cabinetId,
          bankIds: visit.banks.map((b) => b.id),
          plannedStartAt: visit.plannedStartAt,
          plannedEndAt: visit.plannedEndAt,
          technicianIds: sorted,
        },
  );
  const change = useChangeVisit();
  const warnings = serverWarnings ?? check.data?.warnings ?? [];
  const ready = sorted.length > 0 && isReasonGiven(reason) && kindsMissingReason(warnings, reasons).length === 0 && !check.isPending;
  // people on the visit stay listed even if the week's list does not name them
  const people = [
    ...(technicians.data?.items.map((t) => ({ id: t.technicianId, name: t.name, load: `${t.plannedHours} of ${t.availableHours} h` })) ?? []),
    ...visit.technicians
      .filter((t) => !technicians.data?.items.some((x) => x.technicianId === t.id))
      .map((t) => ({ id: t.id, name: t.name, load: '' })),
  ];

  return (
    <form
      className="space-y-3 rounded-lg border border-tide-200 p-3"
      aria-label="Reassign technicians"
      onSubmit={(event) => {
        event.preventDefault();
        if (!ready) return;
        change.mutate(
          { visitId: visit.id, change: { version: visit.version, reason: reason.trim(), technicianIds: sorted, overrides: overridesFor(warnings, reasons) } },
          {
            onSuccess: onDone,
            onError: (error) => {
              if (error instanceof ApiError && error.code === 'override-needed') setServerWarnings(warningsFromIssues(error.issues));
            },
          },
        );
      }}
    >
      <fieldset>
        <legend className="mb-1 text-sm font-medium text-tide-900">Technicians</legend>
        {technicians.isPending ? <Spinner label="Loading technicians" /> : null}
        <div className="grid gap-2 sm:grid-cols-2">
          {people.map((person) => (
            <label key={person.id} className="flex min-h-10 items-center gap-2 rounded-lg border border-tide-100 px-3 py-1.5 text-sm">
              <input
                type="checkbox"
                className="size-4 accent-tide-800"
                checked={technicianIds.includes(person.id)}
                onChange={(e) => {
                  setServerWarnings(null);
                  setTechnicianIds((ids) => (e.target.checked ? [...ids, person.id] : ids.filter((id) => id !== person.id)));
                }}
              />
              <span className="min-w-0 flex-1">{person.name}</span>
              {person.load ? <span className="text-xs text-tide-600">{person.load} that week</span> : null}
            </label>
          ))}
        </div>
        {sorted.length === 0 ? <p className="mt-1 text-sm font-medium text-eol-600">Tick at least one technician.</p> : null}
      </fieldset>
      <Field id="reassign-reason" label="Why the change?" required hint={`At least ${MIN_REASON_LENGTH} characters; kept in the audit trail.`}>
        <TextInput id="reassign-reason" value={reason} onChange={(e) => setReason(e.target.value)} />
      </Field>
      {sorted.length > 0 ? (
        <WarningOverrides
          idPrefix="reassign"
          warnings={warnings}
          reasons={reasons}
          checking={check.isPending}
          onReason={(kind, value) => setReasons((r) => ({ ...r, [kind]: value }))}
        />
      ) : null}
      {change.error && !(change.error instanceof ApiError && change.error.code === 'override-needed') ? (
        <p role="alert" className="text-sm font-medium text-eol-600">
          Not changed: {change.error.message}
        </p>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" disabled={!ready || change.isPending}>
          {change.isPending ? 'Saving…' : 'Save technicians'}
        </Button>
        <Button onClick={onDone}>Back</Button>
      </div>
    </form>
  );
}
