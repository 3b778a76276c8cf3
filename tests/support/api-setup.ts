/**
 * Runs before each API test file, before it imports the app: points the app at a fresh
 * database of its own (the app reads DATABASE_URL once, at import).
 */
import { afterAll } from 'vitest';
import { reserveIdentityProviderPort } from './identity';
import { createTestDatabase } from './test-cluster';

process.env.NODE_ENV = 'test';
process.env.LOG_LEVEL ??= 'silent';
process.env.WEB_DIST_DIR = '';
process.env.DATABASE_URL = await createTestDatabase();
// a free port for this file's own identity provider (tests/support/identity.ts), known
// before the app reads OIDC_ISSUER
process.env.OIDC_ISSUER = await reserveIdentityProviderPort();

afterAll(async () => {
  const { closeSessionStore } = await import('../../api/src/auth/session');
  const { sequelize } = await import('../../api/src/db/sequelize');
  const { stopTestIdentityProvider } = await import('./identity');
  await stopTestIdentityProvider();
  await closeSessionStore();
  await sequelize.close();
});
