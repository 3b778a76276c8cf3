import { Op, QueryTypes, type Transaction, type WhereOptions } from 'sequelize';
import { isRole, type Role } from '../../../shared/constants/roles';
import type { PeopleQuery, PersonSiteRef, PersonUpdate } from '../../../shared/schemas/person';
import { endSessionsOfUser } from '../auth/session';
import { sequelize } from '../db/sequelize';
import { AppError } from '../errors';
import { PersonSite } from '../models/person-site';
import { User } from '../models/user';
import { recordAccessEvent, type RequestOrigin } from './access-events';
import { recordAudit } from './audit';
import type { UnitOfWork } from './unit-of-work';

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

/** The user behind `identity`, found, linked or created and stamped as signed in; or why not. */
async function admitPerson(uow: UnitOfWork<null>, identity: ProviderIdentity, origin: RequestOrigin): Promise<SignInOutcome> {
  const { transaction, now } = uow;
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
      at: now,
    },
    transaction,
  );
  return { ok: true, user, firstSignIn };
}

/**
 * Finds or creates the Ebbline user behind a provider identity and records the sign-in.
 * On the first sign-in the user gets the roles that the `roles` claim names; after that
 * Ebbline's roles rule (an admin edits them on People) and the claim is ignored. A user
 * pre-registered by e-mail (no subject yet) is linked when the provider has verified that
 * address. Name and e-mail follow the provider. A refusal is recorded in the sign-in log too.
 *
 * @param uow - a unit of work of Ebbline itself (no one is signed in yet)
 * @returns the user, or why they may not sign in (deactivated, e-mail held by another account)
 */
export async function signInPerson(
  uow: UnitOfWork<null>,
  identity: ProviderIdentity,
  origin: RequestOrigin,
): Promise<SignInOutcome> {
  const { transaction, now } = uow;
  const outcome = await admitPerson(uow, identity, origin);
  if (!outcome.ok) {
    // a refusal changed nothing, so its log entry commits with the same unit of work
    await recordAccessEvent(
      {
        kind: 'sign-in-failed',
        userId: outcome.userId,
        login: identity.email,
        origin,
        detail: { reason: outcome.reason },
        at: now,
      },
      transaction,
    );
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

/** One person, or `not-found`. */
export async function getPerson(userId: string): Promise<User> {
  const user = await User.findByPk(userId);
  if (!user) throw AppError.notFound('The person');
  return user;
}

/**
 * The sites each of `userIds` works at (rows of `person_sites`), by site name; a person with
 * no rows maps to an empty list.
 */
export async function sitesOfPeople(
  userIds: readonly string[],
  transaction?: Transaction,
): Promise<Map<string, PersonSiteRef[]>> {
  const bySite = new Map<string, PersonSiteRef[]>(userIds.map((id) => [id, []]));
  if (userIds.length === 0) return bySite;
  const rows = await sequelize.query<PersonSiteRef & { userId: string }>(
    `SELECT ps.user_id AS "userId", s.id, s.name, s.code, s.time_zone AS "timeZone"
       FROM person_sites ps JOIN sites s ON s.id = ps.site_id
      WHERE ps.user_id = ANY($1::uuid[])
      ORDER BY lower(s.name), s.id`,
    { bind: [userIds], type: QueryTypes.SELECT, transaction },
  );
  for (const { userId, ...site } of rows) bySite.get(userId)?.push(site);
  return bySite;
}

/**
 * Checks that every id of `siteIds` names a site in use, or one the person already works at
 * (a site retired since stays until it is taken off).
 * @throws AppError `validation-failed` naming `siteIds.<i>` for each unknown or retired site
 */
async function assertSitesUsable(
  siteIds: readonly string[],
  heldIds: ReadonlySet<string>,
  transaction: Transaction,
): Promise<void> {
  if (siteIds.length === 0) return;
  const found = await sequelize.query<{ id: string; retired: boolean }>(
    'SELECT id, retired_at IS NOT NULL AS retired FROM sites WHERE id = ANY($1::uuid[])',
    { bind: [siteIds], type: QueryTypes.SELECT, transaction },
  );
  const retired = new Map(found.map((row) => [row.id, row.retired]));
  const issues = siteIds.flatMap((id, index) => {
    const isRetired = retired.get(id);
    if (isRetired === undefined) {
      return [{ path: `siteIds.${index}`, message: 'There is no site with this id.' }];
    }
    if (isRetired && !heldIds.has(id)) {
      return [{ path: `siteIds.${index}`, message: 'This site is retired: choose a site in use.' }];
    }
    return [];
  });
  if (issues.length > 0) {
    throw AppError.badRequest(issues[0]!.message, issues);
  }
}

/** The active admins, for a person waiting for access to ask. */
export async function listAdmins(): Promise<User[]> {
  return User.findAll({
    where: { active: true, roles: { [Op.contains]: ['admin'] } },
    order: [['name', 'ASC']],
  });
}

/**
 * An admin (the unit of work's actor) changes a person's roles and/or deactivates or
 * reactivates them, in the unit of work with its sign-in log entries; and/or sets the sites
 * they work at (`siteIds` replaces the list) and their hours a week available for visits, with
 * an audit entry naming what was and what is. Only what the change names moves. Deactivation
 * ends the person's sessions once the change is committed; their API tokens stop working
 * because tokens act only for active owners.
 * @throws AppError `not-found`; `validation-failed` naming `siteIds.<i>` for an unknown or
 *   retired site; `conflict` when the change would leave no active admin, or an admin would
 *   deactivate themselves
 */
export async function updatePerson(
  uow: UnitOfWork,
  userId: string,
  change: PersonUpdate,
  origin: RequestOrigin,
): Promise<User> {
  const { transaction, actor, now } = uow;
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
        at: now,
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
        at: now,
      },
      transaction,
    );
  }
  await changeSitesAndHours(uow, user, change);
  const updated = await user.update({ roles: afterRoles, active: afterActive }, { transaction });
  // the sessions live in the session store's own pool: ended only once the deactivation holds
  if (!updated.active) transaction.afterCommit(() => endSessionsOfUser(updated.id).then(() => undefined));
  return updated;
}

/** Sets the person's sites and weekly hours that `change` names, with one audit entry when either moved. */
async function changeSitesAndHours(uow: UnitOfWork, user: User, change: PersonUpdate): Promise<void> {
  const { transaction } = uow;
  if (change.siteIds === undefined && change.availableHoursPerWeek === undefined) return;
  const heldSites = (await sitesOfPeople([user.id], transaction)).get(user.id) ?? [];
  const heldIds = heldSites.map((site) => site.id);
  const before: Record<string, unknown> = {};
  const after: Record<string, unknown> = {};

  if (change.siteIds !== undefined) {
    await assertSitesUsable(change.siteIds, new Set(heldIds), transaction);
    const sameSites =
      change.siteIds.length === heldIds.length && change.siteIds.every((id) => heldIds.includes(id));
    if (!sameSites) {
      await PersonSite.destroy({ where: { userId: user.id }, transaction });
      await PersonSite.bulkCreate(
        change.siteIds.map((siteId) => ({ userId: user.id, siteId })),
        { transaction },
      );
      const nowSites = (await sitesOfPeople([user.id], transaction)).get(user.id) ?? [];
      before.sites = heldSites.map((site) => site.name);
      before.siteIds = heldIds;
      after.sites = nowSites.map((site) => site.name);
      after.siteIds = nowSites.map((site) => site.id);
    }
  }

  const hours = change.availableHoursPerWeek;
  if (hours !== undefined && hours !== user.availableHoursPerWeek) {
    before.availableHoursPerWeek = user.availableHoursPerWeek;
    after.availableHoursPerWeek = hours;
    await user.update({ availableHoursPerWeek: hours }, { transaction });
  }

  const moved = Object.keys(after);
  if (moved.length === 0) return;
  const said = [
    after.sites !== undefined
      ? `sites ${(after.sites as string[]).join(', ') || 'none'}`
      : null,
    after.availableHoursPerWeek !== undefined ? `${hours} h a week available for visits` : null,
  ].filter((part) => part !== null);
  await recordAudit(uow, {
    entityType: 'person',
    entityId: user.id,
    action: 'update',
    summary: `Changed ${user.name}: ${said.join('; ')}`,
    before,
    after,
  });
}
