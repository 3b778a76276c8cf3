/**
 * Role rules and names of the Planner: who reads visits, who plans them, who reviews them, and
 * the planning warnings a planner may override with a reason. The API enforces these roles;
 * the web hides what a role cannot use, from the same lists.
 */
import type { Role } from './roles';

/** Everyone with a role reads visits (a technician only their own and their sites': see the API). */
export const VISIT_READERS: readonly Role[] = ['admin', 'planner', 'technician', 'reliability'];

/** Planners and admins plan, replan and cancel visits. */
export const VISIT_PLANNERS: readonly Role[] = ['admin', 'planner'];

/** Reliability engineers (and admins) review logged visits. */
export const VISIT_REVIEWERS: readonly Role[] = ['admin', 'reliability'];

/** Technicians carry out visits: only people holding this role may be assigned. */
export const VISIT_TECHNICIAN_ROLE: Role = 'technician';

/**
 * What a planning check may warn of:
 * - `outside-window`: the visit is not wholly inside one occurrence of a shutdown window of
 *   its cabinet's area (a decay run needs the drive de-energised);
 * - `double-booked`: an assigned technician has another planned or under-way visit overlapping;
 * - `not-due`: a bank is not yet due by the visit's end (its due date is later).
 */
export const PLANNING_WARNING_KINDS = ['outside-window', 'double-booked', 'not-due'] as const;
export type PlanningWarningKind = (typeof PLANNING_WARNING_KINDS)[number];

/** How each warning is named on screen. */
export const PLANNING_WARNING_LABELS: Record<PlanningWarningKind, string> = {
  'outside-window': 'outside every shutdown window',
  'double-booked': 'technician double-booked',
  'not-due': 'bank not yet due',
};

/** Shortest reason accepted for an override, a cancel or a replan (characters, trimmed). */
export const PLANNING_REASON_MIN_CHARS = 3;

/** Most visits one batch (a window's plan confirmed in one step) may hold. */
export const VISIT_BATCH_MAX = 200;

/** Largest page of the visit list (the calendar asks for a month at once). */
export const VISIT_PAGE_SIZE_MAX = 200;
