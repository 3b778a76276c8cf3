import crypto from 'node:crypto';
import { ApiToken } from '../models/api-token';
import { User } from '../models/user';
import { isRole } from '../../../shared/constants/roles';
import type { AuthUser } from '../types/express';

const PREFIX = 'ebl_';

export function hashToken(secret: string): string {
  return crypto.createHash('sha256').update(secret).digest('hex');
}

export function toAuthUser(user: User): AuthUser {
  return { id: user.id, name: user.name, email: user.email, roles: user.roles.filter(isRole) };
}

/**
 * Issues a bearer token for a user. The secret is returned once and only its hash is stored.
 * @param expiresAt when the token stops working
 */
export async function issueApiToken(
  userId: string,
  name: string,
  expiresAt: Date,
): Promise<{ token: ApiToken; secret: string }> {
  const secret = PREFIX + crypto.randomBytes(32).toString('base64url');
  const token = await ApiToken.create({
    userId,
    name,
    tokenHash: hashToken(secret),
    expiresAt,
    lastUsedAt: null,
    revokedAt: null,
  });
  return { token, secret };
}

/**
 * The active user behind a bearer secret, or null when the token is unknown, expired,
 * revoked or its owner is deactivated. Records the use.
 */
export async function authenticateApiToken(secret: string, now = new Date()): Promise<AuthUser | null> {
  if (!secret.startsWith(PREFIX)) return null;
  const token = await ApiToken.findOne({
    where: { tokenHash: hashToken(secret) },
    include: [{ model: User, as: 'user' }],
  });
  const owner = (token as (ApiToken & { user?: User }) | null)?.user;
  if (!token || !owner || token.revokedAt || token.expiresAt <= now || !owner.active) return null;
  await token.update({ lastUsedAt: now });
  return toAuthUser(owner);
}
