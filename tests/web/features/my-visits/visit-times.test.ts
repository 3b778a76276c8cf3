import { describe, expect, it } from 'vitest';
import {
  clockSpanText,
  dayAfter,
  durationText,
  localDayOn,
  visitTimeText,
  weekStartOn,
} from '../../../../web/src/features/my-visits/utils/visit-times';

describe('visitTimeText', () => {
  it('when a visit lies within one day, then the day is said once and the zone named', () => {
    expect(visitTimeText('2026-12-12T05:00:00Z', '2026-12-12T13:00:00Z', 'Europe/Berlin')).toBe(
      'Sat 12 Dec, 06:00–14:00 Europe/Berlin',
    );
  });

  it('when a visit runs past midnight on the site’s clock, then both days are said', () => {
    expect(visitTimeText('2026-12-12T21:00:00Z', '2026-12-13T05:00:00Z', 'Europe/Berlin')).toBe(
      'Sat 12 Dec, 22:00 – Sun 13 Dec, 06:00 Europe/Berlin',
    );
  });

  it('when the site is in another zone than UTC, then its own clock is read (not the browser’s)', () => {
    // 05:00 UTC is midnight in New York in December (UTC−5)
    expect(visitTimeText('2026-12-12T05:00:00Z', '2026-12-12T07:00:00Z', 'America/New_York')).toBe(
      'Sat 12 Dec, 00:00–02:00 America/New_York',
    );
  });

  it('when summer time begins during a visit, then the clock jumps with it', () => {
    // Europe/Berlin moves from +01:00 to +02:00 at 01:00 UTC on 28 Mar 2027
    expect(visitTimeText('2027-03-28T00:30:00Z', '2027-03-28T01:30:00Z', 'Europe/Berlin')).toBe(
      'Sun 28 Mar, 01:30–03:30 Europe/Berlin',
    );
  });
});

describe('clockSpanText', () => {
  it('when the day is shown apart, then only the clock times are given', () => {
    expect(clockSpanText('2026-12-12T05:00:00Z', '2026-12-12T13:00:00Z', 'Europe/Berlin')).toBe('06:00–14:00');
  });
});

describe('localDayOn and weekStartOn', () => {
  it('when it is late evening UTC, then the site in Asia is already on the next day', () => {
    expect(localDayOn('2026-12-12T20:00:00Z', 'Asia/Tokyo')).toBe('2026-12-13');
    expect(localDayOn('2026-12-12T20:00:00Z', 'Europe/London')).toBe('2026-12-12');
  });

  it('when the week is asked for, then it starts on the Monday on the site’s clock', () => {
    expect(weekStartOn('2026-12-13T12:00:00Z', 'Europe/Berlin')).toBe('2026-12-07');
    // Sunday 23:30 UTC is Monday 08:30 in Tokyo: the next week there
    expect(weekStartOn('2026-12-13T23:30:00Z', 'Asia/Tokyo')).toBe('2026-12-14');
  });

  it('when days are added across a month end, then the calendar rolls over', () => {
    expect(dayAfter('2026-12-28', 7)).toBe('2027-01-04');
  });
});

describe('durationText', () => {
  it.each([
    [35, '35 min'],
    [80, '1 h 20 min'],
    [121, '2 h 5 min'],
    [120, '2 h'],
    [7, '7 min'],
  ])('when a visit takes %i minutes, then it reads "%s"', (minutes, text) => {
    expect(durationText(minutes)).toBe(text);
  });
});
