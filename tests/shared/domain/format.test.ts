import { describe, expect, it } from 'vitest';
import {
  formatDateOn,
  formatFigure,
  formatInterval,
  formatPercentFigure,
} from '../../../shared/domain/format';

describe('formatFigure', () => {
  it('when a figure has more digits than it warrants, then three significant figures remain', () => {
    expect(formatFigure(101.6654)).toBe('102');
    expect(formatFigure(45.27)).toBe('45.3');
    expect(formatFigure(0.012345)).toBe('0.0123');
  });

  it('when a figure runs into thousands, then it is rounded at its third figure and grouped with commas', () => {
    expect(formatFigure(1522.38)).toBe('1,520');
    expect(formatFigure(1_234_567)).toBe('1,230,000');
  });

  it('when rounding carries into a new digit, then the figure is still three significant figures', () => {
    expect(formatFigure(999.7)).toBe('1,000');
    expect(formatFigure(9.996)).toBe('10');
  });

  it('when a figure has trailing zeros after rounding, then they are dropped', () => {
    expect(formatFigure(90.001)).toBe('90');
    expect(formatFigure(1.5)).toBe('1.5');
  });

  it('when a figure is negative, zero or not finite, then a true minus, 0 or the plain word', () => {
    expect(formatFigure(-0.5)).toBe('−0.5');
    expect(formatFigure(0)).toBe('0');
    expect(formatFigure(Number.NaN)).toBe('NaN');
  });

  it('when other figures are asked for, then that many are kept', () => {
    expect(formatFigure(101.6654, 4)).toBe('101.7');
    expect(formatFigure(101.6654, 2)).toBe('100');
  });
});

describe('formatInterval', () => {
  it('when the interval of a ratio of 101.68 % runs 98.43 to 103.21 %, then both ends have the figure’s precision', () => {
    expect(formatInterval(98.43, 103.21, { like: 101.68, unit: '%' })).toBe('98 to 103 %');
  });

  it('when the estimate is in thousands, then both ends are rounded to its tens', () => {
    expect(formatInterval(1488.2, 1561.7, { like: 1522.4, unit: 'µF' })).toBe('1,490 to 1,560 µF');
  });

  it('when the estimate has decimals, then both ends keep the same decimals, zeros included', () => {
    expect(formatInterval(44.96, 45.6, { like: 45.27, unit: 's' })).toBe('45.0 to 45.6 s');
    expect(formatInterval(0.01234, 0.01301, { like: 0.0125 })).toBe('0.0123 to 0.0130');
  });

  it('when both ends round to the same figure (the report’s 101.665 % to 101.692 %), then it is said once, with how narrow it is', () => {
    expect(formatInterval(101.665, 101.692, { like: 101.68, unit: '%' })).toBe(
      '102 % (narrower than 1 %)',
    );
    expect(formatInterval(224.983, 225.03, { like: 225, unit: 's' })).toBe(
      '225 s (narrower than 1 s)',
    );
    expect(formatInterval(4.5312, 4.5348, { like: 4.534, unit: 'min' })).toBe(
      '4.53 min (narrower than 0.01 min)',
    );
  });

  it('when the ends come reversed or without an estimate, then low to high at the precision of the larger end', () => {
    expect(formatInterval(103.21, 98.43, { unit: '%' })).toBe('98 to 103 %');
  });
});

describe('formatPercentFigure', () => {
  it('when a ratio is shown, then as a percentage of three significant figures', () => {
    expect(formatPercentFigure(1.016654)).toBe('102 %');
    expect(formatPercentFigure(0.9134)).toBe('91.3 %');
    expect(formatPercentFigure(0.8)).toBe('80 %');
  });
});

describe('formatDateOn', () => {
  it('when an ISO date is shown, then day, short month and year, with no time zone shift', () => {
    expect(formatDateOn('2027-03-05')).toBe('5 Mar 2027');
    expect(formatDateOn('2026-12-31')).toBe('31 Dec 2026');
  });
});
