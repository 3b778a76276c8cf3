/**
 * The identity provider of one API test file: the real local provider (infra/identity) on a
 * port reserved before the app reads its configuration, with its records in the file's own
 * database (so the PostgreSQL store is exercised too) and cheap password hashing.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { DemoPerson } from '../../infra/seed/people';
import type { SignInFailure } from '../../infra/identity/provider';
import type { ProviderStore } from '../../infra/identity/stores';

let server: http.Server | undefined;
let store: ProviderStore | undefined;

/** Listens on a free loopback port and returns the issuer URL that port will serve. */
export async function reserveIdentityProviderPort(): Promise<string> {
  server = http.createServer((_req, res) => {
    res.statusCode = 503;
    res.end('this test file has not started its identity provider (startTestIdentityProvider)');
  });
  await new Promise<void>((resolve) => server!.listen(0, '127.0.0.1', resolve));
  return `http://localhost:${(server.address() as AddressInfo).port}`;
}

export interface TestProviderOptions {
  people?: readonly DemoPerson[];
  maxFailedAttempts?: number;
  onSignInFailed?: (failure: SignInFailure) => void | Promise<void>;
}

/** Starts (or restarts) the provider on the reserved port; the issuer is process.env.OIDC_ISSUER. */
export async function startTestIdentityProvider(
  options: TestProviderOptions = {},
): Promise<{ issuer: string }> {
  if (!server) throw new Error('no port reserved: tests/support/api-setup.ts reserves one');
  const { getConfig } = await import('../../api/src/config/env');
  const { DEMO_PEOPLE } = await import('../../infra/seed/people');
  const { createAccountStore } = await import('../../infra/identity/accounts');
  const { generateSigningKey } = await import('../../infra/identity/keys');
  const { createIdentityProvider } = await import('../../infra/identity/provider');
  const { postgresStore } = await import('../../infra/identity/stores');
  const config = getConfig();
  // a second start is a restart: the first one's connections end, its records stay
  await store?.close();
  store = postgresStore(config.DATABASE_URL);
  const { app } = createIdentityProvider({
    issuer: config.OIDC_ISSUER,
    clients: [
      {
        clientId: config.OIDC_CLIENT_ID,
        clientSecret: config.OIDC_CLIENT_SECRET,
        clientName: 'Ebbline',
        redirectUris: [config.OIDC_REDIRECT_URL],
        postLogoutRedirectUris: [config.OIDC_POST_LOGOUT_REDIRECT_URL],
        firstParty: true,
      },
    ],
    accounts: await createAccountStore(options.people ?? DEMO_PEOPLE, 4),
    signingKeys: [generateSigningKey()],
    cookieKeys: ['test-cookie-key'],
    adapter: store.adapter,
    failedAttempts: store.failedAttempts,
    maxFailedAttempts: options.maxFailedAttempts ?? 5,
    onSignInFailed: options.onSignInFailed,
  });
  server.removeAllListeners('request');
  server.on('request', app);
  return { issuer: config.OIDC_ISSUER };
}

/** Closes the reserved port and the provider's store (api-setup does it after each file). */
export async function stopTestIdentityProvider(): Promise<void> {
  if (server) {
    const closing = server;
    server = undefined;
    await new Promise<void>((resolve) => {
      closing.close(() => resolve());
      closing.closeAllConnections();
    });
  }
  await store?.close();
  store = undefined;
}
