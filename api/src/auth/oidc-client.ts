import * as oidc from 'openid-client';
import { getConfig, isLoopbackUrl, type Config } from '../config/env';
import { AppError } from '../errors';
import { logger } from '../logger';
import type { PendingSignIn } from './session';

/** What Ebbline takes from a verified ID token. */
export interface SignedInIdentity {
  subject: string;
  email: string;
  emailVerified: boolean;
  name: string;
  /** The provider's `roles` claim as sent (strings); unknown names are dropped later. */
  roles: string[];
  idToken: string;
}

let discovered: Promise<oidc.Configuration> | undefined;

/**
 * The provider's configuration from its discovery document, fetched once and kept. A failed
 * discovery is not kept, so the next sign-in tries again (the provider may start later).
 * Plain http is allowed only for a loopback provider or with OIDC_ALLOW_HTTP.
 */
export function providerConfiguration(config: Config = getConfig()): Promise<oidc.Configuration> {
  if (!discovered) {
    const insecure = config.OIDC_ALLOW_HTTP || isLoopbackUrl(config.OIDC_ISSUER);
    discovered = oidc
      .discovery(
        new URL(config.OIDC_ISSUER),
        config.OIDC_CLIENT_ID,
        { redirect_uris: [config.OIDC_REDIRECT_URL], response_types: ['code'] },
        oidc.ClientSecretBasic(config.OIDC_CLIENT_SECRET),
        insecure ? { execute: [oidc.allowInsecureRequests], timeout: 10 } : { timeout: 10 },
      )
      .catch((err: unknown) => {
        discovered = undefined;
        logger.error({ err, issuer: config.OIDC_ISSUER }, 'identity provider discovery failed');
        throw new AppError(
          'identity-provider-unreachable',
          `Ebbline cannot reach its sign-in provider at ${config.OIDC_ISSUER}. Try again in a minute; if it persists, tell your admin.`,
        );
      });
  }
  return discovered;
}

/** Forgets the discovered configuration (tests that restart the provider). */
export function forgetProviderConfiguration(): void {
  discovered = undefined;
}

/**
 * Starts a sign-in: fresh state, nonce and PKCE verifier (S256), and the provider's
 * authorization URL for the exact redirect URI.
 */
export async function beginSignIn(
  returnTo: string,
  config: Config = getConfig(),
  now = Date.now(),
): Promise<{ url: URL; pending: PendingSignIn }> {
  const provider = await providerConfiguration(config);
  const codeVerifier = oidc.randomPKCECodeVerifier();
  const pending: PendingSignIn = {
    state: oidc.randomState(),
    nonce: oidc.randomNonce(),
    codeVerifier,
    returnTo,
    startedAt: now,
  };
  const url = oidc.buildAuthorizationUrl(provider, {
    redirect_uri: config.OIDC_REDIRECT_URL,
    scope: config.OIDC_SCOPES,
    code_challenge: await oidc.calculatePKCECodeChallenge(codeVerifier),
    code_challenge_method: 'S256',
    state: pending.state,
    nonce: pending.nonce,
  });
  return { url, pending };
}

export type SignInCompletion =
  { ok: true; identity: SignedInIdentity } | { ok: false; detail: string };

/**
 * Completes a sign-in at the callback: checks the state, trades the code (with the PKCE
 * verifier) at the token endpoint and verifies the ID token (signature, issuer, audience,
 * expiry, nonce) through openid-client.
 * @param callbackQuery the query string the provider sent to the callback, with its `?`
 * @returns the identity, or why the provider's answer was refused
 */
export async function completeSignIn(
  callbackQuery: string,
  pending: PendingSignIn,
  config: Config = getConfig(),
): Promise<SignInCompletion> {
  const provider = await providerConfiguration(config);
  // the redirect URI sent to the token endpoint is the configured one, whatever Host the request had
  const currentUrl = new URL(config.OIDC_REDIRECT_URL);
  currentUrl.search = callbackQuery;
  let tokens: Awaited<ReturnType<typeof oidc.authorizationCodeGrant>>;
  try {
    tokens = await oidc.authorizationCodeGrant(provider, currentUrl, {
      pkceCodeVerifier: pending.codeVerifier,
      expectedState: pending.state,
      expectedNonce: pending.nonce,
      idTokenExpected: true,
    });
  } catch (err) {
    // openid-client throws on any failed check; the caller shows a page, not a 500
    logger.warn({ err }, 'sign-in refused at the callback');
    return { ok: false, detail: err instanceof Error ? err.message : String(err) };
  }
  const claims = tokens.claims();
  if (!claims || !tokens.id_token) return { ok: false, detail: 'the provider sent no ID token' };
  const email = typeof claims.email === 'string' ? claims.email.trim().toLowerCase() : '';
  if (!email)
    return {
      ok: false,
      detail: 'the provider shared no e-mail address (Ebbline asks for the email scope)',
    };
  const name = typeof claims.name === 'string' && claims.name.trim() ? claims.name.trim() : email;
  const roles = Array.isArray(claims.roles)
    ? claims.roles.filter((r): r is string => typeof r === 'string')
    : [];
  return {
    ok: true,
    identity: {
      subject: claims.sub,
      email,
      emailVerified: claims.email_verified === true,
      name,
      roles,
      idToken: tokens.id_token,
    },
  };
}

/**
 * Where to send the browser to end the provider's session too (RP-initiated logout), or
 * null when the provider offers no end-session endpoint or cannot be reached.
 */
export async function endSessionUrl(
  idToken: string | undefined,
  config: Config = getConfig(),
): Promise<URL | null> {
  let provider: oidc.Configuration;
  try {
    provider = await providerConfiguration(config);
  } catch {
    return null;
  }
  if (!provider.serverMetadata().end_session_endpoint) return null;
  return oidc.buildEndSessionUrl(provider, {
    post_logout_redirect_uri: config.OIDC_POST_LOGOUT_REDIRECT_URL,
    client_id: config.OIDC_CLIENT_ID,
    ...(idToken ? { id_token_hint: idToken } : {}),
  });
}
