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

export interface WindowOccurrence {
  startsAt: string;
  endsAt: string;
}

export interface ShutdownWindow {
  id: string;
  areaId: string;
  areaName: string;
  siteId: string;
  siteName: string;
  timeZone: string;
  title: string;
  startsAt: string;
  endsAt: string;
  recurrence: string | null;
  recurrenceText: string | null;
  notes: string;
  version: number;
  occurrences?: WindowOccurrence[];
}

/** A technician as the week's load lists them (GET /api/technician-load). */
export interface TechnicianLoad {
  technicianId: string;
  name: string;
  availableHours: number;
  plannedHours: number;
}
