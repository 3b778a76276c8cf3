import pg from 'pg';
import { describe, expect, inject, it } from 'vitest';
import { SAFETY_CHECKS } from '../../shared/constants/decay-runs';
import { captureScheduleSeconds } from '../../shared/domain/capture-schedule';
import { browsersClosedAfterEach, PHONE_VIEWPORT, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { eventually } from '../support/eventually';
import { signIn } from '../support/sign-in';

const browser = browsersClosedAfterEach();

interface PlannedVisit {
  id: string;
  tag: string;
}

/**
 * One of the technician's planned visits, latest first (`skip` 0 is the latest), read from the
 * database: the latest are furthest out, away from the visits other tests look at.
 */
async function lastPlannedVisitOf(email: string, skip = 0): Promise<PlannedVisit> {
  const client = new pg.Client({ connectionString: inject('databaseUrl') });
  await client.connect();
  try {
    const { rows } = await client.query<PlannedVisit>(
      `SELECT v.id, c.tag
         FROM visits v JOIN visit_technicians vt ON vt.visit_id = v.id JOIN users u ON u.id = vt.user_id
         JOIN cabinets c ON c.id = v.cabinet_id
        WHERE u.email = $1 AND v.state = 'planned' AND v.planned_end_at > now()
        ORDER BY v.planned_start_at DESC LIMIT 1 OFFSET $2`,
      [email, skip],
    );
    expect(rows).toHaveLength(1);
    return rows[0]!;
  } finally {
    await client.end();
  }
}

const GATE = SAFETY_CHECKS.filter((c) => c.when === 'before');
const ABSENCE = SAFETY_CHECKS.find((c) => c.key === 'absenceOfVoltageVerified')!;

describe('Guided capture at the cabinet (technician, phone)', () => {
  it('when Lucia starts a visit, passes the safety gate and types the readings at the prompts, then the chart and the verdict follow and the run is saved', async () => {
    const visit = await lastPlannedVisitOf('lucia@brackenmoor.example');
    const { page } = await browser(PHONE_VIEWPORT);
    const console = watchConsole(page);
    await signIn(page, 'lucia', 'tidewater-tech', { returnTo: `/my-visits/${visit.id}` });
    await page.getByRole('heading', { name: visit.tag }).waitFor();

    // the clock the page runs on is the test's from here: the prompts come when the test says
    await page.clock.install();
    await page.reload();
    await page.getByRole('heading', { name: visit.tag }).waitFor();
    await page.getByRole('button', { name: 'Start visit' }).click();
    await page.getByRole('heading', { name: 'At the cabinet' }).waitFor();

    // the bank's expected τ and bus voltage, as the page has them
    const facts = await page.evaluate(async (visitId) => {
      const v = (await (await fetch(`/api/visits/${visitId}`)).json()) as {
        banks: {
          id: string;
          position: string;
          baselineTauSeconds: number;
          lastTauSeconds?: number | null;
        }[];
      };
      const bank = v.banks[0]!;
      const record = (await (await fetch(`/api/banks/${bank.id}`)).json()) as {
        cabinetDcBusVolts: number | null;
      };
      return {
        position: bank.position,
        expectedTauSeconds: bank.lastTauSeconds ?? bank.baselineTauSeconds,
        baselineTauSeconds: bank.baselineTauSeconds,
        busVolts: record.cabinetDcBusVolts,
        bankCount: v.banks.length,
      };
    }, visit.id);
    const v0 = facts.busVolts ?? 560;
    // the prompts come from the bank's expected τ (its last accepted run); the bank on the day
    // discharges with its baseline τ, as a bank that has not aged since its baseline does
    const tau = facts.baselineTauSeconds;
    const schedule = captureScheduleSeconds(facts.expectedTauSeconds);
    // past the schedule's end the prompts go on at its last spacing, as on the phone
    const lastGap = schedule.at(-1)! - schedule.at(-2)!;
    while (schedule.at(-1)! < 6 * tau) schedule.push(schedule.at(-1)! + lastGap);

    await page.getByRole('button', { name: `Measure bank ${facts.position}` }).click();
    // the gate: the marked wait, the estimate, the caution, and Continue only when all four are ticked
    await page.getByTestId('safety-gate').waitFor();
    await page.getByTestId('safety-gate').getByTestId('discharge-caution').waitFor();
    const proceed = page.getByRole('button', { name: 'Continue to the readings' });
    expect(await proceed.isDisabled()).toBe(true);
    for (const [i, check] of GATE.entries()) {
      expect(await proceed.isDisabled()).toBe(true);
      await page.getByRole('checkbox', { name: check.sentence }).check();
      if (i === 0) await screenshot(page, 'capture-gate-phone');
    }
    await eventually(() => proceed.isDisabled()).toBe(false);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );
    await proceed.click();

    await page.getByRole('button', { name: /^Guided capture now/ }).click();
    // time stands still from here until the test moves it
    const startAt = Date.now() + 60_000;
    await page.clock.pauseAt(startAt);
    await page.getByRole('button', { name: 'Start: isolated now' }).click();
    const clock = page.getByRole('timer', { name: 'Time since isolation' });
    await eventually(() => clock.textContent()).toBe('0:00');

    const prompt = page.getByTestId('capture-prompt');
    const voltage = page.getByRole('textbox', { name: 'DC-bus voltage' });
    const verdictLine = page.getByTestId('live-verdict');
    let elapsedMs = 0;
    let typed = 0;
    let sawTrustworthy = false;
    for (const t of schedule) {
      // a prompt that passed while the page reloaded is left out, as a technician would miss it
      if (t * 1000 <= elapsedMs) continue;
      await page.clock.fastForward(t * 1000 - elapsedMs);
      elapsedMs = t * 1000;
      await eventually(() => prompt.getAttribute('data-due')).toBe('true');
      await eventually(() => prompt.textContent()).toContain(`for ${clockFor(t)}`);
      const volts = Math.round(v0 * Math.exp(-t / tau) * 10) / 10;
      // a comma decimal, as a phone keyboard in many countries types it
      await voltage.fill(String(volts).replace('.', ','));
      await page.getByRole('button', { name: 'Record reading' }).click();
      typed++;
      await eventually(() => page.getByTestId('capture-reading').count()).toBe(typed);
      // below 50 V the capture ends by itself
      if (volts < 50) break;
      await eventually(() => page.getByTestId('capture-last-stamp').textContent()).toContain(
        `at ${clockFor(t)}: the time of the prompt`,
      );
      if (typed === 4) {
        // a reload (or a tab closed and opened again) finds the run where it was
        await page.reload();
        // the page's own timers (the query cache's notices) wait on the paused clock: let it
        // step on a little at a time until the run is back
        await eventually(async () => {
          await page.clock.runFor(20);
          return page.getByTestId('capture-reading').count();
        }).toBe(4);
        await page.getByRole('heading', { name: 'Guided capture' }).waitFor();
        elapsedMs = (await page.evaluate(() => Date.now())) - startAt;
        // the clock goes on from the moment of isolation, not from the reload
        const shown = [clockFor(elapsedMs / 1000), clockFor(elapsedMs / 1000 - 1)];
        await eventually(async () => shown.includes((await clock.textContent()) ?? '')).toBe(true);
      }
      if (typed === 3) {
        await page.getByTestId('decay-plot').waitFor();
        await screenshot(page, 'capture-first-readings-phone');
      }
      if (!sawTrustworthy && (await verdictLine.getAttribute('data-trustworthy')) === 'true') {
        sawTrustworthy = true;
        await eventually(() => verdictLine.textContent()).toMatch(/^Healthy: /);
        await screenshot(page, 'capture-verdict-phone');
      }
    }
    expect(typed).toBeGreaterThanOrEqual(5);
    // the live verdict came while readings were still being taken
    expect(sawTrustworthy).toBe(true);
    await eventually(() => verdictLine.textContent()).toMatch(/^Healthy: the bank keeps/);
    expect(
      await page
        .getByRole('img', { name: /Readings against the fitted decay: \d+ used, 0 left out/ })
        .count(),
    ).toBe(1);

    // below 50 V the capture ends; absence of voltage is confirmed before anything else
    await page.getByTestId('capture-ended').waitFor();
    const onward = page.getByRole('button', { name: 'Continue to the observations' });
    expect(await onward.isDisabled()).toBe(true);
    await page.getByRole('checkbox', { name: ABSENCE.sentence }).check();
    // the capture's timing is over: the page's clock runs freely again
    await page.clock.resume();
    await screenshot(page, 'capture-ended-phone');
    await onward.click();

    await page.getByTestId('observations-form').waitFor();
    await page.getByRole('textbox', { name: 'Bank temperature' }).fill('31');
    await page.getByRole('textbox', { name: 'Meter used' }).fill('Corrand DM-40');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );
    await screenshot(page, 'capture-observations-phone');
    await page.getByRole('button', { name: 'Save the run' }).click();

    const status = page.getByTestId('saved-run-status');
    await eventually(() => status.getAttribute('data-status')).toMatch(/^(ready|sending|sent)$/);
    await page.getByTestId('run-verdict').waitFor();
    await screenshot(page, 'capture-saved-phone');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );
    // the phone sends it by itself; the bank then reads as sent with its health
    await eventually(() => status.getAttribute('data-status')).toBe('sent');
    await page.getByRole('button', { name: 'Back to the banks' }).click();
    const row = page.getByTestId(`capture-bank-${facts.position}`);
    await eventually(() => row.textContent()).toContain('sent: healthy');
    await page.getByRole('button', { name: 'Mark as logged' }).click();
    // "Are you sure?" only while a bank of the visit has no run sent
    const warning = page.getByTestId('unsent-runs-warning');
    if (facts.bankCount > 1) {
      await eventually(() => warning.textContent()).toMatch(
        /^Are you sure\?No decay run has been sent/,
      );
    } else {
      expect(await warning.count()).toBe(0);
    }
    await page.getByRole('button', { name: 'Yes, mark as logged' }).waitFor();
    await screenshot(page, 'capture-mark-logged-phone');
    expect(console.problems).toEqual([]);
  }, 240_000);

  it('when readings are typed from a paper sheet and a bulged can is noted, then the verdict is end of life with a safety finding', async () => {
    const visit = await lastPlannedVisitOf('lucia@brackenmoor.example', 1);
    const { page } = await browser(PHONE_VIEWPORT);
    const console = watchConsole(page);
    await signIn(page, 'lucia', 'tidewater-tech', { returnTo: `/my-visits/${visit.id}` });
    await page.getByRole('heading', { name: visit.tag }).waitFor();
    await page.getByRole('button', { name: 'Start visit' }).click();
    await page.getByRole('heading', { name: 'At the cabinet' }).waitFor();
    await page
      .getByRole('button', { name: /^Measure bank / })
      .first()
      .click();
    for (const check of GATE) await page.getByRole('checkbox', { name: check.sentence }).check();
    await page.getByRole('button', { name: 'Continue to the readings' }).click();
    await page.getByTestId('choose-method').waitFor();
    await screenshot(page, 'capture-method-phone');
    await page.getByRole('button', { name: /^Type readings from a paper sheet/ }).click();

    // a sheet kept at the cabinet: m:ss and comma decimals, as people write them
    const sheet = [
      ['0:10', '505'],
      ['0:30', '441'],
      ['1:00', '360,5'],
      ['1:30', '294'],
      ['2:00', '240'],
      ['3:00', '160'],
      ['4:00', '107'],
    ];
    for (const [i, [time, volts]] of sheet.entries()) {
      await page
        .getByRole('textbox', { name: `Row ${i + 1}: time since isolation, seconds` })
        .fill(time!);
      await page.getByRole('textbox', { name: `Row ${i + 1}: DC-bus voltage, volts` }).fill(volts!);
    }
    await page.getByTestId('paper-sheet').getByTestId('decay-plot').waitFor();
    await screenshot(page, 'capture-paper-sheet-phone');
    await page.getByRole('button', { name: 'Use these readings' }).click();

    const finish = page.getByTestId('capture-finish');
    await finish.waitFor();
    await page.getByRole('button', { name: 'Bulged can' }).click();
    await eventually(() =>
      page.getByRole('button', { name: 'Bulged can' }).getAttribute('aria-pressed'),
    ).toBe('true');
    await eventually(() => page.getByTestId('visual-finding-note').textContent()).toContain(
      'end of life',
    );
    const save = page.getByRole('button', { name: 'Save the run' });
    // absence of voltage is confirmed before the run can be saved
    expect(await save.isDisabled()).toBe(true);
    await page.getByRole('checkbox', { name: ABSENCE.sentence }).check();
    await screenshot(page, 'capture-visual-finding-phone');
    await save.click();

    await page.getByTestId('run-verdict').waitFor();
    await eventually(() => page.getByTestId('run-verdict').textContent()).toMatch(
      /End of life.*A bulged can was seen/,
    );
    await eventually(() => page.getByTestId('saved-run-status').getAttribute('data-status')).toBe(
      'sent',
    );
    await page.getByRole('button', { name: 'Back to the banks' }).click();
    await eventually(() => page.getByTestId('capture-banks').textContent()).toContain(
      'sent: end of life',
    );
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );
    expect(console.problems).toEqual([]);
  }, 180_000);
});

/** m:ss, as the capture's clock shows it. */
function clockFor(seconds: number): string {
  return `${Math.floor(seconds / 60)}:${String(Math.floor(seconds % 60)).padStart(2, '0')}`;
}
