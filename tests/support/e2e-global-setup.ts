/**
 * Starts the whole product once for the browser tests: a seeded database copied from the
 * template, and the API serving the built web app, on test ports of their own.
 */
import type { TestProject } from 'vitest/node';
import { createTestDatabase } from './test-cluster';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
  }
}

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const port = Number(process.env.E2E_PORT || 39100);
  const baseUrl = `http://localhost:${port}`;
  Object.assign(process.env, {
    NODE_ENV: 'test',
    LOG_LEVEL: process.env.LOG_LEVEL ?? 'warn',
    PORT: String(port),
    APP_URL: baseUrl,
    WEB_DIST_DIR: process.env.E2E_WEB_DIST_DIR ?? 'dist/web',
    DATABASE_URL: await createTestDatabase('ebbline_e2e'),
  });
  const { seedDemo } = await import('../../infra/seed/index');
  await seedDemo();
  const { startServer } = await import('../../api/src/server');
  const server = await startServer();
  project.provide('baseUrl', baseUrl);
  return async () => {
    await server.close(2000);
  };
}
