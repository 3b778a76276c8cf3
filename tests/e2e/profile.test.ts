import { afterEach, describe, expect, inject, it } from 'vitest';
import { openBrowser, PHONE_VIEWPORT, screenshot, type BrowserSession } from '../support/browser';
import { watchConsole } from '../support/console';
import { signIn } from '../support/sign-in';
import { eventually } from '../support/eventually';

const baseUrl = inject('baseUrl');

let open: BrowserSession[] = [];
afterEach(async () => {
  await Promise.all(open.map((s) => s.close()));
  open = [];
});

describe('the profile page’s API tokens', () => {
  it('when a person makes a token, then its secret is shown once, it works as a bearer, and revoking it stops it', async () => {
    const session = await openBrowser();
    open.push(session);
    const { page } = session;
    const console = watchConsole(page);
    await signIn(page, 'ines', 'tidewater-rel');
    await page.getByRole('link', { name: 'Profile' }).first().click();
    await page.getByRole('heading', { name: 'Your profile' }).waitFor();

    await page.getByRole('button', { name: 'Create token' }).click();
    await page.getByText('Enter a name for the token.').waitFor();

    await page.getByLabel('Name').fill('Logger gateway, Mill 2');
    await page.getByLabel('Expires after').selectOption('30');
    await page.getByRole('button', { name: 'Create token' }).click();
    const shownSecret = page.getByTestId('token-secret').filter({ hasText: /^ebl_/ });
    await shownSecret.waitFor();
    const secret = (await shownSecret.textContent()) ?? '';
    expect(secret).toMatch(/^ebl_/);
    await screenshot(page, 'profile-token-issued');

    const me = await fetch(`${baseUrl}/api/me`, { headers: { Authorization: `Bearer ${secret}` } });
    expect(me.status).toBe(200);
    expect(((await me.json()) as { name: string }).name).toBe('Ines Carvell');

    await page.getByRole('button', { name: 'Done' }).click();
    await eventually(() => page.getByTestId('issued-token').count()).toBe(0);
    // the secret is nowhere on the page any more, not even after a reload; the use shows
    expect(await page.content()).not.toContain(secret);
    await page.reload();
    const row = page.getByTestId('token-row').filter({ hasText: 'Logger gateway, Mill 2' });
    await row.getByText('Active').waitFor();
    await row.getByText('Last used just now').waitFor();
    expect(await page.content()).not.toContain(secret);

    await row.getByRole('button', { name: 'Revoke Logger gateway, Mill 2' }).click();
    await row.getByRole('button', { name: 'Yes, revoke' }).click();
    await row.getByText('Revoked', { exact: true }).waitFor();
    const after = await fetch(`${baseUrl}/api/me`, {
      headers: { Authorization: `Bearer ${secret}` },
    });
    expect(after.status).toBe(401);
    await screenshot(page, 'profile-token-revoked');
    expect(console.problems).toEqual([]);
  });

  it('when opened on a phone, then the profile fits the width', async () => {
    const session = await openBrowser(PHONE_VIEWPORT);
    open.push(session);
    await signIn(session.page, 'tomas', 'tidewater-plan', { returnTo: '/profile' });
    await session.page.getByRole('heading', { name: 'Your profile' }).waitFor();
    expect(
      await session.page.evaluate(() => document.documentElement.scrollWidth),
    ).toBeLessThanOrEqual(390);
    await screenshot(session.page, 'profile-phone');
  });
});
