/**
 * A DC-link bank: one drive's capacitor bank in a cabinet, of a bank design, with its
 * baseline (the reference τ and capacitance its decay runs are judged against) and its place
 * in a replacement chain (a replaced bank keeps its history; the new one starts a new baseline).
 */
import { z } from 'zod';
import type { CapacitorTechnology, HealthName } from '../constants/health';
import { BANK_STATUSES, type BankStatus, type BaselineSource } from '../constants/register';
import type { BankDesignRevisionFields } from './bank-design';
import {
  calendarDate,
  changeShape,
  confirmationField,
  listQuerySchema,
  optionalCalendarDate,
  optionalText,
  positiveNumber,
  recordId,
  requiredText,
  versionField,
  type PersonRef,
  type RecordMeta,
} from './common';

/** Fields a person enters for a bank (its cabinet comes from the path or the body). */
const bankFields = {
  bankDesignId: recordId('bank design'),
  /** Which DC link of the cabinet, e.g. "Drive 1 DC link" or "DC1". */
  position: requiredText(60, 'position'),
  serialNumber: optionalText(80, 'serial number'),
  installedOn: optionalCalendarDate('install date'),
  notes: optionalText(2000, 'notes'),
};
export const bankInputSchema = z.object({ cabinetId: recordId('cabinet'), ...bankFields, confirmed: confirmationField });
export type BankInput = z.input<typeof bankInputSchema>;
export type BankData = z.output<typeof bankInputSchema>;

/** The body of POST /api/cabinets/:cabinetId/banks: the cabinet is in the path. */
export const cabinetBankInputSchema = bankInputSchema.omit({ cabinetId: true });

/**
 * A change to a bank. Changing the design corrects a wrong record (a nameplate baseline
 * follows it); a new bank in the same place is a replacement instead.
 */
export const bankUpdateSchema = z.object({ ...changeShape(bankFields), version: versionField, confirmed: confirmationField });
export type BankUpdate = z.output<typeof bankUpdateSchema>;

/**
 * Setting a baseline by hand, or back to the nameplate. A baseline from a trusted decay run
 * is set when that run is reviewed.
 */
export const bankBaselineInputSchema = z
  .object({
    version: versionField,
    source: z.enum(['nameplate', 'manual'], { error: 'Choose nameplate or manual.' }),
    tauSeconds: positiveNumber('baseline τ').max(100_000).nullable().default(null),
    capacitanceMicrofarads: positiveNumber('baseline capacitance').max(100_000_000).nullable().default(null),
    note: optionalText(500, 'note'),
    confirmed: confirmationField,
  })
  .superRefine((v, ctx) => {
    if (v.source !== 'manual') return;
    if (v.tauSeconds === null) ctx.addIssue({ code: 'custom', path: ['tauSeconds'], message: 'Enter the baseline τ in seconds.' });
    if (v.capacitanceMicrofarads === null)
      ctx.addIssue({ code: 'custom', path: ['capacitanceMicrofarads'], message: 'Enter the baseline capacitance in µF.' });
  });
export type BankBaselineInput = z.input<typeof bankBaselineInputSchema>;
export type BankBaselineData = z.output<typeof bankBaselineInputSchema>;

/** Replacing a bank: the new one takes its place and starts from its design's nameplate. */
export const bankReplacementInputSchema = z.object({
  version: versionField,
  /** Design of the new bank; the old bank's design when left out. */
  bankDesignId: recordId('bank design').optional(),
  serialNumber: optionalText(80, 'serial number'),
  installedOn: calendarDate('date the new bank went in'),
  note: optionalText(500, 'note'),
  confirmed: confirmationField,
});
export type BankReplacementInput = z.input<typeof bankReplacementInputSchema>;
export type BankReplacementData = z.output<typeof bankReplacementInputSchema>;

export const BANK_SORT_FIELDS = ['cabinet', 'position', 'design', 'installedOn', 'status', 'updatedAt'] as const;
export const bankListQuerySchema = listQuerySchema(BANK_SORT_FIELDS, 'cabinet', {
  cabinetId: z.uuid().optional(),
  siteId: z.uuid().optional(),
  bankDesignId: z.uuid().optional(),
  status: z.enum(BANK_STATUSES).optional(),
});
export type BankListQuery = z.output<typeof bankListQuerySchema>;

/** The reference a bank's decay runs are judged against. */
export interface BankBaseline {
  tauSeconds: number;
  capacitanceMicrofarads: number;
  source: BaselineSource;
  setAt: string;
  setBy: PersonRef | null;
  /** Revision of the design whose nameplate gave it (nameplate baselines). */
  designRevision: number | null;
  /** The decay run that set it (decay-run baselines). */
  decayRunId: string | null;
  note: string;
}

/** The latest verdict of a bank's decay runs; null until it has one. */
export interface BankLatestVerdict {
  health: HealthName;
  capacitanceRatio: number;
  tauSeconds: number;
  judgedAt: string;
}

/**
 * The figures of the design's current revision that a decay run on the bank is judged with:
 * construction (C = p × C_unit / s), bleeder, temperature coefficient and health limits.
 */
export type BankDesignFigures = Pick<
  BankDesignRevisionFields,
  | 'unitCapacitanceMicrofarads'
  | 'seriesCount'
  | 'parallelCount'
  | 'bleederOhms'
  | 'tempCoefficientPercentPerKelvin'
  | 'watchRatio'
  | 'endOfLifeRatio'
>;

/** A bank as the API returns it. */
export interface Bank extends RecordMeta {
  cabinetId: string;
  cabinetTag: string;
  siteId: string;
  siteName: string;
  areaName: string;
  bankDesignId: string;
  bankDesignCode: string;
  bankDesignName: string;
  technology: CapacitorTechnology;
  /** Current revision of the design. */
  designRevision: number;
  nominalCapacitanceMicrofarads: number;
  /** The current revision's figures; null only when the design has no revision. */
  designFigures: BankDesignFigures | null;
  /** The cabinet's nominal DC-bus voltage, volts; null when not known. */
  cabinetDcBusVolts: number | null;
  /** The drive maker's marked wait time of the cabinet, minutes; null when not known. */
  cabinetMarkedWaitMinutes: number | null;
  position: string;
  serialNumber: string;
  installedOn: string | null;
  notes: string;
  status: BankStatus;
  baseline: BankBaseline;
  /** The bank this one replaced, and the one that replaced it. */
  replacesBankId: string | null;
  replacedByBankId: string | null;
  replacedOn: string | null;
  latestVerdict: BankLatestVerdict | null;
}

/** One bank of a replacement chain, oldest first. */
export interface BankLineageEntry {
  id: string;
  bankDesignCode: string;
  serialNumber: string;
  installedOn: string | null;
  replacedOn: string | null;
  status: BankStatus;
}

/** A bank with its replacement chain, for its page. */
export interface BankDetail extends Bank {
  lineage: BankLineageEntry[];
}
