/**
 * At the cabinet without a plan: a technician scans a cabinet's QR label on a phone (its address
 * opens the cabinet's page), starts an unplanned visit there and lands on the visit; back on the
 * cabinet's page the visit is offered again ("Open your visit") rather than a second one.
 */
import { describe, expect, it } from 'vitest';
import { browsersClosedAfterEach, PAGE_WAIT_MS, PHONE_VIEWPORT, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { eventually } from '../support/eventually';
import { query } from '../support/product-database';
import { signIn } from '../support/sign-in';

const browser = browsersClosedAfterEach();

describe('an unplanned visit from the cabinet’s label (technician, phone)', () => {
  it('when Dario opens a cabinet by its label and starts an unplanned visit, then he lands on the visit, under way and unplanned, and the cabinet then offers to open it', async () => {
    // a cabinet in service at one of Dario's sites with no visit under way there
    const [cabinet] = await query<{ id: string; tag: string }>(
      `SELECT c.id, c.tag FROM cabinets c JOIN areas a ON a.id = c.area_id JOIN person_sites ps ON ps.site_id = a.site_id
         JOIN users u ON u.id = ps.user_id
        WHERE u.email = 'dario@brackenmoor.example' AND c.retired_at IS NULL AND c.status = 'in-service'
          AND EXISTS (SELECT 1 FROM banks b WHERE b.cabinet_id = c.id AND b.status = 'in-service')
          AND NOT EXISTS (SELECT 1 FROM visits v WHERE v.cabinet_id = c.id AND v.state = 'under-way')
        ORDER BY c.tag DESC LIMIT 1`,
    );
    expect(cabinet).toBeDefined();
    const { page } = await browser(PHONE_VIEWPORT);
    const console = watchConsole(page);
    await signIn(page, 'dario', 'tidewater-tech');
    // the label's QR code holds the address the label route gives
    const label = await page.evaluate(async (id) => {
      const res = await fetch(`/api/cabinets/${id}/label`);
      return (await res.json()) as { url: string };
    }, cabinet!.id);
    expect(new URL(label.url).pathname).toBe(`/register/cabinets/${cabinet!.id}`);
    await page.goto(label.url);

    const start = page.getByRole('button', { name: 'Start an unplanned visit here' });
    await start.waitFor({ timeout: PAGE_WAIT_MS });
    // first thing on a phone: the control is in the first screenful, under the tag
    const box = await start.boundingBox();
    expect(box!.y + box!.height).toBeLessThanOrEqual(PHONE_VIEWPORT.height);
    expect(box!.height).toBeGreaterThanOrEqual(48);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await screenshot(page, 'unplanned-visit-cabinet-phone');

    await start.click();
    await page.waitForURL((url) => /^\/my-visits\/[0-9a-f-]{36}$/.test(url.pathname), { timeout: PAGE_WAIT_MS });
    const visitId = new URL(page.url()).pathname.split('/').pop()!;
    await page.getByRole('heading', { name: cabinet!.tag }).first().waitFor({ timeout: PAGE_WAIT_MS });
    await screenshot(page, 'unplanned-visit-started-phone');

    const [stored] = await query<{ state: string; unplanned: boolean; technicians: string[] }>(
      `SELECT v.state, v.unplanned, array_agg(u.email) AS technicians FROM visits v
         JOIN visit_technicians vt ON vt.visit_id = v.id JOIN users u ON u.id = vt.user_id WHERE v.id = $1 GROUP BY v.id`,
      [visitId],
    );
    expect(stored).toEqual({ state: 'under-way', unplanned: true, technicians: ['dario@brackenmoor.example'] });

    // the label again: the visit under way is offered, not a second one
    await page.goto(label.url);
    const openIt = page.getByRole('link', { name: 'Open your visit' });
    await openIt.waitFor({ timeout: PAGE_WAIT_MS });
    await eventually(() => openIt.getAttribute('href')).toBe(`/my-visits/${visitId}`);
    expect(await page.getByRole('button', { name: 'Start an unplanned visit here' }).count()).toBe(0);
    expect(console.problems).toEqual([]);
  }, 180_000);
});
