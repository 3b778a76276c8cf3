import type { Page } from 'playwright-core';

/**
 * Collects what a page complains about: console errors (a refused content security policy
 * shows up here), uncaught exceptions, failed requests and error answers. Read `problems`
 * after the steps. `expected` names answers that are part of the story, e.g. the 401 of
 * GET /api/me before signing in.
 */
export function watchConsole(
  page: Page,
  expected: RegExp[] = [/ 401 .*\/api\/me$/],
): { problems: string[] } {
  const problems: string[] = [];
  const note = (line: string) => {
    if (!expected.some((re) => re.test(line))) problems.push(line);
  };
  page.on('console', (msg) => {
    // a failed load is reported with its address by the response listener below
    if (msg.type() === 'error' && !msg.text().startsWith('Failed to load resource'))
      note(`console: ${msg.text()}`);
  });
  page.on('pageerror', (err) => note(`page error: ${err.message}`));
  page.on('response', (res) => {
    if (res.status() >= 400) note(`answer ${res.status()} ${res.request().method()} ${res.url()}`);
  });
  page.on('requestfailed', (req) => {
    // a navigation superseded by a redirect is not a failure
    if (req.failure()?.errorText !== 'net::ERR_ABORTED')
      note(`request failed: ${req.url()} ${req.failure()?.errorText}`);
  });
  return { problems };
}
