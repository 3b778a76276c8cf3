/**
 * What a logger records around a discharge that is not the discharge itself, found and taken out
 * with a note rather than fitted or refused:
 *
 * - **repeated times**: a clock coarser than the sampling (0.1 s stamps at 50 Hz) writes the same
 *   time on several rows; their readings are averaged;
 * - **the tail at 0 V**: once the bus is discharged a logger reads noise around zero (−0.04 V,
 *   0.03 V …), which is no reading of the decay;
 * - **pre-trigger readings**: the bus held flat before the switch-off, and readings stamped with
 *   negative times before a trigger at t = 0. A flat stretch inside the fit biases τ (up to 11 %
 *   in trials) and thousands of flat readings look like outliers, so t = 0 is set at the switch-off.
 *
 * Pure functions on parallel arrays (times in seconds, volts, file rows); messages name the rows.
 */

import { EngineInputError } from './errors';
import { formatNumber } from './format';

/** Readings as parallel arrays: file time (s), volts, and the file row of each. */
export interface ReadingArrays {
  t: number[];
  v: number[];
  rows: number[];
}

/** Names of the columns, for messages. */
export interface ReadingColumnNames {
  time: string;
  voltage: string;
}

/** Readings on one time may differ by this share of their mean (or 1 % of the run's peak). */
const REPEAT_AGREEMENT = 0.02;

/** Share of rows repeating a time from which the file is taken to have a coarse clock. */
const COARSE_CLOCK_SHARE = 0.25;

/**
 * Averages the readings of rows that repeat the time of the row before.
 *
 * Readings of one time must agree within 2 % (or 1 % of the run's peak). In a file where a
 * quarter of the rows or more (and at least 10) repeat a time, the clock is coarser than the sampling throughout,
 * and the readings of one stamp may also spread as far as the decay falls from the reading
 * before the stamp to the one after it (a steep control-supply start under a 1 s clock); a rare
 * repeat is held to the 2 %, as a typed time written twice is a slip.
 *
 * @returns the merged readings (the row of each group's first reading) and how many rows were
 *   merged into the row before them
 * @throws EngineInputError('times-not-increasing') when the readings of one time disagree more
 *   than that (a typing slip, not a coarse clock)
 * @example
 * averageRepeatedTimes({ t: [0, 0.1, 0.1, 0.2], v: [10, 9.9, 9.7, 9.6], rows: [2, 3, 4, 5] }, names)
 * // { readings: { t: [0, 0.1, 0.2], v: [10, 9.8, 9.6], rows: [2, 3, 5] }, merged: 1 }
 */
export function averageRepeatedTimes(
  readings: ReadingArrays,
  names: ReadingColumnNames,
): { readings: ReadingArrays; merged: number } {
  const { t, v, rows } = readings;
  const n = t.length;
  let repeats = false;
  for (let i = 1; i < n && !repeats; i++) repeats = t[i] === t[i - 1];
  if (!repeats) return { readings, merged: 0 };
  let peak = 0;
  for (let i = 0; i < n; i++) peak = Math.max(peak, Math.abs(v[i]!));
  let repeated = 0;
  for (let i = 1; i < n; i++) if (t[i] === t[i - 1]) repeated++;
  const coarseClock = repeated >= 10 && repeated >= COARSE_CLOCK_SHARE * n;
  const out: ReadingArrays = { t: [], v: [], rows: [] };
  let merged = 0;
  for (let i = 0; i < n;) {
    let j = i + 1;
    let sum = v[i]!;
    let low = sum;
    let high = sum;
    while (j < n && t[j] === t[i]) {
      sum += v[j]!;
      low = Math.min(low, v[j]!);
      high = Math.max(high, v[j]!);
      j++;
    }
    const mean = sum / (j - i);
    const around = coarseClock ? Math.abs(v[Math.max(i - 1, 0)]! - v[Math.min(j, n - 1)]!) : 0;
    if (high - low > Math.max(REPEAT_AGREEMENT * Math.abs(mean), 0.01 * peak, around)) {
      // Name the reading furthest from the others (the later one of a pair).
      let far = i;
      for (let k = i; k < j; k++) if (Math.abs(v[k]! - mean) >= Math.abs(v[far]! - mean)) far = k;
      const other = far === i ? i + 1 : i;
      throw new EngineInputError(
        'times-not-increasing',
        `Row ${rows[far]}: the time ${formatNumber(t[i]!, 6)} s does not come after row ${rows[other]}'s ${formatNumber(t[i]!, 6)} s (column "${names.time}"), and the rows of this time read ${formatNumber(low, 4)} V to ${formatNumber(high, 4)} V (column "${names.voltage}"): a repeated time is averaged only when its readings agree${coarseClock ? ' as closely as the decay around them allows' : ' within 2 %'}. Check for a typing slip.`,
        [
          {
            path: `row ${rows[far]}, column ${names.time}`,
            message: 'repeated time, readings disagree',
          },
        ],
      );
    }
    out.t.push(t[i]!);
    out.v.push(mean);
    out.rows.push(rows[i]!);
    merged += j - i - 1;
    i = j;
  }
  return { readings: out, merged };
}

/**
 * Refuses times that go backwards, naming the row (after {@link averageRepeatedTimes}, so a repeat
 * is a slip).
 *
 * @throws EngineInputError('times-not-increasing')
 * @example
 * requireIncreasingTimes({ t: [0, 30, 20], v: [5, 4, 3], rows: [2, 3, 4] }, names) // throws: 'Row 4: the time 20 s does not come after row 3's 30 s ...'
 */
export function requireIncreasingTimes(readings: ReadingArrays, names: ReadingColumnNames): void {
  const { t, rows } = readings;
  for (let i = 1; i < t.length; i++) {
    if (!(t[i]! > t[i - 1]!)) {
      throw new EngineInputError(
        'times-not-increasing',
        `Row ${rows[i]}: the time ${formatNumber(t[i]!, 6)} s does not come after row ${rows[i - 1]}'s ${formatNumber(t[i - 1]!, 6)} s (column "${names.time}"); times must increase.`,
        [{ path: `row ${rows[i]}, column ${names.time}`, message: 'time does not increase' }],
      );
    }
  }
}

/** The end of a run that sits at 0 V (see {@link findZeroTail}). */
export interface ZeroTail {
  /** Index of the first reading left out; every reading from here on is at or near 0 V. */
  from: number;
  /** Readings within ±bandVolts of zero count as zero: twice the deepest negative reading. */
  bandVolts: number;
}

/**
 * Finds the tail of a run at 0 V: from the first reading at or below zero to the end (where no
 * reading may rise above twice the noise band or 1 % of the peak), together with the readings just
 * before it that are within the noise band (twice the deepest negative reading).
 *
 * @returns the tail, or null when no reading is at or below 0 V
 * @throws EngineInputError('non-positive-voltage') when a reading at or below zero is followed by a
 *   real voltage (a sign slip or a probe the wrong way round, not the end of a decay), when it lies
 *   far below zero, when it follows a reading above 10 % of the peak (a decay reaches zero
 *   gradually), or when every reading is at or below zero
 * @example
 * findZeroTail({ t: [0, 1, 2, 3, 4], v: [5, 1.8, 0.02, -0.03, 0.01], rows: [2, 3, 4, 5, 6] }, names)
 * // { from: 2, bandVolts: 0.06 }
 */
export function findZeroTail(readings: ReadingArrays, names: ReadingColumnNames): ZeroTail | null {
  const { v, rows } = readings;
  const n = v.length;
  let first = -1;
  let peak = -Infinity;
  for (let i = 0; i < n; i++) {
    if (first < 0 && v[i]! <= 0) first = i;
    peak = Math.max(peak, v[i]!);
  }
  if (first < 0) return null;
  const zeroAt = (i: number): string =>
    `Row ${rows[i]}: the voltage ${formatNumber(v[i]!, 4)} V is not above zero (column "${names.voltage}")`;
  const refuse = (i: number, message: string): never => {
    throw new EngineInputError('non-positive-voltage', message, [
      { path: `row ${rows[i]}, column ${names.voltage}`, message: 'at or below 0 V' },
    ]);
  };
  if (!(peak > 0)) {
    refuse(
      first,
      `${zeroAt(first)}, and no reading is above zero: check the probe polarity or the sign of the column.`,
    );
  }
  let deepest = 0;
  let deepestAt = first;
  for (let i = first; i < n; i++) {
    if (-v[i]! > deepest) {
      deepest = -v[i]!;
      deepestAt = i;
    }
  }
  if (deepest > 0.02 * peak) {
    refuse(
      deepestAt,
      `Row ${rows[deepestAt]}: the voltage ${formatNumber(v[deepestAt]!, 4)} V is not above zero (column "${names.voltage}"), and it is far below the noise around 0 V a logger shows after a decay (${formatPercent(deepest / peak)} of the peak): check the sign, the probe polarity or a typing slip.`,
    );
  }
  // What a discharged bus reads: noise around zero, about as far above it as below.
  const bandVolts = 2 * deepest;
  const real = Math.max(2 * bandVolts, 0.01 * peak);
  for (let i = first; i < n; i++) {
    if (v[i]! > real) {
      refuse(
        first,
        `${zeroAt(first)}, yet row ${rows[i]} reads ${formatNumber(v[i]!, 4)} V after it: only the end of a decay may sit at 0 V. Check the sign, the probe polarity or a typing slip.`,
      );
    }
  }
  let from = first;
  while (from > 0 && v[from - 1]! <= bandVolts) from--;
  // A decay reaches the noise around zero gradually: a drop from a high reading straight to 0 V is
  // a slip or a lost connection, not the end of the discharge.
  if (from > 0 && v[from - 1]! > 0.1 * peak) {
    refuse(
      first,
      `${zeroAt(first)}, right after ${formatNumber(v[from - 1]!, 4)} V at row ${rows[from - 1]}: a decay does not drop to 0 V in one step. Check the sign, the probe's connection or a typing slip.`,
    );
  }
  return { from, bandVolts };
}

function formatPercent(fraction: number): string {
  return `${formatNumber(fraction * 100, 2)} %`;
}

/** Where the discharge starts in a run recorded with pre-trigger readings (see {@link findSwitchOff}). */
export interface SwitchOff {
  /** How it was found: a flat bus before the fall, or readings stamped before a trigger at t = 0. */
  found: 'flat-bus' | 'negative-times';
  /** Index of the first reading kept. */
  firstKept: number;
  /** File time of the switch-off, seconds: t = 0 goes here. */
  atSeconds: number;
  /** Level of the bus before the switch-off, volts (median of the flat readings). */
  levelVolts: number;
}

function median(values: number[]): number {
  const sorted = values.slice().sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

/**
 * The noise band of a flat bus: five times the reading noise (from second differences, which a
 * slow trend does not disturb), at least two steps of the meter's resolution and 0.2 % of the
 * level.
 */
function flatBandVolts(v: readonly number[], level: number): number {
  const count = Math.min(v.length, 400);
  const second: number[] = [];
  let step = Infinity;
  for (let i = 2; i < count; i++) second.push(Math.abs(v[i]! - 2 * v[i - 1]! + v[i - 2]!));
  for (let i = 1; i < count; i++) {
    const d = Math.abs(v[i]! - v[i - 1]!);
    if (d > 0 && d < step) step = d;
  }
  // MAD of second differences: σ·√6 for white noise; 1.4826 turns a MAD into a σ.
  const noise = second.length > 0 ? (1.4826 * median(second)) / Math.sqrt(6) : 0;
  return Math.max(5 * noise, Number.isFinite(step) ? 2 * step : 0, 0.002 * Math.abs(level));
}

/**
 * Finds pre-trigger readings: a flat bus before the fall (at least 5 readings level within their
 * noise, for longer than the fall that follows would allow), or readings at negative times that
 * are flat. The switch-off is where the start of the fall, extrapolated in a straight line, leaves
 * the flat level; readings until the fall is clear of the noise band are left out.
 *
 * A run that falls from its first reading, as a handheld run does, has none.
 *
 * @returns where the discharge starts, or null when the run has no pre-trigger readings
 * @example
 * // 100 readings flat at 560 V, then a decay: t = 0 is set where it leaves 560 V
 * findSwitchOff({ t, v, rows }) // { found: 'flat-bus', firstKept: 102, atSeconds: 10, levelVolts: 560 }
 */
export function findSwitchOff(readings: ReadingArrays): SwitchOff | null {
  const { t, v } = readings;
  const n = v.length;
  if (n < 8) return null;
  const level = median(v.slice(0, Math.min(n, 9)));
  const band = flatBandVolts(v, level);
  const below = level - band;
  let c = -1;
  for (let i = 1; i + 2 < n; i++) {
    if (v[i]! < below && v[i + 1]! < below && v[i + 2]! < below) {
      c = i;
      break;
    }
  }
  const triggerAt = t[0]! < 0 ? t.findIndex((time) => time >= 0) : -1;
  if (c >= 5 && mostlyWithin(v, c, level, band)) {
    // The fall just after the flat stretch, as a straight line.
    let end = c + 1;
    while (end < n - 1 && end - c < 50 && v[end]! > level - 6 * band) end++;
    const line = straightLine(t, v, c, end);
    if (line !== null && line.slope < 0) {
      const flatSeconds = t[c - 1]! - t[0]!;
      if (-line.slope * flatSeconds > 3 * band) {
        const crossing = (level - line.intercept) / line.slope;
        return {
          found: 'flat-bus',
          firstKept: c,
          atSeconds: Math.min(Math.max(crossing, t[0]!), t[c]!),
          levelVolts: level,
        };
      }
    }
  }
  if (triggerAt > 0) {
    // Readings before a trigger at t = 0: left out when they hold the bus flat.
    const before = v.slice(0, triggerAt);
    const preLevel = median(before);
    if (mostlyWithin(before, before.length, preLevel, flatBandVolts(before, preLevel))) {
      return { found: 'negative-times', firstKept: triggerAt, atSeconds: 0, levelVolts: preLevel };
    }
  }
  return null;
}

/** True when at least 95 % of the first `count` readings lie within ±band of the level. */
function mostlyWithin(v: readonly number[], count: number, level: number, band: number): boolean {
  let outside = 0;
  for (let i = 0; i < count; i++) if (Math.abs(v[i]! - level) > band) outside++;
  return outside <= 0.05 * count;
}

function straightLine(
  t: readonly number[],
  v: readonly number[],
  from: number,
  to: number,
): { slope: number; intercept: number } | null {
  const count = to - from + 1;
  if (count < 2) return null;
  let st = 0;
  let sv = 0;
  for (let i = from; i <= to; i++) {
    st += t[i]!;
    sv += v[i]!;
  }
  const mt = st / count;
  const mv = sv / count;
  let stt = 0;
  let stv = 0;
  for (let i = from; i <= to; i++) {
    stt += (t[i]! - mt) ** 2;
    stv += (t[i]! - mt) * (v[i]! - mv);
  }
  if (!(stt > 0)) return null;
  const slope = stv / stt;
  return { slope, intercept: mv - slope * mt };
}
