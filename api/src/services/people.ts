import { Op, type WhereOptions } from 'sequelize';
import { isRole, type Role } from '../../../shared/constants/roles';
import type { PeopleQuery, PersonUpdate } from '../../../shared/schemas/person';
import { endSessionsOfUser } from '../auth/session';
import { sequelize } from '../db/sequelize';
import { AppError } from '../errors';
import { User } from '../models/user';
import type { AuthUser } from '../types/express';
import { recordAccessEvent, type RequestOrigin } from './access-events';

/** What a verified ID token says about the person signing in. */
export interface ProviderIdentity {
  subject: string;
  email: string;
  emailVerified: boolean;
  name: string;
  /** The provider's `roles` claim; names Ebbline does not know are ignored. */
  roles: string[];
}

export type SignInOutcome =
  | { ok: true; user: User; firstSignIn: boolean }
  | { ok: false; reason: 'deactivated' | 'email-taken'; userId: string | null; message: string };

/**
 * Finds or creates the Ebbline user behind a provider identity and records the sign-in.
 * On the first sign-in the user gets the roles that the `roles` claim names; after that
 * Ebbline's roles rule (an admin edits them on People) and the claim is ignored. A user
 * pre-registered by e-mail (no subject yet) is linked when the provider has verified that
 * address. Name and e-mail follow the provider.
 * @returns the user, or why they may not sign in (deactivated, e-mail held by another account)
 */
export async function signInPerson(
  identity: ProviderIdentity,
  origin: RequestOrigin,
  now = new Date(),
): Promise<SignInOutcome> {
  const outcome = await sequelize.transaction(async (transaction): Promise<SignInOutcome> => {
    let firstSignIn = false;
    let user = await User.findOne({
      where: { subject: identity.subject },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!user) {
      const byEmail = await User.findOne({
        where: { email: identity.email },
        transaction,
        lock: transaction.LOCK.UPDATE,
      });
      if (byEmail && (byEmail.subject !== null || !identity.emailVerified)) {
        return {
          ok: false,
          reason: 'email-taken',
          userId: byEmail.id,
          message: `Another Ebbline account already uses ${identity.email}. Ask an admin to sort it out.`,
        };
      }
      if (byEmail) {
        user = await byEmail.update({ subject: identity.subject }, { transaction });
      } else {
        firstSignIn = true;
        user = await User.create(
          {
            subject: identity.subject,
            email: identity.email,
            name: identity.name,
            roles: identity.roles.filter(isRole),
            lastSignInAt: null,
          },
          { transaction },
        );
      }
    }
    if (!user.active) {
      return {
        ok: false,
        reason: 'deactivated',
        userId: user.id,
        message: 'Your Ebbline account is deactivated. Ask an admin if you need it again.',
      };
    }
    const emailFree =
      identity.email === user.email ||
      !(await User.count({
        where: { email: identity.email, id: { [Op.ne]: user.id } },
        transaction,
      }));
    await user.update(
      { name: identity.name, ...(emailFree ? { email: identity.email } : {}), lastSignInAt: now },
      { transaction },
    );
    await recordAccessEvent(
      {
        kind: 'sign-in',
        userId: user.id,
        origin,
        detail: firstSignIn ? { firstSignIn: true, rolesFromProvider: user.roles } : {},
      },
      transaction,
    );
    return { ok: true, user, firstSignIn };
  });
  if (!outcome.ok) {
    await recordAccessEvent({
      kind: 'sign-in-failed',
      userId: outcome.userId,
      login: identity.email,
      origin,
      detail: { reason: outcome.reason },
    });
  }
  return outcome;
}

/** Escapes LIKE's wildcards so a search for "50%" finds "50%". */
function likePattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/** Everyone (or the matches of `q` in name or e-mail), by name. */
export async function listPeople(query: PeopleQuery): Promise<User[]> {
  const where: WhereOptions<User> = {
    ...(query.includeDeactivated ? {} : { active: true }),
    ...(query.q
      ? {
          [Op.or]: [
            { name: { [Op.iLike]: likePattern(query.q) } },
            { email: { [Op.iLike]: likePattern(query.q) } },
          ],
        }
      : {}),
  };
  return User.findAll({
    where,
    order: [
      ['name', 'ASC'],
      ['email', 'ASC'],
    ],
    limit: 1000,
  });
}

/** The active admins, for a person waiting for access to ask. */
export async function listAdmins(): Promise<User[]> {
  return User.findAll({
    where: { active: true, roles: { [Op.contains]: ['admin'] } },
    order: [['name', 'ASC']],
  });
}

/**
 * An admin changes a person's roles and/or deactivates or reactivates them, in one
 * transaction with its sign-in log entries. Deactivation ends the person's sessions; their
 * API tokens stop working because tokens act only for active owners.
 * @throws AppError not-found; conflict when the change would leave no active admin, or an
 *   admin would deactivate themselves
 */
export async function updatePerson(
  actor: AuthUser,
  userId: string,
  change: PersonUpdate,
  origin: RequestOrigin,
): Promise<User> {
  const updated = await sequelize.transaction(async (transaction) => {
    const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!user) throw AppError.notFound('The person');
    const beforeRoles = user.roles.filter(isRole);
    const afterRoles: Role[] = change.roles ?? beforeRoles;
    const afterActive = change.active ?? user.active;
    if (change.active === false && user.id === actor.id) {
      throw AppError.conflict('You cannot deactivate your own account. Ask another admin.');
    }
    const adminBefore = user.active && beforeRoles.includes('admin');
    const adminAfter = afterActive && afterRoles.includes('admin');
    if (adminBefore && !adminAfter) {
      // lock every admin row, so two admins demoting each other at once cannot both succeed
      const admins = await User.findAll({
        where: { active: true, roles: { [Op.contains]: ['admin'] } },
        attributes: ['id'],
        transaction,
        lock: transaction.LOCK.UPDATE,
      });
      if (!admins.some((a) => a.id !== user.id)) {
        throw AppError.conflict(
          'Ebbline needs at least one active admin: make someone else admin first.',
        );
      }
    }
    const rolesChanged = afterRoles.join(',') !== beforeRoles.join(',');
    if (rolesChanged) {
      await recordAccessEvent(
        {
          kind: 'roles-changed',
          userId: user.id,
          actorId: actor.id,
          origin,
          detail: { from: beforeRoles, to: afterRoles },
        },
        transaction,
      );
    }
    if (afterActive !== user.active) {
      await recordAccessEvent(
        {
          kind: afterActive ? 'reactivated' : 'deactivated',
          userId: user.id,
          actorId: actor.id,
          origin,
        },
        transaction,
      );
    }
    return user.update({ roles: afterRoles, active: afterActive }, { transaction });
  });
  if (!updated.active) await endSessionsOfUser(updated.id);
  return updated;
}
