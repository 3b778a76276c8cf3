import { describe, expect, it } from 'vitest';
import type { ShutdownWindow } from '../../../../shared/schemas/shutdown-window';
import { windowOfVisit } from '../../../../web/src/features/my-visits/utils/visit-window';
import { visitJson } from '../../../support/visit-json';

const AREA = '30000000-0000-4000-8000-000000000001';
const OTHER_AREA = '30000000-0000-4000-8000-000000000002';

function windowJson(overrides: Partial<ShutdownWindow>): ShutdownWindow {
  return {
    id: 'w1',
    areaId: AREA,
    areaName: 'Hall 2',
    siteId: 's1',
    siteName: 'Brackenmoor Mill',
    timeZone: 'Europe/Berlin',
    title: 'Saturday shutdown',
    startsAt: '2026-12-05T05:00:00.000Z',
    endsAt: '2026-12-05T17:00:00.000Z',
    recurrence: 'FREQ=WEEKLY;BYDAY=SA;COUNT=8',
    recurrenceText: 'every week on Saturday for 8 times',
    notes: '',
    version: 1,
    retiredAt: null,
    createdAt: '2026-12-01T00:00:00.000Z',
    updatedAt: '2026-12-01T00:00:00.000Z',
    ...overrides,
  };
}

const weekly = windowJson({
  occurrences: [
    { startsAt: '2026-12-05T05:00:00.000Z', endsAt: '2026-12-05T17:00:00.000Z' },
    { startsAt: '2026-12-12T05:00:00.000Z', endsAt: '2026-12-12T17:00:00.000Z' },
  ],
});

describe('windowOfVisit', () => {
  it('when the visit lies inside an occurrence, then that occurrence is named, inside', () => {
    const visit = visitJson({ plannedStartAt: '2026-12-12T06:00:00Z', plannedEndAt: '2026-12-12T08:00:00Z' });
    expect(windowOfVisit(visit, [weekly])).toEqual({
      windowId: 'w1',
      title: 'Saturday shutdown',
      startsAt: '2026-12-12T05:00:00.000Z',
      endsAt: '2026-12-12T17:00:00.000Z',
      fit: 'inside',
    });
  });

  it('when the visit runs past the end of the window, then it is only partly inside', () => {
    const visit = visitJson({ plannedStartAt: '2026-12-12T16:00:00Z', plannedEndAt: '2026-12-12T18:00:00Z' });
    expect(windowOfVisit(visit, [weekly])?.fit).toBe('partly');
  });

  it('when one window holds the visit wholly and another only overlaps, then the one that holds it wins', () => {
    const overlapping = windowJson({ id: 'w2', title: 'Night stop', occurrences: [{ startsAt: '2026-12-12T00:00:00.000Z', endsAt: '2026-12-12T06:30:00.000Z' }] });
    const visit = visitJson({ plannedStartAt: '2026-12-12T06:00:00Z', plannedEndAt: '2026-12-12T08:00:00Z' });
    expect(windowOfVisit(visit, [overlapping, weekly])?.windowId).toBe('w1');
  });

  it('when the only window is of another area, then the visit has none', () => {
    const visit = visitJson({ plannedStartAt: '2026-12-12T06:00:00Z', plannedEndAt: '2026-12-12T08:00:00Z' });
    expect(windowOfVisit(visit, [{ ...weekly, areaId: OTHER_AREA }])).toBeNull();
  });

  it('when a visit only touches the window’s end, then it is not in it', () => {
    const visit = visitJson({ plannedStartAt: '2026-12-12T17:00:00Z', plannedEndAt: '2026-12-12T18:00:00Z' });
    expect(windowOfVisit(visit, [weekly])).toBeNull();
  });
});
