import { describe, expect, it } from 'vitest';
import { ROLES } from '../../../shared/constants/roles';
import {
  mayTakeVisitAction,
  nextVisitState,
  statesAllowing,
  VISIT_ACTIONS,
  VISIT_STATE_LABELS,
  VISIT_STATES,
  visitStateRefusal,
  type VisitAction,
  type VisitState,
} from '../../../shared/domain/visit-states';

/** The whole table written out by hand from the contract: action → from-states → to. */
const ALLOWED: Record<VisitAction, Partial<Record<VisitState, VisitState>>> = {
  start: { planned: 'under-way' },
  log: { 'under-way': 'logged' },
  review: { logged: 'reviewed' },
  cancel: { planned: 'cancelled', 'under-way': 'cancelled', missed: 'cancelled' },
  replan: { planned: 'planned', missed: 'planned' },
  miss: { planned: 'missed' },
};

describe('nextVisitState', () => {
  for (const action of VISIT_ACTIONS) {
    for (const state of VISIT_STATES) {
      const expected = ALLOWED[action][state] ?? null;
      it(`when ${action} is taken on a ${state} visit, then ${expected ?? 'it is refused (null)'}`, () => {
        expect(nextVisitState(state, action)).toBe(expected);
      });
    }
  }

  it('when a visit is reviewed or cancelled, then no action moves it again', () => {
    for (const action of VISIT_ACTIONS) {
      expect(nextVisitState('reviewed', action)).toBeNull();
      expect(nextVisitState('cancelled', action)).toBeNull();
    }
  });

  it('when asked which states allow cancel, then planned, under way and missed', () => {
    expect([...statesAllowing('cancel')]).toEqual(['planned', 'under-way', 'missed']);
  });
});

describe('mayTakeVisitAction', () => {
  it('when an assigned technician starts or logs, then yes; an unassigned one, then no', () => {
    for (const action of ['start', 'log'] as const) {
      expect(mayTakeVisitAction({ action, roles: ['technician'], isAssigned: true })).toBe(true);
      expect(mayTakeVisitAction({ action, roles: ['technician'], isAssigned: false })).toBe(false);
    }
  });

  it('when a planner, admin or reliability engineer who is not assigned starts or logs, then no', () => {
    for (const role of ['planner', 'admin', 'reliability'] as const) {
      expect(mayTakeVisitAction({ action: 'start', roles: [role], isAssigned: false })).toBe(false);
      expect(mayTakeVisitAction({ action: 'log', roles: [role], isAssigned: false })).toBe(false);
    }
  });

  it('when each role reviews, cancels or replans, then only the roles of the rules may', () => {
    const expected: Record<'review' | 'cancel' | 'replan', string[]> = {
      review: ['admin', 'reliability'],
      cancel: ['admin', 'planner'],
      replan: ['admin', 'planner'],
    };
    for (const action of ['review', 'cancel', 'replan'] as const) {
      const allowed = ROLES.filter((role) => mayTakeVisitAction({ action, roles: [role], isAssigned: true }));
      expect([...allowed].sort()).toEqual(expected[action]);
    }
  });

  it('when anyone but Ebbline marks a visit missed, then no; Ebbline itself (roles null), then yes', () => {
    for (const role of ROLES) {
      expect(mayTakeVisitAction({ action: 'miss', roles: [role], isAssigned: true })).toBe(false);
    }
    expect(mayTakeVisitAction({ action: 'miss', roles: null, isAssigned: false })).toBe(true);
  });

  it('when Ebbline itself takes a person’s action, then no', () => {
    for (const action of ['start', 'log', 'review', 'cancel', 'replan'] as const) {
      expect(mayTakeVisitAction({ action, roles: null, isAssigned: false })).toBe(false);
    }
  });

  it('when a person holds no role at all, then no action', () => {
    for (const action of VISIT_ACTIONS) {
      expect(mayTakeVisitAction({ action, roles: [], isAssigned: true })).toBe(false);
    }
  });
});

describe('visitStateRefusal and labels', () => {
  it('when a logged visit is started, then the sentence says so', () => {
    expect(visitStateRefusal('logged', 'start')).toBe("A logged visit can't be started.");
  });

  it('when an under-way visit is reviewed, then "An under way visit"', () => {
    expect(visitStateRefusal('under-way', 'review')).toBe("An under way visit can't be reviewed.");
  });

  it('when labels are shown, then under-way reads "under way" (DOMAIN.md glossary)', () => {
    expect(VISIT_STATE_LABELS['under-way']).toBe('under way');
    expect(Object.keys(VISIT_STATE_LABELS)).toEqual([...VISIT_STATES]);
  });
});
