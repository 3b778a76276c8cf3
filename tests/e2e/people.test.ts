import { describe, expect, inject, it } from 'vitest';
import { browsersClosedAfterEach, PHONE_VIEWPORT, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { signIn } from '../support/sign-in';
import { eventually } from '../support/eventually';

const baseUrl = inject('baseUrl');

const browser = browsersClosedAfterEach();

describe('People (admin)', () => {
  it('when the admin searches and changes a person’s roles, then the list shows it and the sign-in log records who did it', async () => {
    const { page } = await browser();
    const console = watchConsole(page);
    await signIn(page, 'maren', 'tidewater-admin');
    await page.getByTestId('people-list').waitFor();
    await page.getByPlaceholder('Search by name or e-mail').fill('priya');
    await page.getByTestId('people-count').filter({ hasText: '1 person' }).waitFor();

    await page.getByRole('button', { name: 'Edit Priya Halden' }).click();
    await page.getByRole('checkbox', { name: 'Reliability engineer' }).check();
    await page.getByRole('button', { name: 'Save' }).click();
    // the editor closes when the server has saved; the row then shows the new role
    await page.getByRole('button', { name: 'Edit Priya Halden' }).waitFor();
    const row = page.getByTestId('person-row').filter({ hasText: 'Priya Halden' });
    await eventually(() => row.textContent()).toContain('Reliability engineer');
    await screenshot(page, 'people-desktop');

    await page.getByRole('tab', { name: 'Sign-in log' }).click();
    const log = page.getByTestId('sign-in-log');
    await log.waitFor();
    const change = log.locator('li[data-kind="roles-changed"]').first();
    await change.waitFor();
    await eventually(() => change.textContent()).toContain('Priya Halden');
    await eventually(() => change.textContent()).toContain('by Maren Oyelaran');
    await eventually(() => change.textContent()).toContain(
      'Maintenance planner → Maintenance planner, Reliability engineer',
    );
    await eventually(() => log.locator('li[data-kind="sign-in"]').first().textContent()).toMatch(
      /Chrome on Linux/,
    );
    await screenshot(page, 'sign-in-log-desktop');

    // leave Priya as the demo has her
    await page.getByRole('tab', { name: 'People' }).click();
    await page.getByRole('button', { name: 'Edit Priya Halden' }).click();
    await page.getByRole('checkbox', { name: 'Reliability engineer' }).uncheck();
    await page.getByRole('button', { name: 'Save' }).click();
    await page.getByRole('button', { name: 'Edit Priya Halden' }).waitFor();
    expect(console.problems).toEqual([]);
  });

  it('when the last admin tries to drop the admin role, then the editor says why it cannot be done', async () => {
    const { page } = await browser();
    await signIn(page, 'maren', 'tidewater-admin');
    await page.getByRole('button', { name: 'Edit Maren Oyelaran' }).click();
    await page.getByRole('checkbox', { name: 'Admin' }).uncheck();
    await page.getByRole('checkbox', { name: 'Maintenance planner' }).check();
    await page.getByRole('button', { name: 'Save' }).click();
    const alert = page.getByRole('alert').filter({ hasText: 'at least one active admin' });
    await alert.waitFor();
  });

  it('when the admin looks on a phone, then the list stacks and the log fits the width', async () => {
    const { page } = await browser(PHONE_VIEWPORT);
    await signIn(page, 'maren', 'tidewater-admin');
    await page.getByTestId('people-list').waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );
    await screenshot(page, 'people-phone');
    await page.getByRole('tab', { name: 'Sign-in log' }).click();
    await page.getByTestId('sign-in-log').waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );
    await screenshot(page, 'sign-in-log-phone');
  });

  it('when a deactivated person tries to sign in, then Ebbline says the account is deactivated', async () => {
    const admin = await browser();
    await signIn(admin.page, 'maren', 'tidewater-admin');
    await admin.page.getByRole('button', { name: 'Edit Rurik Salo' }).click();
    await admin.page.getByRole('checkbox', { name: /Deactivated/ }).check();
    await admin.page.getByRole('button', { name: 'Save' }).click();
    await admin.page
      .getByTestId('person-row')
      .filter({ hasText: 'Rurik Salo' })
      .getByText('Deactivated')
      .waitFor();

    const rurik = await browser();
    await rurik.page.goto(`${baseUrl}/fleet`);
    await rurik.page.getByLabel('Login').fill('rurik');
    await rurik.page.getByLabel('Password').fill('tidewater-rel');
    await rurik.page.getByRole('button', { name: 'Sign in' }).click();
    await rurik.page.getByTestId('sign-in-problem').waitFor();
    await eventually(() => rurik.page.getByRole('heading').first().textContent()).toBe(
      'Your Ebbline account is deactivated',
    );

    // reactivated, Rurik signs in again
    await admin.page.getByRole('button', { name: 'Edit Rurik Salo' }).click();
    await admin.page.getByRole('checkbox', { name: /Deactivated/ }).uncheck();
    await admin.page.getByRole('button', { name: 'Save' }).click();
    await admin.page.getByRole('button', { name: 'Edit Rurik Salo' }).waitFor();
    await signIn(rurik.page, 'rurik', 'tidewater-rel');
    expect(new URL(rurik.page.url()).pathname).toBe('/fleet');
  });
});
