import { describe, expect, it } from 'vitest';
import {
  loadBar,
  reassignedTechnicians,
  shiftWeek,
  todayOn,
  visitTimesText,
  weekText,
} from '../../../../web/src/features/technician-load/utils/load-week';

describe('loadBar', () => {
  it('when less is planned than available, then the bar is that share and not over', () => {
    const bar = loadBar(2.9, 30);
    expect(bar.fraction).toBeCloseTo(2.9 / 30, 10);
    expect([bar.over, bar.text]).toEqual([false, '2.9 h of 30 h']);
  });

  it('when more is planned than available, then the bar is full and over', () => {
    expect(loadBar(41, 37.5)).toEqual({ fraction: 1, over: true, text: '41 h of 37.5 h' });
  });

  it('when nothing is available, then nothing planned is an empty bar and anything planned is over', () => {
    expect(loadBar(0, 0)).toEqual({ fraction: 0, over: false, text: '0 h of 0 h' });
    expect(loadBar(1, 0)).toMatchObject({ fraction: 1, over: true });
  });
});

describe('the week shown', () => {
  it('when moving a week back or forward, then the day moves by seven days, across a year’s end', () => {
    expect(shiftWeek('2027-01-02', -1)).toBe('2026-12-26');
    expect(shiftWeek('2026-12-30', 1)).toBe('2027-01-06');
  });

  it('when today is asked on a site’s clock, then its date there', () => {
    // 23:30Z on 31 Dec is already 1 Jan in Berlin
    expect(todayOn(Date.parse('2026-12-31T23:30:00Z'), 'Europe/Berlin')).toBe('2027-01-01');
  });

  it('when the week is named, then from Monday to Sunday', () => {
    expect(weekText('2027-01-04')).toBe('Mon 4 Jan – Sun 10 Jan 2027');
  });

  it('when a visit is shown, then on its site’s clock with the zone named', () => {
    expect(visitTimesText('2027-01-09T05:00:00Z', '2027-01-09T06:10:00Z', 'Europe/Berlin')).toBe(
      'Sat 9 Jan, 06:00–07:10 Europe/Berlin',
    );
    expect(visitTimesText('2027-01-10T22:00:00Z', '2027-01-11T00:00:00Z', 'Europe/Berlin')).toBe(
      'Sun 10 Jan, 23:00–Mon 11 Jan, 01:00 Europe/Berlin',
    );
  });
});

describe('reassignedTechnicians', () => {
  it('when one of two is replaced, then the other stays', () => {
    expect(reassignedTechnicians(['a', 'b'], 'a', 'c')).toEqual(['c', 'b']);
  });

  it('when the new one is already on the visit, then they are named once', () => {
    expect(reassignedTechnicians(['a', 'b'], 'a', 'b')).toEqual(['b']);
  });
});
