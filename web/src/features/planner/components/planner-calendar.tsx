import { format, getDay, parse, startOfWeek } from 'date-fns';
import { enGB } from 'date-fns/locale';
import { useMemo } from 'react';
import { Calendar, dateFnsLocalizer, type DayPropGetter, type EventPropGetter, type Formats, type SlotInfo, type ToolbarProps } from 'react-big-calendar';
import dragAndDropModule, { type EventInteractionArgs } from 'react-big-calendar/lib/addons/dragAndDrop';
import 'react-big-calendar/lib/css/react-big-calendar.css';
import 'react-big-calendar/lib/addons/dragAndDrop/styles.css';
import './planner-calendar.css';
import { PLANNER_VIEWS, VISIT_STATE_STYLES, WEEK_STARTS_ON, type PlannerEvent, type PlannerView, type WindowEvent } from '../utils/calendar-events';
import { isMovable } from '../utils/calendar-events';

const localizer = dateFnsLocalizer({
  format,
  parse,
  startOfWeek: (date: Date) => startOfWeek(date, { weekStartsOn: WEEK_STARTS_ON }),
  getDay,
  locales: { 'en-GB': enGB },
});

// The addon is CommonJS (exports.default); bundlers hand it over either as the function or as
// the exports object, so take the function from whichever arrives.
type WithDragAndDrop = typeof dragAndDropModule;
const withDragAndDrop: WithDragAndDrop =
  typeof dragAndDropModule === 'function' ? dragAndDropModule : (dragAndDropModule as unknown as { default: WithDragAndDrop }).default;

const DragAndDropCalendar = withDragAndDrop<PlannerEvent>(Calendar);

/** 24-hour clock everywhere, as on the plant floor. */
const FORMATS: Formats = {
  timeGutterFormat: 'HH:mm',
  eventTimeRangeFormat: ({ start, end }) => `${format(start, 'HH:mm')}–${format(end, 'HH:mm')}`,
  eventTimeRangeStartFormat: ({ start }) => `${format(start, 'HH:mm')} –`,
  eventTimeRangeEndFormat: ({ end }) => `– ${format(end, 'HH:mm')}`,
  agendaTimeFormat: 'HH:mm',
  agendaTimeRangeFormat: ({ start, end }) => `${format(start, 'HH:mm')}–${format(end, 'HH:mm')}`,
  agendaDateFormat: 'EEE d MMM',
  dayFormat: 'EEE d',
  dayHeaderFormat: 'EEEE d MMMM yyyy',
  dayRangeHeaderFormat: ({ start, end }) => `${format(start, 'd MMM')} – ${format(end, 'd MMM yyyy')}`,
  agendaHeaderFormat: ({ start, end }) => `${format(start, 'd MMM')} – ${format(end, 'd MMM yyyy')}`,
  selectRangeFormat: ({ start, end }) => `${format(start, 'HH:mm')}–${format(end, 'HH:mm')}`,
};

const VIEW_LABELS: Record<PlannerView, string> = { month: 'Month', week: 'Week', day: 'Day', agenda: 'Agenda' };

/** Our own toolbar: buttons a thumb can hit, named for screen readers, wrapping on a phone. */
function Toolbar({ label, onNavigate, onView, view }: ToolbarProps<PlannerEvent>) {
  const button = 'min-h-10 rounded-lg px-3 text-sm font-medium transition';
  return (
    <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
      <div className="flex items-center gap-1">
        <button type="button" className={`${button} border border-tide-200 bg-white text-tide-800 hover:bg-tide-50`} onClick={() => onNavigate('TODAY')}>
          Today
        </button>
        <button type="button" aria-label="Previous" className={`${button} text-tide-800 hover:bg-tide-100`} onClick={() => onNavigate('PREV')}>
          ‹
        </button>
        <button type="button" aria-label="Next" className={`${button} text-tide-800 hover:bg-tide-100`} onClick={() => onNavigate('NEXT')}>
          ›
        </button>
        <h2 className="ml-1 text-base font-bold text-tide-900 sm:text-lg" aria-live="polite">
          {label}
        </h2>
      </div>
      <div role="group" aria-label="Calendar view" className="flex rounded-lg border border-tide-200 bg-white p-0.5">
        {PLANNER_VIEWS.map((v) => (
          <button
            key={v}
            type="button"
            aria-pressed={view === v}
            className={`${button} min-h-9 ${view === v ? 'bg-tide-800 text-white' : 'text-tide-800 hover:bg-tide-50'}`}
            onClick={() => onView(v)}
          >
            {VIEW_LABELS[v]}
          </button>
        ))}
      </div>
    </div>
  );
}

/** A visit or a window inside its box: the cabinet and people, or the window's name. */
function EventBox({ event }: { event: PlannerEvent }) {
  return event.kind === 'window' ? (
    <span className="font-medium">▨ {event.title}</span>
  ) : (
    <span>
      <span className="font-bold">{event.visit.cabinetTag}</span>
      {event.visit.technicians.length > 0 ? <span> · {event.visit.technicians.map((t) => t.name).join(', ')}</span> : null}
      {event.visit.unplanned ? <span className="italic"> · unplanned</span> : null}
      {event.pending ? <span> (moving…)</span> : null}
    </span>
  );
}

/** In the agenda: the state's word beside each visit, the window's area beside each window. */
function AgendaEvent({ event }: { event: PlannerEvent }) {
  if (event.kind === 'window') {
    return (
      <span className="inline-flex flex-wrap items-center gap-x-2">
        <span className="rounded border border-dashed border-tide-400 bg-tide-100 px-1.5 text-xs font-medium text-tide-800">shutdown window</span>
        <span>
          {event.window.title} · {event.window.siteName} · {event.window.areaName}
        </span>
      </span>
    );
  }
  const style = VISIT_STATE_STYLES[event.visit.state];
  return (
    <span className="inline-flex flex-wrap items-center gap-x-2">
      <span className="rounded-full border px-1.5 text-xs font-medium" style={{ background: style.background, color: style.text, borderColor: style.border }}>
        {style.label}
      </span>
      {event.visit.unplanned ? (
        <span className="rounded-full border border-dashed border-tide-400 px-1.5 text-xs font-medium text-tide-800">unplanned</span>
      ) : null}
      <span>
        <span className="font-bold">{event.visit.cabinetTag}</span> · {event.visit.siteName} · {event.visit.areaName}
        {event.visit.technicians.length > 0 ? ` · ${event.visit.technicians.map((t) => t.name).join(', ')}` : ''}
      </span>
    </span>
  );
}

const eventPropGetter: EventPropGetter<PlannerEvent> = (event) => {
  if (event.kind === 'window') return { className: 'planner-window' };
  const style = VISIT_STATE_STYLES[event.visit.state];
  return {
    className: `planner-visit planner-visit-${event.visit.state}${event.pending ? ' planner-visit-pending' : ''}`,
    style: { backgroundColor: style.background, borderColor: style.border, color: style.text, borderWidth: 1, borderStyle: 'solid' },
  };
};

/**
 * The Planner's calendar: month, week, day and agenda, visits coloured by state over the
 * shutdown windows; planned and missed visits move and resize by drag for those who plan.
 */
export function PlannerCalendar({
  events,
  backgroundEvents,
  windowDays,
  view,
  agendaDays,
  date,
  canPlan,
  height,
  onView,
  onNavigate,
  onSelectSlot,
  onSelectEvent,
  onMoveVisit,
  loading,
}: {
  events: PlannerEvent[];
  backgroundEvents: WindowEvent[];
  /** Month view: the windows open on each day ("yyyy-MM-dd"), shown as a tint. */
  windowDays: Map<string, string[]>;
  view: PlannerView;
  /** How many days the agenda lists. */
  agendaDays: number;
  date: Date;
  canPlan: boolean;
  height: number;
  onView: (view: PlannerView) => void;
  onNavigate: (date: Date) => void;
  onSelectSlot: (slot: SlotInfo) => void;
  onSelectEvent: (event: PlannerEvent) => void;
  onMoveVisit: (args: EventInteractionArgs<PlannerEvent>) => void;
  /** While the first answer is awaited, the agenda says so instead of "nothing here". */
  loading: boolean;
}) {
  const components = useMemo(() => ({ toolbar: Toolbar, event: EventBox, agenda: { event: AgendaEvent } }), []);
  const scrollToTime = useMemo(() => new Date(1970, 0, 1, 6, 0), []);
  const dayPropGetter: DayPropGetter = (day) => {
    const titles = view === 'month' ? windowDays.get(format(day, 'yyyy-MM-dd')) : undefined;
    return titles ? { className: 'planner-window-day', title: `Shutdown windows: ${titles.join('; ')}` } : {};
  };
  return (
    <div className={`planner-calendar${view === 'agenda' ? ' planner-calendar-agenda' : ''}`} style={view === 'agenda' ? undefined : { height }}>
      <DragAndDropCalendar
        localizer={localizer}
        culture="en-GB"
        formats={FORMATS}
        events={events}
        backgroundEvents={backgroundEvents}
        view={view}
        views={[...PLANNER_VIEWS]}
        date={date}
        onView={(v) => onView(v as PlannerView)}
        onNavigate={onNavigate}
        components={components}
        eventPropGetter={eventPropGetter}
        dayPropGetter={dayPropGetter}
        tooltipAccessor={(event) => event.title}
        showMultiDayTimes
        popup
        step={30}
        timeslots={2}
        scrollToTime={scrollToTime}
        selectable={canPlan}
        onSelectSlot={onSelectSlot}
        onSelectEvent={(event) => onSelectEvent(event)}
        draggableAccessor={(event) => event.kind === 'visit' && !event.pending && isMovable(event.visit, canPlan)}
        resizableAccessor={(event) => event.kind === 'visit' && !event.pending && isMovable(event.visit, canPlan)}
        onEventDrop={onMoveVisit}
        onEventResize={onMoveVisit}
        length={agendaDays}
        messages={{ noEventsInRange: loading ? 'Loading visits and shutdown windows…' : 'No visits or shutdown windows in this range.', showMore: (n) => `+${n} more` }}
      />
    </div>
  );
}
