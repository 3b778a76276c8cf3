/**
 * The answers the Planner reads: visits (GET /api/visits), shutdown windows with their
 * occurrences (GET /api/shutdown-windows) and planning warnings (POST /api/visits/check).
 */
import type { z } from 'zod';
import type { visitUpdateSchema } from '../../../../../shared/schemas/visit';

export { PLANNING_WARNING_KINDS, type PlanningWarningKind } from '../../../../../shared/constants/planning';
export { VISIT_STATE_LABELS, VISIT_STATES, type VisitState, type VisitTransitionAction } from '../../../../../shared/domain/visit-states';
export type { PlanningOverride as VisitOverride, PlanningWarning, Visit, VisitInput } from '../../../../../shared/schemas/visit';

/** The body of PATCH /api/visits/:visitId: names only what changes. */
export type VisitChange = z.input<typeof visitUpdateSchema>;

export type { ShutdownWindow, ShutdownWindowOccurrence as WindowOccurrence } from '../../../../../shared/schemas/shutdown-window';
export type { TechnicianLoad, TechnicianLoadList } from '../../../../../shared/schemas/technician-load';
