/**
 * A decay run recorded at the cabinet: the readings (t from the moment of isolation, volts), the
 * safety checks the technician confirmed, and what they noted (temperature, bleeder, meter,
 * notes, visual findings). The server judges the run itself ({@link judgeRecordedRun}); a body
 * never carries a verdict. A stored run is never edited: a correction is a new version.
 */
import { z } from 'zod';
import type { HealthName } from '../constants/health';
import {
  DECAY_RUN_MAX_SAMPLES,
  DECAY_RUN_TEXT_LIMITS,
  RUN_SOURCES,
  SAFETY_CHECKS,
  VISUAL_FINDINGS,
  type ReviewState,
  type RunSource,
  type SafetyCheckKey,
  type VisualFinding,
} from '../constants/decay-runs';
import type { RecordedRunVerdict } from '../domain/recorded-run';
import { recordId, storableString } from './common';
import { instant } from './visit';

/** Longest time of a reading after isolation, seconds (about 11.6 days). */
export const SAMPLE_MAX_SECONDS = 1_000_000;
/** Voltage bounds of one reading, volts (a small negative reading is a meter's zero or a sign slip). */
export const SAMPLE_VOLTS = { min: -50, max: 2000 } as const;

/** One reading: seconds since isolation and the DC-link voltage. */
export const decaySampleSchema = z.object({
  tSeconds: z
    .number({ error: 'Enter the time of the reading in seconds since isolation.' })
    .min(0, 'The time of a reading cannot be before the isolation (t ≥ 0 s).')
    .max(SAMPLE_MAX_SECONDS, `The time of a reading must be at most ${SAMPLE_MAX_SECONDS} s after the isolation.`),
  volts: z
    .number({ error: 'Enter the voltage of the reading as a number of volts.' })
    .min(SAMPLE_VOLTS.min, `A reading must be at least ${SAMPLE_VOLTS.min} V.`)
    .max(SAMPLE_VOLTS.max, `A reading must be at most ${SAMPLE_VOLTS.max} V.`),
});
export type DecaySampleInput = z.output<typeof decaySampleSchema>;

const samplesField = z
  .array(decaySampleSchema, { error: 'Send the readings as a list of { tSeconds, volts }.' })
  .min(1, 'Record at least one reading.')
  .max(DECAY_RUN_MAX_SAMPLES, `A run holds at most ${DECAY_RUN_MAX_SAMPLES} readings.`);

const sentenceOf = (key: SafetyCheckKey): string =>
  SAFETY_CHECKS.find((check) => check.key === key)?.sentence ?? key;

const confirmed = (key: SafetyCheckKey) =>
  z.literal(true, { error: `Confirm the safety check: "${sentenceOf(key)}"` });

/** The safety checks confirmed with the run, each literally true, and when they were confirmed. */
export const decayRunSafetySchema = z.object(
  {
    qualifiedPerson: confirmed('qualifiedPerson'),
    lockoutTagoutApplied: confirmed('lockoutTagoutApplied'),
    meterRatedAndProved: confirmed('meterRatedAndProved'),
    meterOnTestPoints: confirmed('meterOnTestPoints'),
    absenceOfVoltageVerified: confirmed('absenceOfVoltageVerified'),
    confirmedAt: instant('time of the safety confirmation'),
  },
  { error: 'Send the safety checks confirmed with the run.' },
);
export type DecayRunSafety = z.output<typeof decayRunSafetySchema>;

/** A measured quantity that may be left out or sent as null (not measured). */
const optionalQuantity = (schema: z.ZodNumber) => schema.nullable().optional();

/** What the technician noted beside the readings. */
export const decayRunObservationsSchema = z.object(
  {
    bankTempC: optionalQuantity(
      z
        .number({ error: 'Enter the bank temperature as a number of °C.' })
        .min(-40, 'The bank temperature must be at least −40 °C.')
        .max(150, 'The bank temperature must be at most 150 °C.'),
    ),
    measuredBleederOhms: optionalQuantity(
      z
        .number({ error: 'Enter the measured bleeder resistance as a number of ohms.' })
        .positive('The measured bleeder resistance must be greater than zero.')
        .max(1e12, 'The measured bleeder resistance must be at most 1 TΩ.'),
    ),
    meterName: storableString('meter name')
      .trim()
      .max(DECAY_RUN_TEXT_LIMITS.meterName, `Keep the meter name under ${DECAY_RUN_TEXT_LIMITS.meterName} characters.`)
      .optional(),
    meterInputOhms: optionalQuantity(
      z
        .number({ error: "Enter the meter's input resistance as a number of ohms." })
        .positive("The meter's input resistance must be greater than zero.")
        .max(1e15, "The meter's input resistance must be at most 1 PΩ."),
    ),
    notes: storableString('notes')
      .trim()
      .max(DECAY_RUN_TEXT_LIMITS.notes, `Keep the notes under ${DECAY_RUN_TEXT_LIMITS.notes} characters.`)
      .optional(),
    visualFindings: z
      .array(z.enum(VISUAL_FINDINGS, { error: `Each visual finding is one of: ${VISUAL_FINDINGS.join(', ')}.` }), {
        error: 'Send the visual findings as a list.',
      })
      .max(VISUAL_FINDINGS.length, 'Name each visual finding once.')
      .refine((list) => new Set(list).size === list.length, 'Name each visual finding once.')
      .default([]),
  },
  { error: 'Send the observations of the run.' },
);
export type DecayRunObservations = z.output<typeof decayRunObservationsSchema>;

/** The fields of a run's body, shared by a new run and a correction. */
const runFields = {
  clientId: z.uuid({ error: 'Send the run\'s clientId (a UUID made on the phone).' }),
  source: z.enum(RUN_SOURCES, { error: `The source is one of: ${RUN_SOURCES.join(', ')}.` }),
  loggerFileName: storableString('logger file name')
    .trim()
    .max(
      DECAY_RUN_TEXT_LIMITS.loggerFileName,
      `Keep the logger file name under ${DECAY_RUN_TEXT_LIMITS.loggerFileName} characters.`,
    )
    .optional(),
  /** The moment of isolation; the readings' t = 0 is this instant. */
  isolatedAt: instant('time of isolation'),
  samples: samplesField,
  safety: decayRunSafetySchema,
  observations: decayRunObservationsSchema,
};

/** A new run (`POST /api/visits/:visitId/decay-runs`). */
export const decayRunInputSchema = z.object({ ...runFields, bankId: recordId('bank') });
export type DecayRunInput = z.input<typeof decayRunInputSchema>;
export type DecayRunData = z.output<typeof decayRunInputSchema>;

/** A correction of a run (`POST /api/decay-runs/:runId/corrections`): a new version with its reason. */
export const decayRunCorrectionSchema = z.object({
  ...runFields,
  reason: storableString('reason for the correction', 'Give the reason for the correction.')
    .trim()
    .min(1, 'Give the reason for the correction.')
    .max(
      DECAY_RUN_TEXT_LIMITS.correctionReason,
      `Keep the reason under ${DECAY_RUN_TEXT_LIMITS.correctionReason} characters.`,
    ),
});
export type DecayRunCorrectionInput = z.input<typeof decayRunCorrectionSchema>;
export type DecayRunCorrection = z.output<typeof decayRunCorrectionSchema>;

/** A person named on a run. */
export interface DecayRunPersonRef {
  id: string;
  name: string;
}

/** A stored decay run as the API returns it. Instants are UTC ISO. */
export interface DecayRun {
  id: string;
  clientId: string;
  visitId: string;
  bankId: string;
  bankPosition: string;
  cabinetId: string;
  cabinetTag: string;
  siteId: string;
  siteName: string;
  /** 1 for the run as first recorded; each correction adds one. */
  version: number;
  /** The version this one corrects; null for version 1. */
  supersedesId: string | null;
  /** The version that corrects this one; null while this one is current. */
  supersededById: string | null;
  correctionReason: string | null;
  source: RunSource;
  loggerFileName: string | null;
  isolatedAt: string;
  /** The readings exactly as sent. */
  samples: { tSeconds: number; volts: number }[];
  safety: DecayRunSafety;
  observations: DecayRunObservations;
  /** The server's verdict ({@link judgeRecordedRun} on the samples and the bank as it was). */
  verdict: RecordedRunVerdict;
  health: HealthName | null;
  tauSeconds: number | null;
  /** Compared capacitance / baseline capacitance; null when not judged. */
  capacitanceRatio: number | null;
  safetyFinding: boolean;
  review: {
    state: ReviewState;
    comment: string;
    reviewedBy: DecayRunPersonRef | null;
    reviewedAt: string | null;
  };
  /** True when this run is the bank's baseline. */
  usedAsBaseline: boolean;
  recordedBy: DecayRunPersonRef;
  recordedAt: string;
}

/** A list of runs (`GET /api/visits/:visitId/decay-runs`, `GET /api/banks/:bankId/decay-runs`), newest first. */
export interface DecayRunList {
  items: DecayRun[];
}

export type { VisualFinding };

/** What a review decides of a run: accepted, or queried (with a comment for the technician). */
export const DECAY_RUN_REVIEW_OUTCOMES = ['accepted', 'queried'] as const;
export type DecayRunReviewOutcome = (typeof DECAY_RUN_REVIEW_OUTCOMES)[number];

/** Longest review comment, characters. */
export const REVIEW_COMMENT_MAX_CHARS = 2000;

/**
 * The review of a run (`POST /api/decay-runs/:runId/review`): accepted or queried, with a
 * comment that goes back to the technician (required, and not blank, when queried).
 * `useAsBaseline` (with accepted only) makes the run the bank's baseline.
 */
export const decayRunReviewSchema = z
  .object({
    outcome: z.enum(DECAY_RUN_REVIEW_OUTCOMES, { error: 'The outcome is accepted or queried.' }),
    comment: storableString('comment', 'Send a comment for the technician (it may be empty when you accept the run).')
      .trim()
      .max(REVIEW_COMMENT_MAX_CHARS, `Keep the comment under ${REVIEW_COMMENT_MAX_CHARS} characters.`),
    useAsBaseline: z.boolean({ error: 'useAsBaseline is true or false.' }).optional(),
  })
  .superRefine((review, ctx) => {
    if (review.outcome === 'queried' && review.comment === '') {
      ctx.addIssue({
        code: 'custom',
        path: ['comment'],
        message: 'Say in the comment what is wrong or missing, so the technician can put it right.',
      });
    }
    if (review.useAsBaseline === true && review.outcome !== 'accepted') {
      ctx.addIssue({ code: 'custom', path: ['useAsBaseline'], message: 'Only an accepted run can be used as the baseline.' });
    }
  });
export type DecayRunReviewInput = z.input<typeof decayRunReviewSchema>;
export type DecayRunReview = z.output<typeof decayRunReviewSchema>;

/** Most visits one page of the review queue holds. */
export const REVIEW_QUEUE_PAGE_SIZE_MAX = 200;

/** The review queue's query (`GET /api/review-queue`): a page of the visits waiting for review. */
export const reviewQueueQuerySchema = z.object({
  page: z.coerce.number({ error: 'page is a number.' }).int('page is a whole number').min(1, 'page starts at 1').default(1),
  pageSize: z.coerce
    .number({ error: 'pageSize is a number.' })
    .int('pageSize is a whole number')
    .min(1, 'pageSize is at least 1')
    .max(REVIEW_QUEUE_PAGE_SIZE_MAX, `pageSize is at most ${REVIEW_QUEUE_PAGE_SIZE_MAX}`)
    .default(50),
});
export type ReviewQueueQuery = z.output<typeof reviewQueueQuerySchema>;
