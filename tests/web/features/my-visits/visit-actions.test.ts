import { describe, expect, it } from 'vitest';
import { VISIT_STATES } from '../../../../shared/domain/visit-states';
import { isAssigned, nextActionFor, othersVisits } from '../../../../web/src/features/my-visits/utils/visit-actions';
import { visitJson } from '../../../support/visit-json';

const me = { id: 'tech-1', roles: ['technician'] as const };

describe('nextActionFor', () => {
  it('when my visit is planned, then I may start it; under way, log it', () => {
    expect(nextActionFor(visitJson({ state: 'planned' }), me)).toBe('start');
    expect(nextActionFor(visitJson({ state: 'under-way' }), me)).toBe('log');
  });

  it.each(VISIT_STATES.filter((s) => s !== 'planned' && s !== 'under-way'))(
    'when my visit is %s, then there is nothing to press',
    (state) => {
      expect(nextActionFor(visitJson({ state }), me)).toBeNull();
    },
  );

  it('when the visit is at my site but assigned to someone else, then I may not start it', () => {
    const theirs = visitJson({ technicians: [{ id: 'tech-2', name: 'Kofi Mensah' }] });
    expect(isAssigned(theirs, me)).toBe(false);
    expect(nextActionFor(theirs, me)).toBeNull();
  });

  it('when an admin is listed on a visit but holds no technician role, then they may not start it', () => {
    expect(nextActionFor(visitJson({ state: 'planned' }), { id: 'tech-1', roles: ['admin'] })).toBeNull();
  });
});

describe('othersVisits', () => {
  it('when my visits and colleagues’ come together, then only the colleagues’ are left', () => {
    const mine = visitJson({ technicians: [{ id: 'tech-1', name: 'Ines Falk' }] });
    const shared = visitJson({ technicians: [{ id: 'tech-2', name: 'Kofi Mensah' }, { id: 'tech-1', name: 'Ines Falk' }] });
    const theirs = visitJson({ technicians: [{ id: 'tech-2', name: 'Kofi Mensah' }] });
    expect(othersVisits([mine, shared, theirs], me).map((v) => v.id)).toEqual([theirs.id]);
  });
});
