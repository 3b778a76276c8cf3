/**
 * Starts the local identity provider on loopback for `npm start`, `npm run dev` and the
 * browser tests. Its settings come from the environment (IDP_*), its one client from
 * Ebbline's own OIDC_* settings, so the two always agree.
 *
 *   IDP_PORT (3001)  IDP_HOST (127.0.0.1)  IDP_ISSUER (http://localhost:IDP_PORT)
 *   IDP_COOKIE_KEYS (comma-separated; required outside development and tests)
 *   IDP_DATA_DIR (.data/identity: signing keys)  IDP_STORE (postgres | memory)
 *   IDP_MAX_FAILED_SIGN_INS (5)  IDP_LOCKOUT_MINUTES (15)  IDP_BCRYPT_ROUNDS (10)
 */
import http from 'node:http';
import path from 'node:path';
import { isLoopbackUrl, parseConfig } from '../../api/src/config/env';
import { PROJECT_ROOT } from '../local-cluster';
import { DEMO_PEOPLE, type DemoPerson } from '../seed/people';
import { createAccountStore } from './accounts';
import { loadOrCreateSigningKeys } from './keys';
import { createIdentityProvider, type SignInFailure } from './provider';
import { localIssuer } from './settings';
import { memoryStore, postgresStore } from './stores';

export interface RunningIdentityProvider {
  issuer: string;
  /** True when the signing keys were made by this start (first start of a clone). */
  keysCreated: boolean;
  /** Where the signing keys are kept. */
  keysDir: string;
  /** Stops accepting, lets open requests finish (up to graceMs), then closes its pool. */
  close(graceMs?: number): Promise<void>;
}

// Good enough for a laptop; never for a shared machine (IDP_COOKIE_KEYS then).
const LOCAL_COOKIE_KEYS = ['ebbline-local-idp-cookie-key-1'];

export interface StartOptions {
  env?: NodeJS.ProcessEnv;
  /** The staff accounts; the demo staff by default. */
  people?: readonly DemoPerson[];
  onSignInFailed?: (failure: SignInFailure) => void | Promise<void>;
}

/** Starts the provider and resolves once it listens. */
export async function startIdentityProvider({
  env = process.env,
  people = DEMO_PEOPLE,
  onSignInFailed,
}: StartOptions = {}): Promise<RunningIdentityProvider> {
  const app = parseConfig(env);
  const issuer = localIssuer(env);
  const port = Number(new URL(issuer).port || env.IDP_PORT || 3001);
  const host = env.IDP_HOST || '127.0.0.1';
  const cookieKeys = (env.IDP_COOKIE_KEYS ?? '')
    .split(',')
    .map((k) => k.trim())
    .filter(Boolean);
  if (cookieKeys.length === 0 && !isLoopbackUrl(app.APP_URL)) {
    throw new Error(
      'IDP_COOKIE_KEYS: set at least one long random key for the local provider on a shared machine',
    );
  }
  const keysDir = path.resolve(PROJECT_ROOT, env.IDP_DATA_DIR || '.data/identity');
  const { keys, created } = loadOrCreateSigningKeys(keysDir);
  const store =
    env.IDP_STORE === 'memory'
      ? memoryStore()
      : postgresStore(env.IDP_DATABASE_URL || app.DATABASE_URL);
  const accounts = await createAccountStore(people, Number(env.IDP_BCRYPT_ROUNDS || 10));
  const { app: handler } = createIdentityProvider({
    issuer,
    clients: [
      {
        clientId: app.OIDC_CLIENT_ID,
        clientSecret: app.OIDC_CLIENT_SECRET,
        clientName: 'Ebbline',
        redirectUris: [app.OIDC_REDIRECT_URL],
        postLogoutRedirectUris: [app.OIDC_POST_LOGOUT_REDIRECT_URL],
        firstParty: true,
      },
    ],
    accounts,
    signingKeys: keys,
    cookieKeys: cookieKeys.length ? cookieKeys : LOCAL_COOKIE_KEYS,
    adapter: store.adapter,
    failedAttempts: store.failedAttempts,
    maxFailedAttempts: Number(env.IDP_MAX_FAILED_SIGN_INS || 5),
    lockoutMinutes: Number(env.IDP_LOCKOUT_MINUTES || 15),
    onSignInFailed,
  });
  const server = http.createServer(handler);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, resolve);
  });
  return {
    issuer,
    keysCreated: created,
    keysDir,
    async close(graceMs = 5_000) {
      // pages and token requests in flight finish; idle keep-alive connections go at once
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeIdleConnections();
        setTimeout(() => server.closeAllConnections(), graceMs).unref();
      });
      await store.close();
    },
  };
}
