import crypto from 'node:crypto';
import connectPgSimple from 'connect-pg-simple';
import type { CookieOptions, Request, RequestHandler, Response } from 'express';
import session from 'express-session';
import pg from 'pg';
import { getConfig, type Config } from '../config/env';
import { survivePoolErrors } from '../db/connection-errors';
import { logger } from '../logger';

/** A sign-in started at GET /auth/login and not yet completed at the callback (kept in the browser: pending-sign-in.ts). */
export interface PendingSignIn {
  state: string;
  nonce: string;
  codeVerifier: string;
  returnTo: string;
  /** ms since the epoch; older than SIGN_IN_PENDING_MINUTES is refused. */
  startedAt: number;
}

declare module 'express-session' {
  interface SessionData {
    /** Set once signed in; the user is read fresh from the database on every request. */
    userId?: string;
    /** ms since the epoch of the sign-in; the absolute timeout counts from here. */
    signedInAt?: number;
    /** Bound to this session; sent back in X-CSRF-Token on state-changing requests. */
    csrfToken?: string;
    /** Kept for the provider's logout (id_token_hint). */
    idToken?: string;
  }
}

let pool: pg.Pool | undefined;
let store: session.Store | undefined;

/** The sessions table's own small pool (connect-pg-simple speaks pg, not Sequelize). */
function sessionPool(config: Config): pg.Pool {
  if (!pool) {
    pool = new pg.Pool({
      connectionString: config.DATABASE_URL,
      max: 4,
      idleTimeoutMillis: 10_000,
      // an unreachable database fails the request (503) instead of holding it
      connectionTimeoutMillis: 5_000,
      keepAlive: true,
    });
    survivePoolErrors(pool, 'sessions');
  }
  return pool;
}

function sessionStore(config: Config): session.Store {
  if (!store) {
    const PgStore = connectPgSimple(session);
    store = new PgStore({
      pool: sessionPool(config),
      tableName: 'sessions',
      // the table comes from migration 0002, never from the store
      createTableIfMissing: false,
      pruneSessionInterval: config.NODE_ENV === 'test' ? false : 15 * 60,
      errorLog: (...args: unknown[]) => logger.error({ args }, 'session store'),
    });
  }
  return store;
}

/** The session cookie's attributes; Secure whenever people open Ebbline over https. */
export function sessionCookieOptions(config: Config): CookieOptions {
  return {
    httpOnly: true,
    sameSite: 'lax',
    secure: config.APP_URL.startsWith('https:'),
    path: '/',
    maxAge: config.SESSION_IDLE_MINUTES * 60_000,
  };
}

/**
 * express-session on PostgreSQL: our own cookie name, rolling idle expiry (every request moves
 * the deadline on), nothing stored for visitors who never start a sign-in.
 */
export function sessionMiddleware(config = getConfig()): RequestHandler {
  return session({
    name: config.SESSION_COOKIE_NAME,
    secret: config.SESSION_SECRET,
    store: sessionStore(config),
    resave: false,
    saveUninitialized: false,
    rolling: true,
    // not 'destroy': when the store fails to load a session (PostgreSQL away), req.session is
    // unset, and 'destroy' would delete the row as the 503 goes out, once the database is back,
    // signing the person out. Sessions end only through endSession and regenerateSession.
    unset: 'keep',
    cookie: sessionCookieOptions(config),
  });
}

/** Replaces the session (and its id) with a fresh one: done at sign-in against fixation. */
export function regenerateSession(req: Request): Promise<void> {
  return new Promise((resolve, reject) =>
    req.session.regenerate((err) => (err ? reject(err) : resolve())),
  );
}

export function saveSession(req: Request): Promise<void> {
  return new Promise((resolve, reject) =>
    req.session.save((err) => (err ? reject(err) : resolve())),
  );
}

/** Deletes the session from the store and tells the browser to drop the cookie. */
export async function endSession(req: Request, res: Response, config = getConfig()): Promise<void> {
  if (req.session) {
    await new Promise<void>((resolve, reject) =>
      req.session.destroy((err) => (err ? reject(err) : resolve())),
    );
  }
  const { maxAge: _maxAge, ...cookie } = sessionCookieOptions(config);
  res.clearCookie(config.SESSION_COOKIE_NAME, cookie);
}

/** A fresh random CSRF token for a new session. */
export function newCsrfToken(): string {
  return crypto.randomBytes(32).toString('base64url');
}

/** Ends every session of a user (deactivation): they must sign in again, and cannot. */
export async function endSessionsOfUser(userId: string, config = getConfig()): Promise<number> {
  const result = await sessionPool(config).query(
    "DELETE FROM sessions WHERE sess->>'userId' = $1",
    [userId],
  );
  return result.rowCount ?? 0;
}

/** Closes the session store's pool (server shutdown, end of a test file). */
export async function closeSessionStore(): Promise<void> {
  const closing = pool;
  pool = undefined;
  store = undefined;
  await closing?.end();
}
