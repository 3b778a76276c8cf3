import crypto from 'node:crypto';
import type { CookieOptions, Request, Response } from 'express';
import { getConfig, type Config } from '../config/env';
import type { PendingSignIn } from './session';

/**
 * Sign-ins started at GET /auth/login and not yet completed are kept in the browser, in one
 * sealed cookie (AES-256-GCM under a key derived from SESSION_SECRET: nobody can read or alter
 * it), not in the sessions table. So a visit to /auth/login stores nothing on the server, however
 * many there are; a session row is written only when a sign-in completes at the callback.
 */

/** The cookie's name: the session cookie's, with a suffix (one host may run several apps). */
export function pendingCookieName(config: Config = getConfig()): string {
  return `${config.SESSION_COOKIE_NAME}.sign-in`;
}

function sealingKey(config: Config): Buffer {
  return Buffer.from(
    crypto.hkdfSync('sha256', config.SESSION_SECRET, '', 'ebbline pending sign-ins', 32),
  );
}

/** Seals the list (iv, tag and ciphertext, base64url). */
export function sealPendingSignIns(list: PendingSignIn[], config: Config = getConfig()): string {
  const iv = crypto.randomBytes(12);
  const cipher = crypto.createCipheriv('aes-256-gcm', sealingKey(config), iv);
  const body = Buffer.concat([cipher.update(JSON.stringify(list), 'utf8'), cipher.final()]);
  return Buffer.concat([iv, cipher.getAuthTag(), body]).toString('base64url');
}

/** Opens a sealed list; anything altered, foreign or malformed is an empty list. */
export function unsealPendingSignIns(sealed: string, config: Config = getConfig()): PendingSignIn[] {
  try {
    const raw = Buffer.from(sealed, 'base64url');
    const decipher = crypto.createDecipheriv('aes-256-gcm', sealingKey(config), raw.subarray(0, 12));
    decipher.setAuthTag(raw.subarray(12, 28));
    const text = Buffer.concat([decipher.update(raw.subarray(28)), decipher.final()]).toString('utf8');
    const list: unknown = JSON.parse(text);
    return Array.isArray(list) ? (list as PendingSignIn[]) : [];
  } catch {
    return [];
  }
}

function cookieOptions(config: Config): CookieOptions {
  return {
    httpOnly: true,
    // the provider sends the browser back with a top-level GET, which Lax cookies go along with
    sameSite: 'lax',
    secure: config.APP_URL.startsWith('https:'),
    path: '/auth',
  };
}

/** The sign-ins this browser has under way (the cookie read from the request). */
export function readPendingSignIns(req: Request, config: Config = getConfig()): PendingSignIn[] {
  const name = `${pendingCookieName(config)}=`;
  const found = (req.headers.cookie ?? '')
    .split(';')
    .map((part) => part.trim())
    .find((part) => part.startsWith(name));
  return found ? unsealPendingSignIns(found.slice(name.length), config) : [];
}

/** Stores the list in the browser; an empty list removes the cookie. */
export function writePendingSignIns(
  res: Response,
  list: PendingSignIn[],
  config: Config = getConfig(),
): void {
  const name = pendingCookieName(config);
  if (list.length === 0) {
    res.clearCookie(name, cookieOptions(config));
    return;
  }
  res.cookie(name, sealPendingSignIns(list, config), {
    ...cookieOptions(config),
    maxAge: config.SIGN_IN_PENDING_MINUTES * 60_000,
  });
}
