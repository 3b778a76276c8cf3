import { describe, expect, it } from 'vitest';
import { VISIT_STATES } from '../../../../web/src/features/planner/api/shapes';
import {
  agendaLengthDays,
  calendarLayers,
  defaultView,
  isMovable,
  viewRange,
  visitEvent,
  visitTitle,
  VISIT_STATE_STYLES,
  windowEvents,
  windowTitlesByDay,
} from '../../../../web/src/features/planner/utils/calendar-events';
import { visitOf, windowOf } from './support';

describe('visitEvent', () => {
  it('when a visit is placed on the Berlin clock, then it starts at the Berlin wall time', () => {
    const event = visitEvent(visitOf(), 'Europe/Berlin');
    expect([event.start.getDate(), event.start.getHours(), event.end.getHours()]).toEqual([12, 6, 8]);
    expect(event.pending).toBe(false);
  });

  it('when a move is proposed, then the event shows at the new times and is pending', () => {
    const event = visitEvent(visitOf(), 'Europe/Berlin', { plannedStartAt: '2026-12-13T05:00:00Z', plannedEndAt: '2026-12-13T06:00:00Z' });
    expect([event.start.getDate(), event.start.getHours(), event.end.getHours()]).toEqual([13, 6, 7]);
    expect(event.pending).toBe(true);
  });

  it('when the title is made, then it names the cabinet and the technicians', () => {
    expect(visitTitle(visitOf({ technicians: [{ id: 't1', name: 'Ana' }, { id: 't2', name: 'Ben' }] }))).toBe('BRK-M2-VFD-014 · Ana, Ben');
    expect(visitTitle(visitOf({ technicians: [] }))).toBe('BRK-M2-VFD-014');
    // a visit started at the cabinet says so
    expect(visitTitle(visitOf({ technicians: [{ id: 't1', name: 'Ana' }], unplanned: true }))).toBe('BRK-M2-VFD-014 · Ana · unplanned');
  });
});

describe('windowEvents', () => {
  it('when a window has occurrences, then one event each, keyed by window and start', () => {
    const events = windowEvents([windowOf()], 'Europe/Berlin');
    expect(events.map((e) => e.id)).toEqual(['w1@2026-12-12T05:00:00.000Z', 'w1@2026-12-19T05:00:00.000Z']);
    expect(events[1]!.start.getHours()).toBe(6);
    expect(events[0]!.title).toBe('Saturday stop · Hall 2');
  });

  it('when the answer carries no occurrences, then the first one stands for it', () => {
    expect(windowEvents([windowOf({ occurrences: undefined })], 'UTC')).toHaveLength(1);
  });
});

describe('calendarLayers', () => {
  const visits = [visitEvent(visitOf(), 'UTC')];
  const windows = windowEvents([windowOf()], 'UTC');

  it('when the view is week or day, then windows go behind the visits', () => {
    for (const view of ['week', 'day'] as const) {
      const layers = calendarLayers(view, visits, windows);
      expect(layers.events).toHaveLength(1);
      expect(layers.backgroundEvents).toHaveLength(2);
    }
  });

  it('when the view is the agenda, then windows are listed among the visits, in time order', () => {
    const layers = calendarLayers('agenda', visits, windows);
    expect(layers.backgroundEvents).toEqual([]);
    expect(layers.events.map((e) => e.kind)).toEqual(['window', 'visit', 'window']);
  });

  it('when the view is the month, then only visits are events (the windows tint their days)', () => {
    const layers = calendarLayers('month', visits, windows);
    expect(layers.events.map((e) => e.kind)).toEqual(['visit']);
    expect(layers.backgroundEvents).toEqual([]);
  });
});

describe('windowTitlesByDay', () => {
  it('when windows open on two Saturdays, then each day names its window once', () => {
    const days = windowTitlesByDay(windowEvents([windowOf(), windowOf({ id: 'w2' })], 'Europe/Berlin'));
    expect([...days.keys()]).toEqual(['2026-12-12', '2026-12-19']);
    expect(days.get('2026-12-12')).toEqual(['Saturday stop · Hall 2']);
  });

  it('when a window runs over midnight, then both days are tinted, and not the day its end touches at 00:00', () => {
    const night = windowOf({
      occurrences: [
        { startsAt: '2026-12-12T21:00:00.000Z', endsAt: '2026-12-13T05:00:00.000Z' },
        { startsAt: '2026-12-14T05:00:00.000Z', endsAt: '2026-12-14T23:00:00.000Z' },
      ],
    });
    expect([...windowTitlesByDay(windowEvents([night], 'Europe/Berlin')).keys()]).toEqual(['2026-12-12', '2026-12-13', '2026-12-14']);
  });
});

describe('isMovable', () => {
  it('when a planner looks at planned and missed visits, then they move; no other state does', () => {
    const movable = VISIT_STATES.filter((state) => isMovable(visitOf({ state }), true));
    expect(movable).toEqual(['planned', 'missed']);
  });

  it('when the person does not plan, then nothing moves', () => {
    expect(isMovable(visitOf(), false)).toBe(false);
  });
});

describe('VISIT_STATE_STYLES', () => {
  it('when the states are coloured, then each has its own colour and its word', () => {
    const colours = VISIT_STATES.map((s) => VISIT_STATE_STYLES[s].background);
    expect(new Set(colours).size).toBe(VISIT_STATES.length);
    expect(VISIT_STATE_STYLES['under-way'].label).toBe('under way');
  });
});

describe('viewRange', () => {
  it('when the week of Wed 9 Dec 2026 is shown in Berlin, then from Sunday 6 Dec 23:00 UTC (Monday 00:00 less a day) on', () => {
    const range = viewRange('week', new Date(2026, 11, 9), 'Europe/Berlin');
    expect(range.from).toBe('2026-12-05T23:00:00.000Z');
    expect(range.to).toBe('2026-12-14T23:00:00.000Z');
  });

  it('when a month is shown, then the range covers the weeks around it', () => {
    const range = viewRange('month', new Date(2026, 11, 15), 'UTC');
    // December 2026 begins on a Tuesday: the grid starts Monday 30 Nov, ends Sunday 3 Jan
    expect(range.from).toBe('2026-11-29T00:00:00.000Z');
    expect(range.to).toBe('2027-01-05T00:00:00.000Z');
  });

  it('when the agenda is shown, then it runs its length of days from its date', () => {
    const range = viewRange('agenda', new Date(2026, 11, 1), 'UTC', 30);
    expect(range.from).toBe('2026-11-30T00:00:00.000Z');
    expect(Date.parse(range.to) - Date.parse('2026-12-01T00:00:00Z')).toBe(32 * 86_400_000);
    expect(Date.parse(viewRange('agenda', new Date(2026, 11, 1), 'UTC', 7).to) - Date.parse('2026-12-01T00:00:00Z')).toBe(9 * 86_400_000);
  });
});

describe('agendaLengthDays', () => {
  it('when the screen is a phone, then a week; wider, a month', () => {
    expect(agendaLengthDays(390)).toBe(7);
    expect(agendaLengthDays(1366)).toBe(30);
  });
});

describe('defaultView', () => {
  it('when the screen is a phone, then the agenda; wider, the week', () => {
    expect(defaultView(390)).toBe('agenda');
    expect(defaultView(1280)).toBe('week');
  });
});
