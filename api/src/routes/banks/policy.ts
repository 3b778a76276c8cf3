import { BASELINE_EDITORS, REGISTER_EDITORS, REGISTER_READERS } from '../../../../shared/constants/register';

/**
 * Who may do what with banks: everyone reads; planners and admins add, change, remove and
 * replace them; reliability engineers and admins set baselines.
 */
export const bankPolicy = {
  read: REGISTER_READERS,
  edit: REGISTER_EDITORS,
  baseline: BASELINE_EDITORS,
} as const;
