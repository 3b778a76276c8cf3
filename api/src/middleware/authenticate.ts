import type { RequestHandler } from 'express';
import { getConfig } from '../config/env';
import { endSession } from '../auth/session';
import { AppError } from '../errors';
import { User } from '../models/user';
import { authenticateApiToken, toAuthUser } from '../services/api-tokens';

/**
 * Recognises the caller: `Authorization: Bearer …` (API tokens) first, else the session
 * cookie. The user is read from the database on every request, so a role change or a
 * deactivation counts from the next request on. A session past its absolute limit, or of a
 * deactivated user, is ended here. Sets `req.user`; an absent caller is left to the route's
 * access guard (401), only a bad token is refused here.
 */
export const authenticate: RequestHandler = async (req, res, next) => {
  const header = req.get('authorization');
  if (header) {
    const match = /^Bearer\s+(\S+)$/i.exec(header);
    const user = match?.[1] ? await authenticateApiToken(match[1], new Date()) : null;
    if (!user)
      throw new AppError('invalid-token', 'The API token is unknown, expired or revoked.');
    req.user = user;
    req.authMethod = 'bearer';
    next();
    return;
  }
  const userId = req.session?.userId;
  if (userId) {
    const config = getConfig();
    const signedInAt = req.session.signedInAt ?? 0;
    const withinLimit = Date.now() - signedInAt < config.SESSION_ABSOLUTE_HOURS * 3_600_000;
    const user = withinLimit ? await User.findByPk(userId) : null;
    if (user?.active) {
      req.user = toAuthUser(user);
      req.authMethod = 'session';
    } else {
      await endSession(req, res, config);
    }
  }
  next();
};
