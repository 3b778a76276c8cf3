/**
 * Starts the whole product once for the browser tests: a seeded database copied from the
 * template, the local identity provider, and the API serving the built web app, on test
 * ports of their own (E2E_PORT, E2E_IDP_PORT).
 */
import type { TestProject } from 'vitest/node';
import { createTestDatabase } from './test-cluster';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    /** The local identity provider's issuer (its sign-in page lives there). */
    issuer: string;
    /** The product's database, for tests that must age or inspect a record. */
    databaseUrl: string;
  }
}

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const port = Number(process.env.E2E_PORT || 39100);
  const baseUrl = `http://localhost:${port}`;
  const idpPort = Number(process.env.E2E_IDP_PORT || 39101);
  Object.assign(process.env, {
    // the local identity provider on a test port of its own, its records in the e2e database
    IDP_PORT: String(idpPort),
    IDP_ISSUER: `http://localhost:${idpPort}`,
    IDP_DATA_DIR: `.data/identity-e2e-${idpPort}`,
    IDP_STORE: 'postgres',
    IDP_BCRYPT_ROUNDS: '4',
    OIDC_ISSUER: `http://localhost:${idpPort}`,
    NODE_ENV: 'test',
    LOG_LEVEL: process.env.LOG_LEVEL ?? 'warn',
    PORT: String(port),
    APP_URL: baseUrl,
    WEB_DIST_DIR: process.env.E2E_WEB_DIST_DIR ?? 'dist/web',
    // photos added by the browser tests go to a folder of this run's own
    PHOTO_DIR: `.data/photos-e2e-${port}`,
    DATABASE_URL: await createTestDatabase('ebbline_e2e'),
  });
  const { seedDemo } = await import('../../infra/seed/index');
  await seedDemo();
  const { startIdentityProvider } = await import('../../infra/identity/index');
  const { recordFailureInEbbline } = await import('../../infra/identity/sign-in-log');
  const idp = await startIdentityProvider({ onSignInFailed: recordFailureInEbbline });
  const { startServer } = await import('../../api/src/server');
  const server = await startServer();
  project.provide('baseUrl', baseUrl);
  project.provide('issuer', idp.issuer);
  project.provide('databaseUrl', process.env.DATABASE_URL as string);
  return async () => {
    await server.close(2000);
    await idp.close();
  };
}
