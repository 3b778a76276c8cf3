import { describe, expect, it } from 'vitest';
import { groupMyVisits, groupOfVisit, groupTitle } from '../../../../web/src/features/my-visits/utils/group-visits';
import { visitJson } from '../../../support/visit-json';

// Wednesday 9 Dec 2026, 10:00 in Berlin
const NOW = new Date('2026-12-09T09:00:00Z');

describe('groupOfVisit', () => {
  it('when a visit is later today on the site’s clock, then it is today', () => {
    expect(groupOfVisit(visitJson({ plannedStartAt: '2026-12-09T13:00:00Z', plannedEndAt: '2026-12-09T15:00:00Z' }), NOW)).toEqual({ kind: 'today' });
  });

  it('when a visit is on Sunday of this week, then it is later this week', () => {
    expect(groupOfVisit(visitJson({ plannedStartAt: '2026-12-13T07:00:00Z', plannedEndAt: '2026-12-13T09:00:00Z' }), NOW)).toEqual({ kind: 'this-week' });
  });

  it('when a visit is on Monday next week, then it is a coming week, named by its Monday', () => {
    expect(groupOfVisit(visitJson({ plannedStartAt: '2026-12-14T07:00:00Z', plannedEndAt: '2026-12-14T09:00:00Z' }), NOW)).toEqual({ kind: 'coming', weekOn: '2026-12-14' });
  });

  it('when it is already tomorrow at the site, then a visit there tomorrow-UTC is today', () => {
    // 23:00 UTC on Wed is 08:00 Thu in Tokyo; the visit at 01:00 UTC Thu is Thu 10:00 there
    const lateNow = new Date('2026-12-09T23:00:00Z');
    const tokyo = visitJson({ timeZone: 'Asia/Tokyo', plannedStartAt: '2026-12-10T01:00:00Z', plannedEndAt: '2026-12-10T02:00:00Z' });
    expect(groupOfVisit(tokyo, lateNow)).toEqual({ kind: 'today' });
  });

  it('when a visit is under way, then it comes first whatever its day', () => {
    expect(groupOfVisit(visitJson({ state: 'under-way', plannedStartAt: '2026-12-07T07:00:00Z', plannedEndAt: '2026-12-07T09:00:00Z' }), NOW)).toEqual({ kind: 'under-way' });
  });

  it('when a past visit was missed or never started, then it is earlier and still open', () => {
    const past = { plannedStartAt: '2026-12-07T07:00:00Z', plannedEndAt: '2026-12-07T09:00:00Z' };
    expect(groupOfVisit(visitJson({ ...past, state: 'missed' }), NOW)).toEqual({ kind: 'earlier' });
    expect(groupOfVisit(visitJson({ ...past, state: 'planned' }), NOW)).toEqual({ kind: 'earlier' });
  });

  it('when a past visit is logged, reviewed or cancelled, then it is left out', () => {
    const past = { plannedStartAt: '2026-12-07T07:00:00Z', plannedEndAt: '2026-12-07T09:00:00Z' };
    for (const state of ['logged', 'reviewed', 'cancelled'] as const) {
      expect(groupOfVisit(visitJson({ ...past, state }), NOW)).toBeNull();
    }
  });

  it('when a visit began last night and ends this morning, then it is today', () => {
    expect(groupOfVisit(visitJson({ plannedStartAt: '2026-12-08T21:00:00Z', plannedEndAt: '2026-12-09T05:00:00Z' }), NOW)).toEqual({ kind: 'today' });
  });
});

describe('groupMyVisits', () => {
  it('when visits come in any order, then the groups run under way, today, this week, coming weeks, earlier ones not done, each by start', () => {
    const nextWeekLate = visitJson({ plannedStartAt: '2026-12-17T07:00:00Z', plannedEndAt: '2026-12-17T08:00:00Z' });
    const nextWeekEarly = visitJson({ plannedStartAt: '2026-12-15T07:00:00Z', plannedEndAt: '2026-12-15T08:00:00Z' });
    const inThreeWeeks = visitJson({ plannedStartAt: '2026-12-29T07:00:00Z', plannedEndAt: '2026-12-29T08:00:00Z' });
    const todayLate = visitJson({ plannedStartAt: '2026-12-09T15:00:00Z', plannedEndAt: '2026-12-09T16:00:00Z' });
    const todayEarly = visitJson({ plannedStartAt: '2026-12-09T06:00:00Z', plannedEndAt: '2026-12-09T07:00:00Z' });
    const friday = visitJson({ plannedStartAt: '2026-12-11T07:00:00Z', plannedEndAt: '2026-12-11T08:00:00Z' });
    const underWay = visitJson({ state: 'under-way', plannedStartAt: '2026-12-09T08:00:00Z', plannedEndAt: '2026-12-09T10:00:00Z' });
    const missed = visitJson({ state: 'missed', plannedStartAt: '2026-12-02T07:00:00Z', plannedEndAt: '2026-12-02T08:00:00Z' });
    const loggedPast = visitJson({ state: 'logged', plannedStartAt: '2026-12-03T07:00:00Z', plannedEndAt: '2026-12-03T08:00:00Z' });

    const groups = groupMyVisits(
      [nextWeekLate, inThreeWeeks, todayLate, friday, loggedPast, nextWeekEarly, missed, todayEarly, underWay],
      NOW,
    );
    expect(groups.map((g) => [g.kind, g.weekOn, g.visits.map((v) => v.id)])).toEqual([
      ['under-way', undefined, [underWay.id]],
      ['today', undefined, [todayEarly.id, todayLate.id]],
      ['this-week', undefined, [friday.id]],
      ['coming', '2026-12-14', [nextWeekEarly.id, nextWeekLate.id]],
      ['coming', '2026-12-28', [inThreeWeeks.id]],
      ['earlier', undefined, [missed.id]],
    ]);
  });

  it('when there are no visits, then there are no groups', () => {
    expect(groupMyVisits([], NOW)).toEqual([]);
  });
});

describe('groupTitle', () => {
  it('when a coming week is named, then its Monday is given', () => {
    expect(groupTitle({ kind: 'coming', weekOn: '2026-12-14' })).toBe('Week of Mon 14 Dec');
    expect(groupTitle({ kind: 'today' })).toBe('Today');
    expect(groupTitle({ kind: 'this-week' })).toBe('Later this week');
  });
});
