import { describe, expect, it } from 'vitest';
import type { PlanningWarning } from '../../../../web/src/features/planner/api/shapes';
import {
  groupWarnings,
  isReasonGiven,
  kindsMissingReason,
  overridesFor,
  warningsFromIssues,
} from '../../../../web/src/features/planner/utils/warnings';

const warnings: PlanningWarning[] = [
  { kind: 'double-booked', message: 'Ana has another visit then.', technicianId: 't1' },
  { kind: 'outside-window', message: 'Not inside a shutdown window of Hall 2.' },
  { kind: 'double-booked', message: 'Ben has another visit then.', technicianId: 't2' },
];

describe('groupWarnings', () => {
  it('when two warnings share a kind, then they are one group with both messages, in first-seen order', () => {
    const groups = groupWarnings(warnings);
    expect(groups.map((g) => g.kind)).toEqual(['double-booked', 'outside-window']);
    expect(groups[0]!.messages).toEqual(['Ana has another visit then.', 'Ben has another visit then.']);
    expect(groups[0]!.label).toBe('Technician double-booked');
  });
});

describe('reasons', () => {
  it('when a reason is under 3 characters after trimming, then it is not given', () => {
    expect(isReasonGiven('  ok ')).toBe(false);
    expect(isReasonGiven('yes')).toBe(true);
    expect(isReasonGiven(undefined)).toBe(false);
  });

  it('when one kind has no reason, then it is the one missing', () => {
    expect(kindsMissingReason(warnings, { 'double-booked': 'Ben swaps shifts' })).toEqual(['outside-window']);
    expect(kindsMissingReason(warnings, { 'double-booked': 'Ben swaps shifts', 'outside-window': 'line stops anyway' })).toEqual([]);
    expect(kindsMissingReason([], {})).toEqual([]);
  });

  it('when overrides are made, then one per kind warned, trimmed, and none for kinds no longer warned', () => {
    expect(overridesFor(warnings, { 'double-booked': ' Ben swaps ', 'not-due': 'stale reason' })).toEqual([
      { kind: 'double-booked', reason: 'Ben swaps' },
      { kind: 'outside-window', reason: '' },
    ]);
  });
});

describe('warningsFromIssues', () => {
  it('when a 422 names warnings, then they become warnings; issues of no known kind are left out', () => {
    expect(
      warningsFromIssues([
        { path: ['overrides'], kind: 'not-due', message: 'Bank A is due on 2027-03-01.' },
        { path: ['overrides'], message: 'no kind' },
        { path: ['overrides'], kind: 'made-up', message: 'x' },
      ]),
    ).toEqual([{ kind: 'not-due', message: 'Bank A is due on 2027-03-01.' }]);
  });
});
