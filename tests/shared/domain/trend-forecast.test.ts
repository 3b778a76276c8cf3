import { describe, expect, it } from 'vitest';
import {
  forecastEndOfLife,
  type EndOfLifeForecast,
  type RatioHistoryPoint,
} from '../../../shared/domain/trend-forecast';
import {
  addDays,
  dayNumberFromIsoDate,
  daysBetween,
  DAYS_PER_YEAR,
} from '../../../shared/domain/calendar-dates';
import { EngineInputError, type NotEnoughData } from '../../../shared/domain/errors';
import { gaussian, seededRandom } from './support/synthetic-decay';
import { LOSS_SHAPES, simulateHistory, type LossShape } from './support/ratio-history-simulation';

function ok(result: EndOfLifeForecast | NotEnoughData): EndOfLifeForecast {
  if (result.status !== 'ok') throw new Error(`expected a forecast, got: ${result.reason}`);
  return result;
}

/** Yearly runs from 2014-03-01 following `ratioAt(years)`, with optional noise. */
function history(
  years: number,
  ratioAt: (years: number) => number,
  noise = 0,
  seed = 1,
  everyDays = 365,
): RatioHistoryPoint[] {
  const random = seededRandom(seed);
  const points: RatioHistoryPoint[] = [];
  for (let day = 0; day <= years * DAYS_PER_YEAR; day += everyDays) {
    points.push({
      measuredOn: addDays('2014-03-01', day),
      ratio: ratioAt(day / DAYS_PER_YEAR) + noise * gaussian(random),
    });
  }
  return points;
}

/** The date a straight decline from 1 at `slopePerYear` reaches `limit`. */
function linearCrossingOn(slopePerYear: number, limit: number): string {
  return addDays('2014-03-01', Math.round(((limit - 1) / slopePerYear) * DAYS_PER_YEAR));
}

describe('forecastEndOfLife: models and dates', () => {
  it('when the decline is a straight line, then the linear model is chosen and the date is the straight-line crossing', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(10, (y) => 1 - 0.015 * y),
        endOfLifeRatio: 0.8,
        asOfOn: '2024-03-15',
      }),
    );
    expect(forecast.model).toBe('linear');
    expect(
      Math.abs(daysBetween(linearCrossingOn(-0.015, 0.8), forecast.endOfLifeOn!)),
    ).toBeLessThanOrEqual(1);
    expect(forecast.ratioPerYearNow).toBeCloseTo(-0.015, 9);
  });

  it('when the history is noisy, then the 90 % interval brackets the true crossing and the RUL counts from asOf', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(10, (y) => 1 - 0.018 * y, 0.004, 9),
        endOfLifeRatio: 0.8,
        asOfOn: '2024-06-01',
      }),
    );
    const truth = linearCrossingOn(-0.018, 0.8);
    const [early, late] = forecast.interval90;
    expect(dayNumberFromIsoDate(early!)).toBeLessThanOrEqual(dayNumberFromIsoDate(truth));
    expect(dayNumberFromIsoDate(late!)).toBeGreaterThanOrEqual(dayNumberFromIsoDate(truth));
    expect(dayNumberFromIsoDate(early!)).toBeLessThanOrEqual(
      dayNumberFromIsoDate(forecast.endOfLifeOn!),
    );
    expect(forecast.rulDays).toBe(daysBetween('2024-06-01', forecast.endOfLifeOn!));
  });

  it('when the decline speeds up, then the accelerating model is chosen by AICc and the criterion states the figures', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(10, (y) => 1 - 0.004 * y - 0.0015 * y * y, 0.002, 4),
        endOfLifeRatio: 0.8,
        asOfOn: '2024-03-15',
      }),
    );
    expect(forecast.model).toBe('accelerating');
    expect(forecast.criterion).toMatch(/AICc linear .*, accelerating/);
    const [linear, accelerating] = forecast.models;
    expect(accelerating!.aicc!).toBeLessThan(linear!.aicc! - 2);
    // True crossing: 1 − 0.004y − 0.0015y² = 0.8 → y ≈ 10.27 years.
    const y = (-0.004 + Math.sqrt(0.004 ** 2 + 4 * 0.0015 * 0.2)) / (2 * 0.0015);
    expect(
      Math.abs(
        daysBetween(addDays('2014-03-01', Math.round(y * DAYS_PER_YEAR)), forecast.endOfLifeOn!),
      ),
    ).toBeLessThan(120);
  });

  it('when the quadratic bends upwards, then it is set aside and the linear model stands', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(10, (y) => 1 - 0.03 * y + 0.002 * y * y, 0.001, 5),
        endOfLifeRatio: 0.8,
        asOfOn: '2024-03-15',
      }),
    );
    expect(forecast.model).toBe('linear');
    expect(forecast.models[1]!.usable).toBe(false);
    expect(forecast.criterion).toMatch(/bends upwards/);
  });

  it('when there are fewer than 6 runs, then the linear model is chosen, the criterion says why, and the accelerating fit has no AICc', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(4, (y) => 1 - 0.02 * y, 0.003, 7),
        endOfLifeRatio: 0.8,
        asOfOn: '2018-06-01',
      }),
    );
    expect(forecast.model).toBe('linear');
    expect(forecast.criterion).toMatch(/AICc needs 6 runs/);
    expect(forecast.models.map((m) => m.model)).toEqual(['linear', 'accelerating']);
    expect(Number.isFinite(forecast.models[0]!.aicc)).toBe(true);
    expect(forecast.models[1]!.aicc).toBeNull();
  });

  it('when there are only 3 runs, then the quadratic cannot be fitted with any freedom left and the line alone gives the interval', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(2, (y) => 1 - 0.03 * y, 0.002, 3),
        endOfLifeRatio: 0.8,
        asOfOn: '2016-04-01',
      }),
    );
    expect(forecast.models).toHaveLength(1);
    expect(forecast.accelerationPlausible).toBe(false);
    expect(forecast.earliestEndOfLifeOn).toBe(forecast.models[0]!.interval90[0]);
  });

  it('when the trend is flat, then no end of life is forecast within the horizon', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(6, () => 0.99, 0.0005, 3),
        endOfLifeRatio: 0.8,
        asOfOn: '2020-06-01',
        horizonYears: 20,
      }),
    );
    expect(forecast.endOfLifeOn).toBeNull();
    expect(forecast.rulDays).toBeNull();
    expect(forecast.notes.join(' ')).toMatch(/does not reach/);
  });

  it('when the trend has already crossed the limit, then the end of life is reached, RUL is 0 and the visit is due now', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(10, (y) => 1 - 0.025 * y),
        endOfLifeRatio: 0.8,
        asOfOn: '2024-06-01',
      }),
    );
    expect(forecast.endOfLifeReached).toBe(true);
    expect(forecast.rulDays).toBe(0);
    expect(forecast.nextVisitBy).toBe('2024-06-01');
  });

  it('when every run states its uncertainty, then the fit is weighted and says so', () => {
    const points = history(6, (y) => 1 - 0.02 * y).map((p, i) => ({
      ...p,
      ratioStdError: i === 3 ? 0.05 : 0.005,
    }));
    const forecast = ok(
      forecastEndOfLife({ history: points, endOfLifeRatio: 0.8, asOfOn: '2020-06-01' }),
    );
    expect(forecast.notes.join(' ')).toMatch(/weighted by its stated uncertainty/);
  });

  it('when runs are given out of order, then the answer is the same as in order', () => {
    const points = history(8, (y) => 1 - 0.02 * y, 0.003, 2);
    const inOrder = ok(
      forecastEndOfLife({ history: points, endOfLifeRatio: 0.8, asOfOn: '2022-06-01' }),
    );
    const shuffled = ok(
      forecastEndOfLife({
        history: [...points].reverse(),
        endOfLifeRatio: 0.8,
        asOfOn: '2022-06-01',
      }),
    );
    expect(shuffled.endOfLifeOn).toBe(inOrder.endOfLifeOn);
    expect(shuffled.interval90).toEqual(inOrder.interval90);
  });
});

describe('forecastEndOfLife: next visit', () => {
  it('when the end of life is far off, then the next visit is the standard interval after the last run', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(4, (y) => 1 - 0.005 * y),
        endOfLifeRatio: 0.8,
        asOfOn: '2018-04-01',
        standardIntervalDays: 365,
      }),
    );
    expect(forecast.nextVisitBy).toBe(addDays('2018-02-28', 365));
    expect(forecast.nextVisitReason).toMatch(/standard interval/);
  });

  it('when the bank is below its watch ratio, then the visit comes within the watch interval', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(5, (y) => 1 - 0.025 * y),
        endOfLifeRatio: 0.8,
        watchRatio: 0.9,
        asOfOn: '2019-03-10',
        nearEndIntervalDays: 182,
      }),
    );
    const lastOn = history(5, (y) => 1 - 0.025 * y).at(-1)!.measuredOn;
    expect(daysBetween(lastOn, forecast.nextVisitBy)).toBeLessThanOrEqual(182);
  });

  it('when the earliest plausible end of life is near, then the visit comes halfway to it, earlier than the standard interval', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(10, (y) => 1 - 0.0185 * y, 0.002, 6),
        endOfLifeRatio: 0.8,
        asOfOn: '2024-04-01',
      }),
    );
    const early = forecast.interval90[0]!;
    expect(daysBetween('2024-04-01', early)).toBeGreaterThan(0);
    expect(daysBetween('2024-04-01', forecast.nextVisitBy)).toBe(
      Math.floor(daysBetween('2024-04-01', early) / 2),
    );
    expect(forecast.nextVisitReason).toMatch(/Halfway/);
  });

  it('when the last run is long past, then the next visit is overdue', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(3, (y) => 1 - 0.005 * y),
        endOfLifeRatio: 0.8,
        asOfOn: '2022-01-01',
      }),
    );
    expect(forecast.nextVisitOverdue).toBe(true);
  });

  it('when a next visit is recommended, then it is never later than the standard interval after the last run', () => {
    for (const slope of [-0.001, -0.01, -0.02, -0.03]) {
      const points = history(6, (y) => 1 + slope * y, 0.003, 8);
      const forecast = ok(
        forecastEndOfLife({
          history: points,
          endOfLifeRatio: 0.8,
          asOfOn: '2020-04-01',
          standardIntervalDays: 300,
        }),
      );
      expect(daysBetween(points.at(-1)!.measuredOn, forecast.nextVisitBy)).toBeLessThanOrEqual(300);
    }
  });
});

describe('forecastEndOfLife: honest about acceleration', () => {
  it('when a few yearly runs look straight but could be speeding up, then the interval reaches back to the accelerating fit, the earliest date is given and a sentence says so', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(5, (y) => 1 - 0.012 * y - 0.002 * y * y, 0.01, 11),
        endOfLifeRatio: 0.8,
        asOfOn: '2019-03-01',
      }),
    );
    const [linear, accelerating] = forecast.models;
    expect(forecast.model).toBe('linear');
    expect(forecast.accelerationPlausible).toBe(true);
    expect(forecast.notes.join(' ')).toMatch(
      /Acceleration cannot be ruled out: the runs also fit a decline that speeds up, which could reach 0\.8 as early as \d{4}-\d{2}-\d{2}/,
    );
    expect(forecast.earliestEndOfLifeOn).toBe(forecast.interval90[0]);
    expect(forecast.earliestEndOfLifeOn).toBe(accelerating!.interval90[0]);
    expect(daysBetween(forecast.earliestEndOfLifeOn!, linear!.interval90[0]!)).toBeGreaterThan(0);
    // the date and the late side stay the chosen line's
    expect(forecast.endOfLifeOn).toBe(linear!.endOfLifeOn);
    expect(forecast.interval90[1]).toBe(linear!.interval90[1]);
  });

  it('when the decline clearly slows down, then acceleration is ruled out: no sentence, and the line’s own interval', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(10, (y) => 1 - 0.04 * y + 0.0015 * y * y, 0.001, 5),
        endOfLifeRatio: 0.8,
        asOfOn: '2024-03-15',
      }),
    );
    expect(forecast.accelerationPlausible).toBe(false);
    expect(forecast.notes.join(' ')).not.toMatch(/Acceleration/);
    expect(forecast.interval90).toEqual(forecast.models[0]!.interval90);
    expect(forecast.earliestEndOfLifeOn).toBe(forecast.models[0]!.interval90[0]);
  });

  it('when the simulated histories are built, then each true curve starts at 1 and reaches the limit on its true end-of-life date', () => {
    const random = seededRandom(3);
    for (const shape of LOSS_SHAPES) {
      for (let i = 0; i < 20; i++) {
        const sim = simulateHistory(shape, random);
        expect(sim.trueRatioAt(0)).toBeCloseTo(1, 12);
        expect(sim.trueRatioAt(sim.lifeYears)).toBeCloseTo(sim.endOfLifeRatio, 12);
        expect(sim.trueRatioAt(sim.lifeYears / 2)).toBeGreaterThan(sim.endOfLifeRatio);
        expect(sim.history.length).toBe(sim.historyYears + 1);
        expect(daysBetween(sim.history[0]!.measuredOn, sim.trueEndOfLifeOn)).toBe(
          Math.round(sim.lifeYears * DAYS_PER_YEAR),
        );
        expect(daysBetween(sim.asOfOn, sim.trueEndOfLifeOn)).toBeGreaterThan(0);
      }
    }
  });

  // Invented 3–10 year histories whose true loss is linear, quadratic or exponential in time,
  // yearly runs with 0.5–2 % scatter (tests/shared/domain/support/ratio-history-simulation.ts).
  // The bands: the 90 % interval contains the true date in at least 80 % of each kind (a
  // straight-line interval alone managed about 15–35 % on the accelerating kinds), and the
  // latest next visit comes before the true end of life in at least 99 %.
  const HISTORIES_PER_SHAPE = 300;
  const outcomes = new Map<LossShape, { covered: number; visitBefore: number }>();
  const random = seededRandom(20_261_202);
  for (const shape of LOSS_SHAPES) {
    it(`when ${HISTORIES_PER_SHAPE} histories lose capacitance ${shape === 'linear' ? 'linearly' : shape === 'quadratic' ? 'quadratically' : 'exponentially'}, then the 90 % interval contains the true date in at least 80 % and the next visit comes before it in at least 99 %`, () => {
      const outcome = { covered: 0, visitBefore: 0 };
      for (let i = 0; i < HISTORIES_PER_SHAPE; i++) {
        const sim = simulateHistory(shape, random);
        const forecast = ok(
          forecastEndOfLife({
            history: sim.history,
            endOfLifeRatio: sim.endOfLifeRatio,
            asOfOn: sim.asOfOn,
          }),
        );
        const truth = dayNumberFromIsoDate(sim.trueEndOfLifeOn);
        const [early, late] = forecast.interval90;
        const earlyDay = early === null ? Infinity : dayNumberFromIsoDate(early);
        const lateDay = late === null ? Infinity : dayNumberFromIsoDate(late);
        if (earlyDay <= truth && truth <= lateDay) outcome.covered++;
        if (dayNumberFromIsoDate(forecast.nextVisitBy) < truth) outcome.visitBefore++;
        expect(forecast.earliestEndOfLifeOn).toBe(early);
        if (forecast.accelerationPlausible && forecast.model === 'linear')
          expect(forecast.notes.join(' ')).toMatch(/Acceleration cannot be ruled out/);
      }
      outcomes.set(shape, outcome);
      expect(outcome.covered / HISTORIES_PER_SHAPE).toBeGreaterThanOrEqual(0.8);
      expect(outcome.visitBefore / HISTORIES_PER_SHAPE).toBeGreaterThanOrEqual(0.99);
    });
  }

  it('when the three kinds are taken together, then the next visit comes before the true end of life in at least 99 %', () => {
    expect([...outcomes.keys()]).toEqual(LOSS_SHAPES);
    const before = [...outcomes.values()].reduce((sum, o) => sum + o.visitBefore, 0);
    expect(before / (HISTORIES_PER_SHAPE * LOSS_SHAPES.length)).toBeGreaterThanOrEqual(0.99);
  });
});

describe('forecastEndOfLife: not enough data and bad input', () => {
  it('when there are 2 runs, then not enough data with a plain reason', () => {
    const result = forecastEndOfLife({
      history: history(1, (y) => 1 - 0.02 * y),
      endOfLifeRatio: 0.8,
      asOfOn: '2016-01-01',
    });
    expect(result).toMatchObject({ status: 'not-enough-data' });
    if (result.status === 'not-enough-data') expect(result.reason).toMatch(/at least 3/);
  });

  it('when 3 runs span under 30 days, then not enough data', () => {
    const points = [0, 10, 20].map((d) => ({ measuredOn: addDays('2024-01-01', d), ratio: 0.95 }));
    expect(
      forecastEndOfLife({ history: points, endOfLifeRatio: 0.8, asOfOn: '2024-02-01' }),
    ).toMatchObject({ status: 'not-enough-data' });
  });

  it('when a date is not a calendar date, then EngineInputError names it', () => {
    const points = [{ measuredOn: '2023-02-30', ratio: 1 }, ...history(3, () => 1)];
    expect(() =>
      forecastEndOfLife({ history: points, endOfLifeRatio: 0.8, asOfOn: '2024-01-01' }),
    ).toThrow(expect.objectContaining({ code: 'invalid-date' }));
  });

  it('when a ratio or the limit is not a ratio, then EngineInputError', () => {
    expect(() =>
      forecastEndOfLife({
        history: [{ measuredOn: '2020-01-01', ratio: -1 }],
        endOfLifeRatio: 0.8,
        asOfOn: '2024-01-01',
      }),
    ).toThrow(EngineInputError);
    expect(() =>
      forecastEndOfLife({ history: history(3, () => 1), endOfLifeRatio: 0, asOfOn: '2024-01-01' }),
    ).toThrow(EngineInputError);
  });

  it('when the numbers are all equal, then the forecast is finite (no NaN)', () => {
    const forecast = ok(
      forecastEndOfLife({
        history: history(7, () => 0.97),
        endOfLifeRatio: 0.8,
        asOfOn: '2022-01-01',
      }),
    );
    expect(Number.isFinite(forecast.ratioNow)).toBe(true);
    expect(forecast.models.every((m) => m.aicc === null || Number.isFinite(m.aicc))).toBe(true);
  });
});
