/**
 * The fit command line tool on the invented fixtures in tests/fixtures/decay: its `main` run
 * in-process, and once as engineers run it (`npm run -s fit`). Expectations come from the
 * fixtures' generating facts.
 */

import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { main } from '../../../api/src/cli/fit';
import { PROJECT_ROOT, runAsUser, runInProcess, type CliResult } from '../../support/cli';
import { FIXTURES } from '../../fixtures/decay/fixture-facts';

const fixture = (name: string): string => join(PROJECT_ROOT, 'tests', 'fixtures', 'decay', name);

function fit(...args: string[]): CliResult {
  return runInProcess(main, args);
}

function json(args: string[]): Record<string, unknown> {
  const result = fit(...args);
  expect(result.stderr).toBe('');
  expect(result.status).toBe(0);
  return JSON.parse(result.stdout) as Record<string, unknown>;
}

const handheld = FIXTURES.handheld;

describe('fit main, the meter noise options', () => {
  const base = [fixture('handheld-20.csv'), '--bleeder-ohms', String(handheld.bleederOhms)];
  const halfWidth = (out: Record<string, unknown>) => {
    const [low, high] = out.tauCi95 as [number, number];
    return (high - low) / 2;
  };

  it('when the meter is said to scatter 2 % of the reading, then the fit weighs by at least that and τ’s interval widens', () => {
    const plain = json(base);
    const noisy = json([...base, '--meter-noise-percent', '2', '--timing-jitter-s', '0.5']);
    expect((noisy.noise as { fractionOfReading: number }).fractionOfReading).toBeGreaterThanOrEqual(
      0.02,
    );
    expect(halfWidth(noisy)).toBeGreaterThan(halfWidth(plain));
    // the estimate itself stays on the bank's τ (the fixture's generating fact)
    expect(Math.abs((noisy.tauSeconds as number) / handheld.tauSeconds - 1)).toBeLessThan(0.02);
  });

  it('when a noise option is not a positive number, then exit 2 naming the option', () => {
    const result = fit(...base, '--meter-noise-volts', 'abc');
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr).toMatch(/--meter-noise-volts must be a positive number, got "abc"/);
  });
});

describe('fit main', () => {
  it('when a handheld file is fitted with its bleeder and baseline, then τ, C, ratio and health match the bank it came from', () => {
    const out = json([
      fixture('handheld-20.csv'),
      '--bleeder-ohms',
      String(handheld.bleederOhms),
      '--baseline-uf',
      String(handheld.capacitanceMicrofarads),
      '--nominal-volts',
      '560',
    ]);
    expect(Math.abs((out.tauSeconds as number) / handheld.tauSeconds - 1)).toBeLessThan(0.005);
    const [low, high] = out.tauCi95 as [number, number];
    expect(low).toBeLessThan(handheld.tauSeconds);
    expect(high).toBeGreaterThan(handheld.tauSeconds);
    expect(
      Math.abs((out.capacitanceMicrofarads as number) / handheld.capacitanceMicrofarads - 1),
    ).toBeLessThan(0.005);
    expect(out.ratioToBaseline as number).toBeCloseTo(1, 2);
    expect(out.health).toBe('healthy');
    expect(out.pointsUsed).toBe(20);
    expect(out.excluded).toEqual([]);
    expect(out.kneeSeconds).toBeNull();
    const busTau = (out.capacitanceMicrofarads as number) * 1e-6 * handheld.bleederOhms;
    expect((out.safeAfterSeconds as Record<string, number>)['60']).toBeCloseTo(
      busTau * Math.log(560 / 60),
      6,
    );
    expect((out.safeAfterSeconds as Record<string, number>)['50']).toBeCloseTo(
      busTau * Math.log(560 / 50),
      6,
    );
    expect(out.v0Volts as number).toBeCloseTo(handheld.v0Volts, 0);
    expect(typeof out.rmseVolts).toBe('number');
    expect(out.r2 as number).toBeGreaterThan(0.999);
    expect(Array.isArray(out.warnings)).toBe(true);
    expect(out.caution as string).toMatch(/lockout\/tagout/);
  });

  it('when no baseline is given, then ratio and health are left out', () => {
    const out = json([fixture('handheld-20.csv'), '--bleeder-ohms', '94k']);
    expect(out).not.toHaveProperty('ratioToBaseline');
    expect(out).not.toHaveProperty('health');
    expect((out.warnings as string[]).join(' ')).toMatch(/No --nominal-volts/);
  });

  it('when --meter-ohms is 0, then there is no meter loading and C = τ / R_bleed', () => {
    const loaded = json([fixture('handheld-20.csv'), '--bleeder-ohms', '94000']);
    const unloaded = json([
      fixture('handheld-20.csv'),
      '--bleeder-ohms',
      '94000',
      '--meter-ohms',
      '0',
    ]);
    expect(unloaded.meterInputOhms).toBeNull();
    expect(unloaded.effectiveOhms).toBe(94_000);
    expect(unloaded.capacitanceMicrofarads as number).toBeCloseTo(
      ((unloaded.tauSeconds as number) / 94_000) * 1e6,
      6,
    );
    expect(
      (loaded.capacitanceMicrofarads as number) / (unloaded.capacitanceMicrofarads as number),
    ).toBeCloseTo(94_000 / handheld.effectiveOhms, 9);
  });

  it('when a reading lost a digit, then it is listed in excluded with its row, and τ is unaffected', () => {
    const out = json([fixture('handheld-dropped-digit.csv'), '--bleeder-ohms', '94k']);
    const excluded = out.excluded as {
      row: number;
      tSeconds: number;
      volts: number;
      reason: string;
    }[];
    expect(excluded).toHaveLength(1);
    expect(excluded[0]).toMatchObject({
      row: FIXTURES.droppedDigit.index + 2,
      tSeconds: FIXTURES.droppedDigit.index * 30,
    });
    expect(excluded[0]!.reason).toMatch(/dropped digit/);
    expect(Math.abs((out.tauSeconds as number) / handheld.tauSeconds - 1)).toBeLessThan(0.005);
  });

  it('when a semicolon logger file with decimal commas has a control-supply phase, then the knee is reported and τ is right', () => {
    const logger = FIXTURES.logger;
    const out = json([
      fixture('logger-control-supply.csv'),
      '--bleeder-ohms',
      String(logger.bleederOhms),
      '--baseline-uf',
      String(logger.capacitanceMicrofarads),
      '--temp-c',
      '24',
    ]);
    expect(Math.abs((out.tauSeconds as number) / logger.tauSeconds - 1)).toBeLessThan(0.002);
    const expectedKnee =
      (logger.tauSeconds / 2) *
      Math.log(
        (logger.v0Volts ** 2 + logger.controlSupplyWatts * logger.effectiveOhms) /
          (logger.dropoutVolts ** 2 + logger.controlSupplyWatts * logger.effectiveOhms),
      );
    expect(Math.abs((out.kneeSeconds as number) - expectedKnee)).toBeLessThan(0.5);
    expect((out.controlSupplyWatts as number) / logger.controlSupplyWatts).toBeCloseTo(1, 1);
    expect(out.health).toBe('healthy');
    expect((out.findings as { code: string }[]).map((f) => f.code)).toContain('not-normalised');
  });

  it('when a tab-separated file gives time in ms, then the times are read as seconds', () => {
    const out = json([fixture('tab-milliseconds.tsv'), '--bleeder-ohms', '50k']);
    expect(out.tauSeconds as number).toBeCloseTo(FIXTURES.tabMilliseconds.tauSeconds, 1);
  });

  it('when a temperature coefficient is given, then the capacitance is normalised to 20 °C', () => {
    const out = json([
      fixture('handheld-20.csv'),
      '--bleeder-ohms',
      '94k',
      '--temp-c',
      '-5',
      '--temp-coeff-per-k',
      '0.002',
    ]);
    expect(out.capacitanceAt20CMicrofarads as number).toBeCloseTo(
      (out.capacitanceMicrofarads as number) / (1 + 0.002 * (-5 - 20)),
      6,
    );
  });

  it('when the marked wait time is shorter than the discharge, then it is flagged as a safety finding', () => {
    const out = json([
      fixture('handheld-20.csv'),
      '--bleeder-ohms',
      '94k',
      '--nominal-volts',
      '560',
      '--marked-wait-s',
      '300',
    ]);
    expect(out.exceedsMarkedWait).toBe(true);
    expect(out.safetyFinding).toBe(true);
  });

  it('when the file is -, then the readings come from standard input', () => {
    const fromFile = json([fixture('handheld-20.csv'), '--bleeder-ohms', '94k']);
    const result = runInProcess(main, ['-', '--bleeder-ohms', '94k'], {
      stdin: readFileSync(fixture('handheld-20.csv'), 'utf8'),
    });
    expect(result.status).toBe(0);
    const fromStdin = JSON.parse(result.stdout) as Record<string, unknown>;
    expect(fromStdin.tauSeconds).toBe(fromFile.tauSeconds);
    expect(fromStdin.file).toBe('-');
  });

  it('when a relative file is given, then it is read from the folder the command was typed in', () => {
    const result = runInProcess(main, ['handheld-20.csv', '--bleeder-ohms', '94k'], {
      cwd: join(PROJECT_ROOT, 'tests', 'fixtures', 'decay'),
    });
    expect(result.stderr).toBe('');
    expect(result.status).toBe(0);
  });

  it('when --help is given, then the usage goes to stdout and the status is 0', () => {
    const result = fit('--help');
    expect(result.status).toBe(0);
    expect(result.stdout).toMatch(/^usage: npm run -s fit -- FILE\.csv --bleeder-ohms R/);
  });

  const badCases: [string, string[], RegExp][] = [
    [
      'a negative voltage',
      [fixture('bad-negative-voltage.csv'), '--bleeder-ohms', '94k'],
      /Row 4: the voltage -3 V is not above zero/,
    ],
    [
      'times that do not increase',
      [fixture('bad-times-not-increasing.csv'), '--bleeder-ohms', '94k'],
      /Row 4: the time 30 s does not come after/,
    ],
    [
      'a curve that does not decay',
      [fixture('bad-no-decay.csv'), '--bleeder-ohms', '94k'],
      /does not fall as a discharge does/,
    ],
    [
      'fewer than 3 readings',
      [fixture('bad-two-readings.csv'), '--bleeder-ohms', '94k'],
      /at least 3/,
    ],
    [
      'a fit too poor to trust',
      [fixture('bad-poor-fit.csv'), '--bleeder-ohms', '94k'],
      /unusable decay run/,
    ],
    [
      'a bad cell',
      [fixture('bad-cell.csv'), '--bleeder-ohms', '94k'],
      /Row 3, column "volts": "49O" is not a number/,
    ],
    [
      'a missing header',
      [fixture('bad-no-header.csv'), '--bleeder-ohms', '94k'],
      /No header row found/,
    ],
    ['a missing --bleeder-ohms', [fixture('handheld-20.csv')], /--bleeder-ohms is required/],
    [
      'a malformed resistance',
      [fixture('handheld-20.csv'), '--bleeder-ohms', '94 kilo'],
      /--bleeder-ohms must be a positive resistance/,
    ],
    [
      'an unknown option',
      [fixture('handheld-20.csv'), '--bleeder-ohms', '94k', '--colour', 'red'],
      /Unknown option '--colour'/,
    ],
    [
      'a missing file',
      [fixture('no-such-file.csv'), '--bleeder-ohms', '94k'],
      /cannot read .*ENOENT/,
    ],
  ];
  for (const [what, args, message] of badCases) {
    it(`when given ${what}, then exit 2 with one message on stderr and nothing on stdout`, () => {
      const result = fit(...args);
      expect(result.status).toBe(2);
      expect(result.stdout).toBe('');
      expect(result.stderr).toMatch(message);
      expect(result.stderr.trim().split('\n')).toHaveLength(1);
    });
  }
});

describe('npm run -s fit', () => {
  it(
    'when an engineer runs it on a handheld file, then the process exits 0 with the same JSON as main',
    { timeout: 120_000 },
    () => {
      const args = [fixture('handheld-20.csv'), '--bleeder-ohms', '94k', '--nominal-volts', '560'];
      const spawned = runAsUser('fit', args);
      expect(spawned.stderr).toBe('');
      expect(spawned.status).toBe(0);
      expect(JSON.parse(spawned.stdout)).toEqual(json(args));
    },
  );
});
