import { useQueryClient } from '@tanstack/react-query';
import { format, startOfWeek } from 'date-fns';
import { useMemo, useState, type ReactNode } from 'react';
import type { SlotInfo } from 'react-big-calendar';
import type { EventInteractionArgs } from 'react-big-calendar/lib/addons/dragAndDrop';
import { useSearchParams } from 'react-router';
import { Button, ButtonLink } from '../../../components/ui/button';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { Select } from '../../../components/ui/field';
import { Spinner } from '../../../components/ui/spinner';
import { useAreas, useSites } from '../api/lookups';
import { usePlanRequestContext } from '../api/plan-request';
import type { ShutdownWindow, Visit, VisitState } from '../api/shapes';
import { VISIT_STATES } from '../api/shapes';
import { plannerWindowKeys, useWindowsInRange } from '../api/shutdown-windows';
import { useVisits, visitKeys } from '../api/visits';
import { useWindowWidth } from '../hooks/use-window-width';
import {
  agendaLengthDays,
  calendarLayers,
  defaultView,
  viewRange,
  visitEvent,
  WEEK_STARTS_ON,
  windowEvents,
  windowTitlesByDay,
  type PlannerEvent,
  type PlannerView,
  type WindowEvent,
} from '../utils/calendar-events';
import {
  calendarDateOf,
  dateOnOf,
  readPlannerParams,
  readPlanRequest,
  requestedVisitTimes,
  withoutPlanRequest,
  writePlannerParams,
  type PlannerParams,
} from '../utils/planner-params';
import { describePlannerZone, plannerZone } from '../utils/planner-zone';
import { slotTimes } from '../utils/visit-form';
import { plannerPermissions } from '../utils/visit-rules';
import { formatZonedRange, fromCalendarDate, fromZonedInputValue, toCalendarDate, zonedDateOn } from '../utils/zoned-time';
import { MoveVisitDialog, type ProposedTimes } from './move-visit-dialog';
import { PlannerCalendar } from './planner-calendar';
import { PlannerLegend } from './planner-legend';
import { VisitFormDialog } from './visit-form-dialog';
import { VisitPanel } from './visit-panel';
import { WindowPanel } from './window-panel';

/** What the app hands the Planner from other screens (features do not import each other). */
export interface PlannerSlots {
  /**
   * The dialog that proposes and confirms the visits of one window occurrence: the one named, or
   * one the planner picks there (of the filtered site and area).
   */
  planWindow?: (props: {
    windowId?: string;
    occurrenceStartsAt?: string;
    siteId?: string;
    areaId?: string;
    /** The visits just planned (before onClose). */
    onConfirmed: (visits: Visit[]) => void;
    onClose: () => void;
  }) => ReactNode;
  /** The dialog that adds a shutdown window. */
  newWindow?: (props: { siteId?: string; areaId?: string; onClose: () => void }) => ReactNode;
  /** The dialog that changes or retires a shutdown window (every occurrence of it). */
  editWindow?: (props: { window: ShutdownWindow; onClose: () => void }) => ReactNode;
  /** The technicians' week: hours planned against hours available; a visit opens in the Planner's panel. */
  technicianLoad?: (props: {
    weekOn: string;
    onWeekChange: (weekOn: string) => void;
    siteId?: string;
    /** The calendar's zone, for the week when no site is chosen. */
    timeZone: string;
    onVisitOpen: (visitId: string) => void;
  }) => ReactNode;
}

type Dialog =
  | { kind: 'new-visit'; siteId: string; areaId: string; plannedStartAt: string; plannedEndAt: string }
  | { kind: 'visit'; visitId: string; listed?: Visit }
  | { kind: 'window'; event: WindowEvent }
  | { kind: 'plan-window'; windowId?: string; occurrenceStartsAt?: string }
  | { kind: 'new-window' }
  | { kind: 'edit-window'; window: ShutdownWindow };

const SHOWN_STATES: VisitState[] = VISIT_STATES.filter((s) => s !== 'cancelled');

/**
 * The Planner: visits and shutdown windows on a calendar in a site's time zone, filtered by site
 * and area; drag a visit to move or resize it, select a free slot to plan one, open a visit to
 * act on it.
 */
export function PlannerScreen({ roles, slots }: { roles: readonly string[]; slots: PlannerSlots }) {
  const can = plannerPermissions(roles);
  const client = useQueryClient();
  const width = useWindowWidth();
  const [search, setSearch] = useSearchParams();
  const params = readPlannerParams(search);
  const setParams = (change: Partial<PlannerParams>) => setSearch(writePlannerParams({ ...params, ...change }), { replace: true });

  const sites = useSites();
  const areas = useAreas(params.siteId);
  const siteZones = useMemo(() => (sites.data?.items ?? []).map((s) => ({ id: s.id, name: s.name, timeZone: s.timeZone })), [sites.data]);
  const browserZone = Intl.DateTimeFormat().resolvedOptions().timeZone;
  const zone = plannerZone(siteZones, params.siteId, browserZone);
  const timeZone = zone.timeZone;
  const siteName = siteZones.find((s) => s.id === params.siteId)?.name;

  const view: PlannerView = params.view ?? defaultView(width);
  const date = params.dateOn ? calendarDateOf(params.dateOn) : toCalendarDate(new Date(), timeZone);
  const agendaDays = agendaLengthDays(width);
  const range = viewRange(view, date, timeZone, agendaDays);
  const filters = { siteId: params.siteId || undefined, areaId: params.areaId || undefined };
  // the shown zone comes from the sites: wait for them rather than ask twice
  const zoneKnown = !sites.isPending;
  const visits = useVisits({ ...range, ...filters, states: params.showCancelled ? undefined : SHOWN_STATES }, zoneKnown);
  const windows = useWindowsInRange({ ...range, ...filters }, zoneKnown);

  const [dialog, setDialog] = useState<Dialog | null>(null);

  // "Plan a visit" from the Due list: the address names the cabinet and banks; the form opens
  // with them at the next shutdown window of the cabinet's area until it is closed
  const planRequest = can.plan ? readPlanRequest(search) : null;
  const [requestNow] = useState(() => Date.now());
  const requested = usePlanRequestContext(planRequest?.cabinetId ?? '', requestNow);
  const requestedCabinet = requested.cabinet.data;
  const requestZone = siteZones.find((s) => s.id === requestedCabinet?.siteId)?.timeZone;
  const requestedVisit =
    planRequest && requestedCabinet && requestZone && (requested.windows.isSuccess || requested.windows.isError)
      ? {
          siteId: requestedCabinet.siteId,
          areaId: requestedCabinet.areaId,
          cabinetId: requestedCabinet.id,
          bankIds: planRequest.bankIds,
          ...requestedVisitTimes((requested.windows.data?.items ?? []).flatMap((w) => w.occurrences ?? []), requestNow, tomorrowMorning(requestNow, requestZone)),
        }
      : null;
  const [plannedNotice, setPlannedNotice] = useState<string | null>(null);
  const [move, setMove] = useState<{ visit: Visit; proposed: ProposedTimes } | null>(null);

  const visitEvents = (visits.data?.items ?? []).map((v) => visitEvent(v, timeZone, move?.visit.id === v.id ? move.proposed : undefined));
  const occurrenceEvents = windowEvents(windows.data?.items ?? [], timeZone);
  const layers = calendarLayers(view, visitEvents, occurrenceEvents);
  const windowDays = windowTitlesByDay(occurrenceEvents);

  function onMoveVisit({ event, start, end }: EventInteractionArgs<PlannerEvent>) {
    if (event.kind !== 'visit') return;
    const proposed = {
      plannedStartAt: fromCalendarDate(new Date(start), timeZone),
      plannedEndAt: fromCalendarDate(new Date(end), timeZone),
    };
    if (proposed.plannedStartAt === event.visit.plannedStartAt && proposed.plannedEndAt === event.visit.plannedEndAt) return;
    setMove({ visit: event.visit, proposed });
  }

  function onSelectSlot(slot: SlotInfo) {
    if (!can.plan) return;
    const wholeDays =
      slot.start.getHours() === 0 && slot.start.getMinutes() === 0 && (slot.end.getTime() - slot.start.getTime()) % 86_400_000 === 0;
    const times = slotTimes(slot.start, slot.end, wholeDays);
    setDialog({
      kind: 'new-visit',
      siteId: params.siteId,
      areaId: params.areaId,
      plannedStartAt: fromCalendarDate(times.start, timeZone),
      plannedEndAt: fromCalendarDate(times.end, timeZone),
    });
  }

  function planVisitNow() {
    const start = new Date(date.getFullYear(), date.getMonth(), date.getDate(), 8, 0);
    setDialog({
      kind: 'new-visit',
      siteId: params.siteId,
      areaId: params.areaId,
      plannedStartAt: fromCalendarDate(start, timeZone),
      plannedEndAt: fromCalendarDate(new Date(start.getTime() + 2 * 3600_000), timeZone),
    });
  }

  /** After another screen's dialog: the calendar shows what it saved. */
  function closeAndRefresh() {
    setDialog(null);
    void client.invalidateQueries({ queryKey: visitKeys.lists() });
    void client.invalidateQueries({ queryKey: plannerWindowKeys.lists() });
  }

  const weekOn = format(startOfWeek(date, { weekStartsOn: WEEK_STARTS_ON }), 'yyyy-MM-dd');
  const calendarHeight = width < 640 ? 620 : 760;
  const total = visits.data?.total ?? 0;
  const shown = visits.data?.items.length ?? 0;

  return (
    <div className="space-y-4">
      <header className="space-y-3">
        <div>
          <h1 className="text-2xl font-bold tracking-tight text-tide-900 sm:text-3xl">Planner</h1>
          <p className="mt-1 max-w-2xl text-tide-800">Visits on a calendar, inside the shutdown windows of each area.</p>
        </div>
        <div className="flex flex-wrap gap-2">
          {can.plan ? (
            <Button variant="primary" onClick={planVisitNow}>
              Plan a visit
            </Button>
          ) : null}
          {can.plan && slots.planWindow ? <Button onClick={() => setDialog({ kind: 'plan-window' })}>Plan a window</Button> : null}
          {can.plan && slots.newWindow ? <Button onClick={() => setDialog({ kind: 'new-window' })}>New shutdown window</Button> : null}
          <ButtonLink to="/planner/due">Due list</ButtonLink>
        </div>
      </header>

      <section aria-label="Filters" className="grid grid-cols-2 items-end gap-3 sm:flex sm:flex-wrap">
        <label className="block min-w-0 text-sm font-medium text-tide-900 sm:w-56">
          Site
          <Select className="mt-1" value={params.siteId} onChange={(e) => setParams({ siteId: e.target.value, areaId: '' })}>
            <option value="">Every site</option>
            {sites.data?.items.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </Select>
        </label>
        <label className="block min-w-0 text-sm font-medium text-tide-900 sm:w-56">
          Area
          <Select className="mt-1" value={params.areaId} disabled={!params.siteId} onChange={(e) => setParams({ areaId: e.target.value })}>
            <option value="">{params.siteId ? 'Every area' : 'Every area (pick a site)'}</option>
            {areas.data?.items.map((a) => (
              <option key={a.id} value={a.id}>
                {a.name}
              </option>
            ))}
          </Select>
        </label>
        <label className="col-span-2 flex min-h-10 items-center gap-2 text-sm text-tide-900">
          <input
            type="checkbox"
            className="size-4 accent-tide-800"
            checked={params.showCancelled}
            onChange={(e) => setParams({ showCancelled: e.target.checked })}
          />
          Show cancelled visits
        </label>
      </section>

      <p role="note" aria-label="Time zone" className="rounded-lg bg-white px-3 py-2 text-sm text-tide-800 ring-1 ring-tide-100">
        {zoneKnown ? describePlannerZone(zone, siteName) : 'Finding the sites’ time zones…'}
      </p>
      <PlannerLegend monthTint={view === 'month'} />
      {plannedNotice ? (
        <p role="status" className="flex items-start justify-between gap-3 rounded-lg bg-white px-3 py-2 text-sm font-medium text-tide-900 ring-2 ring-ok-600">
          <span>{plannedNotice}</span>
          <button type="button" className="shrink-0 underline" onClick={() => setPlannedNotice(null)}>
            Dismiss
          </button>
        </p>
      ) : null}

      {visits.isError ? (
        <ErrorPanel title="The visits could not be loaded" action={<Button onClick={() => void visits.refetch()}>Try again</Button>}>
          {visits.error.message}
        </ErrorPanel>
      ) : null}
      {windows.isError ? (
        <p role="alert" className="text-sm font-medium text-eol-600">
          The shutdown windows could not be loaded: {windows.error.message}
        </p>
      ) : null}

      <div className="relative rounded-xl border border-tide-100 bg-white p-2 shadow-sm sm:p-4">
        <PlannerCalendar
          events={layers.events}
          backgroundEvents={layers.backgroundEvents}
          windowDays={windowDays}
          view={view}
          agendaDays={agendaDays}
          date={date}
          canPlan={can.plan}
          height={calendarHeight}
          onView={(v) => setParams({ view: v })}
          onNavigate={(d) => setParams({ dateOn: dateOnOf(d) })}
          onSelectSlot={onSelectSlot}
          onSelectEvent={(event) => setDialog(event.kind === 'visit' ? { kind: 'visit', visitId: event.visit.id, listed: event.visit } : { kind: 'window', event })}
          onMoveVisit={onMoveVisit}
          loading={visits.isPending || windows.isPending}
        />
      </div>
      <div className="flex flex-wrap items-center gap-x-3 text-sm text-tide-600" aria-live="polite">
        {visits.isFetching || windows.isFetching ? <Spinner label="Loading…" /> : null}
        <p>
        {visits.isPending
          ? 'Loading visits…'
          : total > shown
            ? `Showing the first ${shown} of ${total} visits in this range: choose a site or an area to see the rest.`
            : total === 0
              ? can.plan
                ? 'No visits in this range. Select a free time on the calendar, or press “Plan a visit”, to plan one.'
                : 'No visits in this range.'
              : `${total} ${total === 1 ? 'visit' : 'visits'} in this range.${can.plan ? ' Drag a planned visit to move it, or its lower edge to change its length.' : ''}`}
        </p>
      </div>

      {slots.technicianLoad ? (
        <section aria-labelledby="planner-load-title" className="space-y-2">
          <h2 id="planner-load-title" className="text-lg font-bold text-tide-900">
            Technicians this week
          </h2>
          {slots.technicianLoad({
            weekOn,
            onWeekChange: (week) => setParams({ dateOn: week }),
            siteId: params.siteId || undefined,
            timeZone,
            onVisitOpen: (visitId) => setDialog({ kind: 'visit', visitId }),
          })}
        </section>
      ) : null}

      {move ? <MoveVisitDialog visit={move.visit} proposed={move.proposed} onClose={() => setMove(null)} /> : null}
      {requestedVisit && !dialog ? (
        <VisitFormDialog
          initial={requestedVisit}
          fallbackZone={timeZone}
          onClose={() => setSearch(withoutPlanRequest(search), { replace: true })}
        />
      ) : null}
      {dialog?.kind === 'new-visit' ? (
        <VisitFormDialog
          initial={{
            siteId: dialog.siteId,
            areaId: dialog.areaId,
            plannedStartAt: dialog.plannedStartAt,
            plannedEndAt: dialog.plannedEndAt,
          }}
          fallbackZone={timeZone}
          onClose={() => setDialog(null)}
        />
      ) : null}
      {dialog?.kind === 'visit' ? <VisitPanel visitId={dialog.visitId} listed={dialog.listed} can={can} onClose={() => setDialog(null)} /> : null}
      {dialog?.kind === 'window' ? (
        <WindowPanel
          event={dialog.event}
          canPlan={can.plan}
          onClose={() => setDialog(null)}
          onPlanWindow={
            slots.planWindow
              ? () => setDialog({ kind: 'plan-window', windowId: dialog.event.window.id, occurrenceStartsAt: dialog.event.occurrence.startsAt })
              : undefined
          }
          onEditWindow={slots.editWindow ? () => setDialog({ kind: 'edit-window', window: dialog.event.window }) : undefined}
          onPlanVisit={() => {
            const { occurrence, window } = dialog.event;
            const end = Math.min(Date.parse(occurrence.startsAt) + 2 * 3600_000, Date.parse(occurrence.endsAt));
            setDialog({
              kind: 'new-visit',
              siteId: window.siteId,
              areaId: window.areaId,
              plannedStartAt: occurrence.startsAt,
              plannedEndAt: new Date(end).toISOString(),
            });
          }}
        />
      ) : null}
      {dialog?.kind === 'plan-window' && slots.planWindow
        ? slots.planWindow({
            windowId: dialog.windowId,
            occurrenceStartsAt: dialog.occurrenceStartsAt,
            siteId: params.siteId || undefined,
            areaId: params.areaId || undefined,
            onConfirmed: (planned) => {
              // show where they went: the calendar moves to the first of them
              const first = [...planned].sort((a, b) => Date.parse(a.plannedStartAt) - Date.parse(b.plannedStartAt))[0];
              if (!first) return;
              setParams({ dateOn: zonedDateOn(first.plannedStartAt, timeZone) });
              setPlannedNotice(plannedNoticeText(planned, first, timeZone));
            },
            onClose: closeAndRefresh,
          })
        : null}
      {dialog?.kind === 'edit-window' && slots.editWindow ? slots.editWindow({ window: dialog.window, onClose: closeAndRefresh }) : null}
      {dialog?.kind === 'new-window' && slots.newWindow
        ? slots.newWindow({ siteId: params.siteId || undefined, areaId: params.areaId || undefined, onClose: closeAndRefresh })
        : null}
    </div>
  );
}

/** Tomorrow 08:00–10:00 on the site's clock: a requested visit's times when no window is ahead. */
function tomorrowMorning(nowMs: number, timeZone: string): { plannedStartAt: string; plannedEndAt: string } {
  const tomorrowOn = zonedDateOn(new Date(nowMs + 86_400_000), timeZone);
  const start = Date.parse(fromZonedInputValue(`${tomorrowOn}T08:00`, timeZone)!);
  return { plannedStartAt: new Date(start).toISOString(), plannedEndAt: new Date(start + 2 * 3600_000).toISOString() };
}

/** "6 visits planned, the first Thu 10 Dec, 07:00–08:54 Europe/London: they are on the calendar." */
function plannedNoticeText(planned: readonly Visit[], first: Visit, timeZone: string): string {
  const count = planned.length === 1 ? '1 visit planned' : `${planned.length} visits planned`;
  return `${count}, the first ${formatZonedRange(first.plannedStartAt, first.plannedEndAt, timeZone)}: they are on the calendar and in the technicians' week below.`;
}
