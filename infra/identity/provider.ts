/**
 * Ebbline's local identity provider: an OpenID Connect provider (oidc-provider 9) for the
 * demo, the tests and a laptop, standing in for a plant's company provider. It offers the
 * authorization code flow with PKCE (always required), a `roles` scope whose claim carries
 * the directory's roles, its own sign-in page in Ebbline's look, a limit on failed attempts,
 * and RP-initiated logout. Its own dev-only pages are off.
 */
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import express, { type ErrorRequestHandler, type Request, type Response } from 'express';
import helmet from 'helmet';
import Provider, { errors, type Configuration, type KoaContextWithOIDC } from 'oidc-provider';
import { DATABASE_RETRY_AFTER_SECONDS, isDatabaseUnavailable } from '../../api/src/db/connection-errors';
import type { AccountStore } from './accounts';
import type { SigningJwk } from './keys';
import { memoryFailedAttempts, type FailedAttemptStore } from './rate-limit';
import type { AdapterFactory } from './stores';
import { consentPage, problemPage, signInPage, signOutPage, signedOutPage } from './views';

const HERE = path.dirname(fileURLToPath(import.meta.url));
const FONT_DIR = path.resolve(HERE, '../../node_modules/@fontsource/noto-sans/files');
const FONT_FILES = new Set(['400', '500', '700'].map((w) => `noto-sans-latin-${w}-normal.woff2`));

/** A relying party the provider knows. */
export interface ProviderClient {
  clientId: string;
  clientSecret: string;
  clientName: string;
  redirectUris: string[];
  postLogoutRedirectUris: string[];
  /** Ebbline itself: consent is given on the person's behalf, no page. */
  firstParty: boolean;
}

/** A failed attempt at the sign-in form, for the owner's audit (Ebbline's sign-in log). */
export interface SignInFailure {
  login: string;
  reason: 'wrong-password' | 'locked-out';
  ip: string | null;
  userAgent: string | null;
}

export interface IdentityProviderOptions {
  /** Exactly as the relying party will discover it: scheme, host, port, no trailing slash. */
  issuer: string;
  clients: ProviderClient[];
  accounts: AccountStore;
  signingKeys: SigningJwk[];
  /** Keys that sign the provider's cookies; the first signs, all verify (rotation). */
  cookieKeys: string[];
  adapter: AdapterFactory;
  /** Where failed attempts are counted (the store's, so a restart keeps them); memory by default. */
  failedAttempts?: FailedAttemptStore;
  /** Failed attempts per login before it is locked, and for how long (window = lockout). */
  maxFailedAttempts?: number;
  lockoutMinutes?: number;
  onSignInFailed?: (failure: SignInFailure) => void | Promise<void>;
}

/** The page while the sign-in service cannot reach its database (a PostgreSQL restart). */
const UNAVAILABLE_TITLE = 'Sign-in is unavailable for a moment';
const UNAVAILABLE_TEXT =
  "The sign-in service can't reach its database; nothing is lost. Try again in a moment.";

const SCOPE_TEXT: Record<string, string> = {
  openid: 'that it is you (your staff login)',
  profile: 'your name',
  email: 'your e-mail address',
  roles: 'your roles in the staff directory',
};

/** Builds the provider and the Express app that serves it with its own pages. */
export function createIdentityProvider(options: IdentityProviderOptions): {
  provider: Provider;
  app: express.Express;
} {
  const clientsById = new Map(options.clients.map((c) => [c.clientId, c]));
  const appOrigins = [
    ...new Set(
      options.clients
        .flatMap((c) => [...c.redirectUris, ...c.postLogoutRedirectUris])
        .map((u) => new URL(u).origin),
    ),
  ];
  const homeOf = (clientId: unknown) => {
    const client = typeof clientId === 'string' ? clientsById.get(clientId) : undefined;
    const first = client?.redirectUris[0] ?? options.clients[0]?.redirectUris[0];
    return first ? new URL(first).origin : null;
  };

  const configuration: Configuration = {
    clients: options.clients.map((c) => ({
      client_id: c.clientId,
      client_secret: c.clientSecret,
      client_name: c.clientName,
      redirect_uris: c.redirectUris,
      post_logout_redirect_uris: c.postLogoutRedirectUris,
      response_types: ['code'],
      grant_types: ['authorization_code'],
      token_endpoint_auth_method: 'client_secret_basic',
    })),
    adapter: options.adapter,
    jwks: { keys: options.signingKeys as unknown as NonNullable<Configuration['jwks']>['keys'] },
    cookies: {
      keys: options.cookieKeys,
      // our own names: the browser shares cookies between the ports of one host
      names: { session: 'idp.session', interaction: 'idp.interaction', resume: 'idp.resume' },
    },
    findAccount: async (_ctx, subject) => {
      const account = options.accounts.find(subject);
      if (!account) return undefined;
      return {
        accountId: account.subject,
        claims: async () => ({
          sub: account.subject,
          name: account.name,
          email: account.email,
          email_verified: true,
          roles: account.roles,
        }),
      };
    },
    claims: {
      openid: ['sub'],
      profile: ['name'],
      email: ['email', 'email_verified'],
      roles: ['roles'],
    },
    scopes: ['openid', 'profile', 'email', 'roles'],
    responseTypes: ['code'],
    // put the scopes' claims (roles among them) in the ID token itself
    conformIdTokenClaims: false,
    pkce: { required: () => true },
    features: {
      devInteractions: { enabled: false },
      rpInitiatedLogout: {
        enabled: true,
        logoutSource: async (ctx: KoaContextWithOIDC, form: string) => {
          ctx.type = 'html';
          ctx.body = signOutPage(form);
        },
        postLogoutSuccessSource: async (ctx: KoaContextWithOIDC) => {
          ctx.type = 'html';
          ctx.body = signedOutPage(homeOf(ctx.oidc.client?.clientId));
        },
      },
    },
    routes: { authorization: '/authorize' },
    interactions: { url: (_ctx, interaction) => `/interaction/${interaction.uid}` },
    ttl: {
      AccessToken: 3600,
      AuthorizationCode: 60,
      IdToken: 3600,
      Interaction: 600,
      Grant: 14 * 86_400,
      Session: 12 * 3600,
    },
    renderError: async (ctx, out, error) => {
      ctx.type = 'html';
      ctx.body = isDatabaseUnavailable(error)
        ? problemPage(UNAVAILABLE_TITLE, UNAVAILABLE_TEXT, homeOf(ctx.oidc?.client?.clientId))
        : problemPage(
            'Sign-in could not go on',
            `${out.error_description ?? out.error ?? 'The request was not valid.'} Go back to Ebbline and start again.`,
            homeOf(ctx.oidc?.client?.clientId),
          );
    },
  };

  const provider = new Provider(options.issuer, configuration);
  // PostgreSQL away: a passing 503 with Retry-After (pages and token answers alike), not a 500
  provider.on('server_error', (ctx: KoaContextWithOIDC, err: unknown) => {
    if (!isDatabaseUnavailable(err)) return;
    ctx.status = 503;
    ctx.set('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS));
  });
  const lockoutMs = (options.lockoutMinutes ?? 15) * 60_000;
  const attempts = options.failedAttempts ?? memoryFailedAttempts();
  const limiterByLogin = attempts('login', {
    maxFailures: options.maxFailedAttempts ?? 5,
    windowMs: lockoutMs,
    lockoutMs,
  });
  // one address may try several logins (a shared workshop PC), but not without end
  const limiterByAddress = attempts('address', {
    maxFailures: (options.maxFailedAttempts ?? 5) * 5,
    windowMs: lockoutMs,
    lockoutMs,
  });

  const app = express();
  app.disable('x-powered-by');
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'"],
          fontSrc: ["'self'"],
          imgSrc: ["'self'", 'data:'],
          // the sign-in form's answer redirects to the app's callback; Chromium checks that too
          formAction: ["'self'", ...appOrigins],
          frameAncestors: ["'none'"],
          baseUri: ["'none'"],
          objectSrc: ["'none'"],
        },
      },
    }),
  );
  app.use('/assets', express.static(path.join(HERE, 'public'), { maxAge: '1h', index: false }));
  app.get('/assets/fonts/:file', (req, res) => {
    const file = req.params.file;
    if (!FONT_FILES.has(file) || !fs.existsSync(path.join(FONT_DIR, file))) {
      res.status(404).end();
      return;
    }
    res.setHeader('Cache-Control', 'public, max-age=86400');
    res.sendFile(path.join(FONT_DIR, file));
  });

  const form = express.urlencoded({ extended: false, limit: '4kb' });
  const noStore = (_req: Request, res: Response, next: () => void) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  };
  const clientName = (clientId: unknown) =>
    (typeof clientId === 'string' ? clientsById.get(clientId)?.clientName : undefined) ??
    'the application';

  /** Gives the first-party app the scopes and claims it asked for, as a person would. */
  async function grantConsent(req: Request, res: Response): Promise<void> {
    const details = await provider.interactionDetails(req, res);
    const accountId = details.session?.accountId;
    if (!accountId) throw new errors.SessionNotFound('no signed-in person for this consent');
    const grant = details.grantId
      ? await provider.Grant.find(details.grantId)
      : new provider.Grant({ accountId, clientId: String(details.params.client_id) });
    if (!grant) throw new errors.SessionNotFound('the grant of this consent is gone');
    const missing = details.prompt.details as {
      missingOIDCScope?: string[];
      missingOIDCClaims?: string[];
      missingResourceScopes?: Record<string, string[]>;
    };
    if (missing.missingOIDCScope) grant.addOIDCScope(missing.missingOIDCScope.join(' '));
    if (missing.missingOIDCClaims) grant.addOIDCClaims(missing.missingOIDCClaims);
    for (const [indicator, scopes] of Object.entries(missing.missingResourceScopes ?? {})) {
      grant.addResourceScope(indicator, scopes.join(' '));
    }
    const grantId = await grant.save();
    await provider.interactionFinished(
      req,
      res,
      { consent: details.grantId ? {} : { grantId } },
      { mergeWithLastSubmission: true },
    );
  }

  app.get('/interaction/:uid', noStore, async (req, res) => {
    const details = await provider.interactionDetails(req, res);
    const name = clientName(details.params.client_id);
    if (details.prompt.name === 'login') {
      const hint = typeof details.params.login_hint === 'string' ? details.params.login_hint : '';
      res.type('html').send(signInPage({ uid: details.uid, clientName: name, login: hint }));
      return;
    }
    if (details.prompt.name === 'consent') {
      const client = clientsById.get(String(details.params.client_id));
      if (client?.firstParty) {
        await grantConsent(req, res);
        return;
      }
      const account = details.session?.accountId
        ? options.accounts.find(details.session.accountId)
        : undefined;
      const scopes = String(details.params.scope ?? '')
        .split(' ')
        .filter((s) => SCOPE_TEXT[s]);
      res.type('html').send(
        consentPage({
          uid: details.uid,
          clientName: name,
          accountName: account?.name ?? 'you',
          shares: scopes.map((s) => SCOPE_TEXT[s] as string),
        }),
      );
      return;
    }
    res
      .status(400)
      .type('html')
      .send(
        problemPage(
          'Sign-in could not go on',
          'This step is not offered here.',
          homeOf(details.params.client_id),
        ),
      );
  });

  app.post('/interaction/:uid/login', noStore, form, async (req, res) => {
    const details = await provider.interactionDetails(req, res);
    if (details.prompt.name !== 'login') {
      res.redirect(303, details.returnTo);
      return;
    }
    const body = (req.body ?? {}) as Record<string, unknown>;
    const login = typeof body.login === 'string' ? body.login.trim().slice(0, 100) : '';
    const password = typeof body.password === 'string' ? body.password.slice(0, 200) : '';
    const name = clientName(details.params.client_id);
    const loginKey = login.toLowerCase();
    const addressKey = req.ip ?? 'unknown';
    const origin = { ip: req.ip ?? null, userAgent: req.get('user-agent') ?? null };

    if (!login || !password) {
      res
        .status(400)
        .type('html')
        .send(
          signInPage({
            uid: details.uid,
            clientName: name,
            login,
            error: { title: 'Enter your login and your password.' },
          }),
        );
      return;
    }
    const lockedMs = Math.max(
      await limiterByLogin.lockedFor(loginKey),
      await limiterByAddress.lockedFor(addressKey),
    );
    if (lockedMs > 0) {
      await options.onSignInFailed?.({ login, reason: 'locked-out', ...origin });
      res.status(429).setHeader('Retry-After', String(Math.ceil(lockedMs / 1000)));
      res.type('html').send(
        signInPage({
          uid: details.uid,
          clientName: name,
          login,
          error: {
            title: 'Too many failed attempts.',
            text: ` Signing in as ${login} is paused for ${Math.ceil(lockedMs / 60_000)} min. Ask an admin if you have forgotten your password.`,
          },
        }),
      );
      return;
    }
    const account = await options.accounts.verify(login, password);
    if (!account) {
      const lockMs = Math.max(
        await limiterByLogin.recordFailure(loginKey),
        await limiterByAddress.recordFailure(addressKey),
      );
      await options.onSignInFailed?.({
        login,
        reason: lockMs ? 'locked-out' : 'wrong-password',
        ...origin,
      });
      const left = await limiterByLogin.remaining(loginKey);
      res
        .status(lockMs ? 429 : 401)
        .type('html')
        .send(
          signInPage({
            uid: details.uid,
            clientName: name,
            login,
            error: lockMs
              ? {
                  title: 'Too many failed attempts.',
                  text: ` Signing in as ${login} is paused for ${Math.ceil(lockMs / 60_000)} min.`,
                }
              : {
                  title: 'The login or the password is wrong.',
                  text: ` Check both and try again${left <= 2 ? ` (${left} ${left === 1 ? 'try' : 'tries'} left before a pause)` : ''}.`,
                },
          }),
        );
      return;
    }
    await limiterByLogin.clear(loginKey);
    await provider.interactionFinished(
      req,
      res,
      { login: { accountId: account.subject } },
      { mergeWithLastSubmission: false },
    );
  });

  app.post('/interaction/:uid/confirm', noStore, async (req, res) => {
    const details = await provider.interactionDetails(req, res);
    if (details.prompt.name !== 'consent') {
      res.redirect(303, details.returnTo);
      return;
    }
    await grantConsent(req, res);
  });

  app.post('/interaction/:uid/abort', noStore, async (req, res) => {
    await provider.interactionFinished(
      req,
      res,
      { error: 'access_denied', error_description: 'The person did not allow access.' },
      { mergeWithLastSubmission: false },
    );
  });

  const interactionError: ErrorRequestHandler = (err, req, res, next) => {
    if (!req.path.startsWith('/interaction/')) {
      next(err);
      return;
    }
    const expired = err instanceof errors.SessionNotFound || err instanceof errors.InvalidRequest;
    if (isDatabaseUnavailable(err)) {
      res
        .status(503)
        .set('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS))
        .type('html')
        .send(problemPage(UNAVAILABLE_TITLE, UNAVAILABLE_TEXT, homeOf(undefined)));
      return;
    }
    res
      .status(expired ? 400 : 500)
      .type('html')
      .send(
        problemPage(
          expired ? 'This sign-in page has expired' : 'Sign-in could not go on',
          expired
            ? 'Sign-in pages are valid for ten minutes and only in the browser that opened them. Go back to Ebbline and sign in again.'
            : 'Something went wrong at the sign-in service. Go back to Ebbline and try again.',
          homeOf(undefined),
        ),
      );
  };
  app.use(interactionError);
  app.use(provider.callback());
  return { provider, app };
}
