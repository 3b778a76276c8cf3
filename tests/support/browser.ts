import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { afterEach } from 'vitest';

/** Debian's Chromium; a test never downloads a browser. */
export const CHROMIUM_PATH = process.env.CHROMIUM_PATH || '/usr/bin/chromium';

// Flags that keep Chromium from reaching for the network this machine does not have.
const FLAGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--disable-dev-shm-usage',
];

export interface BrowserSession {
  browser: Browser;
  context: BrowserContext;
  page: Page;
  close(): Promise<void>;
}

/**
 * The ceiling of every wait on a page's state (a locator, a navigation, a settled form): long
 * enough for a busy two-core machine, reached only when a test is about to fail.
 */
export const PAGE_WAIT_MS = 60_000;

export const PHONE_VIEWPORT = { width: 390, height: 844 };
export const DESKTOP_VIEWPORT = { width: 1366, height: 900 };

/** A fresh headless Chromium with an empty profile, one page open. */
export async function openBrowser(
  viewport: { width: number; height: number } = DESKTOP_VIEWPORT,
): Promise<BrowserSession> {
  const userDataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'ebbline-chromium-'));
  const context = await chromium.launchPersistentContext(userDataDir, {
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: FLAGS,
    viewport,
  });
  context.setDefaultTimeout(PAGE_WAIT_MS);
  context.setDefaultNavigationTimeout(PAGE_WAIT_MS);
  const page = context.pages()[0] ?? (await context.newPage());
  return {
    browser: context.browser() as Browser,
    context,
    page,
    async close() {
      await context.close();
      fs.rmSync(userDataDir, { recursive: true, force: true });
    },
  };
}

/**
 * Browsers for the tests of one file, each closed when its test ends: call once at the top of
 * the file; the function returned opens one (desktop-wide unless `viewport` says otherwise).
 */
export function browsersClosedAfterEach(): (viewport?: { width: number; height: number }) => Promise<BrowserSession> {
  let open: BrowserSession[] = [];
  afterEach(async () => {
    await Promise.all(open.map((s) => s.close()));
    open = [];
  });
  return async (viewport) => {
    const session = await openBrowser(viewport);
    open.push(session);
    return session;
  };
}

/** Saves a screenshot under .data/screenshots for people to look at after a run. */
export async function screenshot(page: Page, name: string): Promise<string> {
  const dir = path.resolve('.data/screenshots');
  fs.mkdirSync(dir, { recursive: true });
  const file = path.join(dir, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}
