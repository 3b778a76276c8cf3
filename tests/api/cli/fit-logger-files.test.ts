/**
 * The fit tool on logger exports (tests/fixtures/logger-files): the file read as bytes in any of
 * its encodings, the column options, the reader's notes, and the meter's input resistance asked
 * for. Expectations come from the fixtures' generating facts.
 */

import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { main } from '../../../api/src/cli/fit';
import { PROJECT_ROOT, runInProcess } from '../../support/cli';
import { LOGGER_FILES } from '../../fixtures/logger-files/logger-files';

const fixture = (name: string): string =>
  join(PROJECT_ROOT, 'tests', 'fixtures', 'logger-files', name);
const facts = (file: string) => LOGGER_FILES.find((f) => f.file === file)!;
/** The fixtures' bank: 94 kΩ bleeder, 2350 µF, read by a 10 MΩ logger. */
const bank = { bleederOhms: 94_000, capacitanceMicrofarads: 2350 };

function json(args: string[]): Record<string, unknown> {
  const result = runInProcess(main, args);
  expect(result.stderr).toBe('');
  expect(result.status).toBe(0);
  return JSON.parse(result.stdout) as Record<string, unknown>;
}

describe('fit on logger files', () => {
  it('when a UTF-16 file is given, then it is decoded and τ and C match the bank it came from', () => {
    const file = facts('utf16le-bom.txt');
    const out = json([fixture(file.file), '--bleeder-ohms', '94k', '--meter-ohms', '10M']);
    expect(Math.abs((out.tauSeconds as number) / file.tauSeconds - 1)).toBeLessThan(0.01);
    expect(
      Math.abs((out.capacitanceMicrofarads as number) / bank.capacitanceMicrofarads - 1),
    ).toBeLessThan(0.01);
    expect(out.fileRead).toMatchObject({
      encoding: 'utf-16le',
      lineEnds: 'CRLF',
      headerRow: 1,
      timeColumn: 'Time (s)',
      voltageColumn: 'Voltage (V)',
    });
  });

  it('when a Latin-1 file with decimal commas is given, then its German column names are read', () => {
    const out = json([
      fixture('latin1-decimal-comma.csv'),
      '--bleeder-ohms',
      '94k',
      '--meter-ohms',
      '10M',
    ]);
    expect(out.fileRead).toMatchObject({
      encoding: 'latin-1',
      timeColumn: 'Zeit (s)',
      voltageColumn: 'Spannung (V)',
    });
  });

  it('when the file has a flat bus before the switch-off, then the notes say what was left out and t = 0 moved', () => {
    const file = facts('pre-trigger-flat-bus.csv');
    const out = json([fixture(file.file), '--bleeder-ohms', '94k', '--meter-ohms', '10M']);
    expect(Math.abs((out.tauSeconds as number) / file.tauSeconds - 1)).toBeLessThan(0.01);
    expect(Math.abs((out.v0Volts as number) / file.v0Volts - 1)).toBeLessThan(0.01);
    expect((out.fileRead as { notes: string[] }).notes.join(' ')).toMatch(
      /before the switch-off; they were left out and t = 0 is set at the switch-off/,
    );
  });

  it('when two channels could be the bus, then exit 2 names both and the option; --volts-column chooses', () => {
    const refused = runInProcess(main, [fixture('second-channel.csv'), '--bleeder-ohms', '94k']);
    expect(refused.status).toBe(2);
    expect(refused.stdout).toBe('');
    expect(refused.stderr).toBe(
      'fit: Row 1 (the header, semicolon separated): 2 columns could be the voltage: "CH1 (V)" (column 2) and "CH2 (V)" (column 3). Choose one by its name or number. (--volts-column NAME or NUMBER)\n',
    );
    const byName = json([
      fixture('second-channel.csv'),
      '--bleeder-ohms',
      '94k',
      '--meter-ohms',
      '10M',
      '--volts-column',
      'CH1 (V)',
    ]);
    const byNumber = json([
      fixture('second-channel.csv'),
      '--bleeder-ohms',
      '94k',
      '--meter-ohms',
      '10M',
      '--volts-column',
      '2',
    ]);
    expect((byName.fileRead as { voltageColumn: string }).voltageColumn).toBe('CH1 (V)');
    expect(byNumber.tauSeconds).toBe(byName.tauSeconds);
    expect(
      Math.abs((byName.tauSeconds as number) / facts('second-channel.csv').tauSeconds - 1),
    ).toBeLessThan(0.01);
  });

  it('when --time-column names a column the file does not have, then exit 2 lists the columns it has', () => {
    const refused = runInProcess(main, [
      fixture('t_s-v.csv'),
      '--bleeder-ohms',
      '94k',
      '--time-column',
      'elapsed',
    ]);
    expect(refused.status).toBe(2);
    expect(refused.stderr).toBe(
      'fit: Row 1 (the header, comma separated): there is no column "elapsed"; the columns are "t_s" (1), "v" (2). (--time-column NAME or NUMBER)\n',
    );
  });

  it('when no --meter-ohms is given, then a warning asks for it; beside a 470 kΩ bleeder the verdict warns of the doubt', () => {
    const small = json([fixture('t_s-v.csv'), '--bleeder-ohms', '94k']);
    expect((small.warnings as string[]).join(' ')).toMatch(
      /No --meter-ohms given: a 10 MΩ meter was assumed/,
    );
    const large = json([fixture('t_s-v.csv'), '--bleeder-ohms', '470k']);
    const warnings = (large.warnings as string[]).join(' ');
    expect(warnings).toMatch(/Beside the 470 kΩ bleeder that is a guess that matters/);
    expect(warnings).not.toMatch(/No --meter-ohms given/);
    const stated = json([fixture('t_s-v.csv'), '--bleeder-ohms', '470k', '--meter-ohms', '1M']);
    expect((stated.warnings as string[]).join(' ')).not.toMatch(/meter/i);
    expect(stated.meterInputOhms).toBe(1e6);
  });
});
