import { REGISTER_EDITORS, REGISTER_READERS } from '../../../../shared/constants/register';

/** Who may do what with spares: everyone reads; planners and admins edit. */
export const sparePolicy = {
  read: REGISTER_READERS,
  edit: REGISTER_EDITORS,
} as const;
