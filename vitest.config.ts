import { defineConfig } from 'vitest/config';

/**
 * Three projects, run together by `npm test` (infra/test-run.ts starts their PostgreSQL):
 * - unit: pure code (shared/, web logic, CLIs), no database;
 * - api:  supertest against the real database, one fresh database per test file;
 * - e2e:  headless Chromium against the whole product started once for the run.
 *
 * The timeouts are ceilings for a busy machine (a shared two-core box runs a five-second browser
 * test in a minute or more), reached only by a test that hangs; tests wait on states, never on
 * time, so a quick machine never waits for them.
 */
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'unit',
          include: ['tests/shared/**/*.test.ts', 'tests/web/**/*.test.{ts,tsx}', 'tests/api/{cli,config}/**/*.test.ts', 'tests/infra/**/*.test.ts', 'tests/lint/**/*.test.ts'],
          environment: 'node',
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
      {
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          exclude: ['tests/api/{cli,config}/**'],
          setupFiles: ['tests/support/api-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          globalSetup: ['tests/support/e2e-global-setup.ts'],
          testTimeout: 240_000,
          hookTimeout: 240_000,
          // one browser at a time keeps a 2-core machine responsive
          fileParallelism: false,
        },
      },
    ],
  },
});
