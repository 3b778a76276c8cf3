import { describe, expect, it } from 'vitest';
import { browsersClosedAfterEach, PHONE_VIEWPORT, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { eventually } from '../support/eventually';
import { signIn } from '../support/sign-in';

const browser = browsersClosedAfterEach();

describe('shutdown windows (planner)', () => {
  it('when a planner on a phone adds a weekly window from the Planner, then the form words the rule, lists its occurrences on the site’s clock and saves it', async () => {
    const { page } = await browser(PHONE_VIEWPORT);
    const console = watchConsole(page);
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: '/planner' });
    await page.getByRole('button', { name: 'New shutdown window' }).click();
    const dialog = page.getByRole('dialog', { name: 'New shutdown window' });
    await dialog.waitFor();
    await eventually(() => dialog.getByLabel('Site').locator('option').count()).toBeGreaterThan(1);
    await dialog.getByLabel('Site').selectOption({ index: 1 });
    await eventually(() => dialog.getByLabel('Area').locator('option').count()).toBeGreaterThan(1);
    await dialog.getByLabel('Area').selectOption({ index: 1 });
    await dialog.getByLabel('Title').fill('Browser weekend stop');
    // Saturday 9 January 2027 (1 January 2027 is a Friday)
    await dialog.getByLabel('Starts').fill('2027-01-09T06:00');
    await eventually(() => dialog.getByLabel('Ends').inputValue()).toBe('2027-01-09T14:00');
    await dialog.getByLabel('How often').selectOption({ label: 'Every week on Saturday' });
    await dialog.getByLabel('Times in all').fill('4');
    const check = dialog.getByTestId('window-rule-check');
    await eventually(() => check.textContent()).toMatch(/Repeats every week on Saturday for 4 times/);
    await eventually(() => check.locator('li').count()).toBe(4);
    await eventually(() => check.locator('li').first().textContent()).toMatch(/^Sat 9 Jan, 06:00–14:00 \S+\/\S+$/);
    await screenshot(page, 'shutdown-window-form-phone');
    await dialog.getByRole('button', { name: 'Add shutdown window' }).click();
    await eventually(() => dialog.isVisible()).toBe(false);
    expect(console.problems).toEqual([]);
  }, 120_000);

  it('when a planner uploads a file with a bad row, then the import names its row and column and imports nothing', async () => {
    const { page } = await browser(PHONE_VIEWPORT);
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: '/planner/windows/import' });
    await page.getByRole('heading', { name: 'Import shutdown windows from a CSV file' }).waitFor();
    await page.getByTestId('import-file').setInputFiles({
      name: 'windows.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from('site,area,title,start,end,recurrence,notes\nNOPE,Nowhere,Stop,09/01/2027 06:00,2027-01-09 14:00,,\n'),
    });
    await page.getByTestId('import-problems').waitFor();
    await eventually(() => page.getByTestId('import-problem').first().getAttribute('data-column')).toBe('site');
    expect(await page.getByRole('button', { name: /^Import 1 window/ }).isDisabled()).toBe(true);
    await screenshot(page, 'shutdown-window-import-problems-phone');
  }, 120_000);
});
