import type { ShutdownWindow, Visit } from '../../../../web/src/features/planner/api/shapes';

/** A visit as the API answers, with what a test names changed. */
export function visitOf(change: Partial<Visit> = {}): Visit {
  return {
    id: 'v1',
    cabinetId: 'c1',
    cabinetTag: 'BRK-M2-VFD-014',
    siteId: 's1',
    siteName: 'Bremen',
    timeZone: 'Europe/Berlin',
    areaId: 'a1',
    areaName: 'Hall 2',
    plannedStartAt: '2026-12-12T05:00:00.000Z',
    plannedEndAt: '2026-12-12T07:00:00.000Z',
    state: 'planned',
    unplanned: false,
    notes: '',
    overrides: [],
    stateReason: '',
    startedAt: null,
    loggedAt: null,
    reviewedAt: null,
    missedAt: null,
    cancelledAt: null,
    banks: [{ id: 'b1', position: 'A', bankDesignCode: 'EL-450', baselineTauSeconds: 47 }],
    technicians: [{ id: 't1', name: 'Ana' }],
    cabinetMarkedWaitMinutes: 15,
    estimatedMinutes: 45,
    version: 1,
    createdAt: '2026-12-01T00:00:00.000Z',
    updatedAt: '2026-12-01T00:00:00.000Z',
    ...change,
  };
}

/** A weekly Saturday shutdown with two occurrences in range. */
export function windowOf(change: Partial<ShutdownWindow> = {}): ShutdownWindow {
  return {
    id: 'w1',
    areaId: 'a1',
    areaName: 'Hall 2',
    siteId: 's1',
    siteName: 'Bremen',
    timeZone: 'Europe/Berlin',
    title: 'Saturday stop',
    startsAt: '2026-12-12T05:00:00.000Z',
    endsAt: '2026-12-12T13:00:00.000Z',
    recurrence: 'FREQ=WEEKLY;BYDAY=SA;COUNT=8',
    recurrenceText: 'every week on Saturday for 8 times',
    retiredAt: null,
    createdAt: '2026-12-01T00:00:00.000Z',
    updatedAt: '2026-12-01T00:00:00.000Z',
    notes: '',
    version: 1,
    occurrences: [
      { startsAt: '2026-12-12T05:00:00.000Z', endsAt: '2026-12-12T13:00:00.000Z' },
      { startsAt: '2026-12-19T05:00:00.000Z', endsAt: '2026-12-19T13:00:00.000Z' },
    ],
    ...change,
  };
}
