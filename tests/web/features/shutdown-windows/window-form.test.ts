import { describe, expect, it } from 'vitest';
import { NO_REPEAT, type RecurrenceChoice } from '../../../../shared/domain/recurrence-choices';
import { windowBodyOf, type WindowFormValues } from '../../../../web/src/features/shutdown-windows/utils/window-form';
import { windowTimeText } from '../../../../web/src/features/shutdown-windows/utils/window-times';

const weekly: RecurrenceChoice = { ...NO_REPEAT, kind: 'weekly', ends: 'count', count: 8 };
// Saturday 9 January 2027, 06:00–14:00 at a Berlin site (CET, UTC+1)
const values = (change: Partial<WindowFormValues> = {}): WindowFormValues => ({
  areaId: 'area-1',
  title: ' Weekend stop ',
  start: '2027-01-09T06:00',
  end: '2027-01-09T14:00',
  choice: weekly,
  notes: '',
  ...change,
});

describe('windowBodyOf', () => {
  it('when the form is filled in, then the times are the site’s wall time as UTC instants and the rule names Saturday', () => {
    expect(windowBodyOf(values(), 'Europe/Berlin')).toEqual({
      body: {
        areaId: 'area-1',
        title: 'Weekend stop',
        startsAt: '2027-01-09T05:00:00.000Z',
        endsAt: '2027-01-09T13:00:00.000Z',
        recurrence: 'FREQ=WEEKLY;BYDAY=SA;COUNT=8',
        notes: '',
      },
    });
  });

  it('when the same wall time is at a Chicago site, then it is six hours later in UTC (CST, UTC−6)', () => {
    const result = windowBodyOf(values(), 'America/Chicago');
    expect('body' in result && result.body.startsAt).toBe('2027-01-09T12:00:00.000Z');
  });

  it('when the end is before the start, then the end is named', () => {
    expect(windowBodyOf(values({ end: '2027-01-09T05:00' }), 'Europe/Berlin')).toEqual({ problems: { end: 'The end must be after the start.' } });
  });

  it('when the typed rule is not one Ebbline takes, then the recurrence is named', () => {
    const result = windowBodyOf(values({ choice: { ...weekly, kind: 'custom', custom: 'FREQ=HOURLY' } }), 'Europe/Berlin');
    expect(result).toEqual({ problems: { recurrence: 'FREQ must be DAILY, WEEKLY, MONTHLY or YEARLY.' } });
  });

  it('when the area, title and times are missing, then each is named', () => {
    const result = windowBodyOf(values({ areaId: '', title: ' ', start: '', end: '' }), 'Europe/Berlin');
    expect('problems' in result && Object.keys(result.problems).sort()).toEqual(['areaId', 'end', 'start', 'title']);
  });
});

describe('windowTimeText', () => {
  it('when a window lies within a day, then one date and both clock times with the zone', () => {
    expect(windowTimeText('2026-12-12T05:00:00Z', '2026-12-12T13:00:00Z', 'Europe/Berlin')).toBe('Sat 12 Dec, 06:00–14:00 Europe/Berlin');
  });

  it('when a window runs overnight, then both days are named', () => {
    expect(windowTimeText('2026-12-12T21:00:00Z', '2026-12-13T05:00:00Z', 'Europe/Berlin')).toBe('Sat 12 Dec, 22:00 – Sun 13 Dec, 06:00 Europe/Berlin');
  });
});
