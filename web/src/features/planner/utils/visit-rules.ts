/**
 * What the Planner offers a person on a visit, from the shared state rules. The server decides
 * (403 or 409 otherwise); the screen only leaves out what a role or a state cannot use.
 */
import { mayTakeVisitAction, nextVisitState } from '../../../../../shared/domain/visit-states';
import type { Visit } from '../api/shapes';

export interface PlannerPermissions {
  /** Planners and admins: plan, move, reassign, cancel. */
  plan: boolean;
  /** Reliability engineers and admins: review logged visits. */
  review: boolean;
}

/** The Planner's permissions of a person's roles. */
export function plannerPermissions(roles: readonly string[]): PlannerPermissions {
  return {
    plan: mayTakeVisitAction({ action: 'replan', roles, isAssigned: false }),
    review: mayTakeVisitAction({ action: 'review', roles, isAssigned: false }),
  };
}

/** The actions the visit panel shows for a visit. */
export function visitActions(visit: Pick<Visit, 'state'>, can: PlannerPermissions): { cancel: boolean; review: boolean; replan: boolean } {
  return {
    cancel: can.plan && nextVisitState(visit.state, 'cancel') !== null,
    review: can.review && nextVisitState(visit.state, 'review') !== null,
    replan: can.plan && nextVisitState(visit.state, 'replan') !== null,
  };
}
