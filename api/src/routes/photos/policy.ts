import type { Role } from '../../../../shared/constants/roles';
import { VISIT_READERS } from '../../../../shared/constants/planning';

/**
 * Who may use the photo routes. Per visit, the service decides further: only a technician
 * assigned to the visit (or an admin) adds, and a photo is read by whoever may read its visit.
 */
export const photoPolicy = {
  add: ['technician', 'admin'] as readonly Role[],
  read: VISIT_READERS,
} as const;
