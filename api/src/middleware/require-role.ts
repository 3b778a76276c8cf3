import type { RequestHandler } from 'express';
import { hasAnyRole, type Role } from '../../../shared/constants/roles';
import { AppError } from '../errors';

/**
 * Lets the request through only for a signed-in user holding one of `allowed`.
 * 401 without a user, 403 with the wrong role. Every /api route declares one.
 */
export function requireRole(...allowed: Role[]): RequestHandler {
  if (allowed.length === 0) throw new Error('requireRole needs at least one role');
  return (req, _res, next) => {
    if (!req.user) throw AppError.unauthenticated();
    if (!hasAnyRole(req.user.roles, allowed)) {
      throw AppError.forbidden(`This needs one of these roles: ${allowed.join(', ')}.`);
    }
    next();
  };
}

/** Any signed-in user with at least one role. */
export const requireAnyRole: RequestHandler = (req, _res, next) => {
  if (!req.user) throw AppError.unauthenticated();
  if (req.user.roles.length === 0) throw AppError.forbidden('Your account has no role yet.');
  next();
};
