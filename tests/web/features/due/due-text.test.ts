import { describe, expect, it } from 'vitest';
import type { DueBank } from '../../../../shared/schemas/due';
import {
  banksToPlanWith,
  dueBasisText,
  dueDistance,
  dueWhenText,
  formatDueOn,
  formatSiteTime,
  planVisitHref,
  plannedVisitHref,
  siteDateOn,
} from '../../../../web/src/features/due/utils/due-text';

function bank(overrides: Partial<DueBank>): DueBank {
  return {
    bankId: 'b1',
    position: 'DC1',
    bankDesignId: 'd1',
    bankDesignCode: 'EL-1',
    cabinetId: 'c1',
    cabinetTag: 'VFD-1',
    criticality: 'medium',
    siteId: 's1',
    siteName: 'Works',
    timeZone: 'Europe/Berlin',
    areaId: 'a1',
    areaName: 'Hall',
    inspectionIntervalDays: 365,
    lastInspectedOn: null,
    installedOn: '2025-01-01',
    baselineSetOn: '2025-01-02',
    startOn: '2025-01-01',
    startKind: 'installed',
    forecastNextVisitOn: null,
    dueOn: '2026-01-01',
    basis: 'design-interval',
    bucket: 'overdue',
    todayOn: '2026-12-02',
    daysUntilDue: -335,
    health: 'unmeasured',
    plannedVisit: null,
    missedVisit: null,
    ...overrides,
  };
}

describe('Due list words', () => {
  it('when a due date is shown, then with its weekday and year', () => {
    expect(formatDueOn('2026-12-10')).toBe('Thu 10 Dec 2026');
  });

  it('when the distance to a due date is said, then overdue, today and ahead read differently, in days, months or years', () => {
    expect(dueDistance(-3)).toBe('3 days overdue');
    expect(dueDistance(-1)).toBe('1 day overdue');
    expect(dueDistance(0)).toBe('due today');
    expect(dueDistance(1)).toBe('in 1 day');
    expect(dueDistance(40)).toBe('in 40 days');
    expect(dueDistance(59)).toBe('in 59 days');
    expect(dueDistance(60)).toBe('in 1 month');
    expect(dueDistance(-200)).toBe('6 months overdue');
    expect(dueDistance(-729)).toBe('23 months overdue');
    expect(dueDistance(-730)).toBe('1 year overdue');
    expect(dueDistance(-6532)).toBe('17 years overdue');
  });

  it('when the basis is said, then it names the yearly rule, the forecast or the design’s interval', () => {
    expect(dueBasisText('yearly', 730)).toBe('at least yearly');
    expect(dueBasisText('forecast', 365)).toBe('the forecast asks sooner');
    expect(dueBasisText('design-interval', 182)).toBe('every 182 days (design)');
  });

  it('when a visit’s start is shown, then on the site’s clock with the zone named', () => {
    expect(formatSiteTime('2026-12-10T08:00:00Z', 'Europe/Berlin')).toBe(
      'Thu 10 Dec, 09:00 Europe/Berlin',
    );
    expect(formatSiteTime('2026-07-10T08:00:00Z', 'America/Chicago')).toBe(
      'Fri 10 Jul, 03:00 America/Chicago',
    );
    expect(siteDateOn('2026-12-10T23:30:00Z', 'Europe/Berlin')).toBe('2026-12-11');
  });
});

describe('Due list links', () => {
  it('when a bank has a planned visit, then its link opens the Planner on that day at the site', () => {
    const planned = bank({
      plannedVisit: {
        id: 'v1',
        plannedStartAt: '2026-12-10T23:30:00Z',
        plannedEndAt: '2026-12-11T01:30:00Z',
      },
    });
    expect(plannedVisitHref(planned)).toBe('/planner?siteId=s1&view=day&date=2026-12-11');
    expect(plannedVisitHref(bank({}))).toBeNull();
  });

  it('when a visit is planned from a row, then it takes the unplanned banks of the same cabinet on the page, this one first', () => {
    const page = [
      bank({ bankId: 'b1' }),
      bank({ bankId: 'b2' }),
      bank({
        bankId: 'b3',
        plannedVisit: {
          id: 'v',
          plannedStartAt: '2026-12-10T08:00:00Z',
          plannedEndAt: '2026-12-10T09:00:00Z',
        },
      }),
      bank({ bankId: 'b4', cabinetId: 'c2' }),
    ];
    expect(banksToPlanWith(page[1]!, page)).toEqual(['b2', 'b1']);
    expect(banksToPlanWith(page[3]!, page)).toEqual(['b4']);
    expect(planVisitHref(page[1]!, ['b2', 'b1'])).toBe(
      '/planner?siteId=s1&cabinetId=c1&bankIds=b2%2Cb1',
    );
  });
});

describe('dueWhenText', () => {
  it('when a bank was never inspected and is overdue, then it reads due now rather than years overdue', () => {
    expect(dueWhenText({ daysUntilDue: -6532, lastInspectedOn: null, basis: 'design-interval', inspectionIntervalDays: 365 })).toBe(
      'never inspected: due now',
    );
  });

  it('when a bank was inspected, then the distance and the reason', () => {
    expect(dueWhenText({ daysUntilDue: -3, lastInspectedOn: '2025-11-01', basis: 'yearly', inspectionIntervalDays: 730 })).toBe(
      '3 days overdue · at least yearly',
    );
  });

  it('when a bank never inspected is not yet due, then the distance and the reason', () => {
    expect(dueWhenText({ daysUntilDue: 40, lastInspectedOn: null, basis: 'design-interval', inspectionIntervalDays: 365 })).toBe(
      'in 40 days · every 365 days (design)',
    );
  });
});
