import { describe, expect, it } from 'vitest';
import {
  findTypingSlip,
  isOnCurve,
  nameOffCurveReadings,
  residualScales,
} from '../../../shared/domain/outliers';
import { fitDecay, type DecayFit, type DecayFitResult } from '../../../shared/domain/decay-fit';
import { evenTimes, exponentialDecay, seededRandom, withReading } from './support/synthetic-decay';

const scales = { volts: 0.5, log: 0.002 };

function ok(result: DecayFitResult): DecayFit {
  if (result.status !== 'ok') throw new Error(`expected a fit, got: ${result.reason}`);
  return result;
}

describe('findTypingSlip', () => {
  it('when a digit was dropped, then the slip is named with the likely reading', () => {
    expect(findTypingSlip(41, 412.3, scales)).toEqual({ code: 'dropped-digit', likelyVolts: 412 });
  });

  it('when two neighbouring digits were swapped, then the slip is named', () => {
    expect(findTypingSlip(421, 412.3, scales)).toEqual({
      code: 'swapped-digits',
      likelyVolts: 412,
    });
  });

  it('when the decimal point is in the wrong place, then the slip is named', () => {
    expect(findTypingSlip(4.12, 41.2, scales)).toEqual({
      code: 'misplaced-decimal-point',
      likelyVolts: 41.2,
    });
  });

  it('when a digit too many was typed, then the slip is named', () => {
    expect(findTypingSlip(4132, 412.3, scales)).toEqual({ code: 'extra-digit', likelyVolts: 412 });
  });

  it('when no single keystroke explains the reading, then there is no slip', () => {
    expect(findTypingSlip(250, 412.3, scales)).toBeNull();
  });
});

describe('isOnCurve and residualScales', () => {
  it('when a reading is off only in log terms (a low reading with constant noise), then it is still on the curve', () => {
    expect(isOnCurve(2, 1, { volts: 1, log: 0.01 })).toBe(true);
  });

  it('when a reading is off in volts and in log volts, then it is off the curve', () => {
    expect(isOnCurve(300, 412, scales)).toBe(false);
  });

  it('when the residuals are all zero, then the scales fall back to their floors', () => {
    expect(residualScales([100, 50, 25], [100, 50, 25], [1, 1, 1])).toEqual({
      volts: 100 * 2e-4,
      log: 2e-4,
    });
  });
});

describe('nameOffCurveReadings', () => {
  it('when two neighbouring readings each fit the other time, then they are named as swapped', () => {
    const named = nameOffCurveReadings(
      [0, 60, 120, 180],
      [560, 340, 420, 280],
      [560, 420, 340, 280],
      [1, 2],
      { volts: 1, log: 0.003 },
    );
    expect(named.map((n) => n.code)).toEqual(['swapped-readings', 'swapped-readings']);
    expect(named[0]!.reason).toMatch(/look swapped/);
  });

  it('when the last readings rise again, then they are named as a rebound', () => {
    const named = nameOffCurveReadings(
      [0, 60, 120, 180],
      [560, 420, 320, 340],
      [560, 420, 315, 236],
      [3],
      { volts: 1, log: 0.003 },
    );
    expect(named).toEqual([expect.objectContaining({ index: 3, code: 'rebound' })]);
    expect(named[0]!.reason).toMatch(/dielectric absorption/);
  });

  it('when no slip explains a reading, then it is named off-curve with how far off it is', () => {
    const named = nameOffCurveReadings([0, 60, 120], [560, 250, 325], [560, 425, 325], [1], {
      volts: 1,
      log: 0.003,
    });
    expect(named[0]).toMatchObject({ code: 'off-curve' });
    expect(named[0]!.reason).toMatch(/250 V at t = 60 s/);
  });
});

describe('fitDecay with mistyped readings', () => {
  const clean = exponentialDecay({
    v0Volts: 562,
    tauSeconds: 218.8,
    times: evenTimes(20, 30),
    roundToVolts: 1,
  });
  const cleanFit = ok(fitDecay(clean));

  it('when one reading lost a digit, then it is left out, named, and τ is the clean τ', () => {
    const index = 7;
    const samples = withReading(clean, index, Math.floor(clean[index]!.volts / 10));
    const fit = ok(fitDecay(samples));
    expect(fit.excluded).toEqual([expect.objectContaining({ index, code: 'dropped-digit' })]);
    expect(fit.excluded[0]!.reason).toContain(`${clean[index]!.volts} V`);
    expect(fit.tauSeconds / cleanFit.tauSeconds).toBeCloseTo(1, 3);
    expect(fit.warnings.some((w) => w.includes('dropped digit'))).toBe(true);
  });

  it('when two neighbouring readings were written in the wrong order, then both are left out as swapped', () => {
    const samples = clean.map((s, i) =>
      i === 4 ? { ...s, volts: clean[5]!.volts } : i === 5 ? { ...s, volts: clean[4]!.volts } : s,
    );
    const fit = ok(fitDecay(samples));
    expect(fit.excluded.map((e) => [e.index, e.code])).toEqual([
      [4, 'swapped-readings'],
      [5, 'swapped-readings'],
    ]);
    expect(fit.tauSeconds / cleanFit.tauSeconds).toBeCloseTo(1, 3);
  });

  it('when a reading has two digits swapped, then it is left out as swapped digits', () => {
    const index = clean.findIndex(
      (s) =>
        s.volts >= 100 &&
        String(s.volts)[1] !== String(s.volts)[2] &&
        Math.abs(
          Number(`${String(s.volts)[0]}${String(s.volts)[2]}${String(s.volts)[1]}`) - s.volts,
        ) > 5,
    );
    const digits = String(clean[index]!.volts);
    const swapped = Number(`${digits[0]}${digits[2]}${digits[1]}`);
    const fit = ok(fitDecay(withReading(clean, index, swapped)));
    expect(fit.excluded).toEqual([expect.objectContaining({ index, code: 'swapped-digits' })]);
  });

  it('when the first reading has an extra digit, then the robust screening still finds it', () => {
    const fit = ok(fitDecay(withReading(clean, 0, clean[0]!.volts * 10 + 3)));
    expect(fit.excluded).toEqual([expect.objectContaining({ index: 0, code: 'extra-digit' })]);
    expect(fit.tauSeconds / cleanFit.tauSeconds).toBeCloseTo(1, 2);
  });

  it('when honest noise is present, then no reading is left out', () => {
    const random = seededRandom(17);
    const noisy = exponentialDecay({
      v0Volts: 562,
      tauSeconds: 218.8,
      times: evenTimes(40, 15),
      noiseVolts: 0.7,
      random,
    });
    expect(ok(fitDecay(noisy)).excluded).toEqual([]);
  });

  it('when detection is switched off, then the slip stays in and spoils the fit', () => {
    const samples = withReading(clean, 7, Math.floor(clean[7]!.volts / 10));
    expect(fitDecay(samples, { leaveOutOffCurve: false })).toMatchObject({
      status: 'unusable',
      code: 'poor-fit',
    });
  });

  it('when only 4 readings are given, then none is left out (too few to tell a slip from the curve)', () => {
    const samples = [560, 420, 100, 240].map((volts, i) => ({ tSeconds: i * 60, volts }));
    const result = fitDecay(samples);
    expect(result.status === 'unusable' || result.excluded.length === 0).toBe(true);
  });
});
