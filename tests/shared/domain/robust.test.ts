import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { median, medianInPlace, robustLine, weightedMedian } from '../../../shared/domain/robust';

/** Reference: sort, then walk the cumulative weight. */
function sortedWeightedMedian(values: number[], weights: number[]): number {
  const order = values.map((_, i) => i).sort((a, b) => values[a]! - values[b]!);
  const half = weights.reduce((a, b) => a + b, 0) / 2;
  let cumulative = 0;
  for (const i of order) {
    cumulative += weights[i]!;
    if (cumulative >= half) return values[i]!;
  }
  return values[order.at(-1)!]!;
}

describe('median', () => {
  it('when the count is odd or even, then the middle value or the mean of the two middle values comes back', () => {
    expect(median([5, 1, 3])).toBe(3);
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([])).toBe(0);
  });

  it('when compared with sorting on random arrays, then the selection gives the same median', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ noNaN: true, min: -1e6, max: 1e6 }), { minLength: 1, maxLength: 200 }),
        (values) => {
          const sorted = [...values].sort((a, b) => a - b);
          const mid = sorted.length >> 1;
          const expected = sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
          return medianInPlace(Float64Array.from(values)) === expected;
        },
      ),
      { seed: 3, numRuns: 500 },
    );
  });
});

describe('weightedMedian', () => {
  it('when one value carries most of the weight, then it is the weighted median', () => {
    expect(weightedMedian([1, 2, 10], [1, 1, 5])).toBe(10);
  });

  it('when compared with a sort-based reference on random values and weights, then it agrees', () => {
    const entry = fc.record({
      value: fc.integer({ min: 0, max: 20 }),
      weight: fc.integer({ min: 0, max: 8 }),
    });
    fc.assert(
      fc.property(fc.array(entry, { minLength: 1, maxLength: 60 }), (entries) => {
        fc.pre(entries.some((e) => e.weight > 0));
        const values = entries.map((e) => e.value);
        const weights = entries.map((e) => e.weight / 2);
        return weightedMedian(values, weights) === sortedWeightedMedian(values, weights);
      }),
      { seed: 4, numRuns: 1000 },
    );
  });
});

describe('robustLine', () => {
  it('when one point is wildly off, then the line still goes through the others', () => {
    const line = robustLine([0, 1, 2, 3, 4, 5], [1, 3, 5, 7, 90, 11], [1, 1, 1, 1, 1, 1]);
    expect(line).toEqual({ intercept: 1, slope: 2 });
  });

  it('when the end point is off and heavily weighted, then it pulls neither slope nor intercept', () => {
    const x = [0, 1, 2, 3, 4, 5];
    const y = x.map((v) => 3 - 0.25 * v);
    y[0] = 30;
    const line = robustLine(x, y, [1e9, 1, 1, 1, 1, 1]);
    expect(line!.slope).toBeCloseTo(-0.25, 12);
    expect(line!.intercept).toBeCloseTo(3, 12);
  });

  it('when a high-weight point is off by ten times, then the capped weights keep the intercept', () => {
    const x = [0, 1, 2, 3, 4, 5, 6, 7];
    const y = x.map((v) => 5 - 0.5 * v);
    y[0] = y[0]! + Math.log(10);
    const weights = x.map((_, i) => (i === 0 ? 1e6 : 1));
    expect(robustLine(x, y, weights)!.intercept).toBeCloseTo(5, 9);
  });

  it('when the series is longer than 64 points, then it is thinned and still exact on a clean line', () => {
    const x = Array.from({ length: 1000 }, (_, i) => i);
    const line = robustLine(
      x,
      x.map((v) => 2 - 0.01 * v),
      x.map(() => 1),
    );
    expect(line!.slope).toBeCloseTo(-0.01, 12);
  });

  it('when fewer than 2 points take part, then there is no line', () => {
    expect(robustLine([1], [1], [1])).toBeNull();
  });
});
