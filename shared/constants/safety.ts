/**
 * Discharge safety constants. Every screen, report or tool output that shows a discharge time
 * estimate must carry {@link DISCHARGE_CAUTION}.
 */

/** IEC 60204-1, 6.2.4: live parts must fall to this voltage or less after disconnection, in volts. */
export const IEC_60204_SAFE_VOLTS = 60;

/** IEC 60204-1, 6.2.4: the time within which they must get there, in seconds. */
export const IEC_60204_SAFE_WITHIN_SECONDS = 5;

/** Voltages, in volts, for which the discharge estimate gives a time: 60 V (IEC 60204-1) and 50 V. */
export const DISCHARGE_THRESHOLDS_VOLTS = [60, 50] as const;

/** One of {@link DISCHARGE_THRESHOLDS_VOLTS}. */
export type DischargeThresholdVolts = (typeof DISCHARGE_THRESHOLDS_VOLTS)[number];

/** The caution that goes with every discharge estimate, as a title and one sentence per line. */
export const DISCHARGE_CAUTION = {
  title: 'Discharge estimate: not a permission to touch',
  lines: [
    'Only qualified persons may open the cabinet or work on the DC link.',
    'Establish an electrically safe work condition first: lockout/tagout and release of stored energy.',
    'Verify absence of voltage with a rated meter, test-verify-test: check the meter on a known source, measure, check the meter again.',
    "Wait at least the drive maker's marked wait time, whatever this estimate says.",
    "This estimate never replaces the drive maker's marked wait time or a meter reading.",
    'Local codes and licensed practice take precedence over this estimate.',
  ],
} as const;

/** {@link DISCHARGE_CAUTION} as one paragraph, for plain-text outputs (CLI, mail, CSV exports). */
export const DISCHARGE_CAUTION_TEXT = `${DISCHARGE_CAUTION.title}. ${DISCHARGE_CAUTION.lines.join(' ')}`;
