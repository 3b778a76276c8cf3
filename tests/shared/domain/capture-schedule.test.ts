import { describe, expect, it } from 'vitest';
import {
  CAPTURE_MAX_SCHEDULE_SECONDS,
  CAPTURE_MIN_SPACING_FLOOR_SECONDS,
  CAPTURE_MIN_SPACING_SECONDS,
  captureScheduleSeconds,
} from '../../../shared/domain/capture-schedule';
import { EngineInputError } from '../../../shared/domain/errors';

const TAUS = [8, 30, 60, 120, 220.9, 331, 600, 1500];
const gaps = (times: number[]) => times.slice(1).map((t, i) => t - times[i]!);

describe('captureScheduleSeconds', () => {
  it.each(TAUS)('when τ is %s s, then the prompts strictly increase', (tau) => {
    const times = captureScheduleSeconds(tau);
    expect(gaps(times).every((gap) => gap > 0)).toBe(true);
  });

  it.each(TAUS)(
    'when τ is %s s, then the first prompt comes at the smallest spacing after isolation',
    (tau) => {
      expect(captureScheduleSeconds(tau)[0]).toBe(CAPTURE_MIN_SPACING_SECONDS);
    },
  );

  it.each(TAUS)('when τ is %s s, then the last prompt is at 5 τ or just after it', (tau) => {
    const times = captureScheduleSeconds(tau);
    const last = times.at(-1)!;
    expect(last).toBeGreaterThanOrEqual(5 * tau);
    // the last gap overshoots 5 τ by less than one gap
    expect(last - 5 * tau).toBeLessThan(gaps(times).at(-1)! + 1e-9);
  });

  it.each(TAUS)(
    'when τ is %s s, then at the last prompt the bus is below 1 % of V0 (e^−5 = 0.67 %)',
    (tau) => {
      const last = captureScheduleSeconds(tau).at(-1)!;
      expect(Math.exp(-last / tau)).toBeLessThanOrEqual(Math.exp(-5) + 1e-12);
      expect(Math.exp(-last / tau)).toBeLessThan(0.01);
    },
  );

  it.each(TAUS)('when τ is %s s, then no two prompts are closer than 5 s', (tau) => {
    expect(Math.min(...gaps(captureScheduleSeconds(tau)))).toBeGreaterThanOrEqual(
      CAPTURE_MIN_SPACING_SECONDS,
    );
  });

  it('when τ is 120 s, then the prompts are dense at first and spaced later', () => {
    const times = captureScheduleSeconds(120);
    expect(times.slice(0, 6)).toEqual([5, 10, 15, 20, 25, 30]);
    // a third of the prompts in the first τ, where the knee and the steep part are
    expect(times.filter((t) => t <= 120).length).toBeGreaterThanOrEqual(times.length / 3);
    // the later gaps grow, up to a third of τ
    const late = gaps(times).slice(-5);
    expect(late.every((gap) => gap >= 20 && gap <= 40)).toBe(true);
  });

  it('when τ is 120 s, then every prompt is a round figure (a multiple of 5 s)', () => {
    expect(captureScheduleSeconds(120).every((t) => t % 5 === 0)).toBe(true);
  });

  it('when τ is 120 s, then the schedule is the one of the example', () => {
    const times = captureScheduleSeconds(120);
    expect(times.slice(0, 17)).toEqual([
      5, 10, 15, 20, 25, 30, 35, 40, 50, 60, 75, 90, 100, 120, 150, 180, 210,
    ]);
    expect(times.at(-1)).toBe(600);
    expect(times).toHaveLength(30);
  });

  it('when the start and end voltages are given, then the schedule ends at the first prompt after the expected crossing', () => {
    const times = captureScheduleSeconds(120, { startVolts: 560, endVolts: 50 });
    const crossing = 120 * Math.log(560 / 50);
    expect(times.at(-1)!).toBeGreaterThanOrEqual(crossing);
    expect(times.at(-2)!).toBeLessThan(crossing);
    expect(times).toEqual(captureScheduleSeconds(120).filter((t) => t <= times.at(-1)!));
  });

  it('when the start voltage is already below the end voltage, then the schedule runs to 5 τ', () => {
    expect(captureScheduleSeconds(60, { startVolts: 40, endVolts: 50 })).toEqual(
      captureScheduleSeconds(60),
    );
  });

  it('when a smaller spacing is asked for, then it is kept but never below 3 s', () => {
    expect(captureScheduleSeconds(60, { minSpacingSeconds: 3 })[0]).toBe(3);
    const times = captureScheduleSeconds(60, { minSpacingSeconds: 1 });
    expect(Math.min(...gaps(times))).toBeGreaterThanOrEqual(CAPTURE_MIN_SPACING_FLOOR_SECONDS);
  });

  it('when τ is tiny (the bus is gone within seconds), then there are still three prompts at the smallest spacing', () => {
    expect(captureScheduleSeconds(0.5)).toEqual([5, 10, 15]);
    expect(captureScheduleSeconds(2)).toEqual([5, 10, 15]);
  });

  it('when τ is huge, then the schedule stops at 4 h with a bounded number of prompts', () => {
    const times = captureScheduleSeconds(50_000);
    expect(times.at(-1)).toBeLessThanOrEqual(CAPTURE_MAX_SCHEDULE_SECONDS);
    expect(times.at(-1)).toBeGreaterThan(CAPTURE_MAX_SCHEDULE_SECONDS - 3600);
    expect(times.length).toBeLessThan(60);
    expect(Math.min(...gaps(times))).toBeGreaterThanOrEqual(CAPTURE_MIN_SPACING_SECONDS);
  });

  it.each([0, -5, Number.NaN, Number.POSITIVE_INFINITY])(
    'when τ is %s, then it is refused',
    (tau) => {
      expect(() => captureScheduleSeconds(tau)).toThrow(EngineInputError);
    },
  );

  it('when a voltage is not positive, then it is refused naming it', () => {
    try {
      captureScheduleSeconds(60, { startVolts: 0, endVolts: 50 });
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(EngineInputError);
      expect((error as EngineInputError).issues[0]!.path).toBe('startVolts');
    }
  });
});
