import { describe, expect, it } from 'vitest';
import { choiceFromRecurrence, NO_REPEAT, recurrenceFromChoice, repeatLabels, type RecurrenceChoice } from '../../../shared/domain/recurrence-choices';
import { normalizeRecurrence, windowOccurrences } from '../../../shared/domain/shutdown-windows';

// Saturday 9 January 2027 (1 January 2027 is a Friday), 06:00 at the site
const START = '2027-01-09T06:00';
const choice = (change: Partial<RecurrenceChoice>): RecurrenceChoice => ({ ...NO_REPEAT, ends: 'never', ...change });

describe('recurrenceFromChoice', () => {
  it('when a weekly choice is made for a Saturday start, then the rule names Saturday', () => {
    expect(recurrenceFromChoice(choice({ kind: 'weekly', ends: 'count', count: 8 }), START)).toBe('FREQ=WEEKLY;BYDAY=SA;COUNT=8');
  });

  it('when every second week until a day is chosen, then INTERVAL and UNTIL are written', () => {
    expect(recurrenceFromChoice(choice({ kind: 'weekly', interval: 2, ends: 'until', untilOn: '2027-06-30' }), START)).toBe(
      'FREQ=WEEKLY;BYDAY=SA;INTERVAL=2;UNTIL=20270630',
    );
  });

  it('when the monthly weekday is chosen, then the start’s place in its month is kept (9 January: the second Saturday)', () => {
    expect(recurrenceFromChoice(choice({ kind: 'monthly-weekday' }), START)).toBe('FREQ=MONTHLY;BYDAY=2SA');
    expect(repeatLabels(START)['monthly-weekday']).toBe('Every month on the second Saturday');
    // 30 January 2027 is the fifth Saturday: said as the last
    expect(recurrenceFromChoice(choice({ kind: 'monthly-weekday' }), '2027-01-30T06:00')).toBe('FREQ=MONTHLY;BYDAY=-1SA');
  });

  it('when "does not repeat" is chosen, then there is no rule; custom keeps the text', () => {
    expect(recurrenceFromChoice(NO_REPEAT, START)).toBeNull();
    expect(recurrenceFromChoice(choice({ kind: 'custom', custom: ' FREQ=YEARLY ' }), START)).toBe('FREQ=YEARLY');
  });

  it('when any built rule is checked, then the API accepts it and its first occurrence is the start', () => {
    for (const kind of ['daily', 'weekly', 'monthly-weekday', 'monthly-day'] as const) {
      const rule = recurrenceFromChoice(choice({ kind, ends: 'count', count: 3 }), START);
      const check = normalizeRecurrence(rule);
      expect(check.ok, `${kind}: ${rule}`).toBe(true);
      const [first] = windowOccurrences(
        { startsAt: '2027-01-09T05:00:00.000Z', endsAt: '2027-01-09T13:00:00.000Z', recurrence: check.ok ? check.recurrence : null },
        'Europe/Berlin',
        '2027-01-01T00:00:00Z',
        '2028-01-01T00:00:00Z',
      );
      expect(first?.startsAt, kind).toBe('2027-01-09T05:00:00.000Z');
    }
  });
});

describe('choiceFromRecurrence', () => {
  it('when a stored rule is one the choices build, then that choice comes back', () => {
    expect(choiceFromRecurrence('FREQ=WEEKLY;BYDAY=SA;COUNT=8', START)).toMatchObject({ kind: 'weekly', ends: 'count', count: 8 });
    expect(choiceFromRecurrence('FREQ=WEEKLY;BYDAY=SA;INTERVAL=2;UNTIL=20270630T235959', START)).toMatchObject({
      kind: 'weekly',
      interval: 2,
      ends: 'until',
      untilOn: '2027-06-30',
    });
    expect(choiceFromRecurrence(null, START).kind).toBe('once');
  });

  it('when a stored rule is one no choice says, then it is custom with the rule as stored', () => {
    expect(choiceFromRecurrence('FREQ=WEEKLY;BYDAY=SA,SU', START)).toMatchObject({ kind: 'custom', custom: 'FREQ=WEEKLY;BYDAY=SA,SU' });
  });
});
