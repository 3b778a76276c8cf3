/**
 * Stored decay runs in the web: a run sent through the API (as the technician's phone sends it)
 * shows in its bank's history, opens its page with the verdict in plain sentences, and a
 * correction with a reason makes version 2 with both versions visible. At 390 px and on a desktop.
 */
import type { Locator, Page } from 'playwright-core';
import { afterAll, describe, expect, inject, it } from 'vitest';
import type { AuthUser } from '../../api/src/types/express';
import type { Role } from '../../shared/constants/roles';
import type { DecayRun } from '../../shared/schemas/decay-run';
import {
  browsersClosedAfterEach,
  DESKTOP_VIEWPORT,
  PHONE_VIEWPORT,
  screenshot,
} from '../support/browser';
import { watchConsole } from '../support/console';
import { validRunInput } from '../support/decay-runs';
import { eventually } from '../support/eventually';
import { signIn } from '../support/sign-in';

const browser = browsersClosedAfterEach();

// the register and the visit are made through the services, in the database the e2e server serves
process.env.DATABASE_URL = inject('databaseUrl');
const { sequelize } = await import('../../api/src/db/sequelize');
const { storeVisit } = await import('../support/planner-visits');
const { makeArea, makeBank, makeCabinet, makeDesign, makeSite } =
  await import('../support/register');

afterAll(async () => {
  await sequelize.close();
});

async function person(email: string): Promise<AuthUser> {
  const [rows] = (await sequelize.query(
    'SELECT id, name, email, roles FROM users WHERE email = $1',
    { bind: [email] },
  )) as [Array<{ id: string; name: string; email: string; roles: Role[] }>, unknown];
  if (!rows[0]) throw new Error(`no demo person ${email}`);
  return rows[0];
}

/**
 * A cabinet with a 540 V bus and a 15 min marked wait, one bank of the test design (3 strings of
 * 2 × 4700 µF = 7050 µF, 47 kΩ bleeder, +0.25 %/K), and Dario's visit to it, under way.
 */
async function visitUnderWay() {
  const planner = await person('tomas@brackenmoor.example');
  const dario = await person('dario@brackenmoor.example');
  const unique = crypto.randomUUID().slice(0, 6).toUpperCase();
  const site = await makeSite(planner, {
    name: `Run History Works ${unique}`,
    code: `RH${unique}`,
  });
  const area = await makeArea(planner, site.id);
  const cabinet = await makeCabinet(planner, area.id, {
    tag: `RH-VFD-${unique}`,
    markedWaitMinutes: 15,
  });
  const design = await makeDesign(planner, { code: `RH-${unique}` });
  const bank = await makeBank(planner, cabinet.id, design.id, 'DC1');
  const start = new Date(Date.now() - 3_600_000);
  const visit = await storeVisit({
    cabinetId: cabinet.id,
    bankIds: [bank.id],
    technicianIds: [dario.id],
    plannedStartAt: start,
    plannedEndAt: new Date(start.getTime() + 3 * 3_600_000),
    state: 'under-way',
  });
  return { visitId: visit.id, bankId: bank.id, tag: cabinet.tag };
}

/** A JSON POST from the signed-in page, as the web app sends it (session cookie and CSRF token). */
async function postFromPage(
  page: Page,
  path: string,
  body: unknown,
): Promise<{ status: number; body: unknown }> {
  return page.evaluate(
    async ({ path, body }) => {
      const me = (await (
        await fetch('/api/me', { headers: { Accept: 'application/json' } })
      ).json()) as { csrfToken: string };
      const response = await fetch(path, {
        method: 'POST',
        headers: {
          Accept: 'application/json',
          'Content-Type': 'application/json',
          'X-CSRF-Token': me.csrfToken,
        },
        body: JSON.stringify(body),
      });
      return { status: response.status, body: (await response.json()) as unknown };
    },
    { path, body },
  );
}

/** Dario signs in on the page and sends a run of his visit under way; the run as stored. */
async function runSentByDario(page: Page, visitId: string, bankId: string): Promise<DecayRun> {
  await signIn(page, 'dario', 'tidewater-tech', { returnTo: '/my-visits' });
  const sent = await postFromPage(page, `/api/visits/${visitId}/decay-runs`, validRunInput(bankId));
  expect(sent.status).toBe(201);
  return sent.body as DecayRun;
}

/** A locator's text with non-breaking spaces (kept between a figure and its unit) read as spaces. */
function textOf(locator: Locator): () => Promise<string> {
  return async () => ((await locator.textContent()) ?? '').replace(/\u00a0/g, ' ');
}

/** Follows a run's link to its page and waits for its verdict: healthy, τ about a third every 5.5 minutes. */
async function openHealthyRun(page: Page, link: Locator, runId: string): Promise<Locator> {
  await link.click();
  await page.waitForURL((url) => url.pathname === `/runs/${runId}`);
  const detail = page.getByTestId('run-detail');
  await eventually(textOf(detail.getByTestId('verdict-health-word'))).toBe('Healthy');
  // DOMAIN.md: after 1 τ 36.8 % remains ("about a third"); 329.8 s / 60 = 5.5 minutes
  await eventually(textOf(detail.getByTestId('verdict-tau-sentence'))).toMatch(
    /^The voltage fell to about a third every 5\.5 minutes/,
  );
  return detail;
}

async function noSidewaysScroll(page: Page, width: number) {
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
    width,
  );
}

describe('Stored decay runs: bank history, run page, correction', () => {
  it('when Dario sends a run and corrects it on a phone, then the bank history lists it, its page explains the verdict, and version 2 stands beside version 1', async () => {
    const { visitId, bankId } = await visitUnderWay();
    const { page } = await browser(PHONE_VIEWPORT);
    const console = watchConsole(page);
    await signIn(page, 'dario', 'tidewater-tech', { returnTo: `/register/banks/${bankId}` });

    // the run as the phone sends it: guided readings of τ ≈ 329.8 s from 540 V, recorded at 28 °C
    const isolatedAt = new Date(Date.now() - 30 * 60_000).toISOString();
    const sent = await postFromPage(
      page,
      `/api/visits/${visitId}/decay-runs`,
      validRunInput(bankId, { isolatedAt }),
    );
    expect(sent.status).toBe(201);
    const run = sent.body as DecayRun;

    // the bank page lists it in its history, newest first
    await page.goto(`${inject('baseUrl')}/register/banks/${bankId}`);
    const history = page.getByTestId('bank-run-history');
    await eventually(() => history.getByTestId('bank-run-row').count()).toBe(1);
    const row = history.getByTestId('bank-run-row').first();
    await eventually(() => row.textContent()).toMatch(/330 s.*98 %.*healthy.*waiting/);
    // the decay check points to recording runs on a visit
    await eventually(() => page.getByTestId('decay-not-stored').textContent()).toContain(
      "To record a decay run, open this bank's visit",
    );
    expect(await page.getByTestId('bank-run-history').count()).toBe(1);
    await noSidewaysScroll(page, 390);
    await screenshot(page, 'run-history-bank-phone');

    // its page: the verdict in plain sentences
    const detail = await openHealthyRun(page, row.getByRole('link').first(), run.id);
    expect(await textOf(detail.getByTestId('verdict-tau-sentence'))()).toMatch(/ \(τ = 330 s, /);
    // C = 329.8 s / (47 kΩ ∥ 10 MΩ) = 7050 µF at 28 °C; at 20 °C with +0.25 %/K: 7050 / 1.02 = 6,910 µF, 98 % of 7,050 µF
    await eventually(textOf(detail.getByTestId('verdict-capacitance-sentence'))).toMatch(
      /^The bank holds 6,910 µF \(corrected to 20 °C\), 98 % of the nameplate's 7,050 µF/,
    );
    // bus τ = 7050 µF × 47 kΩ = 331 s; 540 V → 50 V: 331 × ln(10.8) = 788 s → 14 minutes (rounded up), under the marked 15
    await eventually(textOf(detail.getByTestId('verdict-safe-after'))).toContain(
      "Approach the DC bus no sooner than 15 minutes after isolation, the cabinet's marked wait (this run says it falls below 50 V within 14 minutes)",
    );
    await eventually(textOf(detail.getByTestId('verdict-next-step'))).toMatch(
      /No action now: check this bank again by /,
    );
    await detail.getByTestId('discharge-caution').waitFor();
    await eventually(() => detail.getByTestId('run-safety-record').textContent()).toContain(
      'Lockout/tagout is applied',
    );
    await eventually(() => detail.getByTestId('run-recorded-by').textContent()).toMatch(
      /^By Dario /,
    );
    await noSidewaysScroll(page, 390);
    await screenshot(page, 'run-detail-phone');

    // a correction: a reading typed wrong, put right with the reason
    await detail.getByRole('button', { name: 'Correct this run' }).click();
    const form = page.getByTestId('correction-form');
    await form.getByRole('button', { name: 'Store as version 2' }).click();
    // the reason is required: said beside the field, nothing sent
    await eventually(() => form.getByTestId('error-correction-reason').textContent()).toContain(
      'Say why the run is corrected',
    );
    const reason = 'Row 3 was typed from the wrong column of the sheet; the sheet says 300 V.';
    await form.getByLabel('Why is this run corrected?').fill(reason);
    await form.getByLabel('Row 3: DC-bus voltage, volts').fill('300');
    await screenshot(page, 'run-correction-phone');
    const seen: string[] = [];
    page.on('framenavigated', (frame) => seen.push(`navigated ${frame.url()}`));
    page.on('request', (request) => seen.push(`${request.method()} ${request.url()}`));
    page.on('response', (response) => seen.push(`${response.status()} ${response.url()}`));
    await form.getByRole('button', { name: 'Store as version 2' }).click();

    // version 2 opens, says what it corrects, and lists both versions
    await page
      .locator('[data-testid="run-correction-reason"], [data-testid="correction-error"]')
      .first()
      .waitFor()
      .catch(async (error: unknown) => {
        await screenshot(page, 'run-correction-stuck-phone');
        throw new Error(`${String(error)}\n${seen.join('\n')}\n${console.problems.join('\n')}`);
      });
    expect(
      await form.getByTestId('correction-error').count(),
      (await form.getByTestId('correction-error').allTextContents()).join(),
    ).toBe(0);
    await page.waitForURL((url) => url.pathname !== `/runs/${run.id}`);
    const second = page.getByTestId('run-detail');
    await eventually(() => second.getAttribute('data-version')).toBe('2');
    await eventually(() => second.getByTestId('run-correction-reason').textContent()).toBe(
      `Version 2 corrects version 1: ${reason}`,
    );
    await eventually(() => second.getByTestId('run-versions').locator('li').count()).toBe(2);
    await eventually(() => second.getByTestId('run-version-1').textContent()).toContain(
      'corrected',
    );
    await eventually(() => second.getByTestId('run-version-2').textContent()).toContain(
      `Version 2 corrects version 1: ${reason}`,
    );
    await noSidewaysScroll(page, 390);
    await screenshot(page, 'run-version-2-phone');

    // version 1 stays readable, pointing to its correction
    await second.getByRole('link', { name: 'Open version 1' }).click();
    await page.waitForURL((url) => url.pathname === `/runs/${run.id}`);
    await page.getByTestId('run-superseded').waitFor();
    expect(await page.getByRole('button', { name: 'Correct this run' }).count()).toBe(0);

    // the bank's history holds both, the correction first
    await page.goto(`${inject('baseUrl')}/register/banks/${bankId}`);
    await eventually(() => history.getByTestId('bank-run-row').count()).toBe(2);
    expect(
      await history
        .getByTestId('bank-run-row')
        .evaluateAll((rows) => rows.map((r) => r.getAttribute('data-version'))),
    ).toEqual(['2', '1']);
    await eventually(() => history.getByTestId('bank-run-row').nth(1).textContent()).toContain(
      'corrected',
    );
    await screenshot(page, 'run-history-two-versions-phone');
    expect(console.problems).toEqual([]);
  });

  it('when Ines queries a run of a logged visit, then Dario sees her comment on his visit at 390 px and corrects the run there', async () => {
    const { visitId, bankId } = await visitUnderWay();
    const phone = await browser(PHONE_VIEWPORT);
    const console = watchConsole(phone.page);
    const run = await runSentByDario(phone.page, visitId, bankId);
    const visit = (await phone.page.evaluate(
      async (id) =>
        (await fetch(`/api/visits/${id}`, { headers: { Accept: 'application/json' } })).json(),
      visitId,
    )) as { version: number };
    const logged = await postFromPage(phone.page, `/api/visits/${visitId}/transitions`, {
      action: 'log',
      version: visit.version,
    });
    expect(logged.status).toBe(200);

    const reviewer = await browser(DESKTOP_VIEWPORT);
    await signIn(reviewer.page, 'ines', 'tidewater-rel', { returnTo: '/review' });
    const comment = 'The readings stop at 200 V: the last rows are missing from the sheet.';
    const queried = await postFromPage(reviewer.page, `/api/decay-runs/${run.id}/review`, {
      outcome: 'queried',
      comment,
    });
    expect(queried.status).toBe(200);

    await phone.page.goto(`${inject('baseUrl')}/my-visits/${visitId}`);
    const runs = phone.page.getByTestId('visit-runs');
    const item = runs
      .getByTestId('visit-run')
      .filter({ has: phone.page.getByTestId('run-review-comment') });
    await eventually(() => item.getByTestId('run-review-comment').textContent()).toBe(comment);
    await eventually(() => runs.getByTestId('visit-runs-queried').textContent()).toContain(
      'One run is queried',
    );
    await noSidewaysScroll(phone.page, 390);
    await screenshot(phone.page, 'visit-runs-queried-phone');

    await item.getByRole('button', { name: 'Correct this run' }).click();
    const form = item.getByTestId('correction-form');
    await form
      .getByLabel('Why is this run corrected?')
      .fill('Added the last rows from the back of the sheet.');
    await form.getByLabel(/^Row 21: time since isolation/).fill('1700');
    await form.getByLabel('Row 21: DC-bus voltage, volts').fill('3.1');
    await form.getByRole('button', { name: 'Store as version 2' }).click();
    // the list shows the current version: version 2, waiting for review again
    const current = runs.getByTestId('visit-run').filter({ hasText: 'version 2' });
    await eventually(() => current.getAttribute('data-review')).toBe('pending');
    await eventually(() => runs.getByTestId('visit-run').count()).toBe(1);
    await eventually(() => current.getByTestId('visit-run-correction').textContent()).toBe(
      'Corrects version 1: Added the last rows from the back of the sheet.',
    );
    await screenshot(phone.page, 'visit-runs-corrected-phone');
    expect(console.problems).toEqual([]);
  });

  it('when Ines opens a stored run on a desktop, then the same plain sentences read and a reliability engineer may correct it', async () => {
    const { visitId, bankId } = await visitUnderWay();
    // the technician's phone sent the run
    const phone = await browser(PHONE_VIEWPORT);
    const run = await runSentByDario(phone.page, visitId, bankId);

    const { page } = await browser(DESKTOP_VIEWPORT);
    const console = watchConsole(page);
    await signIn(page, 'ines', 'tidewater-rel', { returnTo: `/register/banks/${bankId}` });
    const history = page.getByTestId('bank-run-history');
    await eventually(() => history.getByTestId('bank-run-row').count()).toBe(1);
    await screenshot(page, 'run-history-bank-desktop');
    const detail = await openHealthyRun(page, history.getByRole('link').first(), run.id);
    // a reliability engineer may correct a run too
    await detail.getByRole('button', { name: 'Correct this run' }).waitFor();
    await noSidewaysScroll(page, DESKTOP_VIEWPORT.width);
    await screenshot(page, 'run-detail-desktop');
    expect(console.problems).toEqual([]);
  });
});
