/**
 * `TechnicianLoadView`: each technician's week, hours planned against hours available.
 *
 * Props (all optional):
 * - `weekOn?: string` — any day of the week to show, `YYYY-MM-DD` (default: today); the view
 *   follows it when it changes (e.g. the calendar moved to another week).
 * - `onWeekChange?(weekOn: string): void` — told the day of the week the planner moved to with
 *   the view's own week buttons. Given together with `weekOn`, the view is controlled: it shows
 *   `weekOn` only, and the parent passes the new day.
 * - `siteId?: string` — the technicians attached to this site (every technician when nobody
 *   is), the week on the site's clock; without it the week is on the browser's clock.
 * - `onVisitOpen?(visitId: string): void` — shows an "Open" button on each visit (e.g. the
 *   calendar's visit panel).
 *
 * Each technician has a bar (planned / available; over the hours available in the alert
 * colour) and their visits with times on each visit's site clock, the zone named. A planned
 * visit can be reassigned from here: another technician and a reason, sent as the visit's
 * PATCH; warnings the server raises (double-booked, …) can be accepted with the same reason.
 * Works at 390 px: rows stack.
 */
import { useId, useState } from 'react';
import { PLANNING_REASON_MIN_CHARS } from '../../../../../shared/constants/planning';
import type {
  TechnicianLoad,
  TechnicianLoadVisit,
} from '../../../../../shared/schemas/technician-load';
import type { PlanningOverride } from '../../../../../shared/schemas/visit';
import { Button } from '../../../components/ui/button';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { Spinner } from '../../../components/ui/spinner';
import { ApiError } from '../../../lib/api-client';
import { useReassignVisit, useTechnicianLoad } from '../api/technician-load';
import {
  loadBar,
  reassignedTechnicians,
  shiftWeek,
  todayOn,
  visitTimesText,
  weekText,
} from '../utils/load-week';

export interface TechnicianLoadViewProps {
  weekOn?: string;
  onWeekChange?: (weekOn: string) => void;
  siteId?: string;
  /** The zone the week is counted in when no site is chosen (the calendar's); default the browser's. */
  timeZone?: string;
  onVisitOpen?: (visitId: string) => void;
}

const STATE_LABELS: Record<string, string> = {
  planned: 'planned',
  'under-way': 'under way',
  logged: 'logged',
  reviewed: 'reviewed',
};

export function TechnicianLoadView({
  weekOn: controlledWeekOn,
  onWeekChange,
  siteId,
  timeZone,
  onVisitOpen,
}: TechnicianLoadViewProps) {
  const [browserZone] = useState(() => Intl.DateTimeFormat().resolvedOptions().timeZone);
  const controlled = controlledWeekOn !== undefined && onWeekChange !== undefined;
  const [ownWeekOn, setOwnWeekOn] = useState(() => controlledWeekOn ?? todayOn(Date.now()));
  // follow the parent's week when it changes (adjusting state while rendering, as React advises)
  const [lastPropWeekOn, setLastPropWeekOn] = useState(controlledWeekOn);
  if (controlledWeekOn !== lastPropWeekOn) {
    setLastPropWeekOn(controlledWeekOn);
    if (controlledWeekOn !== undefined) setOwnWeekOn(controlledWeekOn);
  }
  const weekOn = controlled ? controlledWeekOn : ownWeekOn;
  const moveTo = (day: string) => {
    if (!controlled) setOwnWeekOn(day);
    onWeekChange?.(day);
  };
  const load = useTechnicianLoad({ weekOn, siteId, timeZone: siteId ? undefined : (timeZone ?? browserZone) });

  return (
    <section aria-label="Technicians’ week" className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 className="text-lg font-bold text-tide-900">
          {load.data ? `Week ${weekText(load.data.weekStartOn)}` : 'Technicians’ week'}
          {load.data ? (
            <span className="ml-2 text-sm font-normal text-tide-800">({load.data.timeZone})</span>
          ) : null}
        </h2>
        <div className="flex flex-wrap gap-2">
          <Button size="sm" onClick={() => moveTo(shiftWeek(weekOn, -1))}>
            Previous week
          </Button>
          <Button size="sm" onClick={() => moveTo(todayOn(Date.now()))}>
            This week
          </Button>
          <Button size="sm" onClick={() => moveTo(shiftWeek(weekOn, 1))}>
            Next week
          </Button>
        </div>
      </div>
      {load.isPending ? <Spinner label="Loading the technicians’ week" /> : null}
      {load.isError ? (
        <ErrorPanel title="The technicians’ week could not be loaded.">
          {load.error.message}
        </ErrorPanel>
      ) : null}
      {load.data && load.data.items.length === 0 ? (
        <p className="text-sm text-tide-800">
          No one holds the technician role yet. An admin gives it on the People screen.
        </p>
      ) : null}
      {load.data ? (
        <ul className="space-y-3">
          {load.data.items.map((technician) => (
            <TechnicianWeek
              key={technician.technicianId}
              technician={technician}
              everyone={load.data.items}
              onVisitOpen={onVisitOpen}
            />
          ))}
        </ul>
      ) : null}
    </section>
  );
}

function TechnicianWeek({
  technician,
  everyone,
  onVisitOpen,
}: {
  technician: TechnicianLoad;
  everyone: readonly TechnicianLoad[];
  onVisitOpen?: (visitId: string) => void;
}) {
  const bar = loadBar(technician.plannedHours, technician.availableHours);
  const percent = Math.round(bar.fraction * 100);
  return (
    <li className="rounded-lg border border-tide-100 bg-white p-3">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-semibold text-tide-950">{technician.name}</h3>
        <span className={`text-sm ${bar.over ? 'font-semibold text-eol-600' : 'text-tide-800'}`}>
          {bar.text}
          {bar.over ? ' (over the hours available)' : ''}
        </span>
      </div>
      <div
        role="meter"
        aria-label={`${technician.name}: hours planned of hours available`}
        aria-valuemin={0}
        aria-valuemax={technician.availableHours}
        aria-valuenow={technician.plannedHours}
        aria-valuetext={bar.text}
        className="mt-2 h-3 overflow-hidden rounded-full bg-tide-100"
      >
        <div
          className={`h-full rounded-full ${bar.over ? 'bg-eol-600' : 'bg-tide-600'}`}
          style={{ width: `${percent}%` }}
        />
      </div>
      {technician.visits.length === 0 ? (
        <p className="mt-2 text-sm text-tide-800">No visits this week.</p>
      ) : (
        <ul className="mt-2 divide-y divide-tide-100">
          {technician.visits.map((visit) => (
            <LoadVisitRow
              key={visit.id}
              visit={visit}
              technician={technician}
              everyone={everyone}
              onVisitOpen={onVisitOpen}
            />
          ))}
        </ul>
      )}
    </li>
  );
}

function LoadVisitRow({
  visit,
  technician,
  everyone,
  onVisitOpen,
}: {
  visit: TechnicianLoadVisit;
  technician: TechnicianLoad;
  everyone: readonly TechnicianLoad[];
  onVisitOpen?: (visitId: string) => void;
}) {
  const [reassigning, setReassigning] = useState(false);
  return (
    <li className="py-2 text-sm">
      <div className="flex flex-col gap-2 sm:flex-row sm:items-center sm:justify-between">
        <div>
          <p className="font-medium text-tide-950">
            {visit.cabinetTag} ·{' '}
            {visitTimesText(visit.plannedStartAt, visit.plannedEndAt, visit.timeZone)}
          </p>
          <p className="text-tide-800">
            {visit.areaName}, {visit.siteName} · {STATE_LABELS[visit.state] ?? visit.state}
          </p>
        </div>
        <div className="flex flex-wrap gap-2">
          {onVisitOpen ? (
            <Button size="sm" variant="ghost" onClick={() => onVisitOpen(visit.id)}>
              Open
            </Button>
          ) : null}
          {visit.state === 'planned' && !reassigning ? (
            <Button
              size="sm"
              onClick={() => setReassigning(true)}
              aria-label={`Reassign ${visit.cabinetTag} from ${technician.name}`}
            >
              Reassign
            </Button>
          ) : null}
        </div>
      </div>
      {reassigning ? (
        <ReassignForm
          visit={visit}
          fromTechnician={technician}
          everyone={everyone}
          onDone={() => setReassigning(false)}
        />
      ) : null}
    </li>
  );
}

function ReassignForm({
  visit,
  fromTechnician,
  everyone,
  onDone,
}: {
  visit: TechnicianLoadVisit;
  fromTechnician: TechnicianLoad;
  everyone: readonly TechnicianLoad[];
  onDone: () => void;
}) {
  const others = everyone.filter((t) => !visit.technicianIds.includes(t.technicianId));
  const [toId, setToId] = useState(others[0]?.technicianId ?? '');
  const [reason, setReason] = useState('');
  const [warnings, setWarnings] = useState<Array<{ kind: string; message: string }>>([]);
  const reassign = useReassignVisit();
  const toFieldId = useId();
  const reasonFieldId = useId();
  const reasonGiven = reason.trim().length >= PLANNING_REASON_MIN_CHARS;

  if (others.length === 0) {
    return (
      <div className="mt-2 flex flex-wrap items-center gap-2 text-tide-800">
        <span>No other technician to give this visit to.</span>
        <Button size="sm" onClick={onDone}>
          Close
        </Button>
      </div>
    );
  }

  const save = () => {
    const overrides: PlanningOverride[] = [...new Set(warnings.map((w) => w.kind))].map((kind) => ({
      kind: kind as PlanningOverride['kind'],
      reason: reason.trim(),
    }));
    reassign.mutate(
      {
        visitId: visit.id,
        version: visit.version,
        reason: reason.trim(),
        technicianIds: reassignedTechnicians(
          visit.technicianIds,
          fromTechnician.technicianId,
          toId,
        ),
        ...(overrides.length > 0 ? { overrides } : {}),
      },
      {
        onSuccess: onDone,
        onError: (error) => {
          if (error instanceof ApiError && error.code === 'override-needed') {
            setWarnings(
              error.issues
                .map((issue) => ({
                  kind: (issue as { kind?: string }).kind ?? '',
                  message: issue.message,
                }))
                .filter((w) => w.kind),
            );
          }
        },
      },
    );
  };

  return (
    <form
      className="mt-2 space-y-2 rounded-lg bg-tide-50 p-3"
      onSubmit={(event) => {
        event.preventDefault();
        save();
      }}
    >
      <div className="flex flex-col gap-2 sm:flex-row">
        <div className="sm:w-1/2">
          <label htmlFor={toFieldId} className="block font-medium text-tide-900">
            Give {visit.cabinetTag} to
          </label>
          <select
            id={toFieldId}
            value={toId}
            onChange={(event) => {
              setToId(event.target.value);
              setWarnings([]);
            }}
            className="mt-1 min-h-10 w-full rounded-lg border border-tide-200 bg-white px-2 py-1"
          >
            {others.map((t) => (
              <option key={t.technicianId} value={t.technicianId}>
                {t.name} ({loadBar(t.plannedHours, t.availableHours).text})
              </option>
            ))}
          </select>
        </div>
        <div className="sm:w-1/2">
          <label htmlFor={reasonFieldId} className="block font-medium text-tide-900">
            Reason
          </label>
          <input
            id={reasonFieldId}
            value={reason}
            onChange={(event) => setReason(event.target.value)}
            placeholder={`e.g. ${fromTechnician.name} is on leave`}
            className="mt-1 min-h-10 w-full rounded-lg border border-tide-200 bg-white px-3 py-2"
          />
        </div>
      </div>
      {warnings.length > 0 ? (
        <div role="alert" className="text-watch-600">
          <p className="font-semibold">
            Saving again accepts these warnings with the reason above:
          </p>
          <ul className="list-disc pl-5">
            {warnings.map((w) => (
              <li key={`${w.kind}-${w.message}`}>{w.message}</li>
            ))}
          </ul>
        </div>
      ) : null}
      {reassign.isError &&
      !(reassign.error instanceof ApiError && reassign.error.code === 'override-needed') ? (
        <p role="alert" className="text-eol-600">
          {reassign.error.message}
        </p>
      ) : null}
      <div className="flex flex-wrap justify-end gap-2">
        <Button size="sm" onClick={onDone}>
          Cancel
        </Button>
        <Button
          size="sm"
          variant="primary"
          type="submit"
          disabled={!reasonGiven || !toId || reassign.isPending}
        >
          {reassign.isPending ? 'Saving…' : warnings.length > 0 ? 'Reassign anyway' : 'Reassign'}
        </Button>
      </div>
    </form>
  );
}
