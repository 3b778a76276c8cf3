import { Op, type Transaction, type WhereOptions } from 'sequelize';
import type { AccessEventKind, AccessEventsQuery } from '../../../shared/schemas/access-event';
import { AccessEvent } from '../models/access-event';
import { User } from '../models/user';

/** Where a request came from, as the sign-in log keeps it. */
export interface RequestOrigin {
  ip: string | null;
  userAgent: string | null;
}

export interface AccessEventInput {
  kind: AccessEventKind;
  /** The person the event is about. */
  userId?: string | null;
  /** Who acted, when it was someone else. */
  actorId?: string | null;
  /** The login typed at a failed sign-in. */
  login?: string | null;
  origin: RequestOrigin;
  detail?: Record<string, unknown>;
  /** When it happened: the unit of work's instant for a change made in one; left out, now. */
  at?: Date;
}

/** Writes one entry of the sign-in log. */
export async function recordAccessEvent(
  input: AccessEventInput,
  transaction?: Transaction,
): Promise<AccessEvent> {
  return AccessEvent.create(
    {
      kind: input.kind,
      userId: input.userId ?? null,
      actorId: input.actorId ?? null,
      login: input.login?.slice(0, 200) ?? null,
      ip: input.origin.ip,
      // user agents can be long; the log needs the start
      userAgent: input.origin.userAgent?.slice(0, 400) ?? null,
      detail: input.detail ?? {},
      ...(input.at ? { createdAt: input.at } : {}),
    },
    { transaction },
  );
}

export type AccessEventWithPeople = AccessEvent & { user?: User | null; actor?: User | null };

/** The newest entries first, with the people they name. */
export async function listAccessEvents(query: AccessEventsQuery): Promise<AccessEventWithPeople[]> {
  const where: WhereOptions<AccessEvent> = {
    ...(query.kind ? { kind: query.kind } : {}),
    ...(query.userId ? { userId: query.userId } : {}),
    ...(query.before ? { createdAt: { [Op.lt]: new Date(query.before) } } : {}),
  };
  return (await AccessEvent.findAll({
    where,
    include: [
      { model: User, as: 'user', attributes: ['id', 'name'] },
      { model: User, as: 'actor', attributes: ['id', 'name'] },
    ],
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: query.limit,
  })) as AccessEventWithPeople[];
}
