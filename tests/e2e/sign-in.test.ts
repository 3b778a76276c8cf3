import { describe, expect, inject, it } from 'vitest';
import { getConfig } from '../../api/src/config/env';
import { browsersClosedAfterEach, PHONE_VIEWPORT, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { agePendingSignIns } from '../support/oidc-flow';
import { signIn, signOut } from '../support/sign-in';
import { eventually } from '../support/eventually';

const baseUrl = inject('baseUrl');
const issuer = inject('issuer');

const browser = browsersClosedAfterEach();

describe('signing in through the local provider', () => {
  it('when nobody is signed in, then Ebbline sends the browser to the provider’s own sign-in page', async () => {
    const { page } = await browser();
    const console = watchConsole(page);
    await page.goto(`${baseUrl}/planner`);
    await page.waitForURL((url) => url.origin === new URL(issuer).origin);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await eventually(() => page.locator('link[rel=stylesheet]').getAttribute('href')).toBe(
      '/assets/sign-in.css',
    );
    // our own font, from our own server
    await eventually(() => page.evaluate(() => document.fonts.check('16px "Noto Sans"'))).toBe(true);
    await screenshot(page, 'sign-in-desktop');
    expect(console.problems).toEqual([]);
  });

  it.each([
    ['maren', 'tidewater-admin', 'Maren Oyelaran', '/people', 'People'],
    ['tomas', 'tidewater-plan', 'Tomas Keelan', '/planner', 'Planner'],
    ['dario', 'tidewater-tech', 'Dario Venn', '/my-visits', 'My visits'],
    ['ines', 'tidewater-rel', 'Ines Carvell', '/fleet', 'Fleet'],
  ])(
    'when %s signs in, then they land on their start screen and can sign out',
    async (login, password, name, start, heading) => {
      const { page } = await browser();
      const console = watchConsole(page);
      await signIn(page, login, password);
      expect(new URL(page.url()).pathname).toBe(start);
      await page.getByRole('heading', { name: heading, exact: true }).waitFor();
      await eventually(() => page.getByTestId('account-name').first().textContent()).toBe(name);
      await screenshot(page, `start-${login}`);
      // the start screen has had the answers it asked for: a query still under way when the
      // session ends is answered 401, which is another story than signing out
      await page.waitForLoadState('networkidle');

      await signOut(page);
      expect(new URL(page.url()).origin).toBe(new URL(baseUrl).origin);
      // the session is gone: Ebbline sends the browser to sign in, and the provider asks again
      await page.goto(`${baseUrl}${start}`);
      await page.getByLabel('Password').waitFor();
      expect(console.problems).toEqual([]);
    },
  );

  it('when people with different roles sign in, then each sees only the screens of their roles', async () => {
    const tech = await browser();
    await signIn(tech.page, 'dario', 'tidewater-tech');
    const techNav = await tech.page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link')
      .allTextContents();
    expect(techNav.join('|')).toContain('My visits');
    expect(techNav.join('|')).not.toContain('People');
    expect(techNav.join('|')).not.toContain('Planner');

    const admin = await browser();
    await signIn(admin.page, 'maren', 'tidewater-admin');
    const adminNav = await admin.page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link')
      .allTextContents();
    expect(adminNav.join('|')).toContain('People');
    expect(adminNav.join('|')).not.toContain('My visits');
  });

  it('when a returnTo path was asked for, then sign-in comes back to it', async () => {
    const { page } = await browser();
    await page.goto(`${baseUrl}/register?tab=sites`);
    await page.getByLabel('Login').fill('tomas');
    await page.getByLabel('Password').fill('tidewater-plan');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(`${baseUrl}/register?tab=sites`);
  });

  it('when the password is wrong, then the provider’s page says so plainly and keeps the login', async () => {
    const { page } = await browser();
    await page.goto(`${baseUrl}/auth/login`);
    await page.getByLabel('Login').fill('priya');
    await page.getByLabel('Password').fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    const message = page.getByTestId('sign-in-error');
    await message.waitFor();
    await eventually(() => message.textContent()).toContain('The login or the password is wrong.');
    await eventually(() => page.getByLabel('Login').inputValue()).toBe('priya');
    await eventually(() => page.getByLabel('Password').inputValue()).toBe('');
    await screenshot(page, 'sign-in-wrong-password');
  });

  it('when the state coming back from the provider is tampered with, then Ebbline refuses it and nobody is signed in', async () => {
    const { page, context } = await browser();
    // the browser does not let a test rewrite redirects, so follow the provider's redirects
    // after the sign-in form here (same cookies as the browser) and hand the browser the
    // callback address with its state changed
    await page.route(`${issuer}/interaction/*/login`, async (route) => {
      let response = await route.fetch({ maxRedirects: 0 });
      let location = response.headers().location ?? '';
      for (
        let hop = 0;
        hop < 10 && location && !location.startsWith(`${baseUrl}/auth/callback`);
        hop++
      ) {
        response = await context.request.get(new URL(location, issuer).href, { maxRedirects: 0 });
        location = response.headers().location ?? '';
      }
      const callback = new URL(location);
      expect(callback.searchParams.get('code')).toBeTruthy();
      callback.searchParams.set('state', `${callback.searchParams.get('state')}-tampered`);
      await route.fulfill({ status: 303, headers: { location: callback.href } });
    });
    await page.goto(`${baseUrl}/auth/login`);
    await page.getByLabel('Login').fill('tomas');
    await page.getByLabel('Password').fill('tidewater-plan');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByTestId('sign-in-problem').waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in-problem');
    await eventually(() => page.getByRole('heading').first().textContent()).toBe(
      'This sign-in could not be matched',
    );
    const me = await page.evaluate(async () => (await fetch('/api/me')).status);
    expect(me).toBe(401);
    await screenshot(page, 'sign-in-problem');
  });

  it('when the sign-in took longer than allowed at the provider, then its state has expired and is refused', async () => {
    const { page } = await browser();
    await page.goto(`${baseUrl}/auth/login`);
    await page.getByLabel('Login').waitFor();
    // the sign-in under way is kept in the browser, sealed: age it by 11 minutes there
    const context = page.context();
    const name = `${getConfig().SESSION_COOKIE_NAME}.sign-in`;
    const pending = (await context.cookies(`${baseUrl}/auth/callback`)).find((c) => c.name === name);
    expect(pending).toBeDefined();
    await context.addCookies([{ ...pending!, value: agePendingSignIns(pending!.value, 660_000) }]);
    await page.getByLabel('Login').fill('priya');
    await page.getByLabel('Password').fill('tidewater-plan');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByTestId('sign-in-problem').waitFor();
    expect(new URL(page.url()).search).toBe('?reason=expired');
    await eventually(() => page.getByRole('heading').first().textContent()).toBe('The sign-in took too long');
  });

  it('when an old callback address is opened again (its state spent), then it is refused', async () => {
    const { page } = await browser();
    let callback = '';
    page.on('request', (req) => {
      if (req.url().includes('/auth/callback?')) callback = req.url();
    });
    await signIn(page, 'ines', 'tidewater-rel');
    expect(callback).toContain('state=');
    await page.goto(callback);
    await page.getByTestId('sign-in-problem').waitFor();
  });
});

describe('roles in the browser', () => {
  it('when a technician opens People by a direct link, then a clear “not allowed” page shows', async () => {
    const { page } = await browser();
    await signIn(page, 'lucia', 'tidewater-tech', { returnTo: '/people' });
    const panel = page.getByTestId('not-allowed');
    await panel.waitFor();
    await eventually(() => panel.textContent()).toContain('People is not open to your role');
    await screenshot(page, 'not-allowed');
  });

  it('when someone without a role signs in, then they wait for access, see whom to ask, and an admin’s grant lets them in', async () => {
    const noor = await browser();
    await signIn(noor.page, 'noor', 'tidewater-new');
    await noor.page.getByTestId('waiting-for-access').waitFor();
    await noor.page.getByTestId('admin-list').waitFor();
    await eventually(() => noor.page.getByTestId('admin-list').textContent()).toContain('Maren Oyelaran');
    await screenshot(noor.page, 'waiting-for-access');

    const admin = await browser();
    await signIn(admin.page, 'maren', 'tidewater-admin');
    await admin.page.getByPlaceholder('Search by name or e-mail').fill('noor');
    await admin.page.getByRole('button', { name: 'Edit Noor Ashdown' }).click();
    await admin.page.getByRole('checkbox', { name: 'Technician' }).check();
    await admin.page.getByRole('button', { name: 'Save' }).click();
    await admin.page.getByRole('button', { name: 'Edit Noor Ashdown' }).waitFor();

    // the next request counts: a reload takes Noor to her start screen
    await noor.page.goto(`${baseUrl}/`);
    await noor.page.waitForURL(`${baseUrl}/my-visits`);
    await noor.page.getByRole('heading', { name: 'My visits', exact: true }).waitFor();
  });
});

describe('on a phone', () => {
  it('when signing in at 390 px, then the provider page and the shell fit, and sign-out sits in the menu', async () => {
    const { page } = await browser(PHONE_VIEWPORT);
    const console = watchConsole(page);
    await page.goto(`${baseUrl}/auth/login`);
    await page.getByLabel('Login').waitFor();
    await screenshot(page, 'sign-in-phone');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );

    await page.getByLabel('Login').fill('tomas');
    await page.getByLabel('Password').fill('tidewater-plan');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: 'Planner', exact: true }).waitFor();
    await page.getByRole('button', { name: 'Menu' }).click();
    await page.locator('#mobile-nav').getByTestId('account-menu').waitFor();
    await screenshot(page, 'shell-phone-menu');
    await signOut(page);
    await screenshot(page, 'signed-out-phone');
    expect(console.problems).toEqual([]);
  });
});
