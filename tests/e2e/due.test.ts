import { describe, expect, it } from 'vitest';
import { browsersClosedAfterEach, PHONE_VIEWPORT, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { eventually } from '../support/eventually';
import { signIn } from '../support/sign-in';

const browser = browsersClosedAfterEach();

/** The count a bucket's tab shows, e.g. "Overdue 12" → 12. */
async function tabCount(text: string | null): Promise<number> {
  const match = /(\d[\d,]*)\s*$/.exec((text ?? '').trim());
  return match ? Number(match[1]!.replace(/,/g, '')) : NaN;
}

describe('Due list (planner)', () => {
  it('when a planner opens the Due list and filters it, then the tabs count, the address bar keeps the filters through a reload, and rows lead to the bank and to planning', async () => {
    const { page } = await browser();
    const console = watchConsole(page);
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: '/planner/due' });
    await page.getByRole('heading', { name: 'Due', exact: true }).waitFor();
    const overdue = page.getByRole('tab', { name: /Overdue/ });
    await eventually(async () => tabCount(await overdue.textContent())).toBeGreaterThan(0);
    expect(await overdue.getAttribute('aria-selected')).toBe('true');
    const table = page.getByRole('table', { name: /Overdue: banks/ });
    await table.getByRole('row').nth(1).waitFor();
    await screenshot(page, 'due-list-desktop');

    // another tab: the address bar says so, and a reload keeps it
    await page.getByRole('tab', { name: /Due in the next three months/ }).click();
    await page.waitForURL(/bucket=next-quarter/);
    await page.getByLabel('Criticality').selectOption('critical');
    await page.waitForURL(/criticality=critical/);
    await page.reload();
    await page.getByRole('heading', { name: 'Due', exact: true }).waitFor();
    // read as the reloaded page settles, not once at the first paint of its heading
    await eventually(() =>
      page.getByRole('tab', { name: /Due in the next three months/ }).getAttribute('aria-selected'),
    ).toBe('true');
    await eventually(() => page.getByLabel('Criticality').inputValue()).toBe('critical');

    // back to the overdue banks: the first row's bank link and its "Plan a visit"
    await page.getByLabel('Criticality').selectOption('');
    await page.getByRole('tab', { name: /Overdue/ }).click();
    await page.waitForURL(/bucket=overdue/);
    const firstRow = page
      .getByRole('table', { name: /Overdue: banks/ })
      .getByRole('row')
      .nth(1);
    await firstRow.waitFor();
    const bankHref = await firstRow.getByRole('link').first().getAttribute('href');
    expect(bankHref).toMatch(/^\/register\/banks\/[0-9a-f-]{36}$/);
    const plan = page.getByRole('link', { name: /^Plan a visit to / }).first();
    const planHref = await plan.getAttribute('href');
    expect(planHref).toMatch(
      /^\/planner\?siteId=[0-9a-f-]{36}&cabinetId=[0-9a-f-]{36}&bankIds=[0-9a-f-]{36}/,
    );
    expect(console.problems).toEqual([]);
  });

  it('when the Due list is opened on a phone (390 px), then it shows cards without sideways scrolling', async () => {
    const { page } = await browser(PHONE_VIEWPORT);
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: '/planner/due' });
    await page.getByRole('heading', { name: 'Due', exact: true }).waitFor();
    const cards = page.getByRole('list', { name: /Overdue: banks/ });
    await cards.getByRole('listitem').first().waitFor();
    await eventually(() =>
      page.evaluate(() => document.documentElement.scrollWidth),
    ).toBeLessThanOrEqual(PHONE_VIEWPORT.width);
    await screenshot(page, 'due-list-phone');
    // the first screen as a phone shows it, for people to look at
    await page.screenshot({ path: '.data/screenshots/due-list-phone-first-screen.png' });
  });
});
