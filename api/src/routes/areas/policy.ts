import { REGISTER_EDITORS, REGISTER_READERS } from '../../../../shared/constants/register';

/** Who may do what with areas: everyone reads; planners and admins edit. */
export const areaPolicy = {
  read: REGISTER_READERS,
  edit: REGISTER_EDITORS,
} as const;
