import { describe, expect, it } from 'vitest';
import { draftInput, draftProblems, fieldErrors, slotTimes, weekOnOf, type VisitDraft } from '../../../../web/src/features/planner/utils/visit-form';

const draft: VisitDraft = {
  siteId: 's1',
  areaId: 'a1',
  cabinetId: 'c1',
  bankIds: ['b2', 'b1'],
  technicianIds: ['t1'],
  plannedStartAt: '2026-12-12T05:00:00.000Z',
  plannedEndAt: '2026-12-12T07:00:00.000Z',
  notes: '  key at the gate  ',
};

describe('draftProblems', () => {
  it('when the draft is complete, then no problem', () => {
    expect(draftProblems(draft)).toEqual({});
  });

  it('when banks and technicians are missing, then each field says so', () => {
    expect(draftProblems({ ...draft, bankIds: [], technicianIds: [] })).toEqual({
      bankIds: 'Tick at least one bank.',
      technicianIds: 'Tick at least one technician.',
    });
  });

  it('when the end is not after the start, then the end field says so', () => {
    expect(draftProblems({ ...draft, plannedEndAt: draft.plannedStartAt }).plannedEndAt).toBe('The end comes after the start.');
  });
});

describe('draftInput', () => {
  it('when complete, then the body with sorted ids and trimmed notes', () => {
    expect(draftInput(draft)).toEqual({
      cabinetId: 'c1',
      bankIds: ['b1', 'b2'],
      technicianIds: ['t1'],
      plannedStartAt: '2026-12-12T05:00:00.000Z',
      plannedEndAt: '2026-12-12T07:00:00.000Z',
      notes: 'key at the gate',
    });
  });

  it('when incomplete, then null (nothing is checked yet)', () => {
    expect(draftInput({ ...draft, cabinetId: '' })).toBeNull();
  });

  it('when notes are blank, then they are left out', () => {
    expect(draftInput({ ...draft, notes: '   ' })).not.toHaveProperty('notes');
  });
});

describe('weekOnOf', () => {
  it('when a visit starts late on a Sunday in New York, then its week is the Monday before, there', () => {
    // Mon 7 Dec 2026 is a Monday; 2026-12-14T03:00Z is Sunday 13 Dec 22:00 in New York
    expect(weekOnOf('2026-12-14T03:00:00Z', 'America/New_York')).toBe('2026-12-07');
    expect(weekOnOf('2026-12-14T03:00:00Z', 'Europe/Berlin')).toBe('2026-12-14');
  });
});

describe('slotTimes', () => {
  it('when a whole day is picked, then 08:00–10:00 that day', () => {
    const { start, end } = slotTimes(new Date(2026, 11, 12), new Date(2026, 11, 13), true);
    expect([start.getDate(), start.getHours(), end.getHours()]).toEqual([12, 8, 10]);
  });

  it('when a time slot is picked, then its own times', () => {
    const slot = { start: new Date(2026, 11, 12, 6, 30), end: new Date(2026, 11, 12, 9) };
    expect(slotTimes(slot.start, slot.end, false)).toEqual(slot);
  });
});

describe('fieldErrors', () => {
  it('when the API names fields by path, then the first message of each field', () => {
    expect(
      fieldErrors([
        { path: 'bankIds.1', message: 'Bank B is not in service.' },
        { path: ['bankIds', 0], message: 'second' },
        { path: ['plannedEndAt'], message: 'The planned end must come after the planned start.' },
      ]),
    ).toEqual({ bankIds: 'Bank B is not in service.', plannedEndAt: 'The planned end must come after the planned start.' });
  });
});
