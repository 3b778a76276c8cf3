/**
 * A bank design: the nameplate of a DC-link bank (technology, cans, series/parallel counts,
 * bleeder), its temperature coefficient, rated life, health limits and inspection interval.
 * Many banks share one design. Changing a technical field makes a new revision, so a verdict
 * keeps the limits it was judged with.
 */
import { z } from 'zod';
import {
  CAPACITOR_TECHNOLOGIES,
  DEFAULT_HEALTH_LIMITS,
  DEFAULT_INSPECTION_INTERVAL_DAYS,
  type CapacitorTechnology,
} from '../constants/health';
import {
  changeShape,
  listQuerySchema,
  optionalText,
  positiveNumber,
  requiredText,
  storableString,
  versionField,
  wholeNumber,
  type PersonRef,
  type RecordMeta,
} from './common';

const ratio = (what: string) =>
  z
    .number({ error: `Enter the ${what} as a fraction, e.g. 0.9.` })
    .gt(0, `The ${what} must be above 0.`)
    .max(1, `The ${what} must be at most 1 (100 %).`);

/** The technical fields of a design: changing any of them makes a new revision. */
export const bankDesignRevisionFieldsSchema = z.object({
  technology: z.enum(CAPACITOR_TECHNOLOGIES, { error: 'Choose electrolytic or film.' }),
  /** Capacitance of one can (or film unit), microfarads. */
  unitCapacitanceMicrofarads: positiveNumber('unit capacitance').max(10_000_000),
  /** Rated voltage of one can, volts. */
  unitRatedVolts: positiveNumber('unit rated voltage').max(20_000),
  /** Cans in series in one string (s). */
  seriesCount: wholeNumber('series count', 1, 12),
  /** Strings in parallel (p). */
  parallelCount: wholeNumber('parallel count', 1, 100),
  /** Bleeder (balancing) resistance across the whole bus, ohms. */
  bleederOhms: positiveNumber('bleeder resistance').max(1_000_000_000),
  /** Capacitance tolerance of the nameplate, ± percent. */
  capacitanceTolerancePercent: positiveNumber('capacitance tolerance').max(50, 'The tolerance must be at most 50 %.'),
  /**
   * Change of capacitance per kelvin, percent per kelvin, used to normalise a reading to 20 °C:
   * C20 = C / (1 + k/100 × (T − 20)).
   */
  tempCoefficientPercentPerKelvin: z
    .number({ error: 'Enter the temperature coefficient as a number (% per K).' })
    .min(-5, 'The temperature coefficient must be between −5 and 5 % per K.')
    .max(5, 'The temperature coefficient must be between −5 and 5 % per K.'),
  /** Rated life at the rated temperature, hours. */
  ratedLifeHours: wholeNumber('rated life', 1, 1_000_000),
  /** Temperature at which the rated life holds, °C. */
  ratedLifeCelsius: z
    .number({ error: 'Enter the rated temperature in °C.' })
    .min(20, 'The rated temperature must be between 20 and 150 °C.')
    .max(150, 'The rated temperature must be between 20 and 150 °C.'),
  /** Capacitance ratio below which the bank is on watch. */
  watchRatio: ratio('watch limit'),
  /** Capacitance ratio below which the bank is at end of life. */
  endOfLifeRatio: ratio('end-of-life limit'),
  inspectionIntervalDays: wholeNumber('inspection interval', 1, 3650),
});
export type BankDesignRevisionFields = z.output<typeof bankDesignRevisionFieldsSchema>;

/** The fields whose change makes a new revision. */
export const BANK_DESIGN_REVISION_FIELDS = Object.keys(bankDesignRevisionFieldsSchema.shape) as Array<
  keyof BankDesignRevisionFields
>;

const limitsInOrder = (v: { watchRatio?: number; endOfLifeRatio?: number }) =>
  v.watchRatio === undefined || v.endOfLifeRatio === undefined || v.endOfLifeRatio < v.watchRatio;
const limitsMessage = { message: 'The end-of-life limit must be below the watch limit.', path: ['endOfLifeRatio'] };

const identityFields = {
  code: storableString('design code', 'Enter a design code.')
    .trim()
    .toUpperCase()
    .min(1, 'Enter a design code.')
    .max(40, 'Keep the code under 40 characters.')
    .regex(/^[A-Z0-9][A-Z0-9._/-]*$/, 'Use letters, digits and . _ / - only, e.g. EL-2S3P-4700.'),
  name: requiredText(160, 'design name'),
  notes: optionalText(2000, 'notes'),
};

/**
 * Fields a person enters for a new design. Limits and interval may be left out: they then
 * start from the defaults of the technology (shared/constants/health.ts).
 */
export const bankDesignInputSchema = z
  .object({
    ...identityFields,
    ...bankDesignRevisionFieldsSchema.shape,
    watchRatio: ratio('watch limit').optional(),
    endOfLifeRatio: ratio('end-of-life limit').optional(),
    inspectionIntervalDays: wholeNumber('inspection interval', 1, 3650).optional(),
  })
  .refine(limitsInOrder, limitsMessage);
export type BankDesignInput = z.input<typeof bankDesignInputSchema>;
export type BankDesignData = z.output<typeof bankDesignInputSchema>;

/** A change to a design, with the version the editor read and why (kept with the revision). */
export const bankDesignUpdateSchema = z
  .object({
    ...changeShape({ ...identityFields, ...bankDesignRevisionFieldsSchema.shape }),
    version: versionField,
    changeNote: optionalText(500, 'change note'),
  })
  .refine(limitsInOrder, limitsMessage);
export type BankDesignUpdate = z.output<typeof bankDesignUpdateSchema>;

/** The schema the design form uses: every field present, limits filled in. */
export const bankDesignFormSchema = z
  .object({ ...identityFields, ...bankDesignRevisionFieldsSchema.shape, changeNote: optionalText(500, 'change note') })
  .refine(limitsInOrder, limitsMessage);
export type BankDesignForm = z.input<typeof bankDesignFormSchema>;

/** Limits and interval a new design of `technology` starts with. */
export function defaultDesignLimits(technology: CapacitorTechnology): {
  watchRatio: number;
  endOfLifeRatio: number;
  inspectionIntervalDays: number;
} {
  return { ...DEFAULT_HEALTH_LIMITS[technology], inspectionIntervalDays: DEFAULT_INSPECTION_INTERVAL_DAYS };
}

/** Rated voltage of the bank (the series string), volts: s × V_unit. */
export function bankRatedVolts(unitRatedVolts: number, seriesCount: number): number {
  return unitRatedVolts * seriesCount;
}

export const BANK_DESIGN_SORT_FIELDS = ['code', 'name', 'technology', 'updatedAt'] as const;
export const bankDesignListQuerySchema = listQuerySchema(BANK_DESIGN_SORT_FIELDS, 'code', {
  technology: z.enum(CAPACITOR_TECHNOLOGIES).optional(),
});
export type BankDesignListQuery = z.output<typeof bankDesignListQuerySchema>;

/** One revision of a design: its technical fields as they were from `createdAt`. */
export interface BankDesignRevision extends BankDesignRevisionFields {
  id: string;
  revision: number;
  changeNote: string;
  createdAt: string;
  createdBy: PersonRef | null;
  nominalCapacitanceMicrofarads: number;
  nominalTauSeconds: number;
}

/** A design as the API returns it: identity plus its current revision's fields. */
export interface BankDesign extends RecordMeta, BankDesignRevisionFields {
  code: string;
  name: string;
  notes: string;
  /** Number of the current revision (1 for a new design). */
  revision: number;
  revisionId: string;
  nominalCapacitanceMicrofarads: number;
  nominalTauSeconds: number;
  bankRatedVolts: number;
  /** Banks in service of this design. */
  bankCount: number;
}
