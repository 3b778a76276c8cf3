import { describe, expect, inject, it } from 'vitest';
import { browsersClosedAfterEach, PHONE_VIEWPORT, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { eventually } from '../support/eventually';
import { signIn } from '../support/sign-in';

const baseUrl = inject('baseUrl');

const browser = browsersClosedAfterEach();

const HEADER =
  'site_code,area,tag,location,drive_make,drive_model,supply_volts,dc_bus_volts,rated_power_kw,marked_wait_minutes,criticality,environment_notes,commissioned_on,status';
/** A date always more than a year after today, whenever the test runs. */
const YEARS_AHEAD = `${new Date().getUTCFullYear() + 2}-03-01`;

const csvFile = (name: string, rows: string[]) => ({ name, mimeType: 'text/csv', buffer: Buffer.from([HEADER, ...rows].join('\r\n') + '\r\n') });

/** A file whose second row has a 5 V bus on a 400 V supply and whose third is commissioned years ahead. */
const questionedFile = (prefix: string) =>
  csvFile(`${prefix.toLowerCase()}.csv`, [
    `M,Line 6 press,${prefix}-001,Bay 1,Tarnwick Drives,TW-55,400,540,55,10,high,,2023-02-01,in-service`,
    `M,Line 6 press,${prefix}-002,Bay 2,Tarnwick Drives,TW-55,400,5,55,10,high,,2023-02-01,in-service`,
    `M,Line 6 press,${prefix}-003,Bay 3,Quellbrook Motion,QM-75,480,650,75,10,medium,,${YEARS_AHEAD},in-service`,
  ]);

describe('the cabinet import questions unlikely values (planner)', () => {
  it('when a file holds a 5 V bus and a date years ahead, then the preview asks, Import waits for the box, and the ticked import stores the cabinets', async () => {
    const { page } = await browser();
    const console = watchConsole(page, [/ 401 .*\/api\/me$/]);
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: '/register/cabinets/import' });
    await page.getByRole('heading', { name: 'Import cabinets from a CSV file' }).waitFor();

    await page.getByTestId('import-file').setInputFiles(questionedFile('BRK-M6-VFD'));
    const question = page.getByTestId('import-question');
    await question.first().waitFor();
    await eventually(() => question.count()).toBe(2);
    await eventually(() => question.nth(0).getAttribute('data-row')).toBe('3');
    await eventually(() => question.nth(0).getAttribute('data-column')).toBe('dc_bus_volts');
    await eventually(() => question.nth(0).textContent()).toContain('A 5 V DC bus on a 400 V supply is unlikely');
    await eventually(() => question.nth(1).getAttribute('data-column')).toBe('commissioned_on');
    await eventually(() => question.nth(1).textContent()).toContain(`The commissioning date ${YEARS_AHEAD} is more than a year ahead`);
    // questions are not problems: none listed, the summary counts them apart
    expect(await page.getByTestId('import-problems').count()).toBe(0);
    await eventually(() => page.getByTestId('import-summary').textContent()).toMatch(/3 rows.*3 ready.*2 to check/);

    const importButton = page.getByRole('button', { name: 'Import 3 cabinets' });
    await eventually(() => importButton.isDisabled()).toBe(true);
    await screenshot(page, 'register-import-questions-desktop');
    const box = page.getByRole('checkbox', { name: 'I have checked these values' });
    await box.check();
    await eventually(() => importButton.isEnabled()).toBe(true);
    await box.uncheck();
    await eventually(() => importButton.isDisabled()).toBe(true);
    await box.check();
    await importButton.click();
    await page.getByTestId('import-done').waitFor();
    await eventually(() => page.getByTestId('import-done').textContent()).toContain('3 cabinets from brk-m6-vfd.csv');

    await page.goto(`${baseUrl}/register/cabinets?q=BRK-M6-VFD`);
    await page.getByTestId('list-total').filter({ hasText: 'of 3' }).waitFor();
    await page.getByRole('link', { name: 'BRK-M6-VFD-002' }).first().click();
    await page.getByRole('heading', { name: 'BRK-M6-VFD-002' }).waitFor();
    await eventually(() => page.locator('main').textContent()).toMatch(/Nominal DC bus\s*5 V/);
    expect(console.problems).toEqual([]);
  });

  it('when the preview is seen on a 390 px phone, then the questions and the box fit the screen', async () => {
    const { page } = await browser(PHONE_VIEWPORT);
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: '/register/cabinets/import' });
    await page.getByRole('heading', { name: 'Import cabinets from a CSV file' }).waitFor();
    await page.getByTestId('import-file').setInputFiles(questionedFile('BRK-M6-PHN'));
    await page.getByTestId('import-question').first().waitFor();
    const box = page.getByRole('checkbox', { name: 'I have checked these values' });
    await box.scrollIntoViewIfNeeded();
    await eventually(() => box.isVisible()).toBe(true);
    // the page itself never scrolls sideways (a wide table scrolls inside its own frame)
    await eventually(() => page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE_VIEWPORT.width);
    // the questions need no sideways scrolling of their own: each message wraps within the screen, its column named under the row
    const panel = page.getByTestId('import-questions-panel');
    await eventually(() => panel.evaluate((el) => el.scrollWidth - el.clientWidth)).toBeLessThanOrEqual(0);
    await eventually(() => page.getByTestId('import-question').first().innerText()).toMatch(/3\s+dc_bus_volts\s+A 5 V DC bus/);
    await screenshot(page, 'register-import-questions-phone');
  });
});
