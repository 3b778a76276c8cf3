import type { Page } from 'playwright-core';
import { afterEach, describe, expect, inject, it } from 'vitest';
import type { Bank } from '../../shared/schemas/bank';
import { openBrowser, PHONE_VIEWPORT, screenshot, type BrowserSession } from '../support/browser';
import { watchConsole } from '../support/console';
import { signIn } from '../support/sign-in';
import { eventually } from '../support/eventually';

const baseUrl = inject('baseUrl');

let open: BrowserSession[] = [];
async function browser(viewport?: { width: number; height: number }): Promise<BrowserSession> {
  const session = await openBrowser(viewport);
  open.push(session);
  return session;
}
afterEach(async () => {
  await Promise.all(open.map((s) => s.close()));
  open = [];
});

/** A seeded electrolytic bank in service with a nameplate baseline and a cabinet bus voltage, through the API as the signed-in person. */
async function seededBank(page: Page): Promise<Bank> {
  const list = await page.evaluate(async () => {
    const res = await fetch('/api/banks?pageSize=100&status=in-service', { headers: { Accept: 'application/json' } });
    return (await res.json()) as { items: Bank[] };
  });
  const bank = list.items.find(
    (b) => b.technology === 'electrolytic' && b.baseline.source === 'nameplate' && b.cabinetDcBusVolts !== null && b.designFigures?.endOfLifeRatio === 0.8,
  );
  if (!bank) throw new Error('the seed has no electrolytic bank with a nameplate baseline');
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
    await eventually(() => page.getByTestId('decay-not-stored').textContent()).toMatch(/not stored.*recording decay runs comes with visits/);
    await page.getByTestId('decay-empty').waitFor();

    // two readings cannot be judged: the reason is said
    const healthy = decay(tau);
    await typeRow(page, 1, healthy[0]!.t, healthy[0]!.v);
    await typeRow(page, 2, healthy[1]!.t, healthy[1]!.v);
    await page.getByTestId('decay-unusable').waitFor();
    await eventually(() => page.getByTestId('decay-unusable').textContent()).toMatch(/Unusable.*at least 3/);

    // the nameplate τ: healthy, with τ, the discharge times and the full caution
    await paste(page, healthy);
    await page.getByTestId('decay-health').filter({ hasText: 'Health: healthy' }).waitFor();
    const shownTau = async () => Number(((await page.getByTestId('decay-tau').textContent()) ?? '').replace(/,/g, '').match(/[\d.]+/)?.[0]);
    await eventually(async () => Math.abs((await shownTau()) / tau - 1)).toBeLessThan(0.01);
    await eventually(() => page.getByTestId('decay-discharge').textContent()).toMatch(/Time to 60 V.*Time to 50 V/);
    const caution = panel.getByTestId('discharge-caution');
    await eventually(() => caution.isVisible()).toBe(true);
    await eventually(() => caution.textContent()).toMatch(/marked wait time.*meter reading/);
    await screenshot(page, 'decay-check-healthy-desktop');

    // τ 25 % lower: end of life below the electrolytic limit 0.80, capacitance loss among the findings
    await paste(page, decay(tau * 0.75));
    await page.getByTestId('decay-health').filter({ hasText: 'Health: end of life' }).waitFor();
    await eventually(() => page.getByTestId('decay-findings').textContent()).toMatch(/of the baseline/);
    await screenshot(page, 'decay-check-end-of-life-desktop');

    // typed row by row, with a dropped digit in row 4: named as left out, the bank still healthy
    await page.getByRole('button', { name: 'Clear readings' }).click();
    const slip = healthy.map((r, i) => (i === 3 ? { t: r.t, v: r.v.slice(0, 1) + r.v.slice(2) } : r));
    for (const [i, r] of slip.entries()) await typeRow(page, i + 1, r.t, r.v);
    await page.getByTestId('decay-health').filter({ hasText: 'Health: healthy' }).waitFor();
    // healthy shows from row 3 on, so wait for the slip of row 4 itself to be named
    const leftOut = () => page.getByTestId('decay-left-out').textContent();
    await eventually(leftOut).toContain('Row 4');
    await eventually(leftOut).toContain(`${slip[3]!.v} V`);
    await eventually(leftOut).toMatch(/dropped digit|mistyped/);

    // a mistyped cell is named beside its row
    await typeRow(page, 12, '3000', '5x0');
    await eventually(() => page.getByTestId('error-reading-12').textContent()).toBe('Row 12: the voltage "5x0" is not a number.');
    await eventually(() => page.getByLabel('Row 12: DC-bus voltage, volts').getAttribute('aria-invalid')).toBe('true');
    await screenshot(page, 'decay-check-left-out-desktop');
    expect(console.problems).toEqual([]);
  });

  it('when a technician checks a bank on a phone, then the panel fits 390 px with the verdict and the caution', async () => {
    const { page } = await browser(PHONE_VIEWPORT);
    const console = watchConsole(page);
    await signIn(page, 'dario', 'tidewater-tech', { returnTo: '/register/banks' });
    const bank = await seededBank(page);
    await page.goto(`${baseUrl}/register/banks/${bank.id}`);
    await page.getByTestId('decay-check').waitFor();
    await paste(page, decay(bank.baseline.tauSeconds));
    await page.getByTestId('decay-health').filter({ hasText: 'Health: healthy' }).waitFor();
    // under the readings, a line of the verdict the technician sees while typing
    await eventually(() => page.getByTestId('decay-live-summary').textContent()).toMatch(/Health: healthy · τ/);
    await eventually(() => page.getByTestId('decay-check').getByTestId('discharge-caution').isVisible()).toBe(true);
    await eventually(() => page.getByLabel('Row 1: time since isolation, seconds').getAttribute('inputmode')).toBe('decimal');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE_VIEWPORT.width);
    await page.getByTestId('decay-check').scrollIntoViewIfNeeded();
    await screenshot(page, 'decay-check-healthy-phone');
    expect(console.problems).toEqual([]);
  });
});
