import { REGISTER_EDITORS, REGISTER_READERS } from '../../../../shared/constants/register';

/** Who may do what with sites: everyone reads; planners and admins edit. */
export const sitePolicy = {
  read: REGISTER_READERS,
  edit: REGISTER_EDITORS,
} as const;
