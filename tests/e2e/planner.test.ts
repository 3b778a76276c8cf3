import { format } from 'date-fns';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { instantOfLocalWallTime, localWallTimeOf } from '../../shared/domain/shutdown-windows';
import { browsersClosedAfterEach, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { eventually } from '../support/eventually';
import { query } from '../support/product-database';
import { signIn } from '../support/sign-in';

const browser = browsersClosedAfterEach();

/** The local calendar day of an instant in a zone, as a Date at local midnight (for date-fns labels). */
function localDay(instant: Date, timeZone: string): Date {
  const on = localWallTimeOf(instant.toISOString(), timeZone).slice(0, 10);
  const [y, m, d] = on.split('-').map(Number) as [number, number, number];
  return new Date(y, m - 1, d);
}

/**
 * Moves the mouse in small steps, as a hand does, so the calendar's drag-and-drop sees a drag.
 * Returns when the button is released.
 */
async function drag(
  page: Page,
  from: { x: number; y: number },
  to: { x: number; y: number },
): Promise<void> {
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  await page.mouse.move(from.x + 4, from.y + 4, { steps: 4 });
  await page.mouse.move(to.x, to.y, { steps: 20 });
  await page.mouse.up();
}

/** A visit's box on the calendar, by its tooltip ("06:00–07:15: BRK-M1-VFD-010 · Dario Venn"). */
const eventTitled = (tag: string) => new RegExp(`(^|: )${tag}( ·|$)`);

/** Gives every planning warning shown in the dialog a reason, so it may be saved anyway. */
async function overrideWarnings(dialog: ReturnType<Page['getByRole']>): Promise<void> {
  const reasons = dialog.getByLabel('Reason to plan it anyway');
  for (const input of await reasons.all())
    await input.fill('Agreed with production for this demo move');
}

describe('the Planner (planner, desktop)', () => {
  it('when the planner drags a visit to the next day, then it is replanned there with the reason, and stays there after a reload', async () => {
    const [visit] = await query<{
      id: string;
      tag: string;
      siteId: string;
      areaId: string;
      timeZone: string;
      startsAt: Date;
      endsAt: Date;
    }>(
      `SELECT v.id, c.tag, a.site_id AS "siteId", a.id AS "areaId", s.time_zone AS "timeZone",
              v.planned_start_at AS "startsAt", v.planned_end_at AS "endsAt"
         FROM visits v JOIN cabinets c ON c.id = v.cabinet_id JOIN areas a ON a.id = c.area_id JOIN sites s ON s.id = a.site_id
        WHERE v.state = 'planned' AND v.planned_start_at > now() + interval '3 hours'
          -- Monday to Saturday, so the next day is in the same week (weeks start on Monday)
          AND extract(isodow FROM v.planned_start_at AT TIME ZONE s.time_zone) < 7
          AND (v.planned_start_at AT TIME ZONE s.time_zone)::date = (v.planned_end_at AT TIME ZONE s.time_zone)::date
          AND extract(hour FROM v.planned_start_at AT TIME ZONE s.time_zone) BETWEEN 6 AND 20
        ORDER BY v.planned_start_at LIMIT 1`,
    );
    expect(visit, 'a planned visit of the demo in the coming days').toBeDefined();
    const day = localDay(visit!.startsAt, visit!.timeZone);
    const nextDay = new Date(day.getFullYear(), day.getMonth(), day.getDate() + 1);
    const { page } = await browser();
    const console = watchConsole(page);
    const planner = `/planner?siteId=${visit!.siteId}&areaId=${visit!.areaId}&view=week&date=${format(day, 'yyyy-MM-dd')}`;
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: planner });
    await page.getByRole('heading', { name: 'Planner', exact: true }).waitFor();

    const event = page.getByTitle(eventTitled(visit!.tag));
    await event.waitFor();
    const from = (await event.boundingBox())!;
    const fromColumn = (await page
      .getByRole('columnheader', { name: format(day, 'EEE d') })
      .boundingBox())!;
    const toColumn = (await page
      .getByRole('columnheader', { name: format(nextDay, 'EEE d') })
      .boundingBox())!;
    const start = { x: from.x + from.width / 2, y: from.y + Math.min(12, from.height / 2) };
    await drag(page, start, { x: start.x + (toColumn.x - fromColumn.x), y: start.y });

    const dialog = page.getByRole('dialog', { name: `Move ${visit!.tag}` });
    await dialog.waitFor();
    await dialog.getByLabel('Why does it move?').fill('Production asked for the day after');
    // the warnings of the new time are checked before saving: none, or each with its reason
    await dialog
      .getByText(/No planning warnings|Reason to plan it anyway/)
      .first()
      .waitFor();
    await overrideWarnings(dialog);
    await screenshot(page, 'planner-move-visit');
    await dialog.getByRole('button', { name: 'Move visit' }).click();
    await dialog.waitFor({ state: 'detached' });

    // stored: the same local time, one day later
    const expectedStart = instantOfLocalWallTime(
      `${format(nextDay, 'yyyy-MM-dd')} ${localWallTimeOf(visit!.startsAt.toISOString(), visit!.timeZone).slice(11)}`,
      visit!.timeZone,
    );
    await eventually(async () => {
      const [row] = await query<{ startsAt: Date; reason: string }>(
        `SELECT planned_start_at AS "startsAt", state_reason AS reason FROM visits WHERE id = $1`,
        [visit!.id],
      );
      return { startsAt: row!.startsAt.toISOString(), reason: row!.reason };
    }).toEqual({ startsAt: expectedStart, reason: 'Production asked for the day after' });

    // after a reload the visit is in the next day's column
    await page.reload();
    const moved = page.getByTitle(eventTitled(visit!.tag));
    await moved.waitFor();
    const column = (await page
      .getByRole('columnheader', { name: format(nextDay, 'EEE d') })
      .boundingBox())!;
    const box = (await moved.boundingBox())!;
    expect(box.x + box.width / 2).toBeGreaterThan(column.x);
    expect(box.x + box.width / 2).toBeLessThan(column.x + column.width);
    await screenshot(page, 'planner-after-move');
    expect(console.problems).toEqual([]);
  });

  it('when the planner plans a shutdown window in one step, then its proposed visits appear on the calendar', async () => {
    const [window] = await query<{
      id: string;
      title: string;
      siteId: string;
      areaId: string;
      timeZone: string;
      startsAt: Date;
      endsAt: Date;
    }>(
      `SELECT w.id, w.title, a.site_id AS "siteId", a.id AS "areaId", s.time_zone AS "timeZone", w.starts_at AS "startsAt", w.ends_at AS "endsAt"
         FROM shutdown_windows w JOIN areas a ON a.id = w.area_id JOIN sites s ON s.id = a.site_id
        WHERE w.recurrence IS NULL AND w.retired_at IS NULL AND w.starts_at > now() + interval '1 day'
          AND NOT EXISTS (SELECT 1 FROM visits v JOIN cabinets c ON c.id = v.cabinet_id
                           WHERE c.area_id = w.area_id AND v.planned_start_at < w.ends_at AND v.planned_end_at > w.starts_at)
        ORDER BY w.starts_at LIMIT 1`,
    );
    expect(window, 'a one-off window of the demo ahead, not yet planned').toBeDefined();
    const countVisits = async () =>
      (
        await query<{ n: number }>(
          `SELECT count(*)::int AS n FROM visits v JOIN cabinets c ON c.id = v.cabinet_id
            WHERE c.area_id = $1 AND v.state = 'planned' AND v.planned_start_at >= $2 AND v.planned_end_at <= $3`,
          [window!.areaId, window!.startsAt, window!.endsAt],
        )
      )[0]!.n;
    expect(await countVisits()).toBe(0);

    const day = localDay(window!.startsAt, window!.timeZone);
    const { page } = await browser();
    const console = watchConsole(page);
    await signIn(page, 'tomas', 'tidewater-plan', {
      returnTo: `/planner?siteId=${window!.siteId}&areaId=${window!.areaId}&view=week&date=${format(day, 'yyyy-MM-dd')}`,
    });
    await page.getByRole('heading', { name: 'Planner', exact: true }).waitFor();
    // the window's occurrence on the calendar opens with "Plan this window"
    const occurrence = page.getByTitle(new RegExp(`(^|: )${window!.title} · `)).first();
    await occurrence.waitFor();
    const box = (await occurrence.boundingBox())!;
    await page.mouse.click(box.x + box.width / 2, box.y + box.height / 2);
    await page
      .getByRole('dialog', { name: window!.title })
      .getByRole('button', { name: 'Plan this window' })
      .click();

    // the proposal: a visit for every bank due by the window's end, split across the technicians
    const proposal = page.getByRole('dialog', { name: 'Plan a shutdown window' });
    await proposal.getByRole('region', { name: 'Proposed visits' }).waitFor();
    const confirm = proposal.getByRole('button', { name: /^Plan \d+ visits?$/ });
    await eventually(() => confirm.isEnabled()).toBe(true);
    const proposed = Number(/\d+/.exec((await confirm.textContent()) ?? '')![0]);
    expect(proposed).toBeGreaterThan(0);
    await screenshot(page, 'planner-plan-window');
    await confirm.click();
    // planned at once, or the server's warnings (a bank not due by then) accepted with one reason
    const anyway = proposal.getByLabel('Plan anyway because…');
    await eventually(async () =>
      (await proposal.count()) === 0
        ? 'planned'
        : (await anyway.count()) > 0
          ? 'warned'
          : 'waiting',
    ).not.toBe('waiting');
    if (await anyway.count()) {
      await anyway.fill('The whole area is open that day');
      await confirm.click();
    }
    await proposal.waitFor({ state: 'detached' });
    // the Planner says what it did and where the visits went
    await page
      .getByRole('status')
      .filter({ hasText: new RegExp(`^${proposed} visits? planned, the first `) })
      .waitFor();

    await eventually(countVisits).toBe(proposed);
    const planned = await query<{ tag: string }>(
      `SELECT c.tag FROM visits v JOIN cabinets c ON c.id = v.cabinet_id
        WHERE c.area_id = $1 AND v.state = 'planned' AND v.planned_start_at >= $2 AND v.planned_end_at <= $3 ORDER BY v.planned_start_at`,
      [window!.areaId, window!.startsAt, window!.endsAt],
    );
    for (const { tag } of planned) await page.getByTitle(eventTitled(tag)).first().waitFor();
    await screenshot(page, 'planner-window-planned');
    expect(console.problems).toEqual([]);
  });
});
