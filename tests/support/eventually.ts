/**
 * Assertions that wait for the state they expect, for the browser tests: a page that is still
 * rendering, a form that is still validating, a list still loading. Nothing here waits for a
 * length of time; the timeout is only the ceiling of a wait on a busy machine.
 */
import { expect } from 'vitest';
import { PAGE_WAIT_MS } from './browser';

/**
 * Polls `read` until the matcher that follows holds, then resolves; fails with the last value
 * seen after {@link PAGE_WAIT_MS}. Use it for anything read from a page after an action.
 *
 * @example await eventually(() => page.getByTestId('error-reading-12').textContent()).toBe('Row 12: …');
 */
export function eventually<T>(read: () => T | Promise<T>) {
  return expect.poll(read, { timeout: PAGE_WAIT_MS, interval: 50 });
}
