import { describe, expect, it } from 'vitest';
import {
  instantOfLocalWallTime,
  localWallTimeOf,
  normalizeRecurrence,
  recurrenceText,
  windowOccurrences,
  windowTimesProblems,
} from '../../../shared/domain/shutdown-windows';

// Europe/Berlin keeps CET (UTC+1) in winter and CEST (UTC+2) in summer. Summer time runs from
// 01:00 UTC on the last Sunday of March to 01:00 UTC on the last Sunday of October (EU
// Directive 2000/84/EC, articles 2 and 3): in 2026 from Sunday 29 March to Sunday 25 October.
// The UTC instants below are worked out by hand from those offsets.
const BERLIN = 'Europe/Berlin';

describe('windowOccurrences', () => {
  // Saturday 21 March 2026, 06:00–14:00 CET = 05:00Z–13:00Z, every Saturday, four times
  const weekly = {
    startsAt: '2026-03-21T05:00:00.000Z',
    endsAt: '2026-03-21T13:00:00.000Z',
    recurrence: 'FREQ=WEEKLY;BYDAY=SA;COUNT=4',
  };

  it('when a weekly window crosses the spring change, then it keeps 06:00–14:00 Berlin time and its UTC instants move an hour earlier', () => {
    expect(windowOccurrences(weekly, BERLIN, '2026-03-01T00:00:00Z', '2026-05-01T00:00:00Z')).toEqual([
      { startsAt: '2026-03-21T05:00:00.000Z', endsAt: '2026-03-21T13:00:00.000Z' }, // CET
      { startsAt: '2026-03-28T05:00:00.000Z', endsAt: '2026-03-28T13:00:00.000Z' }, // CET, the day before the change
      { startsAt: '2026-04-04T04:00:00.000Z', endsAt: '2026-04-04T12:00:00.000Z' }, // CEST
      { startsAt: '2026-04-11T04:00:00.000Z', endsAt: '2026-04-11T12:00:00.000Z' }, // CEST
    ]);
  });

  it('when a weekly window crosses the autumn change, then it keeps its Berlin wall time and its UTC instants move an hour later', () => {
    // Saturday 17 October 2026, 06:00–14:00 CEST = 04:00Z–12:00Z
    const autumn = { startsAt: '2026-10-17T04:00:00.000Z', endsAt: '2026-10-17T12:00:00.000Z', recurrence: 'FREQ=WEEKLY;BYDAY=SA' };
    const found = windowOccurrences(autumn, BERLIN, '2026-10-01T00:00:00Z', '2026-11-08T00:00:00Z');
    expect(found.map((o) => o.startsAt)).toEqual([
      '2026-10-17T04:00:00.000Z', // CEST
      '2026-10-24T04:00:00.000Z', // CEST, the day before the change
      '2026-10-31T05:00:00.000Z', // CET
      '2026-11-07T05:00:00.000Z', // CET
    ]);
    expect(found.map((o) => localWallTimeOf(o.startsAt, BERLIN).slice(11))).toEqual(['06:00', '06:00', '06:00', '06:00']);
  });

  it('when an overnight window spans the night the clocks go forward, then it starts at 22:00 local and lasts the same 8 hours (ending 07:00 local)', () => {
    // Saturday 21 March 2026 22:00 CET = 21:00Z, 8 hours
    const night = { startsAt: '2026-03-21T21:00:00.000Z', endsAt: '2026-03-22T05:00:00.000Z', recurrence: 'FREQ=WEEKLY' };
    const [, second] = windowOccurrences(night, BERLIN, '2026-03-20T00:00:00Z', '2026-03-30T00:00:00Z');
    expect(second).toEqual({ startsAt: '2026-03-28T21:00:00.000Z', endsAt: '2026-03-29T05:00:00.000Z' });
    expect(localWallTimeOf(second!.endsAt, BERLIN)).toBe('2026-03-29T07:00');
  });

  it('when the range cuts an occurrence, then that occurrence is given whole; the range end is exclusive', () => {
    const found = windowOccurrences(weekly, BERLIN, '2026-03-28T10:00:00Z', '2026-04-04T04:00:00Z');
    expect(found).toEqual([{ startsAt: '2026-03-28T05:00:00.000Z', endsAt: '2026-03-28T13:00:00.000Z' }]);
  });

  it('when COUNT runs out, then no later occurrence is given', () => {
    expect(windowOccurrences(weekly, BERLIN, '2026-04-12T00:00:00Z', '2027-01-01T00:00:00Z')).toEqual([]);
  });

  it('when the window is a one-off, then it has its one occurrence only in a range it overlaps', () => {
    const once = { startsAt: '2026-12-12T05:00:00.000Z', endsAt: '2026-12-12T13:00:00.000Z', recurrence: null };
    expect(windowOccurrences(once, BERLIN, '2026-12-01T00:00:00Z', '2027-01-01T00:00:00Z')).toEqual([
      { startsAt: '2026-12-12T05:00:00.000Z', endsAt: '2026-12-12T13:00:00.000Z' },
    ]);
    expect(windowOccurrences(once, BERLIN, '2026-12-12T13:00:00Z', '2027-01-01T00:00:00Z')).toEqual([]);
  });

  it('when the range is before the first occurrence, then nothing comes before the start', () => {
    expect(windowOccurrences(weekly, BERLIN, '2026-01-01T00:00:00Z', '2026-03-21T05:00:00Z')).toEqual([]);
  });

  it('when UNTIL is a date, then the occurrence on that local day is included', () => {
    const until = normalizeRecurrence('FREQ=WEEKLY;BYDAY=SA;UNTIL=20260404');
    expect(until).toEqual({ ok: true, recurrence: 'FREQ=WEEKLY;BYDAY=SA;UNTIL=20260404T235959' });
    const found = windowOccurrences({ ...weekly, recurrence: until.ok ? until.recurrence : null }, BERLIN, '2026-03-01T00:00:00Z', '2026-06-01T00:00:00Z');
    expect(found.map((o) => o.startsAt.slice(0, 10))).toEqual(['2026-03-21', '2026-03-28', '2026-04-04']);
  });

  it('when the first Saturday of each month is asked in New York, then it follows US summer time (from 8 March 2026)', () => {
    // US summer time 2026: from 2:00 local on Sunday 8 March (15 U.S.C. §260a, second Sunday of March);
    // EST is UTC−5, EDT UTC−4. Saturday 7 February 2026 07:00 EST = 12:00Z.
    const monthly = { startsAt: '2026-02-07T12:00:00.000Z', endsAt: '2026-02-07T16:00:00.000Z', recurrence: 'FREQ=MONTHLY;BYDAY=1SA;COUNT=3' };
    const found = windowOccurrences(monthly, 'America/New_York', '2026-01-01T00:00:00Z', '2027-01-01T00:00:00Z');
    expect(found.map((o) => o.startsAt)).toEqual(['2026-02-07T12:00:00.000Z', '2026-03-07T12:00:00.000Z', '2026-04-04T11:00:00.000Z']);
  });

  it('when a limit is given, then no more occurrences than it are given', () => {
    const daily = { startsAt: '2026-01-01T05:00:00.000Z', endsAt: '2026-01-01T06:00:00.000Z', recurrence: 'FREQ=DAILY' };
    expect(windowOccurrences(daily, BERLIN, '2026-01-01T00:00:00Z', '2027-01-01T00:00:00Z', 10)).toHaveLength(10);
    expect(windowOccurrences(daily, BERLIN, '2026-01-01T00:00:00Z', '2027-01-01T00:00:00Z')).toHaveLength(365);
  });
});

describe('normalizeRecurrence', () => {
  it('when the text is empty, then there is no recurrence', () => {
    expect(normalizeRecurrence('  ')).toEqual({ ok: true, recurrence: null });
    expect(normalizeRecurrence(null)).toEqual({ ok: true, recurrence: null });
  });

  it('when the rule is typed in lower case with RRULE:, then it is stored in capitals without it', () => {
    expect(normalizeRecurrence('rrule:freq=monthly;byday=1sa;count=6;')).toEqual({ ok: true, recurrence: 'FREQ=MONTHLY;BYDAY=1SA;COUNT=6' });
  });

  it.each([
    ['FOO=1', /not a recurrence part Ebbline knows/],
    ['blah', /not a recurrence part/],
    ['BYDAY=SA', /how often/],
    ['FREQ=HOURLY', /FREQ must be/],
    ['FREQ=WEEKLY;BYDAY=XX', /BYDAY/],
    ['FREQ=WEEKLY;COUNT=abc', /COUNT/],
    ['FREQ=WEEKLY;COUNT=0', /COUNT/],
    ['FREQ=WEEKLY;INTERVAL=0', /INTERVAL/],
    ['FREQ=WEEKLY;COUNT=3;UNTIL=20270101', /not both/],
    ['FREQ=WEEKLY;UNTIL=20270230', /not a real date/],
    ['FREQ=WEEKLY;DTSTART=20270101T000000Z', /DTSTART/],
    ['FREQ=DAILY;BYHOUR=5', /BYHOUR/],
    ['FREQ=WEEKLY;FREQ=DAILY', /twice/],
    ['FREQ=YEARLY;BYMONTH=13', /BYMONTH/],
  ])('when the rule is %s, then it is refused', (text, message) => {
    const check = normalizeRecurrence(text);
    expect(check.ok).toBe(false);
    expect(check.ok ? '' : check.message).toMatch(message);
  });
});

describe('windowTimesProblems', () => {
  it('when the end is not after the start, then the end is named', () => {
    expect(windowTimesProblems({ startsAt: '2026-12-12T05:00:00Z', endsAt: '2026-12-12T05:00:00Z', recurrence: null }, BERLIN)).toEqual([
      { path: 'endsAt', message: 'The end must be after the start.' },
    ]);
  });

  it('when the start is a Friday and the rule says Saturdays, then the recurrence is named', () => {
    // Friday 11 December 2026 06:00 CET
    const problems = windowTimesProblems({ startsAt: '2026-12-11T05:00:00Z', endsAt: '2026-12-11T13:00:00Z', recurrence: 'FREQ=WEEKLY;BYDAY=SA' }, BERLIN);
    expect(problems).toHaveLength(1);
    expect(problems[0]!.path).toBe('recurrence');
    expect(problems[0]!.message).toContain('2026-12-12 06:00');
  });

  it('when a daily rule repeats a 30-hour window, then the occurrences would overlap and the recurrence is named', () => {
    const problems = windowTimesProblems({ startsAt: '2026-12-12T05:00:00Z', endsAt: '2026-12-13T11:00:00Z', recurrence: 'FREQ=DAILY' }, BERLIN);
    expect(problems.map((p) => p.path)).toEqual(['recurrence']);
  });

  it('when the times are sound, then there is no problem', () => {
    expect(windowTimesProblems({ startsAt: '2026-12-12T05:00:00Z', endsAt: '2026-12-12T13:00:00Z', recurrence: 'FREQ=WEEKLY;BYDAY=SA;COUNT=8' }, BERLIN)).toEqual([]);
  });
});

describe('wall times', () => {
  it('when a Berlin winter wall time is read, then it is one hour ahead of UTC; in summer two', () => {
    expect(instantOfLocalWallTime('2027-01-09 06:00', BERLIN)).toBe('2027-01-09T05:00:00.000Z');
    expect(instantOfLocalWallTime('2027-07-10T06:00', BERLIN)).toBe('2027-07-10T04:00:00.000Z');
    expect(localWallTimeOf('2027-07-10T04:00:00.000Z', BERLIN)).toBe('2027-07-10T06:00');
  });

  it.each(['2027-02-30 06:00', '2027-01-09 25:00', '09/01/2027 06:00', '2027-01-09', ''])('when "%s" is read, then it is not a wall time', (text) => {
    expect(instantOfLocalWallTime(text, BERLIN)).toBeNull();
  });

  it('when a recurrence is described, then rrule words it in English', () => {
    expect(recurrenceText('FREQ=WEEKLY;BYDAY=SA;COUNT=8')).toBe('every week on Saturday for 8 times');
    expect(recurrenceText(null)).toBe('once');
  });
});
