import { describe, expect, it } from 'vitest';
import type { ExcludedReading } from '../../../../../shared/domain';
import { leftOutRows } from '../../../../../web/src/features/decay-runs/utils/left-out-rows';
import { microfarads, ohms, seconds, todayOn } from '../../../../../web/src/features/decay-runs/utils/figures';

const reading = (index: number, code: ExcludedReading['code'], reason: string): ExcludedReading => ({
  index,
  tSeconds: index * 10,
  volts: 500 - index,
  code,
  reason,
  expectedVolts: 500 - index,
});

describe('leftOutRows', () => {
  it('when a mistyped reading is left out, then its own screen row is marked with its reason', () => {
    const marks = leftOutRows([reading(3, 'dropped-digit', 'The reading 24.2 V looks like a dropped digit.')], [1, 2, 3, 5, 6]);
    expect([...marks]).toEqual([[5, { label: 'left out', explanation: 'The reading 24.2 V looks like a dropped digit.' }]]);
  });

  it('when a control-supply phase is left out, then each of its rows is marked and the reason is said once, under the last', () => {
    const why = 'Before the knee: the control supply was drawing power.';
    const marks = leftOutRows([reading(0, 'control-supply-phase', why), reading(1, 'control-supply-phase', why), reading(2, 'control-supply-phase', why)], [1, 2, 3, 4]);
    expect(marks.get(1)).toEqual({ label: 'left out · control-supply phase', explanation: null });
    expect(marks.get(2)?.explanation).toBeNull();
    expect(marks.get(3)).toEqual({ label: 'left out · control-supply phase', explanation: `Rows 1–3 left out: ${why}` });
    expect(marks.has(4)).toBe(false);
  });

  it('when nothing is left out, then no row is marked', () => {
    expect(leftOutRows([], [1, 2, 3]).size).toBe(0);
  });
});

describe('figures of the decay check', () => {
  it('when seconds and microfarads are shown, then to three significant figures, minutes alongside from 2 min', () => {
    expect(seconds(45.27)).toBe('45.3 s');
    expect(seconds(376.4)).toBe('376 s (6.3 min)');
    expect(microfarads(1522.4)).toBe('1,520 µF');
    expect(ohms(147_783)).toBe('148 kΩ');
    expect(ohms(10_000_000)).toBe('10 MΩ');
    expect(ohms(470)).toBe('470 Ω');
  });

  it('when today is asked, then the local calendar date', () => {
    expect(todayOn(new Date(2026, 11, 2, 23, 30))).toBe('2026-12-02');
  });
});
