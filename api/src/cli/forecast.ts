/**
 * `npm run -s forecast -- HISTORY.csv [--limit 0.8] [options]`: forecasts a bank's end of life
 * from its history of capacitance ratios (rows `date,ratio[,stdError]`; `-` reads standard input)
 * and prints `{ model, endOfLifeOn, interval90: [low, high], earliestEndOfLifeOn, rulDays,
 * nextVisitBy, ... }` as JSON on stdout.
 *
 * Options:
 *   --limit R           end-of-life ratio (default 0.8, the electrolytic default)
 *   --watch R           watch ratio; below it the next visit comes within the watch interval
 *   --as-of YYYY-MM-DD  the day of the forecast (default: today, UTC)
 *   --interval-days D   the design's standard inspection interval (default 365)
 *
 * Bad input or not enough history: exit status 2, one message on stderr, nothing on stdout.
 */

import { parseArgs } from 'node:util';
import { defineCli, readInputFile, runIfEntryPoint, UsageError, type CliIo } from './cli-shell';
import {
  dayNumberFromIsoDate,
  forecastEndOfLife,
  parseRatioHistoryCsv,
} from '../../../shared/domain';
import { DEFAULT_HEALTH_LIMITS } from '../../../shared/constants/health';

const USAGE =
  'usage: npm run -s forecast -- HISTORY.csv [--limit 0.8] [--watch 0.9] [--as-of YYYY-MM-DD] [--interval-days 365]';

function forecastCommand(argv: string[], io: CliIo): void {
  const { values, positionals } = parseArgs({
    args: argv,
    options: {
      limit: { type: 'string' },
      watch: { type: 'string' },
      'as-of': { type: 'string' },
      'interval-days': { type: 'string' },
      help: { type: 'boolean' },
    },
    allowPositionals: true,
    strict: true,
  });
  if (values.help) {
    io.stdout.write(`${USAGE}\n`);
    return;
  }
  if (positionals.length !== 1)
    throw new UsageError(
      positionals.length === 0
        ? 'no history CSV file given'
        : `one history file expected, got ${positionals.length}`,
    );
  const file = positionals[0]!;
  const limit = ratio(values.limit, '--limit') ?? DEFAULT_HEALTH_LIMITS.electrolytic.endOfLifeRatio;
  const watch = ratio(values.watch, '--watch');
  if (watch !== undefined && !(watch > limit))
    throw new UsageError(`--watch (${watch}) must be above --limit (${limit})`);
  const intervalRaw = values['interval-days'];
  const intervalDays = intervalRaw === undefined ? undefined : Number(intervalRaw);
  if (intervalDays !== undefined && !(Number.isInteger(intervalDays) && intervalDays > 0)) {
    throw new UsageError(`--interval-days must be a whole number of days, got "${intervalRaw}"`);
  }
  // The command line is the edge of the system: here, and only here, "today" comes from the clock.
  const asOfOn = values['as-of'] ?? new Date().toISOString().slice(0, 10);
  dayNumberFromIsoDate(asOfOn, '--as-of');

  const text = readInputFile(file, io);
  const { history } = parseRatioHistoryCsv(text);
  const forecast = forecastEndOfLife({
    history,
    endOfLifeRatio: limit,
    asOfOn,
    ...(watch !== undefined ? { watchRatio: watch } : {}),
    ...(intervalDays !== undefined ? { standardIntervalDays: intervalDays } : {}),
  });
  if (forecast.status !== 'ok') throw new UsageError(`not enough history: ${forecast.reason}`);
  const output = {
    model: forecast.model,
    endOfLifeOn: forecast.endOfLifeOn,
    interval90: forecast.interval90,
    earliestEndOfLifeOn: forecast.earliestEndOfLifeOn,
    accelerationPlausible: forecast.accelerationPlausible,
    rulDays: forecast.rulDays,
    nextVisitBy: forecast.nextVisitBy,
    nextVisitReason: forecast.nextVisitReason,
    nextVisitOverdue: forecast.nextVisitOverdue,
    endOfLifeReached: forecast.endOfLifeReached,
    asOfOn,
    limit,
    runs: history.length,
    ratioNow: forecast.ratioNow,
    ratioPerYearNow: forecast.ratioPerYearNow,
    criterion: forecast.criterion,
    models: forecast.models,
    notes: forecast.notes,
  };
  io.stdout.write(`${JSON.stringify(output, null, 2)}\n`);
}

function ratio(raw: string | undefined, flag: string): number | undefined {
  if (raw === undefined) return undefined;
  const value = /^(\d+\.?\d*|\.\d+)$/.test(raw.trim()) ? Number(raw) : NaN;
  if (!(value > 0 && value < 2))
    throw new UsageError(`${flag} must be a ratio such as 0.8, got "${raw}"`);
  return value;
}

/**
 * The `forecast` tool: `argv` without `node` and the script, `io` the streams (default the
 * process's own). Returns the exit status: 0 done, 2 bad input or unusable data, 1 a fault.
 *
 * @example main(['history.csv', '--as-of', '2024-06-01'], { stdout, stderr }) // → 0
 */
export const main = defineCli('forecast', forecastCommand);

runIfEntryPoint(import.meta.url, main);
