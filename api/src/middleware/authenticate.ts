import type { RequestHandler } from 'express';
import { AppError } from '../errors';
import { authenticateApiToken } from '../services/api-tokens';

/**
 * Recognises the caller from `Authorization: Bearer …` (API tokens). Sets `req.user`
 * when recognised; never rejects by itself (see requireRole).
 */
export const authenticate: RequestHandler = async (req, _res, next) => {
  const header = req.get('authorization');
  if (header) {
    const match = /^Bearer\s+(\S+)$/i.exec(header);
    const user = match?.[1] ? await authenticateApiToken(match[1]) : null;
    if (!user) throw new AppError('invalid-token', 401, 'The API token is unknown, expired or revoked.');
    req.user = user;
    req.authMethod = 'bearer';
  }
  next();
};
