import { describe, expect, it } from 'vitest';
import {
  averageRepeatedTimes,
  findSwitchOff,
  findZeroTail,
  requireIncreasingTimes,
  type ReadingArrays,
} from '../../../shared/domain/logger-readings';
import { seededRandom } from '../../../infra/seed/seeded-random';

const names = { time: 't', voltage: 'v' };
const rowsFor = (n: number): number[] => Array.from({ length: n }, (_, i) => i + 2);
const readings = (t: number[], v: number[]): ReadingArrays => ({ t, v, rows: rowsFor(t.length) });

function gaussian(random: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
}

/** A logger run: `flat` readings of the bus at v0, then the decay, every `step` s, with noise. */
function loggerRun(options: {
  flat: number;
  step: number;
  tau: number;
  count: number;
  noise: number;
  seed: number;
}): ReadingArrays {
  const random = seededRandom(options.seed);
  const t: number[] = [];
  const v: number[] = [];
  for (let i = 0; i < options.flat + options.count; i++) {
    const since = (i - options.flat) * options.step;
    t.push(i * options.step);
    v.push(
      (since <= 0 ? 565 : 565 * Math.exp(-since / options.tau)) + options.noise * gaussian(random),
    );
  }
  return readings(t, v);
}

describe('averageRepeatedTimes', () => {
  it('when a coarse clock repeats times, then the readings of one time are averaged on the first row', () => {
    expect(
      averageRepeatedTimes(
        readings([0, 0.1, 0.1, 0.1, 0.2], [10, 9.8125, 9.75, 9.6875, 9.5]),
        names,
      ),
    ).toEqual({
      readings: { t: [0, 0.1, 0.2], v: [10, 9.75, 9.5], rows: [2, 3, 6] },
      merged: 2,
    });
  });

  it('when no time repeats, then the readings come back as they were', () => {
    const input = readings([0, 1, 2], [3, 2, 1]);
    expect(averageRepeatedTimes(input, names)).toEqual({ readings: input, merged: 0 });
  });

  it('when the readings of a repeated time disagree by more than 2 %, then the rows are refused', () => {
    expect(() => averageRepeatedTimes(readings([0, 30, 30], [560, 490, 430]), names)).toThrow(
      /^Row 4: the time 30 s does not come after row 3's 30 s \(column "t"\), and the rows of this time read 430 V to 490 V/,
    );
  });
});

describe('averageRepeatedTimes under a 1 s clock at 10 Hz', () => {
  // The control-supply start: about 40 V/s at first (C·dV/dt = −V/R − P/V, 565 V, 40 W, 330 µF).
  const t: number[] = [];
  const v: number[] = [];
  for (let i = 0; i < 300; i++) {
    t.push(Math.floor(i / 10));
    v.push(565 * Math.exp(-(i / 10) / 12));
  }

  it('when a whole second of a steep fall shares one stamp, then its readings are averaged', () => {
    const { readings: merged, merged: count } = averageRepeatedTimes(readings(t, v), names);
    expect(count).toBe(270);
    expect(merged.t).toEqual(Array.from({ length: 30 }, (_, i) => i));
  });

  it('when one reading of a stamp is a slip far off its neighbours, then it is still refused', () => {
    const slipped = v.slice();
    slipped[55] = v[55]! / 10; // a dropped digit inside the stamp of t = 5 s
    expect(() => averageRepeatedTimes(readings(t, slipped), names)).toThrow(
      /^Row 57: the time 5 s does not come after row 52's 5 s .* read 35.73 V to 372.5 V .* as closely as the decay around them allows/,
    );
  });
});

describe('requireIncreasingTimes', () => {
  it('when a time goes back, then its row and column are named', () => {
    expect(() => requireIncreasingTimes(readings([0, 30, 20], [5, 4, 3]), names)).toThrow(
      `Row 4: the time 20 s does not come after row 3's 30 s (column "t"); times must increase.`,
    );
  });
});

describe('findZeroTail', () => {
  it('when the run ends in noise around 0 V, then the tail and the small readings before it are found', () => {
    expect(
      findZeroTail(readings([0, 1, 2, 3, 4, 5, 6], [5, 1.8, 0.4, 0.03, 0.02, -0.03, 0.01]), names),
    ).toEqual({ from: 3, bandVolts: 0.06 });
  });

  it('when a run drops from a high reading straight to 0 V, then it is refused, not cut', () => {
    expect(() => findZeroTail(readings([0, 1, 2, 3], [5, 1.8, 0.02, -0.03]), names)).toThrow(
      /^Row 5: the voltage -0.03 V is not above zero \(column "v"\), right after 1.8 V at row 3: a decay does not drop to 0 V in one step/,
    );
  });

  it('when no reading is at or below 0 V, then there is no tail', () => {
    expect(findZeroTail(readings([0, 1, 2], [5, 2, 0.1]), names)).toBeNull();
  });

  it('when a reading far below zero ends the run, then it is refused as a sign or probe slip', () => {
    expect(() => findZeroTail(readings([0, 1, 2, 3], [560, 300, 2, -40]), names)).toThrow(
      /^Row 5: the voltage -40 V is not above zero \(column "v"\), and it is far below the noise around 0 V/,
    );
  });

  it('when every reading is at or below zero, then the probe polarity is named', () => {
    expect(() => findZeroTail(readings([0, 1], [-560, -300]), names)).toThrow(
      /no reading is above zero: check the probe polarity/,
    );
  });
});

describe('findSwitchOff', () => {
  it('when the bus is flat for 30 s before a decay, then the switch-off is found within one step and the flat readings left out', () => {
    const run = loggerRun({ flat: 150, step: 0.2, tau: 220, count: 1500, noise: 0.1, seed: 11 });
    const found = findSwitchOff(run)!;
    expect(found.found).toBe('flat-bus');
    expect(Math.abs(found.atSeconds - 150 * 0.2)).toBeLessThan(0.2);
    expect(found.firstKept).toBeGreaterThanOrEqual(150);
    expect(found.firstKept).toBeLessThanOrEqual(154);
    expect(found.levelVolts).toBeCloseTo(565, 0);
  });

  it('when the decay with its control-supply drop starts at once, then nothing is left out', () => {
    expect(
      findSwitchOff(loggerRun({ flat: 0, step: 0.5, tau: 220, count: 600, noise: 0.1, seed: 12 })),
    ).toBeNull();
    expect(
      findSwitchOff(loggerRun({ flat: 0, step: 30, tau: 220, count: 20, noise: 0.3, seed: 13 })),
    ).toBeNull();
  });

  it('when a slow decay reads level for a few samples at a coarse resolution, then that is no flat bus', () => {
    const run = loggerRun({ flat: 0, step: 0.1, tau: 2200, count: 2000, noise: 0, seed: 14 });
    run.v = run.v.map((volts) => Math.round(volts)); // a 1 V resolution
    expect(findSwitchOff(run)).toBeNull();
  });

  it('when a few flat readings carry negative times before the trigger, then they are left out at t = 0', () => {
    // Too few to be a flat bus by themselves (fewer than 5), but stamped before the trigger.
    const t = [-0.3, -0.2, -0.1, 0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7];
    const v = [565.1, 564.9, 565.05, ...t.slice(3).map((s) => 565 * Math.exp(-s / 2))];
    expect(findSwitchOff(readings(t, v))).toMatchObject({
      found: 'negative-times',
      firstKept: 3,
      atSeconds: 0,
    });
  });
});

describe('findSwitchOff on varied logger runs (40 runs, invented, seeded)', () => {
  const random = seededRandom(424242);
  const pick = <T>(values: readonly T[]): T => values[Math.floor(random() * values.length)]!;
  const runs = Array.from({ length: 40 }, (_, i) => {
    const step = pick([0.05, 0.1, 0.2, 0.5, 1]);
    const tau = 40 + 3000 * random() ** 2;
    const noise = 0.02 + 0.3 * random();
    const flat = i % 4 === 0 ? 0 : Math.floor(5 + 400 * random());
    const count = Math.min(4000, Math.ceil((2 * tau) / step));
    return { step, tau, noise, flat, count, seed: 1000 + i };
  });

  it('when a run has no flat stretch, then nothing is left out', () => {
    for (const run of runs.filter((r) => r.flat === 0))
      expect(findSwitchOff(loggerRun(run))).toBeNull();
  });

  it('when the flat stretch is clearly flat for the fall that follows, then the switch-off is found within two steps', () => {
    let checked = 0;
    for (const run of runs.filter((r) => r.flat > 0)) {
      const flatSeconds = run.flat * run.step;
      const fallOverFlat = (565 / run.tau) * flatSeconds; // volts the decay would have fallen meanwhile
      if (fallOverFlat < 20 || run.flat < 10) continue; // too short to tell from a slow start
      checked++;
      const found = findSwitchOff(loggerRun(run));
      expect(found, JSON.stringify(run)).not.toBeNull();
      expect(Math.abs(found!.atSeconds - flatSeconds), JSON.stringify(run)).toBeLessThan(
        2 * run.step,
      );
    }
    expect(checked).toBeGreaterThan(10);
  });
});
