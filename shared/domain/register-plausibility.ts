/**
 * What the register refuses because it cannot be true, and what it questions because it is
 * unlikely ("are you sure?" before saving). Pure functions: each returns the field's problem
 * in words, or null when the value is fine; callers pass today's date (`asOfOn`).
 *
 * Refused (no confirmation helps): a bank rated below its cabinet's DC bus.
 * Questioned (saved once the person confirms): a DC bus far from the rectifier arithmetic of
 * the supply, a baseline τ far from R × C, a date more than a year ahead.
 */

/** One field's problem, as shown beside that field. */
export interface PlausibilityIssue {
  /** The field, e.g. "dcBusVolts". */
  path: string;
  message: string;
}

/**
 * DC bus ÷ AC line voltage that passes without a question. A six-pulse diode rectifier gives
 * a mean of 3√2/π ≈ 1.35 × the line voltage under load and up to √2 ≈ 1.41 × at light load
 * (rectifier arithmetic; DOMAIN.md: "about 1.35 to 1.41 x the AC line voltage"). The band is
 * wider to let through line tolerance, active front ends and single-phase drives.
 */
export const DC_BUS_RATIO_BAND = { min: 1.2, max: 1.5 } as const;

/** How far a baseline τ may stray from bleeder × capacitance (τ = R × C) before it is questioned. */
export const BASELINE_TAU_TOLERANCE = 0.3;

const volts = (v: number) => `${formatNumber(v)} V`;

function formatNumber(value: number): string {
  return Number.isInteger(value) ? String(value) : value.toPrecision(3).replace(/\.?0+$/, '');
}

/**
 * Questions a DC-bus voltage outside 1.2–1.5 × the supply voltage.
 *
 * @param supplyVolts - AC line voltage, V
 * @param dcBusVolts - nominal DC-bus voltage, V; null when not known (nothing to question)
 * @example dcBusQuestion(400, 540) // null (1.35 ×)
 * @example dcBusQuestion(400, 5) // 'A 5 V DC bus on a 400 V supply is unlikely: expect about 540–564 V (1.35–1.41 × the supply).'
 */
export function dcBusQuestion(supplyVolts: number, dcBusVolts: number | null): string | null {
  if (dcBusVolts === null || !(supplyVolts > 0)) return null;
  const ratio = dcBusVolts / supplyVolts;
  if (ratio >= DC_BUS_RATIO_BAND.min && ratio <= DC_BUS_RATIO_BAND.max) return null;
  return (
    `A ${volts(dcBusVolts)} DC bus on a ${volts(supplyVolts)} supply is unlikely: expect about ` +
    `${Math.round(supplyVolts * 1.35)}–${Math.round(supplyVolts * 1.41)} V (1.35–1.41 × the supply).`
  );
}

/**
 * Refuses a bank whose rated voltage (cans in series × the rating of one) is below the DC bus
 * it sits on: its cans would be over-voltage from the first power-up.
 *
 * @param bankRatedVolts - s × V_unit of the bank's design, V
 * @param dcBusVolts - the cabinet's nominal DC-bus voltage, V; null when not known
 * @param bankName - how the message names the bank, e.g. 'This bank' or 'Bank DC1'
 * @example bankRatingProblem(900, 540, 'This bank') // null
 * @example bankRatingProblem(450, 930, 'This bank') // 'This bank is rated 450 V, below the cabinet's 930 V DC bus: …'
 */
export function bankRatingProblem(
  bankRatedVolts: number,
  dcBusVolts: number | null,
  bankName = 'This bank',
): string | null {
  if (dcBusVolts === null || bankRatedVolts >= dcBusVolts) return null;
  return (
    `${bankName} is rated ${volts(bankRatedVolts)}, below the cabinet's ${volts(dcBusVolts)} DC bus: ` +
    'it cannot run there. Check the design (cans in series × their rated voltage) and the DC-bus voltage.'
  );
}

/**
 * Questions a baseline τ that disagrees with bleeder × capacitance by more than 30 %.
 *
 * @param tauSeconds - the baseline τ, s
 * @param capacitanceMicrofarads - the baseline capacitance, µF
 * @param bleederOhms - the design's bleeder resistance, Ω
 * @example baselineTauQuestion(4.4, 94, 47_000) // null (R × C = 4.42 s)
 * @example baselineTauQuestion(218, 1, 47_000) // 'A τ of 218 s does not fit 1 µF with a 47000 Ω bleeder: R × C is 0.047 s. …'
 */
export function baselineTauQuestion(
  tauSeconds: number,
  capacitanceMicrofarads: number,
  bleederOhms: number,
): string | null {
  const expected = bleederOhms * capacitanceMicrofarads * 1e-6;
  if (!(expected > 0) || Math.abs(tauSeconds - expected) <= BASELINE_TAU_TOLERANCE * expected)
    return null;
  return (
    `A τ of ${formatNumber(tauSeconds)} s does not fit ${formatNumber(capacitanceMicrofarads)} µF with a ` +
    `${formatNumber(bleederOhms)} Ω bleeder: R × C is ${formatNumber(expected)} s. Check the τ, the capacitance and the bleeder value.`
  );
}

/**
 * The `YYYY-MM-DD` date a year after `asOfOn` (29 February goes to 1 March).
 * @example oneYearAfter('2026-12-02') // '2027-12-02'
 */
export function oneYearAfter(asOfOn: string): string {
  const date = new Date(`${asOfOn}T00:00:00Z`);
  date.setUTCFullYear(date.getUTCFullYear() + 1);
  return date.toISOString().slice(0, 10);
}

/**
 * Questions a date more than a year after today: a commissioning, install or storage date is
 * in the past or near future; years ahead is usually a typing slip (9999, 2062 for 2026).
 *
 * @param date - `YYYY-MM-DD`, or null (nothing to question)
 * @param asOfOn - today, `YYYY-MM-DD`
 * @param what - the date's name in the message, e.g. 'commissioning date'
 * @example futureDateQuestion('2099-01-01', '2026-12-02', 'install date') // 'The install date 2099-01-01 is more than a year ahead: …'
 * @example futureDateQuestion('2027-06-01', '2026-12-02', 'install date') // null
 */
export function futureDateQuestion(
  date: string | null,
  asOfOn: string,
  what: string,
): string | null {
  if (date === null || date <= oneYearAfter(asOfOn)) return null;
  return `The ${what} ${date} is more than a year ahead: is the year right?`;
}

/** The issues of the checks that found something, each under its field. */
export function collectIssues(
  checks: Array<[path: string, message: string | null]>,
): PlausibilityIssue[] {
  return checks.flatMap(([path, message]) => (message === null ? [] : [{ path, message }]));
}
