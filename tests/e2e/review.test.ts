/**
 * Review (reliability engineer, phone): a logged visit with two decay runs is in the queue; one
 * run is queried with a comment for the technician, the other accepted as its bank's baseline;
 * the visit shows reviewed, and the technician reads the comment on his visit. The visit and its runs are made through the services, as the
 * technician's phone would have left them.
 */
import { afterAll, describe, expect, inject, it } from 'vitest';
import type { AuthUser } from '../../api/src/types/express';
import type { Role } from '../../shared/constants/roles';
import { browsersClosedAfterEach, PHONE_VIEWPORT, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { validRunInput } from '../support/decay-runs';
import { eventually } from '../support/eventually';
import { signIn } from '../support/sign-in';

const browser = browsersClosedAfterEach();

// the services below write to the product's own database (the one the e2e server serves)
process.env.DATABASE_URL = inject('databaseUrl');
const { sequelize } = await import('../../api/src/db/sequelize');
const { withUnitOfWork } = await import('../../api/src/services/unit-of-work');
const { recordDecayRun } = await import('../../api/src/services/decay-runs');
const { transitionVisit } = await import('../../api/src/services/visits');
const { makePlace, storeVisit } = await import('../support/planner-visits');
const { decayRunInputSchema } = await import('../../shared/schemas/decay-run');

afterAll(async () => {
  await sequelize.close();
});

/** A demo person as the services take them. */
async function person(email: string): Promise<AuthUser> {
  const [rows] = (await sequelize.query('SELECT id, name, email, roles FROM users WHERE email = $1', { bind: [email] })) as [
    Array<{ id: string; name: string; email: string; roles: Role[] }>,
    unknown,
  ];
  const found = rows[0];
  if (!found) throw new Error(`no demo person ${email}`);
  return found;
}

/**
 * A cabinet of two new banks (nameplate baselines) at a site of its own, and Dario's visit to it:
 * started an hour ago, a guided run on each bank, then logged.
 */
async function loggedVisitWithTwoRuns() {
  const planner = await person('tomas@brackenmoor.example');
  const dario = await person('dario@brackenmoor.example');
  const place = await makePlace(planner, 'Europe/London');
  const start = new Date(Date.now() - 3_600_000);
  const visit = await storeVisit({
    cabinetId: place.cabinet.id,
    bankIds: place.banks.map((b) => b.id),
    technicianIds: [dario.id],
    plannedStartAt: start,
    plannedEndAt: new Date(start.getTime() + 3 * 3_600_000),
    state: 'under-way',
  });
  const isolatedAt = new Date(Date.now() - 30 * 60_000).toISOString();
  for (const bank of place.banks) {
    const input = decayRunInputSchema.parse(validRunInput(bank.id, { isolatedAt }));
    await withUnitOfWork(dario, (uow) => recordDecayRun(uow, visit.id, input));
  }
  const [rows] = (await sequelize.query('SELECT version FROM visits WHERE id = $1', { bind: [visit.id] })) as [Array<{ version: number }>, unknown];
  await withUnitOfWork(dario, (uow) => transitionVisit(uow, visit.id, { action: 'log', version: rows[0]!.version }));
  return { visitId: visit.id, tag: place.cabinet.tag, banks: place.banks };
}

describe('Review (reliability engineer, phone)', () => {
  it('when Ines queries one run with a comment and accepts the other as the baseline, then the visit shows reviewed and Dario reads the comment on his visit', async () => {
    const { visitId, tag, banks } = await loggedVisitWithTwoRuns();
    const [queried, accepted] = banks;
    const { page } = await browser(PHONE_VIEWPORT);
    const console = watchConsole(page);
    await signIn(page, 'ines', 'tidewater-rel', { returnTo: '/review' });
    await page.getByRole('heading', { name: 'Review', exact: true }).waitFor();

    const visit = page.getByTestId('review-visit').filter({ has: page.getByRole('heading', { name: tag, exact: true }) });
    await visit.waitFor();
    // the visit waiting longest is open; any other opens with a tap
    const toggle = visit.getByRole('button', { name: /^(Show the runs? and photos|Hide the runs)$/ });
    if ((await toggle.getAttribute('aria-expanded')) === 'false') await toggle.click();
    // each run with its chart and its verdict, and the caution of a cabinet's discharge
    await eventually(() => visit.getByTestId('decay-plot').count()).toBe(2);
    await eventually(() => visit.getByTestId('run-verdict').count()).toBe(2);
    await visit.getByTestId('discharge-caution').first().waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await screenshot(page, 'review-queue-phone');

    // a query needs a comment: said beside the field, nothing sent
    const first = visit.getByTestId('review-run').filter({ hasText: `Bank ${queried!.position} ` });
    await first.getByRole('button', { name: 'Query' }).click();
    await eventually(() => first.getByText('so the technician can put it right').count()).toBe(1);
    const comment = 'The readings stop at 200 V: take the next run down to 50 V.';
    await first.getByLabel('Comment for the technician').fill(comment);
    await first.getByRole('button', { name: 'Query' }).click();
    await eventually(() => first.getByTestId('review-outcome').textContent()).toContain(`Queried by Ines Carvell`);
    await eventually(() => first.getByTestId('review-outcome').textContent()).toContain(comment);

    // the other run: accepted as the bank's baseline
    const second = visit.getByTestId('review-run').filter({ hasText: `Bank ${accepted!.position} ` });
    await second.getByRole('checkbox', { name: /Use this run as the baseline/ }).check();
    await second.getByRole('button', { name: 'Accept' }).click();

    // the visit's last run is reviewed: the visit is reviewed (and stays on screen, under "Reviewed just now")
    const done = page
      .getByRole('region', { name: 'Reviewed just now' })
      .getByTestId('review-visit')
      .filter({ has: page.getByRole('heading', { name: tag, exact: true }) });
    await eventually(() => done.getByRole('status').textContent()).toContain('the visit is reviewed');
    await eventually(() => done.getByTestId('review-run').filter({ hasText: `Bank ${accepted!.position} ` }).textContent()).toContain(
      'baseline of this bank',
    );
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await screenshot(page, 'review-done-phone');

    const [stored] = (await sequelize.query(
      `SELECT v.state, b.baseline_source, b.baseline_decay_run_id,
              (SELECT review_comment FROM decay_runs WHERE bank_id = $2 AND visit_id = v.id) AS comment
         FROM visits v JOIN banks b ON b.id = $3 WHERE v.id = $1`,
      { bind: [visitId, queried!.id, accepted!.id] },
    )) as [Array<{ state: string; baseline_source: string; baseline_decay_run_id: string | null; comment: string }>, unknown];
    expect(stored[0]).toMatchObject({ state: 'reviewed', baseline_source: 'decay-run', comment });
    expect(stored[0]!.baseline_decay_run_id).not.toBeNull();
    expect(console.problems).toEqual([]);

    // the comment goes back to the technician: Dario reads it on his visit
    const technician = await browser(PHONE_VIEWPORT);
    const technicianConsole = watchConsole(technician.page);
    await signIn(technician.page, 'dario', 'tidewater-tech', { returnTo: `/my-visits/${visitId}` });
    await technician.page.getByRole('heading', { name: tag }).first().waitFor();
    await eventually(() => technician.page.getByTestId('visit-runs').textContent()).toContain(comment);
    expect(await technician.page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await screenshot(technician.page, 'review-comment-technician-phone');
    expect(technicianConsole.problems).toEqual([]);
  });
});
