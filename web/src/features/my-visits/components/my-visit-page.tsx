import { useQuery } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { Link } from 'react-router';
import { PLANNING_WARNING_LABELS } from '../../../../../shared/constants/planning';
import type { Visit } from '../../../../../shared/schemas/visit';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { DetailList } from '../../../components/ui/detail-list';
import { DischargeCaution } from '../../../components/ui/discharge-caution';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { Spinner } from '../../../components/ui/spinner';
import { ApiError } from '../../../lib/api-client';
import { formatSeconds } from '../../../lib/units';
import { areaWindowsQueryOptions, useVisit } from '../api/get-my-visits';
import { useTakeVisitAction } from '../api/take-visit-action';
import { ACTION_BUTTON_TEXT, isAssigned, nextActionFor, type MyVisitAction, type Viewer } from '../utils/visit-actions';
import { visitTimeText, durationText } from '../utils/visit-times';
import { windowOfVisit } from '../utils/visit-window';
import { WindowLine } from './visit-card';
import { VisitStateBadge } from '../../../components/ui/visit-state-badge';

const DAY_MS = 86_400_000;

/** What the app puts into a visit's page from other features (features never import each other). */
export interface MyVisitSlots {
  /** The work at the cabinet (the decay runs of the visit's banks), shown to an assigned technician while the visit is under way. */
  atCabinet?: (visit: Visit) => ReactNode;
  /** Shown in the "Mark as logged" confirmation, e.g. the banks with no run sent yet. */
  beforeLogging?: (visit: Visit) => ReactNode;
  /** The runs recorded on the visit and their review (a queried run with the reviewer's comment), once it is logged or reviewed. */
  recorded?: (visit: Visit) => ReactNode;
}

/** One visit, as a technician opens it at the cabinet: what, where, when, the cautions, and Start / Mark as logged. */
export function MyVisitPage({ visitId, viewer, ...slots }: { visitId: string; viewer: Viewer } & MyVisitSlots) {
  const visit = useVisit(visitId);
  if (visit.isPending) return <Spinner label="Loading the visit…" />;
  if (visit.isError) {
    const missing = visit.error instanceof ApiError && visit.error.status === 404;
    return (
      <div className="space-y-4">
        <BackLink />
        <ErrorPanel title={missing ? 'No such visit for you' : 'The visit could not be loaded'}>
          {missing
            ? 'It may have been cancelled or given to someone else, or it is at a site that is not yours. Your visits are on My visits.'
            : visit.error.message}
        </ErrorPanel>
      </div>
    );
  }
  return <VisitDetail visit={visit.data} viewer={viewer} slots={slots} />;
}

function BackLink() {
  return (
    <Link to="/my-visits" className="inline-flex min-h-10 items-center text-sm font-medium text-tide-800 hover:underline">
      ← My visits
    </Link>
  );
}

function VisitDetail({ visit, viewer, slots }: { visit: Visit; viewer: Viewer; slots: MyVisitSlots }) {
  const range = {
    from: new Date(Date.parse(visit.plannedStartAt) - DAY_MS).toISOString(),
    to: new Date(Date.parse(visit.plannedEndAt) + DAY_MS).toISOString(),
  };
  const windows = useQuery(areaWindowsQueryOptions(visit.areaId, range));
  const window = windows.isSuccess ? windowOfVisit(visit, windows.data) : undefined;
  const outsideOverride = visit.overrides.find((o) => o.kind === 'outside-window');
  const others = visit.technicians.filter((t) => t.id !== viewer.id);

  return (
    <div className="space-y-5" data-testid="my-visit">
      <BackLink />
      <header className="space-y-1">
        <div className="flex flex-wrap items-center gap-2">
          <h1 className="break-all font-mono text-2xl font-bold text-tide-900 sm:text-3xl">{visit.cabinetTag}</h1>
          <VisitStateBadge state={visit.state} />
        </div>
        <p className="text-lg font-medium text-tide-950">
          {visitTimeText(visit.plannedStartAt, visit.plannedEndAt, visit.timeZone)}
        </p>
        <p className="text-tide-800">
          {visit.siteName} · {visit.areaName}
        </p>
        <WindowLine window={window} timeZone={visit.timeZone} />
        {outsideOverride ? (
          <p className="text-sm text-tide-800">
            The planner accepted that it is {PLANNING_WARNING_LABELS['outside-window']}: “{outsideOverride.reason}”
          </p>
        ) : null}
      </header>

      <VisitActions visit={visit} viewer={viewer} slots={slots} />

      <DischargeCaution />

      {slots.atCabinet && visit.state === 'under-way' && isAssigned(visit, viewer) ? slots.atCabinet(visit) : null}

      {slots.recorded && (visit.state === 'logged' || visit.state === 'reviewed') ? slots.recorded(visit) : null}

      <Card title="Cabinet">
        <DetailList
          items={[
            {
              label: 'Tag',
              value: (
                <Link to={`/register/cabinets/${visit.cabinetId}`} className="font-medium text-tide-800 underline">
                  {visit.cabinetTag}
                </Link>
              ),
            },
            { label: 'Where', value: visit.cabinetName || visit.areaName },
            {
              label: 'Marked wait before opening',
              value:
                visit.cabinetMarkedWaitMinutes === null
                  ? 'Not on record: read the label on the drive'
                  : `${visit.cabinetMarkedWaitMinutes} min`,
            },
            { label: 'Estimated time on site', value: `about ${durationText(visit.estimatedMinutes)}` },
            isAssigned(visit, viewer) && others.length > 0
              ? { label: 'With you', value: others.map((t) => t.name).join(', ') }
              : {
                  label: 'Technicians',
                  value: others.length === 0 ? 'You' : others.map((t) => t.name).join(', '),
                },
            ...(visit.notes ? [{ label: 'Planner’s notes', value: visit.notes, wide: true }] : []),
          ]}
        />
      </Card>

      <Card title={visit.banks.length === 1 ? 'Bank' : `${visit.banks.length} banks`}>
        <ul className="divide-y divide-tide-100" data-testid="my-visit-banks">
          {visit.banks.map((bank) => (
            <li key={bank.id}>
              <Link
                to={`/register/banks/${bank.id}`}
                className="flex min-h-12 items-center justify-between gap-3 py-2 hover:bg-tide-50"
              >
                <span className="min-w-0">
                  <span className="block font-bold text-tide-900">{bank.position}</span>
                  <span className="block text-sm text-tide-600">
                    {bank.bankDesignCode} · baseline τ {formatSeconds(bank.baselineTauSeconds)}
                  </span>
                </span>
                <span className="shrink-0 text-sm font-medium text-tide-800" aria-hidden="true">
                  Open ›
                </span>
              </Link>
            </li>
          ))}
        </ul>
      </Card>

      {visit.stateReason ? (
        <p className="text-sm text-tide-800">
          <span className="font-medium">Last change:</span> {visit.stateReason}
        </p>
      ) : null}
    </div>
  );
}

/** Start visit / Mark as logged, for an assigned technician; otherwise why not, in words. */
function VisitActions({ visit, viewer, slots }: { visit: Visit; viewer: Viewer; slots: MyVisitSlots }) {
  const action = nextActionFor(visit, viewer);
  const take = useTakeVisitAction();
  const [confirmingLog, setConfirmingLog] = useState(false);
  const assigned = isAssigned(visit, viewer);

  const run = (chosen: MyVisitAction) =>
    take.mutate({ visit, action: chosen }, { onSuccess: () => setConfirmingLog(false) });

  return (
    <section aria-label="What to do" className="space-y-3 rounded-xl border border-tide-100 bg-white p-4 shadow-sm">
      {action !== null && slots.atCabinet ? (
        <p className="text-sm text-tide-800" data-testid="visit-steps">
          {action === 'start'
            ? 'Start the visit when you begin at the cabinet: Ebbline then leads you through each bank’s safety checks and readings.'
            : 'Record each bank’s decay run below. Mark the visit as logged when every bank is done and the cabinet is closed again.'}
        </p>
      ) : action !== null ? (
        <p className="text-sm text-tide-800" data-testid="capture-later">
          Recording the decay readings in Ebbline is not built yet: it comes in a later release. For now, take
          the readings with your meter or logger as you do today and keep the file. Start the visit when you
          begin at the cabinet and mark it as logged when the readings are taken.
        </p>
      ) : null}
      {!assigned ? (
        <p className="text-sm font-medium text-tide-900">
          This visit is at one of your sites but assigned to{' '}
          {visit.technicians.map((t) => t.name).join(', ') || 'nobody'}: only they can start or log it.
        </p>
      ) : action === null ? (
        <p className="text-sm font-medium text-tide-900">{doneText(visit)}</p>
      ) : action === 'start' ? (
        <Button variant="primary" className="w-full sm:w-auto" disabled={take.isPending} onClick={() => run('start')}>
          {take.isPending ? 'Starting…' : ACTION_BUTTON_TEXT.start}
        </Button>
      ) : confirmingLog ? (
        <div className="space-y-2 rounded-lg bg-tide-50 p-3">
          {slots.beforeLogging ? slots.beforeLogging(visit) : null}
          <p className="text-sm text-tide-900">
            Mark as logged: the readings of {visit.banks.length === 1 ? 'the bank' : `all ${visit.banks.length} banks`} are
            taken and the cabinet is closed again. A reliability engineer then reviews the visit.
          </p>
          <div className="flex flex-wrap gap-2">
            <Button variant="primary" disabled={take.isPending} onClick={() => run('log')}>
              {take.isPending ? 'Saving…' : 'Yes, mark as logged'}
            </Button>
            <Button onClick={() => setConfirmingLog(false)}>Not yet</Button>
          </div>
        </div>
      ) : (
        <Button variant="primary" className="w-full sm:w-auto" onClick={() => setConfirmingLog(true)}>
          {ACTION_BUTTON_TEXT.log}
        </Button>
      )}
      {take.isError ? (
        <p role="alert" className="text-sm font-medium text-eol-600">
          {take.error.message}
        </p>
      ) : null}
    </section>
  );
}

/** Why an assigned technician has nothing to press. */
function doneText(visit: Visit): string {
  switch (visit.state) {
    case 'logged':
      return 'Logged: waiting for a reliability engineer’s review.';
    case 'reviewed':
      return 'Reviewed by a reliability engineer: each run below shows its review (a queried one says what to put right).';
    case 'missed':
      return 'Missed: it was not started in time. Ask your planner to replan it.';
    case 'cancelled':
      return 'Cancelled by the planner: do not go.';
    default:
      return 'Nothing to do on this visit now.';
  }
}
