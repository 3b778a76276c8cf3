import express, { Router, type Request, type Response } from 'express';
import { getConfig } from '../config/env';
import { AppError } from '../errors';
import { requestOrigin } from '../middleware/request-origin';
import { recordAccessEvent } from '../services/access-events';
import { signInPerson } from '../services/people';
import { withUnitOfWork } from '../services/unit-of-work';
import { csrfTokenMatches } from './csrf';
import { beginSignIn, completeSignIn, endSessionUrl, providerConfiguration } from './oidc-client';
import { readPendingSignIns, writePendingSignIns } from './pending-sign-in';
import { safeReturnTo } from './return-to';
import {
  endSession,
  newCsrfToken,
  regenerateSession,
  saveSession,
  type PendingSignIn,
} from './session';

/** Why a sign-in did not complete; the web app's /sign-in-problem page explains each. */
export type SignInProblem =
  | 'state-mismatch'
  | 'expired'
  | 'provider-error'
  | 'rejected'
  | 'deactivated'
  | 'email-taken'
  | 'unreachable';

/** Started sign-ins a session keeps at most (several tabs); older ones are dropped. */
const MAX_PENDING = 5;

/**
 * The browser side of OpenID Connect:
 * - `GET /auth/login?returnTo=/path` starts a sign-in at the provider (code flow, PKCE S256,
 *   state, nonce);
 * - `GET /auth/callback` completes it: a new session (new id) for the user;
 * - `POST /auth/logout` ends Ebbline's session and sends the browser to end the provider's.
 * These are browser navigations, so failures lead to a page rather than JSON.
 */
export const authRouter = Router();

function problem(res: Response, reason: SignInProblem): void {
  res.redirect(303, `/sign-in-problem?reason=${reason}`);
}

function queryString(req: Request): string {
  const at = req.originalUrl.indexOf('?');
  return at >= 0 ? req.originalUrl.slice(at) : '';
}

authRouter.get('/login', async (req, res) => {
  const config = getConfig();
  const returnTo = safeReturnTo(req.query.returnTo);
  if (returnTo === null) {
    throw AppError.badRequest('returnTo: must be a path inside Ebbline, such as /planner.', [
      { path: 'returnTo', message: 'Use a path inside Ebbline, such as /planner.' },
    ]);
  }
  if (req.session.userId) {
    res.redirect(303, returnTo);
    return;
  }
  if (
    !(await providerConfiguration(config).then(
      () => true,
      () => false,
    ))
  ) {
    problem(res, 'unreachable');
    return;
  }
  const now = Date.now();
  const { url, pending } = await beginSignIn(returnTo, config, now);
  const maxAgeMs = config.SIGN_IN_PENDING_MINUTES * 60_000;
  const kept = readPendingSignIns(req, config)
    .filter((p) => now - p.startedAt < maxAgeMs)
    .sort((a, b) => b.startedAt - a.startedAt)
    .slice(0, MAX_PENDING - 1);
  // kept in the browser (pending-sign-in.ts): an anonymous visit stores no session row
  writePendingSignIns(res, [...kept, pending], config);
  res.redirect(303, url.href);
});

authRouter.get('/callback', async (req, res) => {
  const config = getConfig();
  const origin = requestOrigin(req);
  const state = typeof req.query.state === 'string' ? req.query.state : '';
  const pendings = readPendingSignIns(req, config);
  const pending: PendingSignIn | undefined = state
    ? pendings.find((p) => p.state === state)
    : undefined;
  const fail = async (reason: SignInProblem, detail: Record<string, unknown> = {}) => {
    await recordAccessEvent({ kind: 'sign-in-failed', origin, detail: { reason, ...detail } });
    problem(res, reason);
  };

  if (!pending) {
    await fail('state-mismatch');
    return;
  }
  // one use per state in this browser, whatever happens next (the provider's code is single-use too)
  writePendingSignIns(
    res,
    pendings.filter((p) => p !== pending),
    config,
  );

  if (typeof req.query.error === 'string') {
    await fail('provider-error', { error: req.query.error.slice(0, 100) });
    return;
  }
  if (Date.now() - pending.startedAt >= config.SIGN_IN_PENDING_MINUTES * 60_000) {
    await fail('expired');
    return;
  }
  const completion = await completeSignIn(queryString(req), pending, config);
  if (!completion.ok) {
    await fail('rejected', { detail: completion.detail.slice(0, 300) });
    return;
  }
  const { idToken, ...identity } = completion.identity;
  const outcome = await withUnitOfWork(null, (uow) => signInPerson(uow, identity, origin));
  if (!outcome.ok) {
    problem(res, outcome.reason);
    return;
  }
  // a new session id at sign-in: a session id known before sign-in is worth nothing after
  await regenerateSession(req);
  req.session.userId = outcome.user.id;
  req.session.signedInAt = Date.now();
  req.session.csrfToken = newCsrfToken();
  req.session.idToken = idToken;
  await saveSession(req);
  res.redirect(303, pending.returnTo);
});

authRouter.post(
  '/logout',
  express.urlencoded({ extended: false, limit: '4kb' }),
  async (req, res) => {
    const config = getConfig();
    const { userId, idToken, csrfToken } = req.session;
    if (userId) {
      const body = req.body as { _csrf?: unknown } | undefined;
      if (!csrfTokenMatches(req.get('x-csrf-token') ?? body?._csrf, csrfToken)) {
        throw new AppError(
          'csrf-failed',
          'The sign-out did not carry this session’s security token. Reload the page and try again.',
        );
      }
      await recordAccessEvent({ kind: 'sign-out', userId, origin: requestOrigin(req) });
    }
    await endSession(req, res, config);
    const target =
      (await endSessionUrl(idToken, config))?.href ?? config.OIDC_POST_LOGOUT_REDIRECT_URL;
    if (req.accepts(['html', 'json']) === 'json') {
      res.json({ redirectTo: target });
      return;
    }
    res.redirect(303, target);
  },
);
