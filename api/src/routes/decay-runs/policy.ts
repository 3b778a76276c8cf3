import { VISIT_READERS } from '../../../../shared/constants/planning';
import type { Role } from '../../../../shared/constants/roles';

/**
 * Who may use the decay-run routes. Per record the services decide further: a run is recorded
 * by a technician assigned to the visit (or an admin), corrected by the person who recorded it,
 * a reliability engineer or an admin.
 */
export const decayRunPolicy = {
  /** Every signed-in role reads runs (the bank pages, the review, the visit). */
  read: VISIT_READERS,
  /** Technicians record; admins too. */
  record: ['technician', 'admin'] as readonly Role[],
  /** The recorder (a technician), reliability engineers and admins correct. */
  correct: ['technician', 'reliability', 'admin'] as readonly Role[],
} as const;
