import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseDecaySamplesCsv } from '../../../shared/domain/samples-csv';
import { fitDecay, type DecayFit } from '../../../shared/domain/decay-fit';
import { EngineInputError } from '../../../shared/domain/errors';
import {
  buildLoggerFile,
  buildRefusedFile,
  LOGGER_FILES,
  REFUSED_LOGGER_FILES,
  seedOf,
  type LoggerFileFacts,
} from '../../fixtures/logger-files/logger-files';

const folder = join(dirname(fileURLToPath(import.meta.url)), '../../fixtures/logger-files');
const bytesOf = (file: string): Uint8Array => new Uint8Array(readFileSync(join(folder, file)));

function fitted(samples: Parameters<typeof fitDecay>[0]): DecayFit {
  const fit = fitDecay(samples);
  if (fit.status !== 'ok') throw new Error(`expected a fit, got: ${fit.reason}`);
  return fit;
}

/** Readings of the decay the file holds after the switch-off (before any tail is left out). */
function decayReadings(facts: LoggerFileFacts): number {
  return Math.round(facts.decaySeconds / facts.stepSeconds) + 1;
}

describe('parseDecaySamplesCsv on logger export shapes (tests/fixtures/logger-files)', () => {
  for (const facts of LOGGER_FILES) {
    describe(`when the file has ${facts.shape} (${facts.file})`, () => {
      const bytes = bytesOf(facts.file);

      it('then the fixture on disk is the one its facts build', () => {
        expect(Buffer.from(bytes).equals(Buffer.from(buildLoggerFile(facts, seedOf(facts))))).toBe(
          true,
        );
      });

      it('then it is read with the right encoding, line ends, separator, columns and header row', () => {
        const csv = parseDecaySamplesCsv(bytes, facts.options);
        const { expect: wanted } = facts;
        expect({
          encoding: csv.encoding,
          lineEnds: csv.lineEnds,
          separator: csv.separator,
          timeFormat: csv.timeFormat,
          timeColumn: csv.timeColumn,
          voltageColumn: csv.voltageColumn,
          headerRow: csv.headerRow,
        }).toEqual({
          encoding: wanted.encoding,
          lineEnds: wanted.lineEnds,
          separator: wanted.separator,
          timeFormat: wanted.timeFormat,
          timeColumn: wanted.timeColumn,
          voltageColumn: wanted.voltageColumn,
          headerRow: wanted.headerRow,
        });
        expect(csv.averagedRows > 0).toBe(wanted.averagedRows === 'some');
        expect(csv.zeroTail !== null).toBe(wanted.zeroTail === 'some');
        expect(csv.preTrigger?.found ?? null).toBe(wanted.preTrigger ?? null);
      });

      it('then τ and V0 come back within 1 % of the physics that made it (t = 0 at the switch-off)', () => {
        const csv = parseDecaySamplesCsv(bytes, facts.options);
        const fit = fitted(csv.samples);
        expect(Math.abs(fit.tauSeconds / facts.tauSeconds - 1)).toBeLessThan(0.01);
        expect(Math.abs(fit.v0Volts / facts.v0Volts - 1)).toBeLessThan(0.01);
        expect(csv.samples[0]!.tSeconds).toBeGreaterThanOrEqual(0);
        expect(csv.samples[0]!.tSeconds).toBeLessThan(4 * facts.stepSeconds);
      });

      it('then every reading of the decay is kept, in seconds and volts, with its file row', () => {
        const csv = parseDecaySamplesCsv(bytes, facts.options);
        const n = csv.samples.length;
        expect(csv.rowNumbers).toHaveLength(n);
        expect(csv.rowNumbers[0]).toBeGreaterThan(facts.expect.headerRow);
        if (facts.expect.averagedRows) {
          // One sample per tenth of a second of the clock.
          expect(n).toBe(Math.floor(facts.decaySeconds * 10 + 1e-9) + 1);
        } else if (facts.expect.zeroTail) {
          // The tail is left out: readings below the noise around zero (well under 1 V).
          expect(n).toBeLessThan(decayReadings(facts));
          const lowest = Math.min(...csv.samples.map((s) => s.volts));
          expect(lowest).toBeGreaterThan(0);
          expect(lowest).toBeLessThan(10 * facts.noiseVolts);
        } else if (facts.expect.preTrigger) {
          // Every flat reading left out, and at most the first 3 readings of the fall with them.
          expect(n).toBeLessThanOrEqual(decayReadings(facts) - 1);
          expect(n).toBeGreaterThanOrEqual(decayReadings(facts) - 4);
          expect(Math.max(...csv.samples.map((s) => s.volts))).toBeLessThan(facts.v0Volts);
        } else {
          expect(n).toBe(decayReadings(facts));
          const step = (csv.samples[n - 1]!.tSeconds - csv.samples[0]!.tSeconds) / (n - 1);
          expect(step).toBeCloseTo(facts.stepSeconds, 9);
        }
      });
    });
  }

  it('when the flat bus before the switch-off is fitted as it is, then τ is off by more than when it is left out', () => {
    const facts = LOGGER_FILES.find(
      (f) => f.expect.preTrigger === 'flat-bus' && f.flatSeconds >= 30,
    )!;
    const bytes = bytesOf(facts.file);
    const raw = parseDecaySamplesCsv(bytes, { validate: false });
    const cleaned = parseDecaySamplesCsv(bytes);
    const rawError = Math.abs(fitted(raw.samples).tauSeconds / facts.tauSeconds - 1);
    const cleanedError = Math.abs(fitted(cleaned.samples).tauSeconds / facts.tauSeconds - 1);
    expect(raw.samples.length - cleaned.samples.length).toBeGreaterThanOrEqual(
      facts.flatSeconds / facts.stepSeconds,
    );
    expect(rawError).toBeGreaterThan(cleanedError);
    expect(Math.abs(cleaned.preTrigger!.switchOffFileSeconds - facts.flatSeconds)).toBeLessThan(
      facts.stepSeconds,
    );
    expect(cleaned.notes.join(' ')).toMatch(
      /flat at 565 V before the switch-off; they were left out and t = 0 is set at the switch-off \(\d+\.?\d* s in the file's time\)/,
    );
  });

  it('when the second voltage channel is not chosen, then the refusal names both candidates and their columns', () => {
    const facts = LOGGER_FILES.find((f) => f.options?.voltsColumn !== undefined)!;
    const error = errorOf(() => parseDecaySamplesCsv(bytesOf(facts.file)));
    expect(error.message).toBe(
      'Row 1 (the header, semicolon separated): 2 columns could be the voltage: "CH1 (V)" (column 2) and "CH2 (V)" (column 3). Choose one by its name or number.',
    );
    expect(error.issues[0]!.path).toBe('voltsColumn');
    expect(parseDecaySamplesCsv(bytesOf(facts.file), { voltsColumn: 2 }).voltageColumn).toBe(
      'CH1 (V)',
    );
    expect(
      parseDecaySamplesCsv(bytesOf(facts.file), { voltsColumn: 'ch2 (v)' }).voltageColumn,
    ).toBe('CH2 (V)');
  });
});

function errorOf(run: () => unknown): EngineInputError {
  try {
    run();
  } catch (error) {
    if (error instanceof EngineInputError) return error;
    throw error;
  }
  throw new Error('expected an EngineInputError');
}

describe('parseDecaySamplesCsv on files it must refuse', () => {
  for (const refused of REFUSED_LOGGER_FILES) {
    it(`when the file has ${refused.shape} (${refused.file}), then the refusal says what is wrong, where`, () => {
      const bytes = bytesOf(refused.file);
      expect(Buffer.from(bytes).equals(Buffer.from(buildRefusedFile(refused.file)))).toBe(true);
      const error = errorOf(() => parseDecaySamplesCsv(bytes));
      expect(error.code).toBe('invalid-csv');
      expect(error.message).toMatch(refused.message);
    });
  }
});
