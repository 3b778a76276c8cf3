import { describe, expect, it } from 'vitest';
import { VISIT_STATES } from '../../../../web/src/features/planner/api/shapes';
import { plannerPermissions, visitActions } from '../../../../web/src/features/planner/utils/visit-rules';

describe('plannerPermissions', () => {
  it('when the roles are given, then planners and admins plan, reliability and admins review, technicians neither', () => {
    expect(plannerPermissions(['planner'])).toEqual({ plan: true, review: false });
    expect(plannerPermissions(['reliability'])).toEqual({ plan: false, review: true });
    expect(plannerPermissions(['admin'])).toEqual({ plan: true, review: true });
    expect(plannerPermissions(['technician'])).toEqual({ plan: false, review: false });
  });
});

describe('visitActions', () => {
  const everything = { plan: true, review: true };

  it('when each state is shown to an admin, then cancel, review and replan follow the state rules', () => {
    const table = Object.fromEntries(VISIT_STATES.map((state) => [state, visitActions({ state }, everything)]));
    expect(table).toEqual({
      planned: { cancel: true, review: false, replan: true },
      'under-way': { cancel: true, review: false, replan: false },
      logged: { cancel: false, review: true, replan: false },
      reviewed: { cancel: false, review: false, replan: false },
      missed: { cancel: true, review: false, replan: true },
      cancelled: { cancel: false, review: false, replan: false },
    });
  });

  it('when a technician looks, then no action is offered', () => {
    expect(visitActions({ state: 'planned' }, { plan: false, review: false })).toEqual({ cancel: false, review: false, replan: false });
  });
});
