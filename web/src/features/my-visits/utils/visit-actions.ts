/** What a technician may do with a visit on My visits: start it, or mark it as logged. */
import type { Role } from '../../../../../shared/constants/roles';
import { mayTakeVisitAction, nextVisitState } from '../../../../../shared/domain/visit-states';
import type { Visit } from '../../../../../shared/schemas/visit';

/** The two actions My visits offers. */
export type MyVisitAction = 'start' | 'log';

/** Who is looking. */
export interface Viewer {
  id: string;
  roles: readonly Role[];
}

/** True when the viewer is one of the visit's technicians. */
export function isAssigned(visit: Pick<Visit, 'technicians'>, viewer: Pick<Viewer, 'id'>): boolean {
  return visit.technicians.some((t) => t.id === viewer.id);
}

/**
 * The action the viewer may take on the visit now (the same rules the API applies), or null:
 * `start` for a planned visit, `log` for one under way, only for an assigned technician.
 */
export function nextActionFor(visit: Pick<Visit, 'state' | 'technicians'>, viewer: Viewer): MyVisitAction | null {
  const assigned = isAssigned(visit, viewer);
  for (const action of ['start', 'log'] as const) {
    if (nextVisitState(visit.state, action) !== null && mayTakeVisitAction({ action, roles: viewer.roles, isAssigned: assigned })) {
      return action;
    }
  }
  return null;
}

/** The button of each action. */
export const ACTION_BUTTON_TEXT: Record<MyVisitAction, string> = {
  start: 'Start visit',
  log: 'Mark as logged',
};

/** The visits of others at my sites: those of `visits` the viewer is not assigned to. */
export function othersVisits<V extends Pick<Visit, 'technicians'>>(visits: readonly V[], viewer: Pick<Viewer, 'id'>): V[] {
  return visits.filter((visit) => !visit.technicians.some((t) => t.id === viewer.id));
}
