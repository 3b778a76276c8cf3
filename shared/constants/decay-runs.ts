/**
 * Decay runs as they are recorded at the cabinet: where the readings came from, what the
 * technician saw, the safety checks confirmed with the run, and the review states.
 */

/** Visual findings a technician can record; any one makes the bank end of life (DOMAIN.md). */
export const VISUAL_FINDINGS = ['bulged-can', 'open-vent', 'leak', 'discoloration'] as const;

/** One of {@link VISUAL_FINDINGS}. */
export type VisualFinding = (typeof VISUAL_FINDINGS)[number];

/** Each visual finding in plain words. */
export const VISUAL_FINDING_LABELS: Record<VisualFinding, string> = {
  'bulged-can': 'bulged can',
  'open-vent': 'opened vent',
  leak: 'leaking electrolyte',
  discoloration: 'discoloured can or sleeve',
};

/** How the readings of a run were taken: prompted on the phone, typed from a paper sheet, or a logger file. */
export const RUN_SOURCES = ['guided', 'typed', 'logger'] as const;

/** One of {@link RUN_SOURCES}. */
export type RunSource = (typeof RUN_SOURCES)[number];

/** Each run source in plain words. */
export const RUN_SOURCE_LABELS: Record<RunSource, string> = {
  guided: 'guided capture',
  typed: 'typed from a paper sheet',
  logger: 'logger file',
};

/** Review states of a decay run: waiting, accepted, or queried (with a comment). */
export const REVIEW_STATES = ['pending', 'accepted', 'queried'] as const;

/** One of {@link REVIEW_STATES}. */
export type ReviewState = (typeof REVIEW_STATES)[number];

/** Each review state in plain words. */
export const REVIEW_STATE_LABELS: Record<ReviewState, string> = {
  pending: 'waiting for review',
  accepted: 'accepted',
  queried: 'queried',
};

/** A guided capture ends when a reading falls below this voltage, volts. */
export const CAPTURE_END_VOLTS = 50;

/** The safety checks confirmed with every run, in the order a technician confirms them. */
export const SAFETY_CHECK_KEYS = [
  'qualifiedPerson',
  'lockoutTagoutApplied',
  'meterRatedAndProved',
  'meterOnTestPoints',
  'absenceOfVoltageVerified',
] as const;

/** One of {@link SAFETY_CHECK_KEYS}. */
export type SafetyCheckKey = (typeof SAFETY_CHECK_KEYS)[number];

/** One safety check: its key, the sentence the technician confirms, and when it is asked. */
export interface SafetyCheck {
  key: SafetyCheckKey;
  sentence: string;
  /** 'before' the capture (the safety gate) or at its 'end' (after the last reading). */
  when: 'before' | 'end';
}

/**
 * The safety checks (NFPA 70E's electrically safe work condition, DOMAIN.md), each with the
 * sentence the technician confirms. Absence of voltage is confirmed at the END of the capture.
 */
export const SAFETY_CHECKS: readonly SafetyCheck[] = [
  {
    key: 'qualifiedPerson',
    sentence: 'I am a qualified person for work on this drive and its DC link.',
    when: 'before',
  },
  {
    key: 'lockoutTagoutApplied',
    sentence: 'Lockout/tagout is applied: the drive is isolated and cannot be switched on again.',
    when: 'before',
  },
  {
    key: 'meterRatedAndProved',
    sentence: 'My meter is rated for the bus voltage and I checked it on a known source.',
    when: 'before',
  },
  {
    key: 'meterOnTestPoints',
    sentence: "The meter is on the DC-bus test points as the drive maker's manual instructs.",
    when: 'before',
  },
  {
    key: 'absenceOfVoltageVerified',
    sentence: 'I verified absence of voltage with the meter (test, verify, test) after the last reading.',
    when: 'end',
  },
];

/** Longest text fields of a run, characters. */
export const DECAY_RUN_TEXT_LIMITS = {
  loggerFileName: 200,
  meterName: 120,
  notes: 4000,
  correctionReason: 1000,
} as const;

/** Most samples one run may carry (a logger file at a high rate). */
export const DECAY_RUN_MAX_SAMPLES = 20_000;
