import crypto from 'node:crypto';
import type { Transaction } from 'sequelize';
import { ApiToken } from '../models/api-token';
import { User } from '../models/user';
import { isRole, type Role } from '../../../shared/constants/roles';
import type { ApiTokenData, ApiTokenStatus } from '../../../shared/schemas/api-token';
import { AppError } from '../errors';
import type { AuthUser } from '../types/express';
import { recordAccessEvent, type RequestOrigin } from './access-events';
import type { UnitOfWork } from './unit-of-work';

const PREFIX = 'ebl_';
const DAY_MS = 86_400_000;

export function hashToken(secret: string): string {
  return crypto.createHash('sha256').update(secret).digest('hex');
}

/**
 * The acting user of a request. With `narrowTo` (a token's roles) the user acts with only
 * those of their current roles: a token never has more rights than its owner has now.
 */
export function toAuthUser(user: User, narrowTo?: readonly string[] | null): AuthUser {
  const held = user.roles.filter(isRole);
  const roles: Role[] = narrowTo ? held.filter((r) => narrowTo.includes(r)) : held;
  return { id: user.id, name: user.name, email: user.email, roles };
}

/** Whether a token still works at `now`. */
export function apiTokenStatus(token: ApiToken, now: Date): ApiTokenStatus {
  if (token.revokedAt) return 'revoked';
  return token.expiresAt <= now ? 'expired' : 'active';
}

/**
 * Issues a bearer token for a user. The secret is returned once and only its hash is stored.
 * @param expiresAt when the token stops working
 * @param roles narrows the token to these of the owner's roles; null for all of them
 * @param transaction the unit of work's, when issued in one
 */
export async function issueApiToken(
  userId: string,
  name: string,
  expiresAt: Date,
  roles: Role[] | null = null,
  transaction?: Transaction,
): Promise<{ token: ApiToken; secret: string }> {
  const secret = PREFIX + crypto.randomBytes(32).toString('base64url');
  const token = await ApiToken.create(
    {
      userId,
      name,
      tokenHash: hashToken(secret),
      roles,
      expiresAt,
      lastUsedAt: null,
      revokedAt: null,
    },
    { transaction },
  );
  return { token, secret };
}

/**
 * A person (the unit of work's actor) makes a token for themselves on their profile page; it
 * expires `input.expiresInDays` after the unit of work's instant.
 * @param input name, expiry in days (1–365), optional roles (each one the owner holds)
 * @throws AppError `validation-failed` naming `roles` when a role asked for is not the owner's
 */
export async function createApiToken(
  uow: UnitOfWork,
  input: ApiTokenData,
  origin: RequestOrigin,
): Promise<{ token: ApiToken; secret: string }> {
  const { actor: owner, now, transaction } = uow;
  const notHeld = (input.roles ?? []).filter((r) => !owner.roles.includes(r));
  if (notHeld.length > 0) {
    throw AppError.badRequest(
      `roles: you do not hold ${notHeld.join(', ')}; a token never has more rights than you.`,
      [{ path: 'roles', message: `You do not hold: ${notHeld.join(', ')}.` }],
    );
  }
  const roles = input.roles;
  const issued = await issueApiToken(
    owner.id,
    input.name,
    new Date(now.getTime() + input.expiresInDays * DAY_MS),
    roles,
    transaction,
  );
  await recordAccessEvent(
    {
      kind: 'token-created',
      userId: owner.id,
      origin,
      detail: {
        tokenId: issued.token.id,
        name: input.name,
        roles,
        expiresAt: issued.token.expiresAt.toISOString(),
      },
      at: now,
    },
    transaction,
  );
  return issued;
}

/** A person's tokens, newest first (revoked and expired ones included, marked as such). */
export async function listApiTokens(ownerId: string): Promise<ApiToken[]> {
  return ApiToken.findAll({ where: { userId: ownerId }, order: [['createdAt', 'DESC']] });
}

/**
 * Revokes one of the owner's (the unit of work's actor's) tokens; it stops working at once.
 * Revoking twice is harmless.
 * @throws AppError `not-found` when the token is not the owner's
 */
export async function revokeApiToken(uow: UnitOfWork, tokenId: string, origin: RequestOrigin): Promise<ApiToken> {
  const { actor: owner, now, transaction } = uow;
  const token = await ApiToken.findOne({ where: { id: tokenId, userId: owner.id }, transaction, lock: transaction.LOCK.UPDATE });
  if (!token) throw AppError.notFound('The API token');
  if (token.revokedAt) return token;
  await token.update({ revokedAt: now }, { transaction });
  await recordAccessEvent(
    {
      kind: 'token-revoked',
      userId: owner.id,
      origin,
      detail: { tokenId: token.id, name: token.name },
      at: now,
    },
    transaction,
  );
  return token;
}

/**
 * The active user behind a bearer secret, or null when the token is unknown, expired,
 * revoked or its owner is deactivated. Records the use at `now` (the request's instant, read
 * by the authentication middleware: this is a lookup with a bookkeeping touch, not a unit of work).
 */
export async function authenticateApiToken(secret: string, now: Date): Promise<AuthUser | null> {
  if (!secret.startsWith(PREFIX)) return null;
  const token = await ApiToken.findOne({
    where: { tokenHash: hashToken(secret) },
    include: [{ model: User, as: 'user' }],
  });
  const owner = (token as (ApiToken & { user?: User }) | null)?.user;
  if (!token || !owner || apiTokenStatus(token, now) !== 'active' || !owner.active) return null;
  await token.update({ lastUsedAt: now });
  return toAuthUser(owner, token.roles);
}
