/**
 * A drive cabinet: one or more drives, each with a DC-link bank. Identified on the floor by its
 * tag (e.g. BRK-M2-VFD-014).
 */
import { z } from 'zod';
import {
  CABINET_STATUSES,
  CRITICALITIES,
  EDITABLE_CABINET_STATUSES,
  type CabinetStatus,
} from '../constants/register';
import {
  changeShape,
  confirmationField,
  listQuerySchema,
  optionalCalendarDate,
  optionalText,
  positiveNumber,
  recordId,
  storableString,
  versionField,
  type RecordMeta,
} from './common';

/** A cabinet tag: letters, digits and . _ / - ; stored in capitals. */
export const cabinetTagSchema = storableString('cabinet tag', 'Enter the cabinet tag.')
  .trim()
  .toUpperCase()
  .min(1, 'Enter the cabinet tag.')
  .max(40, 'Keep the tag under 40 characters.')
  .regex(/^[A-Z0-9][A-Z0-9._/-]*$/, 'Use letters, digits and . _ / - only, e.g. BRK-M2-VFD-014.');

/** Fields a person enters for a cabinet. */
const cabinetFields = {
  areaId: recordId('area'),
  tag: cabinetTagSchema,
  location: optionalText(200, 'location'),
  driveMake: optionalText(80, 'drive make'),
  driveModel: optionalText(80, 'drive model'),
  /** AC line voltage feeding the drive, volts (e.g. 400). */
  supplyVolts: positiveNumber('supply voltage').max(15_000, 'The supply voltage must be at most 15 000 V.'),
  /** Nominal DC-bus voltage, volts (about 1.35 × the line voltage); null when not known. */
  dcBusVolts: positiveNumber('DC-bus voltage').max(20_000, 'The DC-bus voltage must be at most 20 000 V.').nullable().default(null),
  ratedPowerKilowatts: positiveNumber('rated power').max(100_000).nullable().default(null),
  /**
   * The drive maker's marked wait time before opening after isolation, minutes; at least 1
   * (a wait of 0 would print "wait at least 0 min" on the label), or null when not marked.
   */
  markedWaitMinutes: z
    .number({ error: 'Enter the marked wait time as whole minutes.' })
    .int('Enter the marked wait time as whole minutes.')
    .min(1, 'The marked wait time is at least 1 minute; leave it empty when none is marked.')
    .max(240, 'The marked wait time must be at most 240.')
    .nullable()
    .default(null),
  criticality: z.enum(CRITICALITIES, { error: 'Choose low, medium, high or critical.' }).default('medium'),
  environmentNotes: optionalText(1000, 'environment notes'),
  commissionedOn: optionalCalendarDate('commissioning date'),
  status: z.enum(EDITABLE_CABINET_STATUSES, { error: 'Choose in service or out of service.' }).default('in-service'),
};
export const cabinetInputSchema = z.object({ ...cabinetFields, confirmed: confirmationField });
export type CabinetInput = z.input<typeof cabinetInputSchema>;
export type CabinetData = z.output<typeof cabinetInputSchema>;

/** A change to a cabinet, with the version the editor read. */
export const cabinetUpdateSchema = z.object({ ...changeShape(cabinetFields), version: versionField, confirmed: confirmationField });
export type CabinetUpdate = z.output<typeof cabinetUpdateSchema>;

export const CABINET_SORT_FIELDS = ['tag', 'site', 'area', 'status', 'criticality', 'commissionedOn', 'updatedAt'] as const;
export type CabinetSortField = (typeof CABINET_SORT_FIELDS)[number];

export const cabinetListQuerySchema = listQuerySchema(CABINET_SORT_FIELDS, 'tag', {
  siteId: z.uuid().optional(),
  areaId: z.uuid().optional(),
  status: z.enum(CABINET_STATUSES).optional(),
  criticality: z.enum(CRITICALITIES).optional(),
});
export type CabinetListQuery = z.output<typeof cabinetListQuerySchema>;

/** A cabinet as the API returns it. */
export interface Cabinet extends RecordMeta, Omit<CabinetData, 'status' | 'confirmed'> {
  status: CabinetStatus;
  siteId: string;
  siteName: string;
  siteCode: string;
  areaName: string;
  /** Banks in service in this cabinet. */
  bankCount: number;
}

/** What a cabinet's printable label shows: its address in Ebbline and that address as a QR code. */
export interface CabinetLabel {
  cabinetId: string;
  tag: string;
  url: string;
  /** The QR code of `url` as an SVG document. */
  qrSvg: string;
}
