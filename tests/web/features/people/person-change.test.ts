import { describe, expect, it } from 'vitest';
import type { Person } from '../../../../shared/schemas/person';
import {
  changeOfDraft,
  draftOf,
  hoursPerWeekText,
} from '../../../../web/src/features/people/utils/person-change';

const NORTH = '11111111-1111-4111-8111-111111111111';
const SOUTH = '22222222-2222-4222-8222-222222222222';

const person: Person = {
  id: '33333333-3333-4333-8333-333333333333',
  name: 'Ines Falk',
  email: 'ines@brackenmoor.example',
  roles: ['technician'],
  active: true,
  lastSignInAt: null,
  siteIds: [NORTH],
  sites: [{ id: NORTH, name: 'Northfleet', code: 'N', timeZone: 'Europe/London' }],
  availableHoursPerWeek: 37.5,
  createdAt: '2026-01-01T00:00:00.000Z',
};

describe('changeOfDraft', () => {
  it('when nothing moved, then there is nothing to send', () => {
    expect(changeOfDraft(person, draftOf(person))).toEqual({ ok: true, change: null });
  });

  it('when only the hours moved, then only the hours are sent, as a number', () => {
    expect(changeOfDraft(person, { ...draftOf(person), hoursText: '30' })).toEqual({
      ok: true,
      change: { availableHoursPerWeek: 30 },
    });
  });

  it('when the hours are typed with a decimal comma, then they are read as a decimal', () => {
    expect(changeOfDraft(person, { ...draftOf(person), hoursText: '22,5' })).toEqual({
      ok: true,
      change: { availableHoursPerWeek: 22.5 },
    });
  });

  it('when the sites are the same in another order, then they are not sent', () => {
    const both = { ...person, siteIds: [NORTH, SOUTH] };
    expect(changeOfDraft(both, { ...draftOf(both), siteIds: [SOUTH, NORTH] }).ok).toBe(true);
    expect(changeOfDraft(both, { ...draftOf(both), siteIds: [SOUTH, NORTH] })).toMatchObject({ change: null });
  });

  it('when a site is added, then the whole list is sent and nothing else', () => {
    expect(changeOfDraft(person, { ...draftOf(person), siteIds: [NORTH, SOUTH] })).toEqual({
      ok: true,
      change: { siteIds: [NORTH, SOUTH] },
    });
  });

  it('when every site is taken off, then an empty list is sent', () => {
    expect(changeOfDraft(person, { ...draftOf(person), siteIds: [] })).toEqual({
      ok: true,
      change: { siteIds: [] },
    });
  });

  it.each([
    ['81', 'The hours a week must be at most 80.'],
    ['-2', 'The hours a week must be at least 0.'],
    ['12.25', 'Give the hours a week to one decimal place at most (e.g. 37.5).'],
    ['lots', 'Enter the hours a week as a number.'],
    ['', 'Enter the hours a week as a number.'],
  ])('when the hours are "%s", then the field says what is wrong in the API’s words', (hoursText, message) => {
    expect(changeOfDraft(person, { ...draftOf(person), hoursText })).toEqual({
      ok: false,
      field: 'availableHoursPerWeek',
      message,
    });
  });

  it('when roles change, then they are sent in the order of the role list', () => {
    expect(
      changeOfDraft(person, { ...draftOf(person), roles: ['technician', 'admin'] }),
    ).toEqual({ ok: true, change: { roles: ['admin', 'technician'] } });
  });
});

describe('hoursPerWeekText', () => {
  it('when the hours are whole or a half, then they read plainly', () => {
    expect(hoursPerWeekText(37.5)).toBe('37.5 h a week');
    expect(hoursPerWeekText(0)).toBe('0 h a week');
  });
});
