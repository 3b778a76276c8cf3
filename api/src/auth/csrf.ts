import crypto from 'node:crypto';
import type { RequestHandler } from 'express';
import { AppError } from '../errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** True when `sent` is the session's token (compared in constant time). */
export function csrfTokenMatches(sent: unknown, expected: string | undefined): boolean {
  if (typeof sent !== 'string' || !expected) return false;
  const a = Buffer.from(sent);
  const b = Buffer.from(expected);
  return a.length === b.length && crypto.timingSafeEqual(a, b);
}

/**
 * CSRF protection for cookie-authenticated requests: every POST, PUT, PATCH and DELETE made
 * with a signed-in session must send the session's token in `X-CSRF-Token` (or, for a plain
 * HTML form, the `_csrf` field). API tokens are not sent by browsers on their own, so bearer
 * requests need none. Runs after `authenticate`.
 */
export const requireCsrfToken: RequestHandler = (req, _res, next) => {
  if (SAFE_METHODS.has(req.method) || req.authMethod !== 'session') {
    next();
    return;
  }
  const body = req.body as { _csrf?: unknown } | undefined;
  const sent =
    req.get('x-csrf-token') ?? (typeof body?._csrf === 'string' ? body._csrf : undefined);
  if (!csrfTokenMatches(sent, req.session.csrfToken)) {
    throw new AppError(
      'csrf-failed',
      'The request did not carry this session’s security token (X-CSRF-Token). Reload the page and try again.',
    );
  }
  next();
};
