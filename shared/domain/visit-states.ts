/**
 * The life of a visit: planned → under way → logged → reviewed, or missed, or cancelled; and
 * who may move it. Pure rules: the API applies them and refuses everything else.
 *
 * | action   | from                         | to        | who                                  |
 * |----------|------------------------------|-----------|--------------------------------------|
 * | start    | planned                      | under-way | an assigned technician               |
 * | log      | under-way                    | logged    | an assigned technician               |
 * | review   | logged                       | reviewed  | reliability or admin                 |
 * | cancel   | planned, under-way, missed   | cancelled | planner or admin (with a reason)     |
 * | replan   | planned, missed              | planned   | planner or admin (with a reason)     |
 * | miss     | planned                      | missed    | Ebbline itself (the scheduled job)   |
 */
import { VISIT_PLANNERS, VISIT_REVIEWERS, VISIT_TECHNICIAN_ROLE } from '../constants/planning';
import type { Role } from '../constants/roles';

/** The states of a visit, in the order a visit normally passes through them. */
export const VISIT_STATES = ['planned', 'under-way', 'logged', 'reviewed', 'missed', 'cancelled'] as const;
export type VisitState = (typeof VISIT_STATES)[number];

/** How each state is named on screen. */
export const VISIT_STATE_LABELS: Record<VisitState, string> = {
  planned: 'planned',
  'under-way': 'under way',
  logged: 'logged',
  reviewed: 'reviewed',
  missed: 'missed',
  cancelled: 'cancelled',
};

/** What may happen to a visit. */
export const VISIT_ACTIONS = ['start', 'log', 'review', 'cancel', 'replan', 'miss'] as const;
export type VisitAction = (typeof VISIT_ACTIONS)[number];

/** How each action is named on screen (a button, an audit summary). */
export const VISIT_ACTION_LABELS: Record<VisitAction, string> = {
  start: 'start',
  log: 'log',
  review: 'review',
  cancel: 'cancel',
  replan: 'replan',
  miss: 'mark missed',
};

/** The actions a person sends to `POST /api/visits/:visitId/transitions`. */
export const VISIT_TRANSITION_ACTIONS = ['start', 'log', 'review', 'cancel'] as const;
export type VisitTransitionAction = (typeof VISIT_TRANSITION_ACTIONS)[number];

/** Actions that need a reason from the person taking them. */
export const VISIT_ACTIONS_NEEDING_REASON: readonly VisitAction[] = ['cancel', 'replan'];

const TRANSITIONS: Record<VisitAction, { from: readonly VisitState[]; to: VisitState }> = {
  start: { from: ['planned'], to: 'under-way' },
  log: { from: ['under-way'], to: 'logged' },
  review: { from: ['logged'], to: 'reviewed' },
  cancel: { from: ['planned', 'under-way', 'missed'], to: 'cancelled' },
  replan: { from: ['planned', 'missed'], to: 'planned' },
  miss: { from: ['planned'], to: 'missed' },
};

/**
 * The state a visit reaches when `action` is taken in `state`, or null when the action is not
 * possible there.
 *
 * @example nextVisitState('planned', 'start') // 'under-way'
 * @example nextVisitState('logged', 'start') // null
 */
export function nextVisitState(state: VisitState, action: VisitAction): VisitState | null {
  const rule = TRANSITIONS[action];
  return rule.from.includes(state) ? rule.to : null;
}

/** The states in which `action` may be taken. */
export function statesAllowing(action: VisitAction): readonly VisitState[] {
  return TRANSITIONS[action].from;
}

/**
 * True when a person holding `roles` may take `action` on a visit (the state aside).
 * `isAssigned` says whether the person is one of the visit's technicians: start and log are
 * theirs alone (an admin who is not assigned may not start someone else's visit). `miss` is
 * never a person's: only Ebbline's scheduled job takes it (`roles` empty, `actor` null).
 *
 * @param input.roles - the person's roles; pass `null` for Ebbline itself (the scheduled job)
 * @example mayTakeVisitAction({ action: 'review', roles: ['reliability'], isAssigned: false }) // true
 * @example mayTakeVisitAction({ action: 'start', roles: ['planner'], isAssigned: false }) // false
 */
export function mayTakeVisitAction(input: {
  action: VisitAction;
  roles: readonly string[] | null;
  isAssigned: boolean;
}): boolean {
  const { action, roles, isAssigned } = input;
  if (roles === null) return action === 'miss';
  const holds = (allowed: readonly Role[]) => allowed.some((role) => roles.includes(role));
  switch (action) {
    case 'start':
    case 'log':
      return isAssigned && roles.includes(VISIT_TECHNICIAN_ROLE);
    case 'review':
      return holds(VISIT_REVIEWERS);
    case 'cancel':
    case 'replan':
      return holds(VISIT_PLANNERS);
    case 'miss':
      return false;
  }
}

/**
 * A sentence saying why `action` cannot be taken in `state`, e.g. "A logged visit can't be
 * started."
 */
export function visitStateRefusal(state: VisitState, action: VisitAction): string {
  const article = state === 'under-way' ? 'An' : 'A';
  const verb: Record<VisitAction, string> = {
    start: 'started',
    log: 'logged',
    review: 'reviewed',
    cancel: 'cancelled',
    replan: 'replanned',
    miss: 'marked missed',
  };
  return `${article} ${VISIT_STATE_LABELS[state]} visit can't be ${verb[action]}.`;
}
