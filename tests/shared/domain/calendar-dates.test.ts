import { describe, expect, it } from 'vitest';
import {
  addDays,
  dayNumberFromIsoDate,
  daysBetween,
  isoDateFromDayNumber,
} from '../../../shared/domain/calendar-dates';
import { EngineInputError } from '../../../shared/domain/errors';

describe('calendar dates', () => {
  it('when a date is turned into a day number and back, then it is the same date', () => {
    for (const date of ['1970-01-01', '2000-02-29', '2024-12-31', '2099-07-04']) {
      expect(isoDateFromDayNumber(dayNumberFromIsoDate(date))).toBe(date);
    }
  });

  it('when a leap day is crossed, then it counts', () => {
    expect(addDays('2024-02-28', 2)).toBe('2024-03-01');
    expect(daysBetween('2024-01-01', '2025-01-01')).toBe(366);
    expect(daysBetween('2023-01-01', '2024-01-01')).toBe(365);
  });

  it('when a date does not exist, then EngineInputError names the path', () => {
    expect(() => dayNumberFromIsoDate('2023-02-29', 'history.2.measuredOn')).toThrow(
      /history\.2\.measuredOn/,
    );
    expect(() => dayNumberFromIsoDate('01/03/2024')).toThrow(EngineInputError);
    expect(() => dayNumberFromIsoDate('2024-13-01')).toThrow(EngineInputError);
  });
});
