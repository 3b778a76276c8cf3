import { REGISTER_EDITORS, REGISTER_READERS } from '../../../../shared/constants/register';

/** Who may do what with cabinets: everyone reads and prints labels; planners and admins edit and import. */
export const cabinetPolicy = {
  read: REGISTER_READERS,
  edit: REGISTER_EDITORS,
  import: REGISTER_EDITORS,
} as const;
