import ICAL from 'ical.js';
import pg from 'pg';
import { describe, expect, inject, it } from 'vitest';
import { DISCHARGE_CAUTION } from '../../shared/constants/safety';
import { localWallTimeOf } from '../../shared/domain/shutdown-windows';
import { browsersClosedAfterEach, PHONE_VIEWPORT, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { eventually } from '../support/eventually';
import { signIn } from '../support/sign-in';

const baseUrl = inject('baseUrl');
const browser = browsersClosedAfterEach();

interface PlannedVisit {
  id: string;
  tag: string;
  startsAt: Date;
  timeZone: string;
}

/** The demo's planned visits of a technician in the coming three weeks, read from the database itself. */
async function plannedVisitsOf(email: string): Promise<PlannedVisit[]> {
  const client = new pg.Client({ connectionString: inject('databaseUrl') });
  await client.connect();
  try {
    const { rows } = await client.query<PlannedVisit>(
      `SELECT v.id, c.tag, v.planned_start_at AS "startsAt", s.time_zone AS "timeZone"
         FROM visits v JOIN visit_technicians vt ON vt.visit_id = v.id JOIN users u ON u.id = vt.user_id
         JOIN cabinets c ON c.id = v.cabinet_id JOIN areas a ON a.id = c.area_id JOIN sites s ON s.id = a.site_id
        WHERE u.email = $1 AND v.state = 'planned' AND v.planned_end_at > now() AND v.planned_start_at < now() + interval '21 days'
        ORDER BY v.planned_start_at`,
      [email],
    );
    return rows;
  } finally {
    await client.end();
  }
}

describe('My visits (technician, phone)', () => {
  it('when Dario opens Ebbline on a phone, then My visits lists his planned visits with site, banks and window, and one opens to its cabinet and banks', async () => {
    const planned = await plannedVisitsOf('dario@brackenmoor.example');
    // the demo plans visits for every technician over the coming weeks
    expect(planned.length).toBeGreaterThanOrEqual(3);
    const { page } = await browser(PHONE_VIEWPORT);
    const console = watchConsole(page);
    await signIn(page, 'dario', 'tidewater-tech');
    expect(new URL(page.url()).pathname).toBe('/my-visits');
    await page.getByRole('heading', { name: 'My visits', exact: true }).waitFor();

    for (const visit of planned) {
      await page
        .getByRole('link', { name: new RegExp(`^Visit to ${visit.tag},`) })
        .first()
        .waitFor();
    }
    // by its address: other browser tests may start a visit of Dario's at the same cabinet
    // (an unplanned one, listed first), whose card has the same name
    const first = page
      .getByRole('link', { name: new RegExp(`^Visit to ${planned[0]!.tag},`) })
      .and(page.locator(`a[href="/my-visits/${planned[0]!.id}"]`));
    // the card names the site, the banks and the shutdown window it falls in
    await eventually(() => first.textContent()).toMatch(/Bank|banks/);
    await eventually(() => first.textContent()).toContain('Window:');
    await eventually(() => first.textContent()).toContain(planned[0]!.timeZone);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );
    await screenshot(page, 'my-visits-phone');

    await first.click();
    await page.waitForURL((url) => url.pathname === `/my-visits/${planned[0]!.id}`);
    await page.getByRole('heading', { name: planned[0]!.tag }).waitFor();
    await page.getByRole('heading', { name: 'Cabinet' }).waitFor();
    await page.getByRole('heading', { name: /^(Bank|\d+ banks)$/ }).waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );
    await screenshot(page, 'my-visit-phone');
    expect(console.problems).toEqual([]);
  });

  it('when Lucia makes her calendar feed on her profile, then the feed holds her planned visits with their site’s zone', async () => {
    const planned = await plannedVisitsOf('lucia@brackenmoor.example');
    expect(planned.length).toBeGreaterThanOrEqual(3);
    const { page } = await browser(PHONE_VIEWPORT);
    const console = watchConsole(page);
    await signIn(page, 'lucia', 'tidewater-tech', { returnTo: '/profile' });
    await page.getByRole('heading', { name: 'Your profile' }).waitFor();
    await page.getByRole('button', { name: 'Make a calendar address' }).click();
    // shown once, in the notice that says to copy it now
    const shown = page
      .getByRole('status')
      .filter({ hasText: 'Copy your calendar address now' })
      .getByTestId('calendar-feed-url');
    await eventually(() => shown.textContent()).toMatch(/\/feeds\/visits\/[^/]+\.ics$/);
    const feedUrl = ((await shown.textContent()) ?? '').trim();
    expect(new URL(feedUrl).origin).toBe(new URL(baseUrl).origin);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );
    await screenshot(page, 'calendar-feed-phone');

    // the feed is read as a calendar program would: no session, only the secret address
    const answer = await fetch(feedUrl);
    expect(answer.status).toBe(200);
    expect(answer.headers.get('content-type')).toMatch(/^text\/calendar/);
    const calendar = new ICAL.Component(ICAL.parse(await answer.text()));
    const events = calendar.getAllSubcomponents('vevent').map((e) => new ICAL.Event(e));
    for (const visit of planned) {
      const event = events.find((e) => e.summary === `Decay run: ${visit.tag}`);
      expect(event, visit.tag).toBeDefined();
      // the event starts when the visit does, written as the site's wall time with its zone
      expect(event!.startDate.toString().slice(0, 16)).toBe(
        localWallTimeOf(visit.startsAt.toISOString(), visit.timeZone),
      );
      expect(event!.component.getFirstProperty('dtstart')!.getParameter('tzid')).toBe(
        visit.timeZone,
      );
      // the cabinet, its banks and the discharge caution, as the app words it
      expect(event!.description).toContain(visit.tag);
      expect(event!.description).toMatch(/[Bb]ank/);
      expect(event!.description).toContain(DISCHARGE_CAUTION.title);
    }
    expect(console.problems).toEqual([]);
  });
});
