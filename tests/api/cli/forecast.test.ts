/**
 * The forecast command line tool on invented histories in tests/fixtures/decay: its `main` run
 * in-process, and once as engineers run it (`npm run -s forecast`).
 */

import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { linearRegression } from 'simple-statistics';
import { main } from '../../../api/src/cli/forecast';
import { PROJECT_ROOT, runAsUser, runInProcess, type CliResult } from '../../support/cli';
import { FIXTURES } from '../../fixtures/decay/fixture-facts';

const fixture = (name: string): string => join(PROJECT_ROOT, 'tests', 'fixtures', 'decay', name);

function forecast(...args: string[]): CliResult {
  return runInProcess(main, args);
}

const dayOf = (iso: string): number => Date.parse(`${iso}T00:00:00Z`) / 86_400_000;

describe('forecast main', () => {
  it('when a linear ten-year history is given, then the forecast matches an independent straight-line fit (simple-statistics)', () => {
    const result = forecast(fixture('history-linear.csv'), '--as-of', '2024-06-01');
    expect(result.stderr).toBe('');
    expect(result.status).toBe(0);
    const out = JSON.parse(result.stdout) as {
      model: string;
      endOfLifeOn: string;
      interval90: [string, string];
      earliestEndOfLifeOn: string;
      accelerationPlausible: boolean;
      rulDays: number;
      nextVisitBy: string;
      notes: string[];
    };
    expect(out.model).toBe('linear');
    // Independent reference: ordinary least squares of ratio on day number by simple-statistics.
    const rows = readFileSync(fixture('history-linear.csv'), 'utf8')
      .trim()
      .split('\n')
      .slice(1)
      .map((line) => line.split(','));
    const line = linearRegression(rows.map(([date, ratio]) => [dayOf(date!), Number(ratio)]));
    const referenceDay = Math.round((0.8 - line.b) / line.m);
    expect(Math.abs(dayOf(out.endOfLifeOn) - referenceDay)).toBeLessThanOrEqual(1);
    expect(dayOf(out.interval90[0])).toBeLessThan(dayOf(out.endOfLifeOn));
    expect(dayOf(out.interval90[1])).toBeGreaterThan(dayOf(out.endOfLifeOn));
    expect(out.rulDays).toBe(dayOf(out.endOfLifeOn) - dayOf('2024-06-01'));
    // the earliest plausible date is always given; when a speed-up cannot be ruled out, it says so
    expect(out.earliestEndOfLifeOn).toBe(out.interval90[0]);
    expect(out.notes.some((note) => /Acceleration cannot be ruled out/.test(note))).toBe(
      out.accelerationPlausible,
    );
    const lastRun = rows.at(-1)![0]!;
    expect(dayOf(out.nextVisitBy)).toBeLessThanOrEqual(dayOf(lastRun) + 365);
    // The generating slope puts the crossing within the interval.
    const truth =
      Date.UTC(FIXTURES.historyLinear.startYear, 2, 1) / 86_400_000 +
      (0.2 / -FIXTURES.historyLinear.slopePerYear) * 365.2425;
    expect(truth).toBeGreaterThan(dayOf(out.interval90[0]));
    expect(truth).toBeLessThan(dayOf(out.interval90[1]));
  });

  it('when a different limit is given, then the crossing moves accordingly', () => {
    const at80 = JSON.parse(
      forecast(fixture('history-linear.csv'), '--as-of', '2024-06-01').stdout,
    ) as { endOfLifeOn: string };
    const at85 = JSON.parse(
      forecast(fixture('history-linear.csv'), '--limit', '0.85', '--as-of', '2022-01-01').stdout,
    ) as { endOfLifeOn: string };
    expect(dayOf(at85.endOfLifeOn)).toBeLessThan(dayOf(at80.endOfLifeOn));
  });

  it('when the file is -, then the history comes from standard input', () => {
    const result = runInProcess(main, ['-', '--as-of', '2024-06-01'], {
      stdin: readFileSync(fixture('history-linear.csv'), 'utf8'),
    });
    expect(result.stderr).toBe('');
    expect(result.status).toBe(0);
    expect(JSON.parse(result.stdout)).toEqual(
      JSON.parse(forecast(fixture('history-linear.csv'), '--as-of', '2024-06-01').stdout),
    );
  });

  const badCases: [string, string[], RegExp][] = [
    ['only two runs', [fixture('history-two-runs.csv')], /not enough history: Only 2 decay runs/],
    [
      'an impossible date',
      [fixture('history-bad-date.csv')],
      /Row 3, column date: "2022-02-30" is not a calendar date/,
    ],
    [
      'a malformed limit',
      [fixture('history-linear.csv'), '--limit', 'eighty'],
      /--limit must be a ratio/,
    ],
    [
      'a malformed as-of date',
      [fixture('history-linear.csv'), '--as-of', '1 June'],
      /--as-of: "1 June" is not a calendar date/,
    ],
    ['no file', [], /no history CSV file given/],
  ];
  for (const [what, args, message] of badCases) {
    it(`when given ${what}, then exit 2 with one message on stderr and nothing on stdout`, () => {
      const result = forecast(...args);
      expect(result.status).toBe(2);
      expect(result.stdout).toBe('');
      expect(result.stderr).toMatch(message);
      expect(result.stderr.trim().split('\n')).toHaveLength(1);
    });
  }
});

describe('npm run -s forecast', () => {
  it(
    'when an engineer runs it on a history, then the process exits 0 with the same JSON as main',
    { timeout: 120_000 },
    () => {
      const args = [fixture('history-linear.csv'), '--as-of', '2024-06-01'];
      const spawned = runAsUser('forecast', args);
      expect(spawned.stderr).toBe('');
      expect(spawned.status).toBe(0);
      const inProcess = forecast(...args);
      expect(inProcess.status).toBe(0);
      expect(JSON.parse(spawned.stdout)).toEqual(JSON.parse(inProcess.stdout));
    },
  );
});
