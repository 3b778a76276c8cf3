/**
 * The physics behind the demo's decay-run history, written from DOMAIN.md and independent of
 * the engine that judges the runs. Pure: every figure comes from the seeded generator passed in.
 *
 * - **Ageing.** Each bank keeps its own path of capacitance over the years, C(t) = C0 · r(t):
 *   a steady loss per year scaled by the cabinet's temperature (Arrhenius, the "10 K rule":
 *   ageing doubles per 10 K warmer, common practice), and for some banks a knee after which the
 *   loss speeds up (quadratic in the years past it). A few banks age fast enough to be in watch
 *   or at end of life by now, never far past it (a plant replaces such a bank: the loss over its
 *   years is capped at a fifth to a little over a quarter). Film banks lose a few tenths of a percent a year.
 * - **Bleeder faults.** Now and then a bleeder resistor drifts high or a string opens: R rises by
 *   a fifth to four fifths for a year or so, so τ = R·C rises (a safety finding) until it is fixed.
 * - **A run.** The bus starts at about its nominal voltage and discharges through the bleeder in
 *   parallel with the meter's input resistance; on designs whose control supply runs from the
 *   bus, a constant power P is drawn above the dropout voltage (V² + P·R decays with τ/2). The
 *   technician reads a handheld meter at the guided capture's prompts (shared/domain/capture-
 *   schedule.ts), a second or so late, rounded to the meter's resolution, with a little noise,
 *   until the bus is below 50 V; now and then one reading is mistyped. Capacitance follows the
 *   bank's temperature by the design's coefficient.
 */
import { captureScheduleSeconds } from '../../shared/domain/capture-schedule';
import { controlSupplyDecayVolts } from '../../shared/domain/control-supply';
import type { DecaySample } from '../../shared/domain/decay-fit';

const YEAR_MS = 365.25 * 86_400_000;

/** What the history of one bank is simulated from (the register's figures). */
export interface BankHistoryFacts {
  technology: 'electrolytic' | 'film';
  /** Nameplate bank capacitance at 20 °C, microfarads. */
  nominalMicrofarads: number;
  /** Design bleeder across the bus, ohms. */
  bleederOhms: number;
  /** Capacitance change per kelvin, percent (the design's coefficient). */
  tempCoefficientPercentPerKelvin: number;
  /** The cabinet's nominal DC-bus voltage, volts. */
  busVolts: number;
  /** Typical air temperature inside the cabinet, °C (warm halls age banks faster). */
  cabinetTempC: number;
  /** Power the drive's control supply draws from the bus while it runs, watts (0: supplied otherwise). */
  controlSupplyWatts: number;
}

/** One bank's invented life: where its capacitance starts and how it falls, and any bleeder fault. */
export interface AgeingPath {
  /** Capacitance when new, as a fraction of the nameplate (within the tolerance). */
  initialRatio: number;
  /** Steady loss, fraction of the initial capacitance per year (at the cabinet's temperature). */
  lossPerYear: number;
  /** Years after install when the loss starts to speed up; null when it never does. */
  kneeYears: number | null;
  /** Extra loss past the knee: fraction × (years past the knee)². */
  kneeLossPerYearSquared: number;
  /** A bleeder fault: from `fromYears` to `toYears` after install R is (1 + rise) × the design's. */
  bleederFault: { fromYears: number; toYears: number; rise: number } | null;
}

const uniform = (random: () => number, low: number, high: number) => low + (high - low) * random();

/** A standard normal draw (Box–Muller). */
export function gaussian(random: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
}

/**
 * Draws a bank's ageing path. About one bank in five has a late knee, about one in twelve ages
 * fast (in watch or at end of life within its years), about one in fifteen has a bleeder fault.
 *
 * @param facts - the bank's technology and cabinet temperature
 * @param lifeYears - years the bank has been (or was) in service, for placing the knee and the fault
 * @param random - the seeded generator
 * @example
 * ageingPathOf(facts, 9.5, seededRandom(7)) // { initialRatio: 1.03, lossPerYear: 0.011, kneeYears: null, ... }
 */
export function ageingPathOf(facts: BankHistoryFacts, lifeYears: number, random: () => number): AgeingPath {
  const film = facts.technology === 'film';
  // Arrhenius, the 10 K rule, around a 35 °C cabinet
  const arrhenius = 2 ** ((facts.cabinetTempC - 35) / 10);
  const initialRatio = film ? uniform(random, 0.99, 1.03) : uniform(random, 0.97, 1.08);
  const fast = random() < 0.08;
  const base = film ? uniform(random, 0.0005, 0.003) : fast ? uniform(random, 0.02, 0.035) : uniform(random, 0.004, 0.016);
  const knee = !film && random() < 0.2 && lifeYears > 4;
  const kneeYears = knee ? uniform(random, Math.max(3, lifeYears * 0.45), Math.max(3.5, lifeYears * 0.8)) : null;
  const faulty = random() < 0.07 && lifeYears > 3;
  const from = faulty ? uniform(random, 1.5, lifeYears - 1) : 0;
  let lossPerYear = base * arrhenius;
  let kneeLossPerYearSquared = knee ? uniform(random, 0.008, 0.03) : 0;
  // a plant replaces a bank soon after end of life: over its years a bank loses at most about a
  // fifth to a little over a quarter (a film bank a few percent), however fast it aged
  const maxLoss = film ? uniform(random, 0.02, 0.05) : uniform(random, 0.2, 0.28);
  const past = kneeYears === null ? 0 : Math.max(0, lifeYears - kneeYears);
  const loss = lossPerYear * lifeYears + kneeLossPerYearSquared * past * past;
  if (loss > maxLoss) {
    lossPerYear *= maxLoss / loss;
    kneeLossPerYearSquared *= maxLoss / loss;
  }
  return {
    initialRatio,
    lossPerYear,
    kneeYears,
    kneeLossPerYearSquared,
    bleederFault: faulty ? { fromYears: from, toYears: from + uniform(random, 0.7, 1.6), rise: uniform(random, 0.2, 0.8) } : null,
  };
}

/**
 * Capacitance at 20 °C as a fraction of the nameplate, `years` after install (never below 0.3).
 *
 * @example capacitanceRatioAt({ initialRatio: 1, lossPerYear: 0.01, kneeYears: null, kneeLossPerYearSquared: 0, bleederFault: null }, 5) // 0.95
 */
export function capacitanceRatioAt(path: AgeingPath, years: number): number {
  const past = path.kneeYears === null ? 0 : Math.max(0, years - path.kneeYears);
  const loss = path.lossPerYear * years + path.kneeLossPerYearSquared * past * past;
  return Math.max(0.3, path.initialRatio * (1 - loss));
}

/** The bleeder's resistance `years` after install, ohms: the design's, or risen during a fault. */
export function bleederOhmsAt(path: AgeingPath, designOhms: number, years: number): number {
  const fault = path.bleederFault;
  return fault && years >= fault.fromYears && years < fault.toYears ? designOhms * (1 + fault.rise) : designOhms;
}

/** Years between two instants. */
export function yearsBetween(fromMs: number, toMs: number): number {
  return (toMs - fromMs) / YEAR_MS;
}

/** The physical facts of one discharge as the meter sees it. */
export interface RunPhysics {
  /** Bus voltage at isolation, volts. */
  v0Volts: number;
  /** Bus capacitance at the bank's temperature, microfarads. */
  capacitanceMicrofarads: number;
  /** Bleeder resistance, ohms. */
  bleederOhms: number;
  /** Meter input resistance, ohms. */
  meterInputOhms: number;
  /** Control supply's power above its dropout, watts (0: none). */
  controlSupplyWatts: number;
  /** Bus voltage at which the control supply drops out, volts. */
  dropoutVolts: number;
}

/** R_eff = bleeder ∥ meter, ohms. */
export function effectiveOhmsOf(physics: RunPhysics): number {
  return 1 / (1 / physics.bleederOhms + 1 / physics.meterInputOhms);
}

/** The RC time constant of the run, seconds: C · (R_bleed ∥ R_meter). */
export function trueTauSecondsOf(physics: RunPhysics): number {
  return physics.capacitanceMicrofarads * 1e-6 * effectiveOhmsOf(physics);
}

/** A handheld meter of the demo plant. */
export interface DemoMeter {
  name: string;
  inputOhms: number;
  resolutionVolts: number;
}

/** The plant's handheld meters (invented names): 10 MΩ inputs but one older 1 MΩ unit. */
export const DEMO_METERS: readonly DemoMeter[] = [
  { name: 'Calder DM-87 (store no. 4)', inputOhms: 10e6, resolutionVolts: 0.1 },
  { name: 'Calder DM-87 (store no. 7)', inputOhms: 10e6, resolutionVolts: 0.1 },
  { name: 'Norvane HV-2 (workshop)', inputOhms: 10e6, resolutionVolts: 1 },
  { name: 'Teskey 1000 V insulated meter', inputOhms: 1e6, resolutionVolts: 0.1 },
];

/** The end of a guided capture: the bus below this, volts (CAPTURE_END_VOLTS of the product). */
export const HISTORY_END_VOLTS = 50;

/** A reading as typed with one keystroke slip: a digit dropped or doubled, or the point moved. */
export function mistype(volts: number, random: () => number): number {
  const text = volts.toFixed(volts >= 100 ? 0 : 1);
  for (let attempt = 0; attempt < 20; attempt++) {
    const kind = Math.floor(random() * 3);
    const i = Math.floor(random() * text.length);
    let slipped = text;
    if (kind === 0 && text[i] !== '.') slipped = text.slice(0, i) + text.slice(i + 1);
    else if (kind === 1 && text[i] !== '.') slipped = text.slice(0, i) + text[i] + text.slice(i);
    else if (kind === 2) slipped = String(Number((volts * (random() < 0.5 ? 10 : 0.1)).toPrecision(6)));
    const value = Number(slipped);
    if (value > 0 && Number.isFinite(value) && Math.abs(value / volts - 1) > 0.05) return value;
  }
  return volts * 10;
}

const roundTo = (value: number, step: number) => {
  const digits = step < 1 ? Math.round(-Math.log10(step)) : 0;
  return Number((Math.round(value / step) * step).toFixed(digits));
};

/** One simulated handheld run: the readings as typed, and the truth behind them. */
export interface SimulatedHistoryRun {
  samples: DecaySample[];
  /** The RC τ a perfect fit finds, seconds. */
  tauSeconds: number;
  /** Index of the mistyped reading, or null. */
  slipIndex: number | null;
}

/**
 * The readings of one guided capture: prompted at the capture schedule for the τ the technician
 * expected (`expectedTauSeconds`, the bank's baseline), read a second or so late off a meter of
 * `resolutionVolts` with noise of a few tenths of a volt and 0.1 % of the reading, recorded at the
 * prompted time, until the first reading below 50 V (or the schedule's end).
 *
 * @param physics - the discharge
 * @param expectedTauSeconds - τ the capture schedule is made for, seconds
 * @param options.resolutionVolts - the meter's resolution, volts
 * @param options.mistyped - one reading (not the first two) is mistyped
 * @param random - the seeded generator
 * @example
 * simulateHistoryRun({ v0Volts: 560, capacitanceMicrofarads: 2350, bleederOhms: 94_000, meterInputOhms: 10e6,
 *   controlSupplyWatts: 0, dropoutVolts: 300 }, 221, { resolutionVolts: 0.1, mistyped: false }, seededRandom(1))
 * // { samples: [{ tSeconds: 0, volts: 560.1 }, { tSeconds: 5, volts: 547.6 }, ...], tauSeconds: 218.9, slipIndex: null }
 */
export function simulateHistoryRun(
  physics: RunPhysics,
  expectedTauSeconds: number,
  options: { resolutionVolts: number; mistyped: boolean },
  random: () => number,
): SimulatedHistoryRun {
  const tauSeconds = trueTauSecondsOf(physics);
  const decay = {
    v0Volts: physics.v0Volts,
    tauSeconds,
    controlSupplyWatts: physics.controlSupplyWatts,
    effectiveOhms: effectiveOhmsOf(physics),
    dropoutVolts: physics.dropoutVolts,
  };
  const times = captureScheduleSeconds(expectedTauSeconds, { endVolts: HISTORY_END_VOLTS, startVolts: physics.v0Volts });
  const noiseVolts = uniform(random, 0.05, 0.3);
  const lateSeconds = uniform(random, 0.2, 1.2);
  const samples: DecaySample[] = [];
  for (const tSeconds of times) {
    const readAt = tSeconds === 0 ? 0 : Math.max(0, tSeconds + lateSeconds + 0.4 * gaussian(random));
    const shown = controlSupplyDecayVolts(decay, readAt);
    const noisy = shown + noiseVolts * gaussian(random) + 0.001 * shown * gaussian(random);
    const volts = Math.max(roundTo(noisy, options.resolutionVolts), options.resolutionVolts);
    samples.push({ tSeconds, volts });
    if (volts < HISTORY_END_VOLTS) break;
  }
  // keep going past the schedule's end if the bus is still high (a slower bank than expected)
  let t = times[times.length - 1] ?? 0;
  while (samples[samples.length - 1]!.volts >= HISTORY_END_VOLTS && samples.length < 80) {
    t += Math.max(30, Math.round(expectedTauSeconds / 3 / 30) * 30);
    const shown = controlSupplyDecayVolts(decay, t + lateSeconds);
    samples.push({ tSeconds: t, volts: Math.max(roundTo(shown + noiseVolts * gaussian(random), options.resolutionVolts), options.resolutionVolts) });
  }
  let slipIndex: number | null = null;
  if (options.mistyped && samples.length > 4) {
    slipIndex = 2 + Math.floor(random() * (samples.length - 2));
    samples[slipIndex] = { ...samples[slipIndex]!, volts: mistype(samples[slipIndex]!.volts, random) };
  }
  return { samples, tauSeconds, slipIndex };
}

/**
 * Capacitance at the bank's temperature from its value at 20 °C, by the design's coefficient.
 *
 * @example capacitanceAtMicrofarads(2200, 0.25, 40) // 2310
 */
export function capacitanceAtMicrofarads(at20Microfarads: number, coefficientPercentPerKelvin: number, bankTempC: number): number {
  return at20Microfarads * (1 + (coefficientPercentPerKelvin / 100) * (bankTempC - 20));
}
