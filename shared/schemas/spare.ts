/**
 * A spare in store: a whole drive or a DC-link bank. Stored electrolytics lose oxide, so a
 * spare is due for reforming a fixed interval after it was last reformed (or went into store).
 */
import { z } from 'zod';
import { DEFAULT_REFORMING_INTERVAL_DAYS, SPARE_KINDS, SPARE_STATUSES, type SpareKind, type SpareStatus } from '../constants/register';
import {
  calendarDate,
  changeShape,
  confirmationField,
  listQuerySchema,
  optionalCalendarDate,
  optionalText,
  recordId,
  requiredText,
  storableString,
  versionField,
  wholeNumber,
  type RecordMeta,
} from './common';

const spareFields = {
  code: storableString('spare code', 'Enter the spare code.')
    .trim()
    .toUpperCase()
    .min(1, 'Enter the spare code.')
    .max(40, 'Keep the code under 40 characters.')
    .regex(/^[A-Z0-9][A-Z0-9._/-]*$/, 'Use letters, digits and . _ / - only, e.g. BRK-SP-007.'),
  kind: z.enum(SPARE_KINDS, { error: 'Choose bank or drive.' }),
  description: requiredText(200, 'description'),
  siteId: recordId('site where it is stored'),
  /** Design of a spare bank (or of the bank inside a spare drive), when known. */
  bankDesignId: z.uuid({ error: 'Choose a bank design.' }).nullable().default(null),
  storageLocation: optionalText(200, 'storage location'),
  storageStartedOn: calendarDate('date it went into store'),
  lastReformedOn: optionalCalendarDate('last reforming date'),
  reformingIntervalDays: wholeNumber('reforming interval', 1, 3650).default(DEFAULT_REFORMING_INTERVAL_DAYS),
  status: z.enum(SPARE_STATUSES, { error: 'Choose in store or issued.' }).default('in-store'),
  notes: optionalText(2000, 'notes'),
};

const reformedAfterStore = (v: { storageStartedOn?: string; lastReformedOn?: string | null }) =>
  !v.storageStartedOn || !v.lastReformedOn || v.lastReformedOn >= v.storageStartedOn;
const reformedMessage = { message: 'The last reforming cannot be before the spare went into store.', path: ['lastReformedOn'] };

/** Fields a person enters for a spare. */
export const spareInputSchema = z.object({ ...spareFields, confirmed: confirmationField }).refine(reformedAfterStore, reformedMessage);
export type SpareInput = z.input<typeof spareInputSchema>;
export type SpareData = z.output<typeof spareInputSchema>;

/** A change to a spare, with the version the editor read. */
export const spareUpdateSchema = z
  .object({ ...changeShape(spareFields), version: versionField, confirmed: confirmationField })
  .refine(reformedAfterStore, reformedMessage);
export type SpareUpdate = z.output<typeof spareUpdateSchema>;

/**
 * The date a spare is due for reforming: the last reforming (or, never reformed, the day it
 * went into store) plus the interval.
 *
 * @param storageStartedOn - `YYYY-MM-DD`, the day it went into store
 * @param lastReformedOn - `YYYY-MM-DD` or null when never reformed
 * @param reformingIntervalDays - days between reformings
 * @returns `YYYY-MM-DD`
 * @example reformingDueOn('2024-03-01', null, 365) // '2025-03-01'
 */
export function reformingDueOn(storageStartedOn: string, lastReformedOn: string | null, reformingIntervalDays: number): string {
  const from = new Date(`${lastReformedOn ?? storageStartedOn}T00:00:00Z`);
  from.setUTCDate(from.getUTCDate() + reformingIntervalDays);
  return from.toISOString().slice(0, 10);
}

export const SPARE_SORT_FIELDS = ['code', 'reformingDueOn', 'site', 'kind', 'updatedAt'] as const;
export const spareListQuerySchema = listQuerySchema(SPARE_SORT_FIELDS, 'reformingDueOn', {
  siteId: z.uuid().optional(),
  kind: z.enum(SPARE_KINDS).optional(),
  status: z.enum(SPARE_STATUSES).optional(),
  /** Only spares whose reforming due date has passed. */
  overdue: z.enum(['true', 'false']).transform((v) => v === 'true').optional(),
});
export type SpareListQuery = z.output<typeof spareListQuerySchema>;

/** A spare as the API returns it. */
export interface Spare extends RecordMeta {
  code: string;
  kind: SpareKind;
  description: string;
  siteId: string;
  siteName: string;
  bankDesignId: string | null;
  bankDesignCode: string | null;
  storageLocation: string;
  storageStartedOn: string;
  lastReformedOn: string | null;
  reformingIntervalDays: number;
  reformingDueOn: string;
  /** True when the due date has passed (today, UTC). */
  reformingOverdue: boolean;
  status: SpareStatus;
  notes: string;
}
