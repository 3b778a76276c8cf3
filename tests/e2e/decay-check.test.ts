import fs from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, inject, it } from 'vitest';
import type { Bank } from '../../shared/schemas/bank';
import { banksInService } from '../support/banks-in-service';
import { browsersClosedAfterEach, PHONE_VIEWPORT, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { signIn } from '../support/sign-in';
import { eventually } from '../support/eventually';

const baseUrl = inject('baseUrl');

const browser = browsersClosedAfterEach();

/**
 * A seeded electrolytic bank in service with a cabinet bus voltage, through the API as the
 * signed-in person: one with a nameplate baseline when the seed still has one, else one whose
 * baseline came from its first trusted decay run (the demo history gives most banks one).
 */
async function seededBank(page: Page): Promise<Bank> {
  const candidates = (await banksInService(page)).filter(
    (b) => b.technology === 'electrolytic' && b.cabinetDcBusVolts !== null && b.designFigures?.endOfLifeRatio === 0.8,
  );
  const bank = candidates.find((b) => b.baseline.source === 'nameplate') ?? candidates.find((b) => b.baseline.source === 'decay-run');
  if (!bank) throw new Error('the seed has no electrolytic bank in service with a bus voltage and a baseline');
  return bank;
}

/** An invented decay V = 560 · e^(−t/τ) over 2.5 τ, times in whole seconds. */
function decay(tauSeconds: number): { t: string; v: string }[] {
  return Array.from({ length: 11 }, (_, k) => {
    const t = Math.round((k * tauSeconds) / 4);
    return { t: String(t), v: (560 * Math.exp(-t / tauSeconds)).toFixed(1) };
  });
}

async function paste(page: Page, readings: { t: string; v: string }[]) {
  const box = page.getByLabel('Pasted readings');
  if (!(await box.isVisible())) await page.getByText('Paste readings', { exact: true }).click();
  await box.fill(readings.map((r) => `${r.t}\t${r.v}`).join('\n'));
  await page.getByRole('button', { name: 'Use these readings' }).click();
}

async function typeRow(page: Page, row: number, t: string, v: string) {
  await page.getByLabel(`Row ${row}: time since isolation, seconds`).fill(t);
  await page.getByLabel(`Row ${row}: DC-bus voltage, volts`).fill(v);
}

/** The verdict's one health word, its next step and the ratio line, as the page shows them. */
async function verdictWords(page: Page) {
  return {
    health: (await page.getByTestId('decay-health').textContent()) ?? '',
    word: (await page.getByTestId('decay-health-word').textContent()) ?? '',
    nextStep: (await page.getByTestId('decay-next-step').textContent()) ?? '',
    nextKind: (await page.getByTestId('decay-next-step').getAttribute('data-kind')) ?? '',
  };
}

/** Every figure of a text, e.g. "101.5" and "98.4" from "101.5 % (95 %: 98.4 to 103 %)". */
const figures = (text: string) => text.match(/\d[\d,]*(\.\d+)?/g) ?? [];
/** Significant figures of a written figure: "1,520" → 3, "0.0123" → 3, "101.665" → 6. */
const significant = (figure: string) => figure.replace(/[,.]/g, '').replace(/^0+/, '').replace(/0+$/, '').length || 1;

/** The chart's text size in CSS pixels as drawn: the font size times the SVG's scale on the page. */
async function chartTextPixels(page: Page): Promise<number[]> {
  return page.getByTestId('decay-plot').evaluate((svg) => {
    const plot = svg as SVGSVGElement;
    const scale = plot.getBoundingClientRect().width / plot.viewBox.baseVal.width;
    return [...plot.querySelectorAll('text')].map((t) => Number(t.getAttribute('font-size')) * scale);
  });
}

/** Saves a picture of the verdict column alone (readable at phone width, unlike the full page). */
async function verdictShot(page: Page, name: string) {
  const dir = path.resolve('.data/screenshots');
  fs.mkdirSync(dir, { recursive: true });
  await page.locator('#decay-result').screenshot({ path: path.join(dir, `${name}.png`) });
}

describe('the decay check on a bank page', () => {
  it('when an engineer enters the readings of a discharge, then the engine’s verdict follows them: healthy, end of life, a dropped digit left out, the caution beside the estimate', async () => {
    const { page } = await browser();
    const console = watchConsole(page);
    await signIn(page, 'ines', 'tidewater-rel', { returnTo: '/register/banks' });
    const bank = await seededBank(page);
    const tau = bank.baseline.tauSeconds;
    await page.goto(`${baseUrl}/register/banks/${bank.id}`);
    const panel = page.getByTestId('decay-check');
    await panel.waitFor();
    await eventually(() => page.getByTestId('decay-not-stored').textContent()).toMatch(/not stored.*To record a decay run, open this bank's visit/);
    await page.getByTestId('decay-empty').waitFor();

    // two readings cannot be judged: the reason is said
    const healthy = decay(tau);
    await typeRow(page, 1, healthy[0]!.t, healthy[0]!.v);
    await typeRow(page, 2, healthy[1]!.t, healthy[1]!.v);
    await page.getByTestId('decay-unusable').waitFor();
    await eventually(() => page.getByTestId('decay-unusable').textContent()).toMatch(/Unusable.*at least 3/);

    // the baseline τ: healthy, with τ, the discharge times and the full caution
    await paste(page, healthy);
    await page.getByTestId('decay-health').filter({ hasText: 'Health: healthy' }).waitFor();
    const shownTau = async () => Number(((await page.getByTestId('decay-tau').textContent()) ?? '').replace(/,/g, '').match(/[\d.]+/)?.[0]);
    await eventually(async () => Math.abs((await shownTau()) / tau - 1)).toBeLessThan(0.01);
    await eventually(() => page.getByTestId('decay-discharge').textContent()).toMatch(/Time to 60 V.*Time to 50 V/);
    const caution = panel.getByTestId('discharge-caution');
    await eventually(() => caution.isVisible()).toBe(true);
    await eventually(() => caution.textContent()).toMatch(/marked wait time.*meter reading/);
    // one health word, said once, and the next check by a date
    await eventually(async () => (await verdictWords(page)).word).toBe('healthy');
    const healthy1 = await verdictWords(page);
    expect(healthy1.health).toMatch(/^Health: healthy(?! healthy)/);
    expect(healthy1.nextKind).toBe('check-again');
    expect(healthy1.nextStep).toMatch(/^Next step: No action now: check this bank again by \d{1,2} [A-Z][a-z]{2} \d{4}\.$/);
    // figures to three significant figures, the ratio's interval alike (never "101.665 % to 101.692 %")
    const ratioLine = (await page.getByTestId('decay-ratio').textContent()) ?? '';
    expect(ratioLine).toMatch(/^Capacitance \d[\d.]* % of the baseline \(95 %: /);
    for (const figure of figures(ratioLine)) expect(significant(figure), `${figure} in "${ratioLine}"`).toBeLessThanOrEqual(3);
    const tauText = (await page.getByTestId('decay-verdict').textContent()) ?? '';
    expect(tauText).not.toMatch(/\d+\.\d{3,}/);
    for (const px of await chartTextPixels(page)) expect(px).toBeGreaterThanOrEqual(12);
    await screenshot(page, 'decay-check-healthy-desktop');

    // τ 25 % lower: end of life below the electrolytic limit 0.80, capacitance loss among the findings
    await paste(page, decay(tau * 0.75));
    await page.getByTestId('decay-health').filter({ hasText: 'Health: end of life' }).waitFor();
    await eventually(() => page.getByTestId('decay-findings').textContent()).toMatch(/of the baseline/);
    await eventually(async () => (await verdictWords(page)).word).toBe('end of life');
    const endOfLife = await verdictWords(page);
    expect(endOfLife.nextKind).toBe('replace');
    expect(endOfLife.nextStep).toMatch(/Replace this bank at the next shutdown, and tell the reliability engineer and the maintenance planner/);
    await screenshot(page, 'decay-check-end-of-life-desktop');

    // typed row by row, with a dropped digit in row 4: named as left out, the bank still healthy
    await page.getByRole('button', { name: 'Clear readings' }).click();
    const slip = healthy.map((r, i) => (i === 3 ? { t: r.t, v: r.v.slice(0, 1) + r.v.slice(2) } : r));
    for (const [i, r] of slip.entries()) await typeRow(page, i + 1, r.t, r.v);
    await page.getByTestId('decay-health').filter({ hasText: 'Health: healthy' }).waitFor();
    // healthy shows from row 3 on, so wait for the slip of row 4 itself to be marked in the readings
    await eventually(() => page.getByTestId('reading-row-4').getAttribute('data-left-out')).toBe('true');
    const leftOut = () => page.getByTestId('left-out-reading-4').textContent();
    await eventually(leftOut).toContain(`${slip[3]!.v} V`);
    await eventually(leftOut).toMatch(/^left out.*(dropped digit|mistyped)/);
    expect(await page.getByTestId('reading-row-3').getAttribute('data-left-out')).toBeNull();
    // explained once: the verdict only counts the row
    const reason = ((await leftOut()) ?? '').replace(/^left out/, '').trim();
    const panelText = (await panel.textContent()) ?? '';
    expect(panelText.split(reason).length - 1).toBe(1);
    await eventually(() => page.getByTestId('decay-readings-used').textContent()).toMatch(/row 4 left out: marked in the readings/);

    // a mistyped cell is named beside its row
    await typeRow(page, 12, '3000', '5x0');
    await eventually(() => page.getByTestId('error-reading-12').textContent()).toBe('Row 12: the voltage "5x0" is not a number.');
    await eventually(() => page.getByLabel('Row 12: DC-bus voltage, volts').getAttribute('aria-invalid')).toBe('true');
    await screenshot(page, 'decay-check-left-out-desktop');
    await verdictShot(page, 'decay-check-verdict-desktop');

    // τ 40 % above the baseline's: far outside any ageing, never called healthy; the bus stays live longer
    await page.getByRole('button', { name: 'Clear readings' }).click();
    await paste(page, decay(tau * 1.4));
    await eventually(async () => (await verdictWords(page)).word).toBe('not judged: check the bleeder value and the readings');
    const implausible = await verdictWords(page);
    expect(implausible.health).not.toMatch(/healthy/);
    expect(implausible.nextKind).toBe('treat-as-live');
    expect(implausible.nextStep).toMatch(/Treat the DC bus as live for longer than its marked wait, and measure the bleeder resistance/);
    await eventually(() => page.getByTestId('decay-findings').textContent()).toMatch(/far outside any physical ageing.*check the bleeder value and the readings/);
    await eventually(() => caution.isVisible()).toBe(true);
    await screenshot(page, 'decay-check-implausible-desktop');
    expect(console.problems).toEqual([]);
  });

  it('when a technician checks a bank on a phone, then the panel fits 390 px with the verdict and the caution', async () => {
    const { page } = await browser(PHONE_VIEWPORT);
    const console = watchConsole(page);
    await signIn(page, 'dario', 'tidewater-tech', { returnTo: '/register/banks' });
    const bank = await seededBank(page);
    await page.goto(`${baseUrl}/register/banks/${bank.id}`);
    await page.getByTestId('decay-check').waitFor();
    // a dropped digit in row 4, as typed in a hurry
    const readings = decay(bank.baseline.tauSeconds).map((r, i) => (i === 3 ? { t: r.t, v: r.v.slice(0, 1) + r.v.slice(2) } : r));
    await paste(page, readings);
    await page.getByTestId('decay-health').filter({ hasText: 'Health: healthy' }).waitFor();
    // under the readings, a line of the verdict the technician sees while typing
    await eventually(() => page.getByTestId('decay-live-summary').textContent()).toMatch(/Health: healthy · τ/);
    await eventually(async () => (await verdictWords(page)).word).toBe('healthy');
    expect((await verdictWords(page)).nextStep).toMatch(/check this bank again by/);
    await eventually(() => page.getByTestId('reading-row-4').getAttribute('data-left-out')).toBe('true');
    await eventually(() => page.getByTestId('left-out-reading-4').isVisible()).toBe(true);
    // the chart drawn for the phone: its text at least 12 px as shown, and inside the screen
    for (const px of await chartTextPixels(page)) expect(px).toBeGreaterThanOrEqual(12);
    const plotBox = await page.getByTestId('decay-plot').boundingBox();
    expect(plotBox!.x + plotBox!.width).toBeLessThanOrEqual(PHONE_VIEWPORT.width);
    await eventually(() => page.getByTestId('decay-check').getByTestId('discharge-caution').isVisible()).toBe(true);
    await eventually(() => page.getByLabel('Row 1: time since isolation, seconds').getAttribute('inputmode')).toBe('decimal');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE_VIEWPORT.width);
    await page.getByTestId('decay-check').scrollIntoViewIfNeeded();
    await screenshot(page, 'decay-check-healthy-phone');
    await verdictShot(page, 'decay-check-verdict-phone');
    expect(console.problems).toEqual([]);
  });
});
