/**
 * An unplanned visit: a technician at a cabinet (its QR label opened its page) starts a visit
 * there and then, without a plan. `POST /api/cabinets/:cabinetId/unplanned-visits`.
 */
import { z } from 'zod';
import { recordId } from './common';

/** Most banks one visit names (a cabinet holds a handful). */
export const UNPLANNED_VISIT_MAX_BANKS = 50;

/** The body: the banks to inspect; absent = every bank in service of the cabinet. */
export const unplannedVisitInputSchema = z
  .object({
    bankIds: z
      .array(recordId('banks'), { error: 'bankIds is a list of bank ids.' })
      .min(1, { error: 'Choose at least one bank, or leave bankIds out for every bank of the cabinet.' })
      .max(UNPLANNED_VISIT_MAX_BANKS, { error: `Choose at most ${UNPLANNED_VISIT_MAX_BANKS} banks.` })
      .refine((ids) => new Set(ids).size === ids.length, { error: 'Name each bank once.' })
      .optional(),
  })
  .strict();

export type UnplannedVisitInput = z.infer<typeof unplannedVisitInputSchema>;
