/**
 * The whole visit at the cabinet on a phone, as issue 11's "Done when" tells it: a technician
 * signs in, opens a visit, starts it, passes the safety gate, types the readings at the prompts
 * (the test drives the page's clock), sees the verdict, adds a photo and a run from a logger
 * file, then loses the connection, saves another run, reloads without a connection (the service
 * worker serves the app; the run is still on the phone) and, back online, the run is sent once.
 * And a run in progress survives a closed tab, and one started online goes on after a reload
 * without a connection, from the facts kept with it.
 */
import path from 'node:path';
import sharp from 'sharp';
import type { Page } from 'playwright-core';
import { describe, expect, inject, it } from 'vitest';
import { SAFETY_CHECKS } from '../../shared/constants/decay-runs';
import { captureScheduleSeconds } from '../../shared/domain/capture-schedule';
import { browsersClosedAfterEach, PHONE_VIEWPORT, screenshot } from '../support/browser';
import { watchConsole } from '../support/console';
import { eventually } from '../support/eventually';
import { query } from '../support/product-database';
import { signIn } from '../support/sign-in';

const browser = browsersClosedAfterEach();

const GATE = SAFETY_CHECKS.filter((c) => c.when === 'before');
const ABSENCE = SAFETY_CHECKS.find((c) => c.key === 'absenceOfVoltageVerified')!;
const LOGGER_FILE = path.resolve('tests/fixtures/logger-files/plain-seconds.csv');
const RUN_POST = /\/api\/visits\/[0-9a-f-]+\/decay-runs$/;

interface PlannedVisit {
  id: string;
  tag: string;
}

/** Kofi's planned visits in the coming weeks, earliest first (the demo plans several; no other browser test uses them). */
async function plannedVisitsOfKofi(): Promise<PlannedVisit[]> {
  return query<PlannedVisit>(
    `SELECT v.id, c.tag
       FROM visits v JOIN visit_technicians vt ON vt.visit_id = v.id JOIN users u ON u.id = vt.user_id
       JOIN cabinets c ON c.id = v.cabinet_id
      WHERE u.email = 'kofi@brackenmoor.example' AND v.state = 'planned' AND v.planned_end_at > now()
      ORDER BY v.planned_start_at`,
    [],
  );
}

/** The stored runs with this clientId (the server keeps one at most). */
async function runsWithClientId(clientId: string): Promise<{ id: string; samples: unknown }[]> {
  return query('SELECT id, samples FROM decay_runs WHERE client_id = $1', [clientId]);
}

interface StoredDraft {
  clientId: string;
  visitId: string;
  status: string;
  body: { samples?: { tSeconds: number; volts: number }[]; source?: string };
  snapshot?: { cabinetTag: string; bankPosition: string; expectedTauSeconds: number; engine: unknown };
}

/** The drafts in this browser's IndexedDB, read with the plain API (what a reload would find). */
async function draftsInBrowser(page: Page): Promise<StoredDraft[]> {
  return page.evaluate(
    () =>
      new Promise<StoredDraft[]>((resolve, reject) => {
        const open = indexedDB.open('ebbline-drafts');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const db = open.result;
          if (!db.objectStoreNames.contains('drafts')) {
            db.close();
            resolve([]);
            return;
          }
          const all = db.transaction('drafts').objectStore('drafts').getAll();
          all.onsuccess = () => {
            db.close();
            resolve(all.result as StoredDraft[]);
          };
          all.onerror = () => reject(all.error);
        };
      }),
  );
}

/** The bank's expected τ and the cabinet's bus voltage, as the page has them. */
async function bankFacts(page: Page, visitId: string) {
  return page.evaluate(async (id) => {
    const visit = (await (await fetch(`/api/visits/${id}`)).json()) as {
      banks: { id: string; position: string; baselineTauSeconds: number; lastTauSeconds?: number | null }[];
    };
    const bank = visit.banks[0]!;
    const record = (await (await fetch(`/api/banks/${bank.id}`)).json()) as { cabinetDcBusVolts: number | null };
    return { position: bank.position, tauSeconds: bank.lastTauSeconds ?? bank.baselineTauSeconds, busVolts: record.cabinetDcBusVolts };
  }, visitId);
}

/** Opens the bank's run and passes the safety gate (the four checks ticked, then Continue). */
async function passSafetyGate(page: Page, position: string, again: boolean): Promise<void> {
  await page.getByRole('button', { name: again ? `Measure bank ${position} again` : `Measure bank ${position}` }).click();
  const gate = page.getByTestId('safety-gate');
  await gate.waitFor();
  await gate.getByTestId('discharge-caution').waitFor();
  for (const check of GATE) await page.getByRole('checkbox', { name: check.sentence }).check();
  await page.getByRole('button', { name: 'Continue to the readings' }).click();
  await page.getByTestId('choose-method').waitFor();
}

/** m:ss, as the capture's clock shows it. */
function clockFor(seconds: number): string {
  return `${Math.floor(seconds / 60)}:${String(Math.floor(seconds % 60)).padStart(2, '0')}`;
}

/** A small JPEG, as a phone's camera would hand one over. */
async function cabinetPhoto(): Promise<Buffer> {
  return sharp({ create: { width: 320, height: 240, channels: 3, background: '#5fb3b3' } }).jpeg({ quality: 80 }).toBuffer();
}

/**
 * Watches a page that will lose its connection: its problems (the requests that fail while the
 * connection is cut are part of the story) and the clientId of every run it POSTs.
 */
function watchOfflineRuns(page: Page): { console: { problems: string[] }; runPosts: string[] } {
  const console = watchConsole(page, [
    / 401 .*\/api\/me$/,
    // while the connection is cut, the page's own requests fail; that is the story
    /request failed: .* net::ERR_INTERNET_DISCONNECTED/,
  ]);
  const runPosts: string[] = [];
  page.on('request', (request) => {
    if (request.method() === 'POST' && RUN_POST.test(new URL(request.url()).pathname)) {
      runPosts.push((JSON.parse(request.postData() ?? '{}') as { clientId?: string }).clientId ?? '');
    }
  });
  return { console, runPosts };
}

describe('At the cabinet, from sign-in to a run sent after the connection came back (technician, phone)', () => {
  it('when Kofi records a guided run, a photo and a logger file, then saves a run offline and reloads, then back online that run is sent exactly once', async () => {
    const [visit] = await plannedVisitsOfKofi();
    expect(visit).toBeDefined();
    const { page, context } = await browser(PHONE_VIEWPORT);
    const { console, runPosts } = watchOfflineRuns(page);

    // signs in, opens the visit from My visits
    await signIn(page, 'kofi', 'tidewater-tech');
    await page.getByRole('link', { name: new RegExp(`^Visit to ${visit!.tag},`) }).first().click();
    await page.getByRole('heading', { name: visit!.tag }).waitFor();
    expect(new URL(page.url()).pathname).toBe(`/my-visits/${visit!.id}`);
    // the app shell is kept by the service worker for the offline part below
    expect(await page.evaluate(async () => Boolean((await navigator.serviceWorker.ready).active))).toBe(true);

    // the clock the page runs on is the test's from here
    await page.clock.install();
    await page.reload();
    await page.getByRole('heading', { name: visit!.tag }).waitFor();
    await page.getByRole('button', { name: 'Start visit' }).click();
    await page.getByRole('heading', { name: 'At the cabinet' }).waitFor();
    const facts = await bankFacts(page, visit!.id);
    const v0 = facts.busVolts ?? 560;
    const tau = facts.tauSeconds;

    // 1. a guided run, typed at the prompts
    await passSafetyGate(page, facts.position, false);
    await page.getByRole('button', { name: /^Guided capture now/ }).click();
    await page.clock.pauseAt(Date.now() + 60_000);
    await page.getByRole('button', { name: 'Start: isolated now' }).click();
    await eventually(() => page.getByRole('timer', { name: 'Time since isolation' }).textContent()).toBe('0:00');
    const prompt = page.getByTestId('capture-prompt');
    let elapsedMs = 0;
    let typed = 0;
    for (const t of captureScheduleSeconds(tau)) {
      await page.clock.fastForward(t * 1000 - elapsedMs);
      elapsedMs = t * 1000;
      await eventually(() => prompt.getAttribute('data-due')).toBe('true');
      await eventually(() => prompt.textContent()).toContain(`for ${clockFor(t)}`);
      // the meter's reading, with a little of a real meter's scatter
      const volts = Math.round(v0 * Math.exp(-t / tau) * (1 + 0.002 * Math.sin(t)) * 10) / 10;
      await page.getByRole('textbox', { name: 'DC-bus voltage' }).fill(String(volts));
      await page.getByRole('button', { name: 'Record reading' }).click();
      typed++;
      await eventually(() => page.getByTestId('capture-reading').count()).toBe(typed);
      if (volts < 50) break;
    }
    expect(typed).toBeGreaterThanOrEqual(5);
    await eventually(() => page.getByTestId('live-verdict').getAttribute('data-trustworthy')).toBe('true');
    await page.clock.resume();
    await page.getByTestId('capture-ended').waitFor();
    await page.getByRole('checkbox', { name: ABSENCE.sentence }).check();
    await page.getByRole('button', { name: 'Continue to the observations' }).click();
    await page.getByTestId('observations-form').waitFor();
    await page.getByRole('textbox', { name: 'Bank temperature' }).fill('28');

    // a photo of the bank, sent with the run's page
    const finish = page.getByTestId('capture-finish');
    await finish.locator('input[type="file"][accept="image/*"]').setInputFiles({
      name: 'bank.jpg',
      mimeType: 'image/jpeg',
      buffer: await cabinetPhoto(),
    });
    await finish.getByText('✓ Photo added.').waitFor();
    await finish.getByRole('button', { name: /^Open the photo/ }).first().waitFor();

    await page.getByRole('button', { name: 'Save the run' }).click();
    const status = page.getByTestId('saved-run-status');
    await eventually(() => status.getAttribute('data-status')).toBe('sent');
    await page.getByTestId('run-verdict').waitFor();
    await eventually(() => page.getByTestId('verdict-health-sentence').textContent()).not.toBe('');
    await screenshot(page, 'at-the-cabinet-verdict-phone');
    const guided = (await draftsInBrowser(page)).find((d) => d.body.source === 'guided')!;
    expect(await runsWithClientId(guided.clientId)).toHaveLength(1);

    // 2. a run read from a logger file
    await page.getByRole('button', { name: 'Back to the banks' }).click();
    await passSafetyGate(page, facts.position, true);
    await page.getByRole('button', { name: /^Read a logger file/ }).click();
    await page.getByTestId('logger-file-input').setInputFiles(LOGGER_FILE);
    await page.getByTestId('logger-preview').waitFor();
    await page.getByTestId('logger-use').click();
    await page.getByTestId('capture-finish').waitFor();
    await page.getByRole('checkbox', { name: ABSENCE.sentence }).check();
    await page.getByRole('button', { name: 'Save the run' }).click();
    await eventually(() => status.getAttribute('data-status')).toBe('sent');
    await page.getByTestId('run-verdict').waitFor();
    const logger = (await draftsInBrowser(page)).find((d) => d.body.source === 'logger')!;
    expect(await runsWithClientId(logger.clientId)).toHaveLength(1);

    // 3. the connection is cut: the next run stays on the phone
    await page.getByRole('button', { name: 'Back to the banks' }).click();
    await context.setOffline(true);
    await page.getByTestId('connection-note').getByText('You are offline.').waitFor();
    await passSafetyGate(page, facts.position, true);
    await page.getByRole('button', { name: /^Type readings from a paper sheet/ }).click();
    await page.getByTestId('paper-sheet').waitFor();
    const sheet = [0, 30, 60, 120, 180, 240].map((t) => ({ t, volts: Math.round(v0 * Math.exp(-t / tau) * 10) / 10 }));
    for (const [i, row] of sheet.entries()) {
      await page.getByRole('textbox', { name: `Row ${i + 1}: time since isolation, seconds` }).fill(String(row.t));
      await page.getByRole('textbox', { name: `Row ${i + 1}: DC-bus voltage, volts` }).fill(String(row.volts));
    }
    await page.getByRole('button', { name: 'Use these readings' }).click();
    await page.getByRole('checkbox', { name: ABSENCE.sentence }).check();
    await page.getByRole('button', { name: 'Save the run' }).click();
    await eventually(() => status.getAttribute('data-status')).toBe('ready');
    await eventually(() => status.textContent()).toContain('Saved on this phone');
    await screenshot(page, 'at-the-cabinet-offline-saved-phone');
    const offline = (await draftsInBrowser(page)).find((d) => d.body.source === 'typed')!;
    expect(offline.status).toBe('ready');
    expect(offline.body.samples).toEqual(sheet.map((r) => ({ tSeconds: r.t, volts: r.volts })));

    // reloaded without a connection: the service worker serves the app, the run is still here
    await page.reload();
    expect(await page.evaluate(() => Boolean(navigator.serviceWorker.controller))).toBe(true);
    // (Chromium's emulation may report the reloaded page online while nothing gets through)
    await page.getByTestId('connection-note').getByText('Readings are kept on this phone and sent by themselves').waitFor();
    const kept = page.locator(`[data-testid="offline-draft"][data-client-id="${offline.clientId}"]`);
    await kept.waitFor();
    await eventually(() => kept.textContent()).toContain('6 readings · saved, waiting to be sent');
    await screenshot(page, 'at-the-cabinet-offline-reload-phone');
    expect(runPosts.filter((id) => id === offline.clientId)).toEqual([]);
    expect(await runsWithClientId(offline.clientId)).toEqual([]);

    // back online: the run is sent by itself, once
    await context.setOffline(false);
    await page.getByTestId('app-shell').waitFor();
    await eventually(async () => (await draftsInBrowser(page)).find((d) => d.clientId === offline.clientId)?.status).toBe('sent');
    const stored = await runsWithClientId(offline.clientId);
    expect(stored).toHaveLength(1);
    expect(stored[0]!.samples).toEqual(offline.body.samples); // the raw readings, unchanged
    expect(runPosts.filter((id) => id === offline.clientId)).toHaveLength(1);
    // every run of the story went exactly once
    expect(runPosts).toEqual([guided.clientId, logger.clientId, offline.clientId]);
    expect(console.problems).toEqual([]);
  }, 240_000);

  it('when the tab is closed in the middle of a run, then a new tab opens the run where it was, readings kept; another tab follows it live', async () => {
    const visits = await plannedVisitsOfKofi();
    const visit = visits.at(-1)!;
    const { page, context } = await browser(PHONE_VIEWPORT);
    await signIn(page, 'kofi', 'tidewater-tech', { returnTo: `/my-visits/${visit.id}` });
    await page.getByRole('heading', { name: visit.tag }).waitFor();
    await page.getByRole('button', { name: 'Start visit' }).click();
    await page.getByRole('heading', { name: 'At the cabinet' }).waitFor();
    const facts = await bankFacts(page, visit.id);
    // a second tab on the same visit hears of the run as soon as it starts (no reload)
    const other = await context.newPage();
    await other.goto(`${inject('baseUrl')}/my-visits/${visit.id}`);
    await other.getByTestId(`capture-bank-${facts.position}`).waitFor();
    await passSafetyGate(page, facts.position, false);
    await other.getByTestId('bank-capture').waitFor();
    await other.close();
    await page.getByRole('button', { name: /^Type readings from a paper sheet/ }).click();
    await page.getByTestId('paper-sheet').waitFor();
    const rows = [
      { t: 0, volts: 540 },
      { t: 20, volts: 430.5 },
      { t: 45, volts: 322 },
    ];
    for (const [i, row] of rows.entries()) {
      await page.getByRole('textbox', { name: `Row ${i + 1}: time since isolation, seconds` }).fill(String(row.t));
      await page.getByRole('textbox', { name: `Row ${i + 1}: DC-bus voltage, volts` }).fill(String(row.volts));
    }
    // what was typed is on the phone as it is typed
    await eventually(async () => (await draftsInBrowser(page)).find((d) => d.visitId === visit.id)?.body.samples?.length).toBe(3);
    await page.close();

    const again = await context.newPage();
    await again.goto(`${inject('baseUrl')}/my-visits/${visit.id}`);
    await again.getByRole('heading', { name: visit.tag }).waitFor();
    // the run in progress opens where it was: the paper sheet with its three rows
    await again.getByTestId('paper-sheet').waitFor();
    for (const [i, row] of rows.entries()) {
      await eventually(() => again.getByRole('textbox', { name: `Row ${i + 1}: time since isolation, seconds` }).inputValue()).toBe(String(row.t));
      await eventually(() => again.getByRole('textbox', { name: `Row ${i + 1}: DC-bus voltage, volts` }).inputValue()).toBe(String(row.volts));
    }
    const [kept] = (await draftsInBrowser(again)).filter((d) => d.visitId === visit.id);
    expect(kept?.status).toBe('capturing');
    await screenshot(again, 'at-the-cabinet-reopened-phone');
  }, 240_000);

  it('when a paper sheet started online is reloaded without a connection, then it goes on from the phone, is saved there and, back online, is sent exactly once', async () => {
    const visits = await plannedVisitsOfKofi();
    expect(visits.length).toBeGreaterThanOrEqual(3);
    const visit = visits[1]!;
    const { page, context } = await browser(PHONE_VIEWPORT);
    const { console, runPosts } = watchOfflineRuns(page);
    await signIn(page, 'kofi', 'tidewater-tech', { returnTo: `/my-visits/${visit.id}` });
    await page.getByRole('heading', { name: visit.tag }).waitFor();
    expect(await page.evaluate(async () => Boolean((await navigator.serviceWorker.ready).active))).toBe(true);
    await page.getByRole('button', { name: 'Start visit' }).click();
    await page.getByRole('heading', { name: 'At the cabinet' }).waitFor();
    const facts = await bankFacts(page, visit.id);
    const v0 = facts.busVolts ?? 560;
    const tau = facts.tauSeconds;
    const sheet = [0, 30, 60, 120, 180, 240].map((t) => ({ t, volts: Math.round(v0 * Math.exp(-t / tau) * 10) / 10 }));

    // online: the safety gate, then the first three rows of the paper sheet
    await passSafetyGate(page, facts.position, false);
    await page.getByRole('button', { name: /^Type readings from a paper sheet/ }).click();
    await page.getByTestId('paper-sheet').waitFor();
    for (const [i, row] of sheet.slice(0, 3).entries()) {
      await page.getByRole('textbox', { name: `Row ${i + 1}: time since isolation, seconds` }).fill(String(row.t));
      await page.getByRole('textbox', { name: `Row ${i + 1}: DC-bus voltage, volts` }).fill(String(row.volts));
    }
    await eventually(async () => (await draftsInBrowser(page)).find((d) => d.visitId === visit.id)?.body.samples?.length).toBe(3);
    const started = (await draftsInBrowser(page)).find((d) => d.visitId === visit.id)!;
    // the facts the capture needs are kept with the run
    expect(started.snapshot).toMatchObject({ cabinetTag: visit.tag, bankPosition: facts.position, expectedTauSeconds: tau });
    expect(started.snapshot?.engine).toBeTruthy();

    // the connection is cut and the page reloaded: the service worker serves the app
    await context.setOffline(true);
    await page.reload();
    expect(await page.evaluate(() => Boolean(navigator.serviceWorker.controller))).toBe(true);
    await page.getByTestId('connection-note').getByText('Readings are kept on this phone and sent by themselves').waitFor();
    const kept = page.locator(`[data-testid="offline-draft"][data-client-id="${started.clientId}"]`);
    await eventually(() => kept.getAttribute('data-status')).toBe('capturing');
    await eventually(() => kept.textContent()).toContain(`${visit.tag} · ${facts.position}`);
    await screenshot(page, 'at-the-cabinet-offline-capturing-phone');

    // the same run goes on: the paper sheet with its three rows, three more typed
    await kept.getByRole('button', { name: 'Go on with this run' }).click();
    await page.getByTestId('paper-sheet').waitFor();
    await eventually(() => page.getByTestId('bank-capture').textContent()).toContain(`${visit.tag} · ${facts.position}`);
    for (const [i, row] of sheet.slice(0, 3).entries()) {
      await eventually(() => page.getByRole('textbox', { name: `Row ${i + 1}: DC-bus voltage, volts` }).inputValue()).toBe(String(row.volts));
    }
    for (const [i, row] of sheet.entries()) {
      if (i < 3) continue;
      await page.getByRole('textbox', { name: `Row ${i + 1}: time since isolation, seconds` }).fill(String(row.t));
      await page.getByRole('textbox', { name: `Row ${i + 1}: DC-bus voltage, volts` }).fill(String(row.volts));
    }
    await page.getByRole('button', { name: 'Use these readings' }).click();
    await page.getByTestId('observations-form').waitFor();
    await page.getByRole('textbox', { name: 'Bank temperature' }).fill('31');
    await page.getByRole('checkbox', { name: ABSENCE.sentence }).check();
    await page.getByRole('button', { name: 'Save the run' }).click();
    const status = page.getByTestId('saved-run-status');
    await eventually(() => status.getAttribute('data-status')).toBe('ready');
    await eventually(() => status.textContent()).toContain('Saved on this phone');
    // judged on the phone with the bank's figures kept with the run
    await page.getByTestId('run-verdict').waitFor();
    await screenshot(page, 'at-the-cabinet-offline-continued-phone');
    const saved = (await draftsInBrowser(page)).find((d) => d.clientId === started.clientId)!;
    expect(saved.status).toBe('ready');
    expect(saved.body.samples).toEqual(sheet.map((r) => ({ tSeconds: r.t, volts: r.volts })));
    await page.getByRole('button', { name: 'Back to the banks' }).click();
    await eventually(() => kept.textContent()).toContain('6 readings · saved, waiting to be sent');
    expect(runPosts).toEqual([]);
    expect(await runsWithClientId(started.clientId)).toEqual([]);

    // back online: the run is sent by itself, once
    await context.setOffline(false);
    await page.getByTestId('app-shell').waitFor();
    await eventually(async () => (await draftsInBrowser(page)).find((d) => d.clientId === started.clientId)?.status).toBe('sent');
    const stored = await runsWithClientId(started.clientId);
    expect(stored).toHaveLength(1);
    expect(stored[0]!.samples).toEqual(saved.body.samples);
    expect(runPosts).toEqual([started.clientId]);
    expect(console.problems).toEqual([]);
  }, 240_000);
});
