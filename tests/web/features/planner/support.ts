import type { ShutdownWindow, Visit } from '../../../../web/src/features/planner/api/shapes';
import { visitJson } from '../../../support/visit-json';

/** A visit as the API answers (at the planner's Bremen site), with what a test names changed. */
export function visitOf(change: Partial<Visit> = {}): Visit {
  return visitJson({
    id: 'v1',
    cabinetId: 'c1',
    siteId: 's1',
    siteName: 'Bremen',
    areaId: 'a1',
    banks: [{ id: 'b1', position: 'A', bankDesignCode: 'EL-450', baselineTauSeconds: 47, lastTauSeconds: null, runCount: 0 }],
    technicians: [{ id: 't1', name: 'Ana' }],
    cabinetMarkedWaitMinutes: 15,
    estimatedMinutes: 45,
    ...change,
  });
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
