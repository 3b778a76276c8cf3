import { describe, expect, it } from 'vitest';
import {
  addMonthsOn,
  calendarDateInZone,
  daysUntilDue,
  dueBucketOf,
  dueDateOf,
  dueOnOf,
  dueStartOf,
  dueStatusOf,
  endOfMonthOn,
  LONGEST_INSPECTION_INTERVAL_DAYS,
  nextQuarterEndOn,
} from '../../../shared/domain/due';
import { EngineInputError } from '../../../shared/domain/errors';

const bank = {
  lastInspectedOn: null,
  installedOn: null,
  baselineSetOn: '2025-01-01',
  inspectionIntervalDays: 365,
};

describe('due start', () => {
  it('when the bank has a logged visit, then the interval counts from that visit', () => {
    expect(
      dueStartOf({
        lastInspectedOn: '2026-02-03',
        installedOn: '2020-01-01',
        baselineSetOn: '2020-01-02',
      }),
    ).toEqual({ startOn: '2026-02-03', startKind: 'last-visit' });
  });

  it('when the bank has no visit but an install date, then it counts from the install date', () => {
    expect(
      dueStartOf({ lastInspectedOn: null, installedOn: '2024-03-01', baselineSetOn: '2024-03-05' }),
    ).toEqual({
      startOn: '2024-03-01',
      startKind: 'installed',
    });
  });

  it('when the bank has neither, then it counts from the day its baseline was set', () => {
    expect(
      dueStartOf({ lastInspectedOn: null, installedOn: null, baselineSetOn: '2024-03-05' }),
    ).toEqual({
      startOn: '2024-03-05',
      startKind: 'baseline',
    });
  });
});

describe('due date', () => {
  it('when the design interval is shorter than a year, then the bank is due at the design interval', () => {
    const due = dueDateOf({ ...bank, lastInspectedOn: '2026-01-10', inspectionIntervalDays: 182 });
    expect(due).toEqual({
      dueOn: '2026-07-11',
      startOn: '2026-01-10',
      startKind: 'last-visit',
      basis: 'design-interval',
    });
  });

  it('when the design allows longer than a year, then the bank is still due within a year (NFPA 70B: at least yearly; common practice)', () => {
    expect(LONGEST_INSPECTION_INTERVAL_DAYS).toBe(365);
    const due = dueDateOf({ ...bank, baselineSetOn: '2025-06-30', inspectionIntervalDays: 730 });
    expect(due.dueOn).toBe('2026-06-30');
    expect(due.basis).toBe('yearly');
  });

  it('when the interval is exactly a year, then the design interval is named (a tie goes to the design)', () => {
    const due = dueDateOf({ ...bank, installedOn: '2024-02-29' });
    expect(due.dueOn).toBe('2025-02-28'); // 365 days after a leap day
    expect(due.basis).toBe('design-interval');
    expect(due.startKind).toBe('installed');
  });

  it('when the forecast recommends an earlier next visit, then the bank is due then', () => {
    const due = dueDateOf({
      ...bank,
      lastInspectedOn: '2026-01-10',
      forecastNextVisitOn: '2026-04-01',
    });
    expect(due.dueOn).toBe('2026-04-01');
    expect(due.basis).toBe('forecast');
  });

  it('when the forecast is later than the interval, then the interval stands', () => {
    const due = dueDateOf({
      ...bank,
      lastInspectedOn: '2026-01-10',
      forecastNextVisitOn: '2028-01-01',
    });
    expect(due.dueOn).toBe('2027-01-10');
    expect(due.basis).toBe('design-interval');
  });

  it('when the forecast is already past, then the bank is due on that past day', () => {
    expect(
      dueOnOf({ ...bank, lastInspectedOn: '2026-01-10', forecastNextVisitOn: '2025-12-01' }),
    ).toBe('2025-12-01');
  });

  it('when dueOnOf is asked, then it gives the date of dueDateOf', () => {
    const inputs = { ...bank, installedOn: '2023-07-15', inspectionIntervalDays: 90 };
    expect(dueOnOf(inputs)).toBe(dueDateOf(inputs).dueOn);
    expect(dueOnOf(inputs)).toBe('2023-10-13');
  });

  it('when a date is not a calendar date, then EngineInputError names it', () => {
    expect(() => dueOnOf({ ...bank, lastInspectedOn: '2026-02-30' })).toThrow(EngineInputError);
    expect(() => dueOnOf({ ...bank, forecastNextVisitOn: 'soon' })).toThrow(/forecastNextVisitOn/);
  });
});

describe('calendar months', () => {
  it('when a month has 28, 29, 30 or 31 days, then its end is that day', () => {
    expect(endOfMonthOn('2026-02-10')).toBe('2026-02-28');
    expect(endOfMonthOn('2024-02-01')).toBe('2024-02-29');
    expect(endOfMonthOn('2026-04-30')).toBe('2026-04-30');
    expect(endOfMonthOn('2026-12-02')).toBe('2026-12-31');
  });

  it('when months are added past a shorter month, then the day is clamped to its end (as PostgreSQL does)', () => {
    expect(addMonthsOn('2026-11-30', 3)).toBe('2027-02-28');
    expect(addMonthsOn('2027-11-30', 3)).toBe('2028-02-29');
    expect(addMonthsOn('2026-10-31', 1)).toBe('2026-11-30');
    expect(addMonthsOn('2026-12-02', 3)).toBe('2027-03-02');
    expect(addMonthsOn('2026-03-15', -3)).toBe('2025-12-15');
  });

  it('when the next quarter is asked, then it ends three calendar months after today', () => {
    expect(nextQuarterEndOn('2026-12-02')).toBe('2027-03-02');
  });
});

describe('due buckets', () => {
  const today = '2026-12-02';

  it('when the due date is before today, then the bank is overdue', () => {
    expect(dueBucketOf('2026-12-01', today)).toBe('overdue');
    expect(dueBucketOf('2020-01-01', today)).toBe('overdue');
  });

  it('when the bank is due today, then it is due this month, not yet overdue', () => {
    expect(dueBucketOf(today, today)).toBe('this-month');
  });

  it('when the bank is due on the last day of the month, then it is due this month', () => {
    expect(dueBucketOf('2026-12-31', today)).toBe('this-month');
  });

  it('when the bank is due next month up to today plus three months, then it is due next quarter', () => {
    expect(dueBucketOf('2027-01-01', today)).toBe('next-quarter');
    expect(dueBucketOf('2027-03-02', today)).toBe('next-quarter');
  });

  it('when the bank is due after today plus three months, then it is later', () => {
    expect(dueBucketOf('2027-03-03', today)).toBe('later');
  });

  it('when today is the last day of a month, then tomorrow is already next quarter', () => {
    expect(dueBucketOf('2027-01-01', '2026-12-31')).toBe('next-quarter');
    expect(dueBucketOf('2026-12-31', '2026-12-31')).toBe('this-month');
  });

  it('when days until due are asked, then overdue is negative', () => {
    expect(daysUntilDue('2026-11-30', today)).toBe(-2);
    expect(daysUntilDue('2026-12-12', today)).toBe(10);
  });
});

describe('the site’s day', () => {
  it('when it is already tomorrow at the site, then the site’s date is tomorrow', () => {
    expect(calendarDateInZone('2026-12-31T23:30:00Z', 'Europe/Berlin')).toBe('2027-01-01');
    expect(calendarDateInZone('2026-12-31T23:30:00Z', 'America/Chicago')).toBe('2026-12-31');
    expect(calendarDateInZone(new Date('2026-06-30T22:30:00Z'), 'Europe/Berlin')).toBe(
      '2026-07-01',
    );
  });

  it('when a bank fell due yesterday on the site’s clock, then it is overdue although UTC still says yesterday', () => {
    const status = dueStatusOf(
      { ...bank, lastInspectedOn: '2025-11-30' },
      '2026-11-30T23:30:00Z',
      'Europe/Berlin',
    );
    expect(status.dueOn).toBe('2026-11-30');
    expect(status.todayOn).toBe('2026-12-01');
    expect(status.bucket).toBe('overdue');
    expect(
      dueStatusOf({ ...bank, lastInspectedOn: '2025-11-30' }, '2026-11-30T23:30:00Z', 'UTC').bucket,
    ).toBe('this-month');
  });
});
