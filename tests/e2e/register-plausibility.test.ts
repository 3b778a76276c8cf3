import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { browsersClosedAfterEach, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { eventually } from '../support/eventually';
import { signIn } from '../support/sign-in';

const browser = browsersClosedAfterEach();

/** The value beside `label` in a record's details. */
const detail = (page: Page, label: string) =>
  page
    .locator('dl > div')
    .filter({ has: page.locator('dt', { hasText: new RegExp(`^${label}$`) }) })
    .locator('dd');

describe('the register questions what is unlikely', () => {
  it('when a planner enters a 5 V DC bus on a 400 V supply, then "Are you sure?" shows beside the field, and Save anyway saves it', async () => {
    const { page } = await browser();
    // the question is the API's 422 answer: part of the story
    const console = watchConsole(page, [/ 401 .*\/api\/me$/, /answer 422 POST .*\/api\/cabinets$/]);
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: '/register/cabinets/new' });
    await page.getByRole('heading', { name: 'Add a cabinet' }).waitFor();

    const site = page.getByLabel('Site');
    await site.locator('option').nth(1).waitFor({ state: 'attached' });
    await site.selectOption({ index: 1 });
    const area = page.getByLabel('Area');
    await area.locator('option').nth(1).waitFor({ state: 'attached' });
    await area.selectOption({ index: 1 });
    await page.getByRole('textbox', { name: 'Tag', exact: true }).fill('BRK-E2E-VFD-005');
    await page.getByLabel('Supply voltage (AC line)').fill('400');
    await page.getByLabel('Nominal DC-bus voltage').fill('5');
    await page.getByLabel('Marked discharge wait time').fill('8');
    await page.getByRole('button', { name: 'Add cabinet' }).click();

    const question = page.getByTestId('question-dcBusVolts');
    await question.waitFor();
    await eventually(() => question.textContent()).toMatch(
      /Are you sure\?.*5 V DC bus on a 400 V supply is unlikely: expect about 540–564 V/,
    );
    await screenshot(page, 'register-cabinet-question-dc-bus');
    // nothing saved yet: still the form, no other question, no refusal
    expect(await page.getByRole('heading', { name: 'BRK-E2E-VFD-005' }).count()).toBe(0);
    expect(await page.getByTestId('save-problem').count()).toBe(0);

    await question.getByRole('button', { name: 'Save anyway' }).click();
    await page.getByRole('heading', { name: 'BRK-E2E-VFD-005' }).waitFor();
    expect(console.problems).toEqual([]);
  }, 180_000);

  it('when a marked wait of 0 minutes is entered, then the form refuses it beside the field', async () => {
    const { page } = await browser();
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: '/register/cabinets/new' });
    await page.getByRole('heading', { name: 'Add a cabinet' }).waitFor();
    await page.getByLabel('Marked discharge wait time').fill('0');
    await page.getByRole('button', { name: 'Add cabinet' }).click();
    await page.getByTestId('error-markedWaitMinutes').waitFor();
    await eventually(() => page.getByTestId('error-markedWaitMinutes').textContent()).toBe(
      'The marked wait time is at least 1 minute; leave it empty when none is marked.',
    );
  }, 180_000);

  it('when "Reformed today" is pressed on a spare bank, then its design stays', async () => {
    const { page } = await browser();
    await signIn(page, 'tomas', 'tidewater-plan', { returnTo: '/register/spares?q=BRK-SP-001' });
    await page.getByRole('link', { name: 'BRK-SP-001' }).click();
    await page.getByRole('heading', { name: 'BRK-SP-001' }).waitFor();
    const design = detail(page, 'Bank design');
    await eventually(() => design.textContent()).toMatch(/^EL-/);
    const designBefore = await design.textContent();

    await page.getByRole('button', { name: 'Reformed today' }).click();
    const today = new Date().toLocaleDateString('en-GB', {
      day: 'numeric',
      month: 'short',
      year: 'numeric',
      timeZone: 'UTC',
    });
    await eventually(() => detail(page, 'Last reformed').textContent()).toBe(today);
    expect(await design.textContent()).toBe(designBefore);
    await page.reload();
    await eventually(() => detail(page, 'Bank design').textContent()).toBe(designBefore);
  }, 180_000);
});
