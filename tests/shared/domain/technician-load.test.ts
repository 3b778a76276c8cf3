import { describe, expect, it } from 'vitest';
import { hoursWithin, plannedHoursWithin, weekOf } from '../../../shared/domain/technician-load';

describe('weekOf', () => {
  it('when the day is a Saturday in Berlin’s winter, then the week runs Monday to Monday, midnight CET (UTC+1)', () => {
    expect(weekOf('2027-01-09', 'Europe/Berlin')).toEqual({
      weekStartOn: '2027-01-04',
      startsAt: '2027-01-03T23:00:00.000Z',
      endsAt: '2027-01-10T23:00:00.000Z',
    });
  });

  it('when the day is a Monday, then the week starts that day; a Sunday belongs to the week before it', () => {
    expect(weekOf('2027-01-04', 'UTC').weekStartOn).toBe('2027-01-04');
    expect(weekOf('2027-01-10', 'UTC').weekStartOn).toBe('2027-01-04');
    expect(weekOf('2027-01-11', 'UTC').weekStartOn).toBe('2027-01-11');
  });

  it('when the week holds the change to summer time, then it is 167 real hours long', () => {
    // 28 Mar 2027 is a Sunday; Europe/Berlin goes from UTC+1 to UTC+2 that night
    const week = weekOf('2027-03-24', 'Europe/Berlin');
    expect(week).toEqual({
      weekStartOn: '2027-03-22',
      startsAt: '2027-03-21T23:00:00.000Z',
      endsAt: '2027-03-28T22:00:00.000Z',
    });
    expect((Date.parse(week.endsAt) - Date.parse(week.startsAt)) / 3_600_000).toBe(167);
  });

  it('when the zone is west of UTC, then Monday midnight is later in UTC', () => {
    expect(weekOf('2027-01-06', 'America/Chicago').startsAt).toBe('2027-01-04T06:00:00.000Z');
  });

  it('when the day is not a calendar date, then it refuses', () => {
    expect(() => weekOf('2027-02-30', 'UTC')).toThrow(/not a calendar date/);
  });
});

describe('hoursWithin and plannedHoursWithin', () => {
  const week = { startsAt: '2027-01-04T00:00:00Z', endsAt: '2027-01-11T00:00:00Z' };

  it('when a visit runs over the week’s end, then only its hours inside count', () => {
    expect(
      hoursWithin('2027-01-10T22:00:00Z', '2027-01-11T02:00:00Z', week.startsAt, week.endsAt),
    ).toBe(2);
  });

  it('when a visit lies outside the week, then it counts nothing', () => {
    expect(
      hoursWithin('2027-01-11T00:00:00Z', '2027-01-11T02:00:00Z', week.startsAt, week.endsAt),
    ).toBe(0);
  });

  it('when visits add up, then the sum is rounded to a tenth of an hour (70 + 45 min = 1.9166… h → 1.9)', () => {
    expect(
      plannedHoursWithin(
        [
          { plannedStartAt: '2027-01-09T05:00:00Z', plannedEndAt: '2027-01-09T06:10:00Z' },
          { plannedStartAt: '2027-01-09T06:10:00Z', plannedEndAt: '2027-01-09T06:55:00Z' },
        ],
        week,
      ),
    ).toBe(1.9);
  });
});
