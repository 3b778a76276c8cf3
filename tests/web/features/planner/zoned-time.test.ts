import { describe, expect, it } from 'vitest';
import {
  formatZonedInstant,
  formatZonedRange,
  fromCalendarDate,
  fromZonedInputValue,
  toCalendarDate,
  toZonedInputValue,
  zonedDateOn,
} from '../../../../web/src/features/planner/utils/zoned-time';

// Offsets from the IANA zone rules: Berlin UTC+1 in winter, UTC+2 from the last Sunday of March;
// New York UTC-5 in winter; Kolkata UTC+5:30 all year.

describe('toCalendarDate', () => {
  it('when an instant is shown in Berlin in winter, then the calendar reads the Berlin wall clock', () => {
    const date = toCalendarDate('2026-12-12T05:00:00Z', 'Europe/Berlin');
    expect([date.getFullYear(), date.getMonth(), date.getDate(), date.getHours(), date.getMinutes()]).toEqual([2026, 11, 12, 6, 0]);
  });

  it('when the zone is behind UTC, then the calendar day can be the day before', () => {
    const date = toCalendarDate('2026-12-12T03:00:00Z', 'America/New_York');
    expect([date.getDate(), date.getHours()]).toEqual([11, 22]);
  });

  it('when the zone has a half-hour offset, then the minutes follow it', () => {
    const date = toCalendarDate('2026-12-12T00:00:00Z', 'Asia/Kolkata');
    expect([date.getHours(), date.getMinutes()]).toEqual([5, 30]);
  });
});

describe('fromCalendarDate', () => {
  it('when a calendar date is read in Berlin, then it is the inverse of toCalendarDate', () => {
    const instant = '2026-12-12T05:00:00.000Z';
    expect(fromCalendarDate(toCalendarDate(instant, 'Europe/Berlin'), 'Europe/Berlin')).toBe(instant);
  });

  it('when a drop lands on 06:00 on a summer day in Berlin, then the instant is 04:00 UTC', () => {
    expect(fromCalendarDate(new Date(2027, 6, 10, 6, 0), 'Europe/Berlin')).toBe('2027-07-10T04:00:00.000Z');
  });

  it('when the same wall clock is read in another zone, then the instant differs by the offsets', () => {
    const wall = new Date(2026, 11, 12, 6, 0);
    const berlin = Date.parse(fromCalendarDate(wall, 'Europe/Berlin'));
    const newYork = Date.parse(fromCalendarDate(wall, 'America/New_York'));
    expect((newYork - berlin) / 3600_000).toBe(6);
  });
});

describe('datetime-local values', () => {
  it('when an instant is put in the field, then it reads in the site zone', () => {
    expect(toZonedInputValue('2026-12-12T05:00:00Z', 'Europe/Berlin')).toBe('2026-12-12T06:00');
  });

  it('when a value is typed, then it is read in the site zone', () => {
    expect(fromZonedInputValue('2026-12-12T06:00', 'Europe/Berlin')).toBe('2026-12-12T05:00:00.000Z');
  });

  it('when the value is incomplete, then null', () => {
    expect(fromZonedInputValue('2026-12-12', 'Europe/Berlin')).toBeNull();
    expect(fromZonedInputValue('', 'Europe/Berlin')).toBeNull();
  });
});

describe('formatZonedRange', () => {
  it('when start and end fall on one day, then one date, both times and the zone', () => {
    expect(formatZonedRange('2026-12-12T05:00:00Z', '2026-12-12T13:00:00Z', 'Europe/Berlin')).toBe('Sat 12 Dec, 06:00–14:00 Europe/Berlin');
  });

  it('when the span crosses midnight, then both dates are named', () => {
    expect(formatZonedRange('2026-12-12T21:00:00Z', '2026-12-13T05:00:00Z', 'Europe/Berlin')).toBe(
      'Sat 12 Dec, 22:00 – Sun 13 Dec, 06:00 Europe/Berlin',
    );
  });

  it('when the instant is shown in an instant format, then the year and zone are named', () => {
    expect(formatZonedInstant('2026-12-12T05:00:00Z', 'Europe/Berlin')).toBe('Sat 12 Dec 2026, 06:00 Europe/Berlin');
  });

  it('when the date of an instant is asked in a zone behind UTC, then the local date', () => {
    expect(zonedDateOn('2026-12-12T03:00:00Z', 'America/New_York')).toBe('2026-12-11');
  });
});
