import pg from 'pg';
import sharp from 'sharp';
import { describe, expect, inject, it } from 'vitest';
import { browsersClosedAfterEach, PHONE_VIEWPORT, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { eventually } from '../support/eventually';
import { signIn } from '../support/sign-in';

const browser = browsersClosedAfterEach();

/**
 * A visit of Dario's own, under way since an hour ago at the cabinet of his first planned demo
 * visit with its banks: stored beside the demo's visits, so the other browser tests find theirs as seeded.
 */
async function visitUnderWayOf(email: string): Promise<{ id: string; tag: string }> {
  const client = new pg.Client({ connectionString: inject('databaseUrl') });
  await client.connect();
  try {
    await client.query('BEGIN');
    const { rows } = await client.query<{ id: string; tag: string; plannedId: string; userId: string }>(
      `WITH first AS (
         SELECT v.id AS planned_id, v.cabinet_id, u.id AS user_id FROM visits v
           JOIN visit_technicians vt ON vt.visit_id = v.id JOIN users u ON u.id = vt.user_id
          WHERE u.email = $1 AND v.state = 'planned' ORDER BY v.planned_start_at LIMIT 1)
       INSERT INTO visits (cabinet_id, planned_start_at, planned_end_at, state, started_at, created_at, updated_at)
       SELECT cabinet_id, now() - interval '1 hour', now() + interval '3 hours', 'under-way', now() - interval '1 hour', now(), now() FROM first
       RETURNING id, (SELECT tag FROM cabinets c WHERE c.id = cabinet_id) AS tag,
                 (SELECT planned_id FROM first) AS "plannedId", (SELECT user_id FROM first) AS "userId"`,
      [email],
    );
    const visit = rows[0]!;
    await client.query('INSERT INTO visit_banks (visit_id, bank_id) SELECT $1, bank_id FROM visit_banks WHERE visit_id = $2', [visit.id, visit.plannedId]);
    await client.query('INSERT INTO visit_technicians (visit_id, user_id) VALUES ($1, $2)', [visit.id, visit.userId]);
    await client.query('COMMIT');
    return { id: visit.id, tag: visit.tag };
  } finally {
    await client.end();
  }
}

/** A phone photo: 1200 × 900 with a gradient, the camera's details and a GPS position in its EXIF. */
async function phonePhoto(): Promise<Buffer> {
  const width = 1200;
  const height = 900;
  const pixels = Buffer.alloc(width * height * 3);
  for (let y = 0; y < height; y += 1) {
    for (let x = 0; x < width; x += 1) pixels.set([(x * 255) / width, (y * 255) / height, 140], (y * width + x) * 3);
  }
  return sharp(pixels, { raw: { width, height, channels: 3 } })
    .jpeg()
    .withExif({ IFD0: { Make: 'Quellbrook' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '53/1 33/1 0/1' } })
    .toBuffer();
}

describe('Photos of a visit (technician, phone)', () => {
  it('when Dario adds a photo on a visit under way, then its thumbnail shows and opens the full-size photo; offline he is told to add it when the connection is back', async () => {
    const visit = await visitUnderWayOf('dario@brackenmoor.example');
    const { page, context } = await browser(PHONE_VIEWPORT);
    const console = watchConsole(page);
    await signIn(page, 'dario', 'tidewater-tech', { returnTo: `/my-visits/${visit.id}` });
    await page.getByRole('heading', { name: visit.tag }).waitFor();

    const photos = page.getByRole('region', { name: 'Photos of the visit' });
    await photos.getByText('No photos yet.').waitFor();
    const add = photos.getByLabel('Add a photo');
    expect(await add.getAttribute('accept')).toBe('image/*');
    expect(await add.getAttribute('capture')).toBe('environment');
    // a note saved as .jpg is refused by its content, in plain words, and nothing shows
    await add.setInputFiles({ name: 'IMG_0041.jpg', mimeType: 'image/jpeg', buffer: Buffer.from('Bank DC1 looked fine.\n') });
    await photos.getByRole('alert').getByText('This file is not a photo Ebbline can read').waitFor();
    await screenshot(page, 'visit-photos-refused-phone');
    await photos.getByLabel(/What the next photo shows/).fill('Cabinet label and door');
    await add.setInputFiles({ name: 'IMG_0042.jpg', mimeType: 'image/jpeg', buffer: await phonePhoto() });

    const thumbnail = photos.getByRole('button', { name: /^Open the photo “Cabinet label and door” taken .* by Dario/ });
    await thumbnail.waitFor();
    await photos.getByText('✓ Photo added.').waitFor();
    // the thumbnail's image has loaded from the API (a broken image has no natural width)
    await eventually(() => thumbnail.locator('img').evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBeGreaterThan(0);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await screenshot(page, 'visit-photos-phone');

    await thumbnail.click();
    const viewer = page.getByRole('dialog', { name: 'Cabinet label and door' });
    const full = viewer.getByRole('img', { name: 'Cabinet label and door' });
    await eventually(() => full.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBe(1200);
    await screenshot(page, 'visit-photo-full-phone');
    await viewer.getByRole('button', { name: 'Close' }).click();
    await viewer.waitFor({ state: 'hidden' });

    await context.setOffline(true);
    await photos.getByText('You are offline. Photos can be added when the connection is back').waitFor();
    expect(await add.isDisabled()).toBe(true);
    await context.setOffline(false);
    await eventually(() => add.isDisabled()).toBe(false);
    // only the refusal of the note, which the page showed
    expect(console.problems.filter((p) => !/^answer 415 POST .*\/photos$/.test(p))).toEqual([]);
  }, 180_000);
});
