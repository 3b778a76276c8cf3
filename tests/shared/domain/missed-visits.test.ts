import { describe, expect, it } from 'vitest';
import { isVisitMissed, missedVisitCutoff } from '../../../shared/domain/missed-visits';

describe('missedVisitCutoff', () => {
  it('when the while is 12 h, then the cutoff is 12 h before the check', () => {
    expect(missedVisitCutoff(new Date('2027-01-10T12:00:00Z'), 12).toISOString()).toBe(
      '2027-01-10T00:00:00.000Z',
    );
  });

  it('when the while is 0 h, then the cutoff is the check itself', () => {
    expect(missedVisitCutoff(new Date('2027-01-10T12:00:00Z'), 0).toISOString()).toBe(
      '2027-01-10T12:00:00.000Z',
    );
  });

  it('when the while is a fraction of an hour, then it counts in minutes', () => {
    expect(missedVisitCutoff(new Date('2027-01-10T12:00:00Z'), 1.5).toISOString()).toBe(
      '2027-01-10T10:30:00.000Z',
    );
  });

  it('when the while is negative or not a number, then it is refused', () => {
    expect(() => missedVisitCutoff(new Date(), -1)).toThrow(RangeError);
    expect(() => missedVisitCutoff(new Date(), Number.NaN)).toThrow(RangeError);
  });
});

describe('isVisitMissed', () => {
  const end = '2027-01-09T14:00:00.000Z';

  it('when a planned visit ended more than the while ago, then it is missed', () => {
    expect(
      isVisitMissed({ state: 'planned', plannedEndAt: end }, new Date('2027-01-10T02:00:01Z'), 12),
    ).toBe(true);
  });

  it('when the end plus the while is exactly now, then it is not yet missed', () => {
    expect(
      isVisitMissed({ state: 'planned', plannedEndAt: end }, new Date('2027-01-10T02:00:00Z'), 12),
    ).toBe(false);
  });

  it('when the visit is under way, logged, reviewed, missed or cancelled, then it is never (again) missed', () => {
    for (const state of ['under-way', 'logged', 'reviewed', 'missed', 'cancelled']) {
      expect(
        isVisitMissed({ state, plannedEndAt: end }, new Date('2027-02-01T00:00:00Z'), 12),
      ).toBe(false);
    }
  });
});
