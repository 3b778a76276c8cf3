/**
 * The fit command line tool, run as engineers run it (tsx on the real file) on the invented
 * fixtures in tests/fixtures/decay. Expectations come from the fixtures' generating facts.
 */

import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { FIXTURES } from '../../fixtures/decay/fixture-facts';

const root = join(import.meta.dirname, '..', '..', '..');
const fixture = (name: string): string => join(root, 'tests', 'fixtures', 'decay', name);

function fit(...args: string[]): { status: number | null; stdout: string; stderr: string } {
  const result = spawnSync('npx', ['tsx', 'api/src/cli/fit.ts', ...args], {
    cwd: root,
    encoding: 'utf8',
    timeout: 60_000,
  });
  return { status: result.status, stdout: result.stdout, stderr: result.stderr };
}

function json(args: string[]): Record<string, unknown> {
  const result = fit(...args);
  expect(result.stderr).toBe('');
  expect(result.status).toBe(0);
  return JSON.parse(result.stdout) as Record<string, unknown>;
}

const handheld = FIXTURES.handheld;

describe('npm run fit', { timeout: 60_000 }, () => {
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
