import { afterAll, beforeAll, describe, inject, it } from 'vitest';
import { openBrowser, PHONE_VIEWPORT, screenshot, type BrowserSession } from '../support/browser';
import { signIn } from '../support/sign-in';
import { eventually } from '../support/eventually';

const baseUrl = inject('baseUrl');

describe('the application shell', () => {
  let session: BrowserSession;
  beforeAll(async () => {
    session = await openBrowser();
    await signIn(session.page, 'ines', 'tidewater-rel');
  });
  afterAll(async () => session?.close());

  it('when the app loads, then it shows the health and version that the API reports', async () => {
    const api = (await (await fetch(`${baseUrl}/api/health`)).json()) as { version: string };
    const { page } = session;
    await page.goto(`${baseUrl}/fleet`);
    await page.getByTestId('health-status').waitFor();
    await eventually(() => page.getByTestId('health-status').textContent()).toBe('ok');
    await eventually(() => page.getByTestId('health-version').textContent()).toBe(api.version);
    await screenshot(page, 'shell-desktop');
  });

  it('when the screen is phone-wide, then the menu opens the navigation', async () => {
    const phone = await openBrowser(PHONE_VIEWPORT);
    try {
      await signIn(phone.page, 'tomas', 'tidewater-plan', { returnTo: '/fleet' });
      await phone.page.getByRole('button', { name: 'Menu' }).click();
      await phone.page.locator('#mobile-nav').getByRole('link', { name: /Register/ }).click();
      await phone.page.getByRole('heading', { name: 'Register' }).waitFor();
      await screenshot(phone.page, 'shell-phone');
    } finally {
      await phone.close();
    }
  });
});
