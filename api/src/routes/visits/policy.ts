import { VISIT_PLANNERS, VISIT_READERS } from '../../../../shared/constants/planning';

/**
 * Who may use the visit routes. Per record, the services decide further: a technician reads the
 * visits assigned to them and every visit of their sites (others are "not found"), and starts
 * and logs only their own; reliability engineers review; planners and admins cancel and replan.
 */
export const visitPolicy = {
  read: VISIT_READERS,
  plan: VISIT_PLANNERS,
  /** Everyone with a role may ask; the state rules say who may take which action. */
  transition: VISIT_READERS,
} as const;
