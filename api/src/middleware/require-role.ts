import type { RequestHandler } from 'express';
import { hasAnyRole, type Role } from '../../../shared/constants/roles';
import { AppError } from '../errors';

/** Who a route lets in. Every /api route declares one (see route-access.ts). */
export type AccessRule =
  | { kind: 'public' }
  | { kind: 'signed-in' }
  | { kind: 'any-role' }
  | { kind: 'roles'; roles: readonly Role[] };

/** Marks a middleware as an access declaration, so the route check at boot can find it. */
export const ACCESS_RULE = Symbol('ebbline.access-rule');

export type AccessGuard = RequestHandler & { [ACCESS_RULE]: AccessRule };

function guard(rule: AccessRule, handler: RequestHandler): AccessGuard {
  return Object.assign(handler, { [ACCESS_RULE]: rule });
}

/** The access rule a middleware declares, or undefined when it is no access guard. */
export function accessRuleOf(handler: unknown): AccessRule | undefined {
  return typeof handler === 'function' ? (handler as Partial<AccessGuard>)[ACCESS_RULE] : undefined;
}

/**
 * Lets the request through only for a signed-in user holding one of `allowed`.
 * 401 without a user, 403 with the wrong role. Every /api route declares one.
 */
export function requireRole(...allowed: Role[]): AccessGuard {
  if (allowed.length === 0) throw new Error('requireRole needs at least one role');
  return guard({ kind: 'roles', roles: allowed }, (req, _res, next) => {
    if (!req.user) throw AppError.unauthenticated();
    if (!hasAnyRole(req.user.roles, allowed)) {
      throw AppError.forbidden(`This needs one of these roles: ${allowed.join(', ')}.`);
    }
    next();
  });
}

/** Any signed-in user with at least one role. */
export const requireAnyRole: AccessGuard = guard({ kind: 'any-role' }, (req, _res, next) => {
  if (!req.user) throw AppError.unauthenticated();
  if (req.user.roles.length === 0) throw AppError.forbidden('Your account has no role yet.');
  next();
});

/** Any signed-in user, even one still waiting for a role (GET /api/me, the admins to ask). */
export const requireSignedIn: AccessGuard = guard({ kind: 'signed-in' }, (req, _res, next) => {
  if (!req.user) throw AppError.unauthenticated();
  next();
});

/** Deliberately open to anyone, signed in or not (health checks). */
export const allowPublic: AccessGuard = guard({ kind: 'public' }, (_req, _res, next) => next());

/**
 * Refuses API tokens: for what a script must never do, such as making more tokens.
 * Not an access declaration by itself; put it after one.
 */
export const requireSessionCaller: RequestHandler = (req, _res, next) => {
  if (req.authMethod !== 'session') {
    throw new AppError(
      'session-required',
      'This needs a signed-in browser session; an API token cannot do it.',
    );
  }
  next();
};
