/**
 * A simulation of real decay runs, written from the physics and independent of the engine:
 *
 * - the bus capacitance C discharges through the bleeder in parallel with the instrument's input
 *   resistance (meter loading), τ = C · (R_bleed ∥ R_meter);
 * - above its dropout voltage the drive's control supply draws a constant power P, so
 *   C·dV/dt = −V/R − P/V and V² + P·R decays with τ/2; below the dropout the decay is plain RC;
 * - a handheld meter shows the voltage rounded to its resolution, with a little noise and a
 *   %-of-reading flicker; the technician reads it near, not at, the prompted time (timing
 *   jitter) and writes down the prompted time; now and then a reading is mistyped;
 * - a logger samples on an exact clock with noise in volts, hundreds to thousands of samples.
 *
 * Every run carries its true τ and the truth about its control-supply phase, so tests can score
 * the engine against it. All randomness comes from the seeded generator passed in.
 */

import type { DecaySample } from '../../../../shared/domain/decay-fit';
import { gaussian } from './synthetic-decay';

/** The physical facts of one discharge. */
export interface DischargePhysics {
  /** Bus voltage at isolation, volts. */
  v0Volts: number;
  /** Bus capacitance, farads. */
  capacitanceFarads: number;
  /** Bleeder resistance across the bus, ohms. */
  bleederOhms: number;
  /** Input resistance of the instrument across the bus, ohms (Infinity = none). */
  instrumentOhms: number;
  /** Constant power drawn by the control supply above its dropout voltage, watts (0 = none). */
  controlSupplyWatts: number;
  /** Bus voltage below which the control supply stops drawing, volts. */
  dropoutVolts: number;
}

/** R_eff = bleeder ∥ instrument, ohms. */
export function effectiveOhmsOf(physics: DischargePhysics): number {
  return Number.isFinite(physics.instrumentOhms)
    ? 1 / (1 / physics.bleederOhms + 1 / physics.instrumentOhms)
    : physics.bleederOhms;
}

/** The RC time constant the fit should find: C · R_eff, seconds. */
export function trueTauSeconds(physics: DischargePhysics): number {
  return physics.capacitanceFarads * effectiveOhmsOf(physics);
}

/** Time at which the bus reaches the dropout voltage (0 when it starts below it), seconds. */
export function kneeSecondsOf(physics: DischargePhysics): number {
  if (physics.controlSupplyWatts <= 0 || physics.v0Volts <= physics.dropoutVolts) return 0;
  const tau = trueTauSeconds(physics);
  const pr = physics.controlSupplyWatts * effectiveOhmsOf(physics);
  return (tau / 2) * Math.log((physics.v0Volts ** 2 + pr) / (physics.dropoutVolts ** 2 + pr));
}

/**
 * The bus voltage at `tSeconds` after isolation: (V² + P·R) decays with τ/2 down to the dropout
 * voltage, then V decays with τ. Checked against a general-purpose ODE integrator in
 * decay-simulation.test.ts.
 */
export function busVoltsAt(physics: DischargePhysics, tSeconds: number): number {
  const tau = trueTauSeconds(physics);
  const knee = kneeSecondsOf(physics);
  if (knee > 0 && tSeconds < knee) {
    const pr = physics.controlSupplyWatts * effectiveOhmsOf(physics);
    return Math.sqrt(
      Math.max((physics.v0Volts ** 2 + pr) * Math.exp((-2 * tSeconds) / tau) - pr, 0),
    );
  }
  const startVolts = knee > 0 ? physics.dropoutVolts : physics.v0Volts;
  return startVolts * Math.exp(-(tSeconds - knee) / tau);
}

/** The kinds of simulated run. */
export type SimulatedRunKind =
  'clean' | 'typo' | 'short' | 'control-supply' | 'logger' | 'logger-control-supply';

/** Every kind, handheld first. */
export const SIMULATED_RUN_KINDS: readonly SimulatedRunKind[] = [
  'clean',
  'typo',
  'short',
  'control-supply',
  'logger',
  'logger-control-supply',
];

/** One simulated run with its truth. */
export interface SimulatedRun {
  kind: SimulatedRunKind;
  samples: DecaySample[];
  physics: DischargePhysics;
  /** The τ a perfect fit would report, seconds. */
  tauSeconds: number;
  /** Time the control supply dropped out, seconds (0 = no control-supply phase). */
  kneeSeconds: number;
  /** Readings taken before the knee. */
  readingsBeforeKnee: number;
  /** Index of the mistyped reading, or null. */
  slipIndex: number | null;
}

const uniform = (random: () => number, low: number, high: number): number =>
  low + (high - low) * random();
const logUniform = (random: () => number, low: number, high: number): number =>
  Math.exp(uniform(random, Math.log(low), Math.log(high)));
const pick = <T>(random: () => number, items: readonly T[]): T =>
  items[Math.floor(random() * items.length)]!;

/** DC bus voltages of 230, 400 and 480 V drives (rectifier arithmetic, DOMAIN.md). */
const BUS_VOLTS = [
  [310, 325],
  [540, 565],
  [650, 680],
] as const;

function physicsOf(
  random: () => number,
  instrumentOhms: number,
  controlSupply: boolean,
): DischargePhysics {
  const [low, high] = pick(random, BUS_VOLTS);
  const v0Volts = uniform(random, low, high);
  const bleederOhms = logUniform(random, 30_000, 470_000);
  const tauBleed = logUniform(random, 90, 1200);
  const effectiveOhms = 1 / (1 / bleederOhms + 1 / instrumentOhms);
  // A switched-mode control supply dropping out at 45–80 % of the bus voltage. Its draw is set
  // through P·R / V0² (0.1–10: from a supply that drew ten times the bleeder's power at
  // isolation to one tenth of it), which is what decides how long the phase lasts (from a few
  // per cent of τ to about half of it), and kept to what such supplies draw: 2–80 W.
  const drawRatio = logUniform(random, 0.1, 10);
  const watts = Math.min(Math.max((drawRatio * v0Volts * v0Volts) / effectiveOhms, 2), 80);
  return {
    v0Volts,
    capacitanceFarads: tauBleed / bleederOhms,
    bleederOhms,
    instrumentOhms,
    controlSupplyWatts: controlSupply ? watts : 0,
    dropoutVolts: v0Volts * uniform(random, 0.45, 0.8),
  };
}

/** A prompt interval a technician can follow: 5, 10, 15, 20, 30, 60, 120 s. */
function niceStep(seconds: number): number {
  const steps = [5, 10, 15, 20, 30, 60, 120];
  let best = steps[0]!;
  for (const step of steps)
    if (Math.abs(Math.log(step / seconds)) < Math.abs(Math.log(best / seconds))) best = step;
  return best;
}

/**
 * Prompted times of a handheld run: `count` readings over about `spanTimeConstants` τ, evenly
 * or denser at the start (half steps for the first four), at a whole prompt interval.
 */
function promptedTimes(
  random: () => number,
  count: number,
  tauSeconds: number,
  spanTimeConstants: number,
): number[] {
  const step = niceStep((spanTimeConstants * tauSeconds) / (count - 1));
  const denseStart = random() < 0.5;
  const times: number[] = [];
  let t = 0;
  for (let i = 0; i < count; i++) {
    times.push(t);
    t += denseStart && i < 4 ? Math.max(step / 2, 5) : step;
  }
  return times;
}

/** A meter as a technician uses it: resolution, noise in volts and as a fraction of the reading. */
interface MeterFacts {
  resolutionVolts: number;
  noiseVolts: number;
  fractionOfReading: number;
  jitterSeconds: number;
}

function handheldMeter(random: () => number): MeterFacts {
  return {
    resolutionVolts: pick(random, [0.1, 1, 1]),
    noiseVolts: uniform(random, 0.02, 0.3),
    fractionOfReading: uniform(random, 0, 0.002),
    jitterSeconds: uniform(random, 0.3, 3),
  };
}

function roundTo(value: number, step: number): number {
  const digits = step < 1 ? Math.round(-Math.log10(step)) : 0;
  return Number((Math.round(value / step) * step).toFixed(digits));
}

/** The reading as typed with one keystroke slip: a digit dropped, doubled, swapped, or the point moved. */
export function mistype(volts: number, random: () => number): number {
  const text = String(volts);
  for (let attempt = 0; attempt < 20; attempt++) {
    const kind = Math.floor(random() * 4);
    const i = Math.floor(random() * text.length);
    let slipped = text;
    if (kind === 0 && text[i] !== '.') slipped = text.slice(0, i) + text.slice(i + 1);
    else if (kind === 1 && text[i] !== '.') slipped = text.slice(0, i) + text[i] + text.slice(i);
    else if (kind === 2 && i + 1 < text.length && text[i] !== '.' && text[i + 1] !== '.')
      slipped = text.slice(0, i) + text[i + 1] + text[i] + text.slice(i + 2);
    else if (kind === 3)
      slipped = String(Number((volts * (random() < 0.5 ? 10 : 0.1)).toPrecision(8)));
    const value = Number(slipped);
    // A slip worth the name: at least 3 % off and still a positive number.
    if (value > 0 && Number.isFinite(value) && Math.abs(value / volts - 1) > 0.03) return value;
  }
  return volts * 10;
}

function handheldRun(random: () => number, kind: SimulatedRunKind): SimulatedRun {
  const controlSupply = kind === 'control-supply';
  const physics = physicsOf(random, 10e6, controlSupply);
  const tau = trueTauSeconds(physics);
  const knee = kneeSecondsOf(physics);
  const count = 10 + Math.floor(random() * 16);
  const span = kind === 'short' ? uniform(random, 0.25, 0.8) : uniform(random, 1.2, 3);
  const times = promptedTimes(random, count, tau, span);
  const meter = handheldMeter(random);
  const samples = times.map((tSeconds) => {
    const readAt = Math.max(0, tSeconds + meter.jitterSeconds * gaussian(random));
    const shown = busVoltsAt(physics, readAt);
    const noisy =
      shown +
      meter.noiseVolts * gaussian(random) +
      meter.fractionOfReading * shown * gaussian(random);
    return {
      tSeconds,
      volts: Math.max(roundTo(noisy, meter.resolutionVolts), meter.resolutionVolts),
    };
  });
  let slipIndex: number | null = null;
  if (kind === 'typo') {
    slipIndex = Math.floor(random() * samples.length);
    samples[slipIndex] = {
      ...samples[slipIndex]!,
      volts: mistype(samples[slipIndex]!.volts, random),
    };
  }
  return {
    kind,
    samples,
    physics,
    tauSeconds: tau,
    kneeSeconds: knee,
    readingsBeforeKnee: samples.filter((s) => s.tSeconds < knee).length,
    slipIndex,
  };
}

function loggerRun(random: () => number, kind: SimulatedRunKind): SimulatedRun {
  const physics = physicsOf(random, pick(random, [1e6, 10e6]), kind === 'logger-control-supply');
  const tau = trueTauSeconds(physics);
  const knee = kneeSecondsOf(physics);
  const count = Math.round(logUniform(random, 200, 3000));
  const span = uniform(random, 1.5, 4);
  const step = (span * tau) / count;
  const noiseVolts = logUniform(random, 0.02, 0.5);
  const resolutionVolts = pick(random, [0.001, 0.01]);
  const samples: DecaySample[] = [];
  for (let i = 0; i < count; i++) {
    const tSeconds = Number((i * step).toFixed(3));
    const volts = roundTo(
      busVoltsAt(physics, tSeconds) + noiseVolts * gaussian(random),
      resolutionVolts,
    );
    samples.push({ tSeconds, volts: Math.max(volts, resolutionVolts) });
  }
  return {
    kind,
    samples,
    physics,
    tauSeconds: tau,
    kneeSeconds: knee,
    readingsBeforeKnee: samples.filter((s) => s.tSeconds < knee).length,
    slipIndex: null,
  };
}

/**
 * One simulated run of the given kind:
 * - `clean`: handheld, 10–25 readings over 1.2–3 τ, rounding, meter noise, timing jitter;
 * - `typo`: the same with one mistyped reading;
 * - `short`: handheld over only 0.25–0.8 τ;
 * - `control-supply`: handheld with a constant-power control supply (3–60 W) above its dropout;
 * - `logger` / `logger-control-supply`: 200–3000 samples over 1.5–4 τ on an exact clock, noise in
 *   volts, a 1 or 10 MΩ input, without and with a control supply.
 *
 * @example
 * const run = simulateRun('control-supply', seededRandom(7)); // run.samples, run.tauSeconds, run.kneeSeconds
 */
export function simulateRun(kind: SimulatedRunKind, random: () => number): SimulatedRun {
  return kind === 'logger' || kind === 'logger-control-supply'
    ? loggerRun(random, kind)
    : handheldRun(random, kind);
}
