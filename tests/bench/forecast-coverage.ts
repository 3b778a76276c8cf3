/**
 * `npx tsx tests/bench/forecast-coverage.ts [seed …] [--histories N]`: how honest the end-of-life
 * forecast is on invented histories whose true loss is linear, quadratic or exponential
 * (tests/shared/domain/support/ratio-history-simulation.ts). For each seed and shape it prints
 * the share of 90 % intervals that contain the true date, the share of next visits that come
 * before it, the median error of the forecast date, and how often the earliest plausible date
 * is already past (the "check now" answers). The simulation test asserts bands on the same
 * figures; this script is for reading them across seeds.
 */

import { parseArgs } from 'node:util';
import { dayNumberFromIsoDate, DAYS_PER_YEAR } from '../../shared/domain/calendar-dates';
import { forecastEndOfLife } from '../../shared/domain/trend-forecast';
import { seededRandom } from '../../infra/seed/seeded-random';
import { LOSS_SHAPES, simulateHistory } from '../shared/domain/support/ratio-history-simulation';

const { values, positionals } = parseArgs({
  options: { histories: { type: 'string', default: '400' } },
  allowPositionals: true,
});
const seeds = positionals.length > 0 ? positionals.map(Number) : [1, 2, 3];
const perShape = Number(values.histories);

const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length === 0 ? NaN : s[Math.floor(s.length / 2)]!;
};
const percent = (part: number, whole: number): string => `${((100 * part) / whole).toFixed(1)} %`;

console.log(`End-of-life forecast on invented histories (${perShape} per shape and seed)`);
for (const seed of seeds) {
  const random = seededRandom(seed);
  for (const shape of LOSS_SHAPES) {
    let covered = 0;
    let visitBefore = 0;
    let checkNow = 0;
    let accelerationNoted = 0;
    const errorsYears: number[] = [];
    const leadYears: number[] = [];
    const started = performance.now();
    for (let i = 0; i < perShape; i++) {
      const sim = simulateHistory(shape, random);
      const forecast = forecastEndOfLife({
        history: sim.history,
        endOfLifeRatio: sim.endOfLifeRatio,
        asOfOn: sim.asOfOn,
      });
      if (forecast.status !== 'ok') throw new Error(forecast.reason);
      const truth = dayNumberFromIsoDate(sim.trueEndOfLifeOn);
      const asOf = dayNumberFromIsoDate(sim.asOfOn);
      const [early, late] = forecast.interval90;
      const earlyDay = early === null ? Infinity : dayNumberFromIsoDate(early);
      const lateDay = late === null ? Infinity : dayNumberFromIsoDate(late);
      if (earlyDay <= truth && truth <= lateDay) covered++;
      if (dayNumberFromIsoDate(forecast.nextVisitBy) < truth) visitBefore++;
      if (earlyDay <= asOf) checkNow++;
      else leadYears.push((earlyDay - asOf) / DAYS_PER_YEAR);
      if (/acceleration/i.test(forecast.notes.join(' '))) accelerationNoted++;
      const meanDay =
        forecast.endOfLifeOn === null ? Infinity : dayNumberFromIsoDate(forecast.endOfLifeOn);
      errorsYears.push((meanDay - truth) / DAYS_PER_YEAR);
    }
    const msEach = (performance.now() - started) / perShape;
    console.log(
      `  seed ${seed} ${shape.padEnd(11)} 90 % interval contains truth ${percent(covered, perShape)}, ` +
        `next visit before it ${percent(visitBefore, perShape)}, median date error ${median(errorsYears).toFixed(2)} y, ` +
        `earliest date already past ${percent(checkNow, perShape)}, median lead of the earliest date ${median(leadYears).toFixed(2)} y, ` +
        `acceleration noted ${percent(accelerationNoted, perShape)}, ${msEach.toFixed(2)} ms each`,
    );
  }
}
