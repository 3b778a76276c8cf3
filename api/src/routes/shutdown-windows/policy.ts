import { VISIT_PLANNERS, VISIT_READERS } from '../../../../shared/constants/planning';

/** Who may do what with shutdown windows: everyone reads; planners and admins keep and import them. */
export const shutdownWindowPolicy = {
  read: VISIT_READERS,
  edit: VISIT_PLANNERS,
  import: VISIT_PLANNERS,
} as const;
