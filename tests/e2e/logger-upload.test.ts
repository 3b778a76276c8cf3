/**
 * A logger file read on a phone (390 px), on the bank page's decay check ("Or read a logger
 * file"): a PNG named .csv is refused in plain words; a scope file with two voltage channels
 * asks for its columns; once chosen, the readings come back as a chart with the live fit and a
 * verdict line, and "Use these readings" puts them into the check.
 */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Page } from 'playwright-core';
import { describe, expect, inject, it } from 'vitest';
import type { Bank } from '../../shared/schemas/bank';
import { banksInService } from '../support/banks-in-service';
import { browsersClosedAfterEach, PHONE_VIEWPORT, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { eventually } from '../support/eventually';
import { signIn } from '../support/sign-in';

const baseUrl = inject('baseUrl');
const fixtures = join(dirname(fileURLToPath(import.meta.url)), '../fixtures/logger-files');

const browser = browsersClosedAfterEach();

/** A seeded bank in service whose design can judge a run, through the API as the signed-in person. */
async function seededBank(page: Page): Promise<Bank> {
  const bank = (await banksInService(page)).find((b) => b.technology === 'electrolytic' && b.designFigures !== null);
  if (!bank) throw new Error('the seed has no electrolytic bank in service');
  return bank;
}

/** The first figure of a text as a number ("τ 219 s (3.6 min)" → 219). */
const firstFigure = (text: string | null) => Number((text ?? '').replace(/,/g, '').match(/τ\s*([\d.]+)/)?.[1] ?? NaN);

describe('a logger file on the bank page, at phone width', () => {
  it(
    'when a technician uploads a scope file whose columns must be chosen, then the chart shows the fit and the readings can be used',
    async () => {
      const session = await browser(PHONE_VIEWPORT);
      const { page } = session;
      // the 415 and the 422 are part of the story
      const console = watchConsole(page, [/ 401 .*\/api\/me$/, / 415 POST .*\/api\/logger-files\/preview$/, / 422 POST .*\/api\/logger-files\/preview$/]);
      await signIn(page, 'dario', 'tidewater-tech', { returnTo: '/register/banks' });
      const bank = await seededBank(page);
      await page.goto(`${baseUrl}/register/banks/${bank.id}`);
      await page.getByTestId('decay-check').waitFor();
      await page.getByText('Or read a logger file', { exact: true }).click();
      const upload = page.getByTestId('logger-upload');
      await upload.getByText('Choose a logger file').waitFor();
      const input = upload.getByTestId('logger-file-input');

      // an image named .csv: refused by its content, said in plain words
      const png = Buffer.from(
        'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==',
        'base64',
      );
      await input.setInputFiles({ name: 'readings.csv', mimeType: 'text/csv', buffer: png });
      await upload.getByTestId('logger-error').waitFor();
      await eventually(() => upload.getByTestId('logger-error').textContent()).toMatch(/not a logger's text export.*"readings\.csv" is a PNG image, not a text file/);

      // two voltage channels: the columns are asked for, with the header and the first rows
      await input.setInputFiles(join(fixtures, 'second-channel.csv'));
      const picker = upload.getByTestId('logger-columns');
      await picker.waitFor();
      await eventually(() => picker.textContent()).toMatch(/2 columns could be the voltage: "CH1 \(V\)" \(column 2\) and "CH2 \(V\)" \(column 3\)/);
      await eventually(() => picker.locator('tbody tr').count()).toBe(5);
      await upload.getByTestId('logger-time-column').selectOption({ label: '1 · Time (s)' });
      await upload.getByTestId('logger-volts-column').selectOption({ label: '2 · CH1 (V)' });
      await screenshot(page, 'logger-upload-columns-phone');
      await upload.getByTestId('logger-read-columns').click();

      // the preview: 601 readings, the chart with its fitted decay, τ of the fixture's bank (218.8 s, tests/fixtures/logger-files/logger-files.ts)
      const preview = upload.getByTestId('logger-preview');
      await preview.waitFor();
      expect(await picker.count()).toBe(0);
      await eventually(() => preview.getByTestId('logger-read-summary').textContent()).toMatch(/^601 readings from second-channel\.csv.*time from “Time \(s\)”, voltage from “CH1 \(V\)”/);
      const plot = preview.getByTestId('decay-plot');
      await plot.waitFor();
      await eventually(() => plot.getAttribute('aria-label')).toMatch(/^Readings against the fitted decay: \d+ used, \d+ left out$/);
      await eventually(async () => Math.abs(firstFigure(await preview.getByTestId('logger-summary').textContent()) / 218.8 - 1)).toBeLessThan(0.01);
      await eventually(() => preview.getByTestId('logger-summary').textContent()).toMatch(/^Health: .+ · τ 219 s \(3\.6 min\)/);
      // the columns can be chosen again from the preview, the ones read preselected
      await preview.getByTestId('logger-choose-columns').click();
      await eventually(() => upload.getByTestId('logger-volts-column').inputValue()).toBe('2');
      expect(await upload.getByTestId('logger-time-column').inputValue()).toBe('1');
      await upload.getByTestId('logger-read-columns').click();
      await eventually(() => upload.getByTestId('logger-columns').count()).toBe(0);
      await preview.waitFor();
      // nothing wider than the phone
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE_VIEWPORT.width);
      await preview.getByTestId('logger-use').scrollIntoViewIfNeeded();
      await screenshot(page, 'logger-upload-preview-phone');

      // the readings go into the check: its table and its own verdict, τ alike
      await preview.getByTestId('logger-use').click();
      await upload.getByTestId('logger-used').waitFor();
      await eventually(() => page.getByTestId('reading-row-601').count()).toBe(1);
      const tau = page.getByTestId('decay-tau');
      await tau.waitFor();
      await eventually(async () => {
        const shown = Number(((await tau.textContent()) ?? '').replace(/,/g, '').match(/[\d.]+/)?.[0]);
        return Math.abs(shown / 218.8 - 1);
      }).toBeLessThan(0.01);
      expect(console.problems).toEqual([]);
    },
    240_000,
  );

  it(
    'when a logger file reads without a question, then the preview comes at once, with what was left out said',
    async () => {
      const session = await browser(PHONE_VIEWPORT);
      const { page } = session;
      await signIn(page, 'dario', 'tidewater-tech', { returnTo: '/register/banks' });
      const bank = await seededBank(page);
      await page.goto(`${baseUrl}/register/banks/${bank.id}`);
      await page.getByText('Or read a logger file', { exact: true }).click();
      const upload = page.getByTestId('logger-upload');
      await upload.getByTestId('logger-file-input').setInputFiles({
        name: 'pre-trigger-flat-bus.csv',
        mimeType: 'text/csv',
        buffer: readFileSync(join(fixtures, 'pre-trigger-flat-bus.csv')),
      });
      const preview = upload.getByTestId('logger-preview');
      await preview.waitFor();
      // 30 s of flat bus before the switch-off (the fixture's facts) are left out and said so
      await eventually(() => preview.getByTestId('logger-warnings').textContent()).toMatch(/left out and t = 0 is set at the switch-off/);
      await eventually(async () => Math.abs(firstFigure(await preview.getByTestId('logger-summary').textContent()) / 218.8 - 1)).toBeLessThan(0.01);
      await screenshot(page, 'logger-upload-pre-trigger-phone');
    },
    240_000,
  );
});
