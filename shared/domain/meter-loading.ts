/**
 * Meter loading, stated rather than assumed. During a decay run the bus discharges through the
 * bleeder and the meter (or logger) in parallel, so C = τ / (R_bleed ∥ R_meter). Handheld meters
 * mostly have 10 MΩ on DC volts (common practice), which is why 10 MΩ is the default; loggers,
 * scope probes and DAQ inputs range from 1 MΩ to over 1 GΩ (from memory), so for them the input
 * resistance must be asked for. Beside a small bleeder the meter hardly matters (94 kΩ ∥ 10 MΩ is
 * 0.9 % off 94 kΩ); beside a large one an assumed 10 MΩ is a guess that moves the capacitance.
 */

import { DEFAULT_METER_INPUT_OHMS } from '../constants/health';
import { effectiveDischargeOhms } from './capacitance';
import { formatNumber, formatOhms } from './format';

/**
 * Bleeders above this make an assumed meter a warning: 200 kΩ ∥ 10 MΩ sends 2 % of the discharge
 * current through the meter, and a 1 MΩ logger input instead of 10 MΩ would move the capacitance
 * by about 18 %.
 */
export const ASSUMED_METER_WARNING_BLEEDER_OHMS = 200_000;

/** A lower input resistance some loggers and scope probes have, for the size of the doubt. */
const LOW_INPUT_OHMS = 1_000_000;

/**
 * The warning for a run whose meter input resistance was not stated, when the bleeder is large
 * enough for the assumed 10 MΩ to matter (over 200 kΩ).
 *
 * @param bleederOhms - the bleeder the capacitance is computed with, ohms
 * @param statedMeterInputOhms - the meter input resistance as the person gave it (`undefined` when
 *   not given; `null` or 0 means stated as none)
 * @returns the warning in plain words, or null when the meter was stated or does not matter
 * @example
 * assumedMeterWarning(470_000, undefined)
 * // 'The meter's input resistance was not given, so 10 MΩ was assumed. Beside the 470 kΩ bleeder ...'
 * assumedMeterWarning(470_000, 10e6) // null: stated
 * assumedMeterWarning(94_000, undefined) // null: the meter hardly matters
 */
export function assumedMeterWarning(
  bleederOhms: number,
  statedMeterInputOhms: number | null | undefined,
): string | null {
  if (statedMeterInputOhms !== undefined || !(bleederOhms > ASSUMED_METER_WARNING_BLEEDER_OHMS))
    return null;
  const share = bleederOhms / (bleederOhms + DEFAULT_METER_INPUT_OHMS);
  const lowInputChange =
    effectiveDischargeOhms(bleederOhms, DEFAULT_METER_INPUT_OHMS) /
      effectiveDischargeOhms(bleederOhms, LOW_INPUT_OHMS) -
    1;
  return `The meter's input resistance was not given, so ${formatOhms(DEFAULT_METER_INPUT_OHMS)} was assumed. Beside the ${formatOhms(bleederOhms)} bleeder that is a guess that matters: the meter carries ${formatNumber(share * 100, 2)} % of the discharge current, and with a ${formatOhms(LOW_INPUT_OHMS)} input (some loggers and scope probes) the capacitance would be ${formatNumber(lowInputChange * 100, 2)} % higher. State the meter's or logger's input resistance.`;
}
