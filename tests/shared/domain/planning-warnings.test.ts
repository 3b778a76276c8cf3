import { describe, expect, it } from 'vitest';
import {
  insideSomeOccurrence,
  localDateOf,
  planningWarnings,
  spansOverlap,
  unacceptedKinds,
  type PlanningFacts,
} from '../../../shared/domain/planning-warnings';

/** A visit Saturday 2027-01-09 07:00–09:00 UTC in a 06:00–14:00 UTC window, Ana on it, bank A due. */
function facts(overrides: Partial<PlanningFacts> = {}): PlanningFacts {
  return {
    visit: { startAt: '2027-01-09T07:00:00Z', endAt: '2027-01-09T09:00:00Z', technicianIds: ['ana'], bankIds: ['a'] },
    timeZone: 'Europe/London',
    windowOccurrences: [{ startsAt: '2027-01-09T06:00:00Z', endsAt: '2027-01-09T14:00:00Z' }],
    otherVisits: [],
    technicianNames: { ana: 'Ana Ferreira', ben: 'Ben Okafor' },
    banks: [{ id: 'a', position: 'DC1', dueOn: '2026-12-01' }],
    ...overrides,
  };
}

describe('planningWarnings: outside-window', () => {
  it('when the visit lies wholly inside one occurrence, then no warning', () => {
    expect(planningWarnings(facts())).toEqual([]);
  });

  it('when the visit starts and ends exactly with the occurrence, then it is inside', () => {
    const visit = { ...facts().visit, startAt: '2027-01-09T06:00:00Z', endAt: '2027-01-09T14:00:00Z' };
    expect(planningWarnings(facts({ visit }))).toEqual([]);
  });

  it('when the visit runs a minute past the end, then outside-window', () => {
    const visit = { ...facts().visit, startAt: '2027-01-09T13:00:00Z', endAt: '2027-01-09T14:01:00Z' };
    expect(planningWarnings(facts({ visit })).map((w) => w.kind)).toEqual(['outside-window']);
  });

  it('when the visit spans two back-to-back occurrences, then it is not inside one of them', () => {
    const windowOccurrences = [
      { startsAt: '2027-01-09T06:00:00Z', endsAt: '2027-01-09T08:00:00Z' },
      { startsAt: '2027-01-09T08:00:00Z', endsAt: '2027-01-09T10:00:00Z' },
    ];
    expect(planningWarnings(facts({ windowOccurrences })).map((w) => w.kind)).toEqual(['outside-window']);
  });

  it('when there is no occurrence at all, then the message says every window', () => {
    expect(planningWarnings(facts({ windowOccurrences: [] }))).toEqual([
      { kind: 'outside-window', message: 'The visit falls outside every shutdown window of its area.' },
    ]);
  });
});

describe('planningWarnings: double-booked', () => {
  const other = { id: 'v2', cabinetTag: 'BRK-M2-VFD-014', technicianIds: ['ana'], startAt: '2027-01-09T08:30:00Z', endAt: '2027-01-09T10:00:00Z' };

  it('when an assigned technician has an overlapping visit, then one warning naming them and the other cabinet', () => {
    expect(planningWarnings(facts({ otherVisits: [other] }))).toEqual([
      { kind: 'double-booked', technicianId: 'ana', message: 'Ana Ferreira already has a visit to BRK-M2-VFD-014 at that time.' },
    ]);
  });

  it('when the other visit only touches (ends as this starts), then no warning', () => {
    const touching = { ...other, startAt: '2027-01-09T05:00:00Z', endAt: '2027-01-09T07:00:00Z' };
    expect(planningWarnings(facts({ otherVisits: [touching] }))).toEqual([]);
  });

  it('when the overlapping visit is someone else’s, then no warning for Ana', () => {
    expect(planningWarnings(facts({ otherVisits: [{ ...other, technicianIds: ['ben'] }] }))).toEqual([]);
  });

  it('when two technicians are each double-booked, then one warning each, in the visit’s order', () => {
    const visit = { ...facts().visit, technicianIds: ['ben', 'ana'] };
    const warnings = planningWarnings(facts({ visit, otherVisits: [other, { ...other, id: 'v3', technicianIds: ['ben'] }] }));
    expect(warnings.map((w) => w.technicianId)).toEqual(['ben', 'ana']);
  });

  it('when a technician has several overlapping visits, then one warning naming the earliest', () => {
    const earlier = { ...other, id: 'v0', cabinetTag: 'EARLY-1', startAt: '2027-01-09T06:30:00Z', endAt: '2027-01-09T07:30:00Z' };
    const warnings = planningWarnings(facts({ otherVisits: [other, earlier] }));
    expect(warnings).toHaveLength(1);
    expect(warnings[0]!.message).toContain('EARLY-1');
  });
});

describe('planningWarnings: not-due', () => {
  it('when a bank is due after the local date of the visit’s end, then not-due names it', () => {
    const banks = [{ id: 'a', position: 'DC1', dueOn: '2027-03-01' }];
    expect(planningWarnings(facts({ banks }))).toEqual([{ kind: 'not-due', bankId: 'a', message: 'Bank DC1 is not due until 2027-03-01.' }]);
  });

  it('when the bank is due on the visit’s day, then no warning', () => {
    expect(planningWarnings(facts({ banks: [{ id: 'a', position: 'DC1', dueOn: '2027-01-09' }] }))).toEqual([]);
  });

  it('when the visit ends after local midnight, then the due date counts against the local date', () => {
    // ends 2027-06-30 23:30 UTC = 2027-07-01 01:30 in Berlin (CEST, UTC+2): a bank due 07-01 is due
    const visit = { ...facts().visit, startAt: '2027-06-30T22:00:00Z', endAt: '2027-06-30T23:30:00Z' };
    const windowOccurrences = [{ startsAt: '2027-06-30T20:00:00Z', endsAt: '2027-07-01T04:00:00Z' }];
    const banks = [{ id: 'a', position: 'DC1', dueOn: '2027-07-01' }];
    expect(planningWarnings(facts({ visit, windowOccurrences, banks, timeZone: 'Europe/Berlin' }))).toEqual([]);
    expect(planningWarnings(facts({ visit, windowOccurrences, banks, timeZone: 'UTC' })).map((w) => w.kind)).toEqual(['not-due']);
  });
});

describe('planningWarnings: order and overrides', () => {
  it('when all three kinds come together, then outside-window, double-booked, not-due in that order', () => {
    const warnings = planningWarnings(
      facts({
        windowOccurrences: [],
        otherVisits: [{ id: 'v2', cabinetTag: 'X-1', technicianIds: ['ana'], startAt: '2027-01-09T07:30:00Z', endAt: '2027-01-09T08:00:00Z' }],
        banks: [{ id: 'a', position: 'DC1', dueOn: '2028-01-01' }],
      }),
    );
    expect(warnings.map((w) => w.kind)).toEqual(['outside-window', 'double-booked', 'not-due']);
    expect(unacceptedKinds(warnings, [{ kind: 'not-due' }])).toEqual(['outside-window', 'double-booked']);
    expect(unacceptedKinds(warnings, [{ kind: 'not-due' }, { kind: 'double-booked' }, { kind: 'outside-window' }])).toEqual([]);
  });
});

describe('helpers', () => {
  it('when an instant is late on a UTC day, then its local date in Berlin is the next day', () => {
    expect(localDateOf('2027-01-09T23:30:00Z', 'Europe/Berlin')).toBe('2027-01-10');
    expect(localDateOf('2027-01-09T23:30:00Z', 'America/New_York')).toBe('2027-01-09');
  });

  it('when spans touch or overlap, then spansOverlap says no and yes', () => {
    const a = { startAt: '2027-01-09T07:00:00Z', endAt: '2027-01-09T08:00:00Z' };
    expect(spansOverlap(a, { startAt: '2027-01-09T08:00:00Z', endAt: '2027-01-09T09:00:00Z' })).toBe(false);
    expect(spansOverlap(a, { startAt: '2027-01-09T07:59:00Z', endAt: '2027-01-09T09:00:00Z' })).toBe(true);
    expect(insideSomeOccurrence(a, [{ startsAt: '2027-01-09T07:00:00Z', endsAt: '2027-01-09T08:00:00Z' }])).toBe(true);
  });
});
