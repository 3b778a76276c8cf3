/**
 * Signing in through the local identity provider's page in a real browser, for browser
 * tests: `await signIn(page, 'tomas', 'tidewater-plan')`. The demo accounts and their
 * passwords are in infra/seed/people.ts (and the README's table).
 */
import type { Page } from 'playwright-core';
import { inject } from 'vitest';
import { PAGE_WAIT_MS } from './browser';

export interface SignInOptions {
  /** A path inside Ebbline to land on after signing in; default `/` (the role's start screen). */
  returnTo?: string;
  /** Ebbline's address; default the e2e run's (inject('baseUrl')). */
  baseUrl?: string;
}

/**
 * Opens /auth/login, fills in the provider's sign-in form (skipped when the browser still
 * has a provider session) and waits until Ebbline has loaded the signed-in shell, or the
 * "waiting for access" page for a person without a role.
 * @throws when the provider keeps showing its form (e.g. a wrong password)
 */
export async function signIn(
  page: Page,
  login: string,
  password: string,
  options: SignInOptions = {},
): Promise<void> {
  const baseUrl = options.baseUrl ?? inject('baseUrl');
  const appOrigin = new URL(baseUrl).origin;
  await page.goto(`${baseUrl}/auth/login?returnTo=${encodeURIComponent(options.returnTo ?? '/')}`);
  if (new URL(page.url()).origin !== appOrigin) {
    await page.getByLabel('Login').fill(login);
    await page.getByLabel('Password').fill(password);
    await Promise.all([
      page.waitForURL((url) => url.origin === appOrigin, { timeout: PAGE_WAIT_MS }),
      page.getByRole('button', { name: 'Sign in' }).click(),
    ]);
  }
  await page
    .locator('[data-testid="app-shell"], [data-testid="waiting-for-access"]')
    .first()
    .waitFor();
  // `/` leads on to the role's start screen
  if ((options.returnTo ?? '/') === '/' && (await page.getByTestId('app-shell').count())) {
    await page.waitForURL((url) => url.pathname !== '/');
  }
}

/**
 * Signs out with the account menu's button (opening the phone menu first when needed) and
 * waits for the signed-out page, after the provider's session has ended too.
 */
export async function signOut(page: Page): Promise<void> {
  const button = page.getByRole('button', { name: 'Sign out' }).locator('visible=true').first();
  if (!(await button.count())) await page.getByRole('button', { name: 'Menu' }).click();
  await Promise.all([
    page.waitForURL((url) => url.pathname === '/signed-out', { timeout: PAGE_WAIT_MS }),
    page.getByRole('button', { name: 'Sign out' }).locator('visible=true').first().click(),
  ]);
  await page.getByTestId('signed-out').waitFor();
}
