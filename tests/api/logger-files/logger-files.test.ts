/**
 * `POST /api/logger-files/preview`: a logger's or oscilloscope's file read as a decay run's
 * readings by the engine's reader; refusals for what is not text, too large, or leaves its columns
 * open; nothing stored. Expected figures come from the physical facts each fixture was built from
 * (tests/fixtures/logger-files/logger-files.ts and upload-files.ts), never from earlier answers.
 */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import sharp from 'sharp';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { DECAY_RUN_MAX_SAMPLES } from '../../../shared/constants/decay-runs';
import { LOGGER_FILE_MAX_BYTES, LOGGER_FILE_MAX_LINES } from '../../../shared/constants/logger-files';
import type { LoggerFilePreview } from '../../../shared/schemas/logger-file';
import { seededRandom } from '../../../infra/seed/seeded-random';
import { createCaller, type TestCaller } from '../../support/auth';
import { countRows } from '../../support/register';
import { LOGGER_FILES, REFUSED_LOGGER_FILES, type LoggerFileFacts } from '../../fixtures/logger-files/logger-files';
import { decayReadingsOf, UPLOAD_FILES } from '../../fixtures/logger-files/upload-files';

const app = createApp();
const folder = join(dirname(fileURLToPath(import.meta.url)), '../../fixtures/logger-files');
const bytesOf = (file: string) => readFileSync(join(folder, file));
const PATH = '/api/logger-files/preview';
const TIMEOUT = 30_000;

let technician: TestCaller;

beforeAll(async () => {
  technician = await createCaller(['technician']);
}, TIMEOUT);

function send(bytes: Buffer, filename: string, fields: Record<string, string> = {}, caller: TestCaller = technician) {
  let req = request(app).post(PATH).set('Authorization', caller.auth);
  for (const [name, value] of Object.entries(fields)) req = req.field(name, value);
  return req.attach('file', bytes, { filename, contentType: 'text/csv' });
}

/** The voltage of the ideal decay at `t` seconds after the switch-off. */
const ideal = (facts: { v0Volts: number; tauSeconds: number }, t: number) => facts.v0Volts * Math.exp(-t / facts.tauSeconds);

/** The readings of the decay after the switch-off in a fixture of ./logger-files.ts (its facts). */
const decayReadings = (facts: LoggerFileFacts) => Math.round(facts.decaySeconds / facts.stepSeconds) + 1;

function columnsOf(facts: LoggerFileFacts): Record<string, string> {
  const fields: Record<string, string> = {};
  if (facts.options?.timeColumn !== undefined) fields.timeColumn = String(facts.options.timeColumn);
  if (facts.options?.voltsColumn !== undefined) fields.voltsColumn = String(facts.options.voltsColumn);
  return fields;
}

describe('when a logger file of each known shape is previewed (tests/fixtures/logger-files)', () => {
  for (const facts of LOGGER_FILES) {
    it(
      `when the file has ${facts.shape} (${facts.file}), then its readings come back with their columns, first and last points`,
      async () => {
        const res = await send(bytesOf(facts.file), facts.file, columnsOf(facts));
        expect(res.status, JSON.stringify(res.body.error)).toBe(200);
        const preview = res.body as LoggerFilePreview;
        expect(preview).toMatchObject({
          fileName: facts.file,
          timeColumn: facts.expect.timeColumn,
          voltsColumn: facts.expect.voltageColumn,
          headerRow: facts.expect.headerRow,
        });
        // the header's cells hold the columns read, and rows follow it
        expect(preview.header.columns).toContain(facts.expect.timeColumn);
        expect(preview.header.columns).toContain(facts.expect.voltageColumn);
        expect(preview.header.rows.length).toBeGreaterThan(0);
        const { samples, rowNumbers } = preview;
        const n = samples.length;
        expect(rowNumbers).toHaveLength(n);
        const first = samples[0]!;
        const last = samples[n - 1]!;
        // t = 0 at the switch-off: the first kept reading is within a few sampling steps of it (facts: stepSeconds)
        expect(first.tSeconds).toBeGreaterThanOrEqual(0);
        expect(first.tSeconds).toBeLessThan(4 * facts.stepSeconds);
        // each reading is the physics plus the logger's noise (facts: v0Volts, tauSeconds, noiseVolts = 0.1 V or less): 1 V is 10 σ
        expect(Math.abs(first.volts - ideal(facts, first.tSeconds))).toBeLessThan(1);
        expect(Math.abs(last.volts - ideal(facts, last.tSeconds))).toBeLessThan(1);
        if (facts.expect.averagedRows) {
          // a 0.1 s clock: one averaged reading per tenth of a second (facts: decaySeconds 40 s → 401)
          expect(n).toBe(Math.floor(facts.decaySeconds * 10 + 1e-9) + 1);
          expect(preview.leftOut.averagedRows).toBeGreaterThan(0);
        } else if (facts.expect.zeroTail) {
          // the tail at 0 V is left out and counted; the last kept reading is still above 0 V
          expect(n).toBeLessThan(decayReadings(facts));
          expect(preview.leftOut.zeroTail!.readings).toBe(preview.rowCount - n);
          expect(last.volts).toBeGreaterThan(0);
        } else if (facts.expect.preTrigger) {
          // the flat bus before the switch-off is left out (facts: flatSeconds / stepSeconds readings), the decay kept
          expect(preview.leftOut.preTrigger).toMatchObject({ found: facts.expect.preTrigger });
          expect(preview.leftOut.preTrigger!.readings).toBeGreaterThanOrEqual(Math.round(facts.flatSeconds / facts.stepSeconds));
          expect(n).toBeGreaterThanOrEqual(decayReadings(facts) - 4);
          expect(Math.abs(last.tSeconds - facts.decaySeconds)).toBeLessThan(facts.stepSeconds);
          expect(preview.warnings.join(' ')).toMatch(/left out and t = 0 is set at the switch-off/);
        } else {
          // every reading from the switch-off to the end (facts: decaySeconds / stepSeconds + 1 = 601)
          expect(n).toBe(decayReadings(facts));
          expect(preview.rowCount).toBe(n);
          expect(last.tSeconds).toBeCloseTo(facts.decaySeconds, 6);
        }
      },
      TIMEOUT,
    );
  }
});

describe('when a messier export is previewed (tests/fixtures/logger-files/upload)', () => {
  for (const facts of UPLOAD_FILES) {
    it(
      `when the file has ${facts.shape} (${facts.file}), then its readings come back in seconds and volts`,
      async () => {
        const res = await send(readFileSync(join(folder, 'upload', facts.file)), facts.file);
        expect(res.status, JSON.stringify(res.body.error)).toBe(200);
        const preview = res.body as LoggerFilePreview;
        expect(preview).toMatchObject({
          timeColumn: facts.expect.timeColumn,
          voltsColumn: facts.expect.voltsColumn,
          headerRow: facts.expect.headerRow,
          format: { encoding: facts.expect.encoding, separator: facts.expect.separator },
        });
        const n = preview.samples.length;
        const first = preview.samples[0]!;
        const last = preview.samples[n - 1]!;
        // facts: 565 V, τ = 218.8 s, noise 0.1 V (a kV column written to 5 decimals rounds to 0.005 V more)
        expect(Math.abs(first.volts - ideal(facts, first.tSeconds))).toBeLessThan(1);
        expect(Math.abs(last.volts - ideal(facts, last.tSeconds))).toBeLessThan(1);
        // facts: the decay lasts 300 s after the switch-off
        expect(Math.abs(last.tSeconds - facts.decaySeconds)).toBeLessThan(facts.stepSeconds);
        if (facts.expect.preTrigger) {
          // facts: 5 s of flat bus at 0.1 s = 50 readings before the switch-off; the first readings of the fall go
          // with them until the fall leaves the bus's noise band (0.1 V σ against 565 V / 218.8 s = 2.6 V/s: under 1 s)
          expect(preview.leftOut.preTrigger).toMatchObject({ found: 'flat-bus' });
          expect(preview.leftOut.preTrigger!.readings).toBeGreaterThanOrEqual(50);
          expect(n).toBeGreaterThanOrEqual(decayReadingsOf(facts) - 10);
          expect(first.tSeconds).toBeLessThan(1);
        } else {
          // facts: decaySeconds / stepSeconds + 1 readings, t = 0 first
          expect(n).toBe(decayReadingsOf(facts));
          expect(first.tSeconds).toBe(0);
        }
      },
      TIMEOUT,
    );
  }
});

describe('when the column names leave the voltage open', () => {
  it(
    'when two channels could be the voltage, then 422 columns-ambiguous offers the columns and first rows; the same file with the columns chosen reads',
    async () => {
      const bytes = bytesOf('second-channel.csv');
      const refused = await send(bytes, 'second-channel.csv');
      expect(refused.status).toBe(422);
      expect(refused.body.error.code).toBe('columns-ambiguous');
      expect(refused.body.error.message).toBe(
        'Row 1 (the header, semicolon separated): 2 columns could be the voltage: "CH1 (V)" (column 2) and "CH2 (V)" (column 3). Choose one by its name or number.',
      );
      // the file's header and its first five rows, as written (tests/fixtures/logger-files/second-channel.csv)
      expect(refused.body.error.candidates).toMatchObject({
        question: 'voltsColumn',
        headerRow: 1,
        columns: ['Time (s)', 'CH1 (V)', 'CH2 (V)'],
      });
      expect(refused.body.error.candidates.rows).toHaveLength(5);
      expect(refused.body.error.candidates.rows[0]).toEqual(['0,0', '565,02', '23,95']);

      const chosen = await send(bytes, 'second-channel.csv', { timeColumn: 'Time (s)', voltsColumn: 'CH1 (V)' });
      expect(chosen.status).toBe(200);
      expect(chosen.body).toMatchObject({ timeColumn: 'Time (s)', voltsColumn: 'CH1 (V)' });
      // the header and the first rows come with the readings, to choose other columns from
      expect(chosen.body.header.columns).toEqual(['Time (s)', 'CH1 (V)', 'CH2 (V)']);
      expect(chosen.body.header.rows).toEqual(refused.body.error.candidates.rows);
      // facts: 601 readings from 565 V
      expect(chosen.body.samples).toHaveLength(601);
      expect(Math.abs(chosen.body.samples[0].volts - 565)).toBeLessThan(1);

      const byNumber = await send(bytes, 'second-channel.csv', { timeColumn: '1', voltsColumn: '2' });
      expect(byNumber.status).toBe(200);
      expect(byNumber.body.voltsColumn).toBe('CH1 (V)');
    },
    TIMEOUT,
  );

  it(
    'when a chosen column is not in the file, then the columns are offered again with the reason',
    async () => {
      const res = await send(bytesOf('second-channel.csv'), 'second-channel.csv', { voltsColumn: 'CH9 (V)' });
      expect(res.status).toBe(422);
      expect(res.body.error.code).toBe('columns-ambiguous');
      expect(res.body.error.message).toMatch(/there is no column "CH9 \(V\)"/);
      expect(res.body.error.candidates.columns).toEqual(['Time (s)', 'CH1 (V)', 'CH2 (V)']);
    },
    TIMEOUT,
  );

  it(
    'when a column choice is too long, then 400 names the field',
    async () => {
      const res = await send(bytesOf('second-channel.csv'), 'second-channel.csv', { voltsColumn: 'x'.repeat(201) });
      expect(res.status).toBe(400);
      expect(res.body.error.issues[0].path).toBe('voltsColumn');
    },
    TIMEOUT,
  );
});

describe('when a file cannot be read as a decay run (REFUSED_LOGGER_FILES)', () => {
  for (const refused of REFUSED_LOGGER_FILES) {
    it(
      `when the file has ${refused.shape} (${refused.file}), then 422 with the reader's reason`,
      async () => {
        const res = await send(bytesOf(refused.file), refused.file);
        expect(res.status).toBe(422);
        // no voltage column named: a question the person can settle by choosing one
        expect(res.body.error.code).toBe(refused.file === 'refuse-no-voltage-column.csv' ? 'columns-ambiguous' : 'unreadable-file');
        expect(res.body.error.message).toMatch(refused.message);
      },
      TIMEOUT,
    );
  }

  it(
    'when a kV column is read as volts, then 422 names the row and asks about the unit',
    async () => {
      const text = 'Time (s);U\n0;5650\n1;5600\n2;5550\n';
      const res = await send(Buffer.from(text), 'volts-times-ten.csv');
      expect(res.status).toBe(422);
      expect(res.body.error.code).toBe('unreadable-file');
      expect(res.body.error.message).toBe('Row 2, column "U": 5650 V is above the 2000 V a decay run may hold. Is the column\'s unit right (V, mV or kV in its header)?');
    },
    TIMEOUT,
  );
});

describe('the limits', () => {
  it(
    'when the file is one byte over the limit, then 413 names the limit; at the limit it is read',
    async () => {
      const readings = bytesOf('plain-seconds.csv');
      // a last line of spaces pads the file: a blank line, which the reader skips
      const padded = (size: number) => Buffer.concat([readings, Buffer.alloc(size - readings.length, ' ')]);
      const over = await send(padded(LOGGER_FILE_MAX_BYTES + 1), 'padded.csv');
      expect(over.status).toBe(413);
      expect(over.body.error.code).toBe('file-too-large');
      expect(over.body.error.message).toMatch(/^The file is larger than 5 MB\./);
      const at = await send(padded(LOGGER_FILE_MAX_BYTES), 'padded.csv');
      expect(at.status).toBe(200);
      expect(at.body.samples).toHaveLength(601);
    },
    TIMEOUT,
  );

  it(
    'when the file has more lines than are read, then 413 names the line limit',
    async () => {
      const lines = ['t_s,v', ...Array.from({ length: LOGGER_FILE_MAX_LINES }, (_, i) => `${i},1`)];
      const res = await send(Buffer.from(lines.join('\n')), 'long.csv');
      expect(res.status).toBe(413);
      expect(res.body.error.message).toMatch(/^The file has more than 50,000 lines/);
    },
    TIMEOUT,
  );

  it(
    'when a file holds more readings than a run keeps, then every n-th is kept and a warning says so',
    async () => {
      // 25,001 readings of the bank's decay at 0.01 s (τ = 218.8 s): over the 20,000 a run holds, so every second is kept
      const tau = 218.8;
      const lines = ['Time (s),Voltage (V)'];
      for (let i = 0; i <= 25_000; i++) lines.push(`${(i / 100).toFixed(2)},${(565 * Math.exp(-i / 100 / tau)).toFixed(2)}`);
      const res = await send(Buffer.from(lines.join('\n')), 'fast-logger.csv');
      expect(res.status).toBe(200);
      expect(res.body.samples.length).toBeLessThanOrEqual(DECAY_RUN_MAX_SAMPLES);
      expect(res.body.samples).toHaveLength(12_501);
      expect(res.body.leftOut.thinned).toEqual({ readings: 12_500, step: 2 });
      expect(res.body.samples.at(-1)).toEqual({ tSeconds: 250, volts: Number((565 * Math.exp(-250 / tau)).toFixed(2)) });
      expect(res.body.warnings.at(-1)).toBe('The file holds 25,001 readings; every second was kept (12,501), as a decay run holds at most 20,000.');
    },
    TIMEOUT,
  );
});

describe('what is not a text file, whatever its name', () => {
  it(
    'when a PNG image is renamed .csv, then 415 not-a-text-file',
    async () => {
      const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#336699' } }).png().toBuffer();
      const res = await send(png, 'readings.csv');
      expect(res.status).toBe(415);
      expect(res.body.error.code).toBe('not-a-text-file');
      expect(res.body.error.message).toMatch(/^"readings\.csv" is a PNG image, not a text file\./);
    },
    TIMEOUT,
  );

  it(
    'when a workbook (a zip) or a PDF is sent, then 415 not-a-text-file',
    async () => {
      const zip = Buffer.concat([Buffer.from([0x50, 0x4b, 0x03, 0x04]), Buffer.alloc(200, 1)]);
      const pdf = Buffer.from('%PDF-1.7\n1 0 obj\n<< /Type /Catalog >>\nendobj\n');
      for (const [bytes, name] of [[zip, 'run.xlsx'], [pdf, 'run.csv']] as const) {
        const res = await send(bytes, name);
        expect(res.status).toBe(415);
        expect(res.body.error.code).toBe('not-a-text-file');
      }
    },
    TIMEOUT,
  );

  it(
    'when a binary file holds zero bytes, then 415 not-a-text-file; UTF-16 text (zero bytes of its own) is read',
    async () => {
      const binary = Buffer.from([0x01, 0x02, 0x00, 0x10, 0x00, 0x00, 0x7f, 0x33, 0x00, 0x01, 0x00, 0x00, 0xfe, 0x00, 0x12, 0x00, 0x00, 0x00]);
      const res = await send(binary, 'logger.csv');
      expect(res.status).toBe(415);
      expect(res.body.error.code).toBe('not-a-text-file');
      const utf16 = await send(bytesOf('utf16le-bom.txt'), 'utf16le-bom.txt');
      expect(utf16.status).toBe(200);
    },
    TIMEOUT,
  );
});

describe('who may preview, and what is kept', () => {
  it(
    'when a planner sends a file, then 403; without credentials, 401',
    async () => {
      const planner = await createCaller(['planner']);
      const res = await send(bytesOf('plain-seconds.csv'), 'plain-seconds.csv', {}, planner);
      expect(res.status).toBe(403);
      const anonymous = await request(app).post(PATH).attach('file', bytesOf('plain-seconds.csv'), 'plain-seconds.csv');
      expect(anonymous.status).toBe(401);
    },
    TIMEOUT,
  );

  it(
    'when reliability or an admin sends a file, then it is read',
    async () => {
      for (const roles of [['reliability'], ['admin']] as const) {
        const caller = await createCaller([...roles]);
        const res = await send(bytesOf('plain-seconds.csv'), 'plain-seconds.csv', {}, caller);
        expect(res.status).toBe(200);
      }
    },
    TIMEOUT,
  );

  it(
    'when no file is sent, then 400 names the file field',
    async () => {
      const res = await request(app).post(PATH).set('Authorization', technician.auth).field('voltsColumn', '2');
      expect(res.status).toBe(400);
      expect(res.body.error.issues[0].path).toBe('file');
    },
    TIMEOUT,
  );

  it(
    'when files are previewed, then nothing is stored (no audit entry, no outbox message)',
    async () => {
      const before = [await countRows('audit_entries'), await countRows('outbox_messages')];
      await send(bytesOf('plain-seconds.csv'), 'plain-seconds.csv');
      await send(bytesOf('second-channel.csv'), 'second-channel.csv');
      expect([await countRows('audit_entries'), await countRows('outbox_messages')]).toEqual(before);
    },
    TIMEOUT,
  );
});

describe('hostile files', () => {
  /** A file of logger-like pieces put together at random: headers, separators, numbers, clock times, junk. */
  function hostileFile(random: () => number): Buffer {
    const pick = <T>(items: readonly T[]) => items[Math.floor(random() * items.length)]!;
    const pieces = ['Time (s)', 'CH1 (V)', 'CH2 (V)', 'U [kV]', 't_s', 'v', 'Zeit [ms]', 'Timestamp', '08:15:30.5', '2024-06-11T08:15:30Z', '565,02', '-1e309', 'NaN', '1e400', '"', '""', '\u0000', '\ufeff', 'OL', '', ' ', '∞', '٣', '\ud800'];
    const separators = [',', ';', '\t', ' ', '|'];
    const ends = ['\n', '\r\n', '\r'];
    if (random() < 0.3) {
      // a decay with a piece or two put in at random places
      const rows = Array.from({ length: 5 + Math.floor(random() * 60) }, (_, k) => `${k},${(565 * Math.exp(-k / 30)).toFixed(2)}`);
      for (let m = Math.floor(random() * 3); m > 0; m--) rows[Math.floor(random() * rows.length)] = pick(pieces);
      return Buffer.from([pick(['Time (s),Voltage (V)', 't_s,v', 'Time (s),CH1 (V),CH2 (V)']), ...rows].join(pick(ends)));
    }
    const lines: string[] = [];
    const count = Math.floor(random() * 40);
    for (let i = 0; i < count; i++) {
      const cells = Array.from({ length: 1 + Math.floor(random() * 4) }, () => (random() < 0.5 ? String((random() - 0.2) * 10 ** Math.floor(random() * 8)) : pick(pieces)));
      lines.push(cells.join(pick(separators)));
    }
    const text = lines.join(pick(ends));
    if (random() < 0.15) return Buffer.from(Array.from({ length: Math.floor(random() * 300) }, () => Math.floor(random() * 256)));
    if (random() < 0.1) return Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')]);
    return Buffer.from(text, random() < 0.1 ? 'latin1' : 'utf8');
  }

  it(
    'when 300 files of random logger-like pieces are sent, then every answer is a 200 or a refusal in words, never a 5xx',
    async () => {
      const random = seededRandom(4_711);
      const statuses = new Map<number, number>();
      for (let i = 0; i < 300; i++) {
        const fields: Record<string, string> = {};
        if (random() < 0.2) fields.voltsColumn = random() < 0.5 ? String(Math.floor(random() * 6) - 1) : 'CH2 (V)';
        if (random() < 0.1) fields.timeColumn = random() < 0.5 ? '0' : 'Timestamp';
        const res = await send(hostileFile(random), `hostile-${i}.csv`, fields);
        statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
        expect(res.status, `file ${i}: ${JSON.stringify(res.body)}`).toBeLessThan(500);
        if (res.status !== 200) expect(res.body.error.message.length).toBeGreaterThan(10);
        else expect(res.body.samples.length).toBeGreaterThan(0);
      }
      // the corpus reaches more than one answer
      expect(statuses.size).toBeGreaterThan(2);
    },
    120_000,
  );
});
