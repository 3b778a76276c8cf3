import { BANK_DESIGN_EDITORS, REGISTER_READERS } from '../../../../shared/constants/register';

/** Who may do what with bank designs: everyone reads; reliability engineers and admins edit. */
export const bankDesignPolicy = {
  read: REGISTER_READERS,
  edit: BANK_DESIGN_EDITORS,
} as const;
