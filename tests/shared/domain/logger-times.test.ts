import { describe, expect, it } from 'vitest';
import {
  readClockSeconds,
  readTimestampSeconds,
  timeReaderFor,
} from '../../../shared/domain/logger-times';

describe('readClockSeconds', () => {
  it('when a clock time has fractions with a point or a comma, then it is seconds since midnight', () => {
    expect(readClockSeconds('08:15:30.25')).toBe(29_730.25);
    expect(readClockSeconds('8:15:30,5')).toBe(29_730.5);
  });

  it('when a clock time says PM, then 12 hours are added (12 PM is noon, 12 AM midnight)', () => {
    expect(readClockSeconds('1:00:00 PM')).toBe(13 * 3600);
    expect(readClockSeconds('12:00:01 PM')).toBe(12 * 3600 + 1);
    expect(readClockSeconds('12:00:01 am')).toBe(1);
  });

  it('when a cell is not a clock time, then it is null', () => {
    for (const cell of ['25:00:00', '08:61:00', '08:15', '560', '2024-06-11']) {
      expect(readClockSeconds(cell)).toBeNull();
    }
  });
});

describe('readTimestampSeconds', () => {
  // Seconds since 1970 of 2024-06-11 08:15:30 UTC, from Date.UTC (ECMAScript's own calendar).
  const at = Date.UTC(2024, 5, 11, 8, 15, 30) / 1000;

  it('when an ISO 8601 time is written with T, Z or a space, then it is read', () => {
    expect(readTimestampSeconds('2024-06-11T08:15:30.5Z', false)).toBe(at + 0.5);
    expect(readTimestampSeconds('2024-06-11 08:15:30', false)).toBe(at);
    expect(readTimestampSeconds('2024/06/11 08:15:30', false)).toBe(at);
  });

  it('when an offset is written, then the time is moved to UTC', () => {
    expect(readTimestampSeconds('2024-06-11T10:15:30+02:00', false)).toBe(at);
    expect(readTimestampSeconds('2024-06-11T03:15:30-0500', false)).toBe(at);
  });

  it('when the date is written day first with dots, or with slashes either way, then it is read', () => {
    expect(readTimestampSeconds('11.06.2024 08:15:30,5', false)).toBe(at + 0.5);
    expect(readTimestampSeconds('06/11/2024 8:15:30 AM', false)).toBe(at);
    expect(readTimestampSeconds('11/06/2024 08:15:30', true)).toBe(at);
  });

  it('when the date does not exist, then it is null', () => {
    expect(readTimestampSeconds('2024-06-31 08:15:30', false)).toBeNull();
    expect(readTimestampSeconds('2024-13-01 08:15:30', false)).toBeNull();
  });
});

describe('timeReaderFor', () => {
  it('when the first cell is a number, then times are numbers in the header unit', () => {
    const reader = timeReaderFor('1500', true, 1e-3)!;
    expect(reader.format).toBe('seconds');
    expect(reader.read('2500,5')).toBeCloseTo(2.5005, 12);
    expect(reader.read('08:00:00')).toBeNull();
  });

  it('when the first cell is a clock time, then the file has clock times', () => {
    const reader = timeReaderFor('23:59:59.9', false, 1)!;
    expect(reader.format).toBe('clock');
    expect(reader.read('00:00:00.1')).toBeCloseTo(0.1, 12);
  });

  it('when the first slashed date cannot be month first, then the file is read day first', () => {
    const reader = timeReaderFor('13/06/2024 08:00:00', false, 1)!;
    expect(reader.format).toBe('timestamp');
    expect(reader.read('14/06/2024 08:00:00')! - reader.read('13/06/2024 08:00:00')!).toBe(86_400);
  });

  it('when the first cell is no time at all, then there is no reader', () => {
    expect(timeReaderFor('n/a', false, 1)).toBeNull();
  });
});
