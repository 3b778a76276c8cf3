/**
 * The calendar feed from the profile page, as a technician uses it: make the address, read it
 * as a calendar app would (parsed by ical.js), turn it off. On a phone's width.
 */
import ICAL from 'ical.js';
import { afterEach, describe, expect, inject, it } from 'vitest';
import { openBrowser, PHONE_VIEWPORT, screenshot, type BrowserSession } from '../support/browser';
import { watchConsole } from '../support/console';
import { eventually } from '../support/eventually';
import { signIn } from '../support/sign-in';

const baseUrl = inject('baseUrl');

let open: BrowserSession[] = [];
afterEach(async () => {
  await Promise.all(open.map((s) => s.close()));
  open = [];
});

describe('the profile page’s calendar feed', () => {
  it('when a technician makes an address on a phone, then a calendar app reads their visits from it, until it is turned off', async () => {
    const session = await openBrowser(PHONE_VIEWPORT);
    open.push(session);
    const { page } = session;
    const console = watchConsole(page);
    await signIn(page, 'dario', 'tidewater-tech', { returnTo: '/profile' });
    await page.getByRole('heading', { name: 'Your profile' }).waitFor();

    const section = page.getByTestId('calendar-feed');
    await section.getByRole('button', { name: 'Make a calendar address' }).click();
    const shown = section.getByTestId('calendar-feed-url');
    await eventually(() => shown.textContent()).toMatch(/\/feeds\/visits\/ebc_[\w-]+\.ics$/);
    const url = (await shown.textContent())!;
    expect(url.startsWith(`${baseUrl}/feeds/visits/`)).toBe(true);
    await section.getByText('How to add it to your calendar').waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );
    await screenshot(page, 'profile-calendar-feed-made-phone');

    const feed = await fetch(url);
    expect(feed.status).toBe(200);
    expect(feed.headers.get('content-type')).toMatch(/^text\/calendar/);
    const calendar = new ICAL.Component(ICAL.parse(await feed.text()));
    const vevents = calendar.getAllSubcomponents('vevent');
    const events = vevents.map((e) => new ICAL.Event(e));
    // the demo plans visits over the next weeks for every technician
    expect(events.length).toBeGreaterThan(0);
    expect(events.every((e) => e.summary.includes('Decay run: '))).toBe(true);
    expect(events[0]!.description).toContain('Discharge estimate: not a permission to touch');
    // each event in its site's zone, named (TZID) and described in the feed (VTIMEZONE)
    const zones = calendar
      .getAllSubcomponents('vtimezone')
      .map((z) => z.getFirstPropertyValue('tzid'));
    for (const vevent of vevents) {
      expect(zones).toContain(vevent.getFirstProperty('dtstart')!.getParameter('tzid'));
    }

    await section.getByRole('button', { name: 'Done' }).click();
    await section.getByText(/Your calendar address is in use/).waitFor();
    expect(await page.content()).not.toContain(url);

    await section.getByRole('button', { name: 'Turn off' }).click();
    await section.getByRole('button', { name: 'Yes, turn off' }).click();
    await section.getByText('You have no calendar address.').waitFor();
    expect((await fetch(url)).status).toBe(404);
    await screenshot(page, 'profile-calendar-feed-off-phone');
    expect(console.problems).toEqual([]);
  });
});
