/**
 * Calendar feeds: a person's secret address (GET /feeds/visits/<secret>.ics) that their
 * calendar app subscribes to, so their visits show beside the rest of their day. Like an API
 * token, the secret is shown once and only its SHA-256 is kept; making a new address turns
 * the old one off, and turning it off is at once. Both are security events: they go to the
 * sign-in log (access_events) in the same unit of work.
 */
import crypto from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { sequelize } from '../db/sequelize';
import { CalendarFeed } from '../models/calendar-feed';
import { User } from '../models/user';
import { recordAccessEvent, type RequestOrigin } from './access-events';
import type { UnitOfWork } from './unit-of-work';

/** Marks the secret as a calendar feed's (never mistaken for an API token's `ebl_`). */
const SECRET_PREFIX = 'ebc_';

/** The secret's fingerprint, as stored: SHA-256, hex. */
export function calendarFeedHash(secret: string): string {
  return crypto.createHash('sha256').update(secret).digest('hex');
}

/** The person's feed in use, or null. */
export async function findActiveCalendarFeed(userId: string): Promise<CalendarFeed | null> {
  return CalendarFeed.findOne({ where: { userId, revokedAt: null } });
}

/** Turns off the owner's feed in use, if any, in the unit of work; returns its id. */
async function revokeActive(uow: UnitOfWork): Promise<string | null> {
  const { actor: owner, now, transaction } = uow;
  const [rows] = (await sequelize.query(
    `UPDATE calendar_feeds SET revoked_at = :now
      WHERE user_id = :userId AND revoked_at IS NULL RETURNING id`,
    { replacements: { now: now.toISOString(), userId: owner.id }, transaction },
  )) as [Array<{ id: string }>, unknown];
  return rows[0]?.id ?? null;
}

/**
 * Makes a new feed address for the unit of work's actor, turning off the one in use.
 * @returns the feed and its secret (shown once; only its fingerprint is stored)
 */
export async function createCalendarFeed(
  uow: UnitOfWork,
  origin: RequestOrigin,
): Promise<{ feed: CalendarFeed; secret: string }> {
  const { actor: owner, now, transaction } = uow;
  // one change of a person's feeds at a time: two makes at once end with one address in use
  await User.findByPk(owner.id, { transaction, lock: transaction.LOCK.UPDATE });
  const replacedFeedId = await revokeActive(uow);
  const secret = SECRET_PREFIX + crypto.randomBytes(32).toString('base64url');
  const feed = await CalendarFeed.create(
    {
      userId: owner.id,
      tokenHash: calendarFeedHash(secret),
      createdAt: now,
      revokedAt: null,
      lastUsedAt: null,
    },
    { transaction },
  );
  await recordAccessEvent(
    {
      kind: 'calendar-feed-created',
      userId: owner.id,
      origin,
      detail: { feedId: feed.id, replacedFeedId },
      at: now,
    },
    transaction,
  );
  return { feed, secret };
}

/**
 * Turns off the actor's feed address: calendar apps get 404 from the next fetch. Turning off
 * when none is in use changes nothing and logs nothing.
 * @returns whether a feed was turned off
 */
export async function revokeCalendarFeed(uow: UnitOfWork, origin: RequestOrigin): Promise<boolean> {
  const { actor: owner, now, transaction } = uow;
  await User.findByPk(owner.id, { transaction, lock: transaction.LOCK.UPDATE });
  const feedId = await revokeActive(uow);
  if (!feedId) return false;
  await recordAccessEvent(
    { kind: 'calendar-feed-revoked', userId: owner.id, origin, detail: { feedId }, at: now },
    transaction,
  );
  return true;
}

/** How often a fetch is written down as the feed's last use (calendar apps fetch often). */
const LAST_USED_GRANULARITY_MS = 60_000;

/**
 * The active person behind a feed secret, or null when the secret is unknown, turned off or
 * its owner deactivated (the caller answers all alike). Notes the fetch at `now` as the
 * feed's last use (at most once a minute): a lookup with a bookkeeping touch, not a unit of work.
 */
export async function calendarFeedOwner(secret: string, now: Date): Promise<User | null> {
  if (!secret.startsWith(SECRET_PREFIX)) return null;
  const feed = await CalendarFeed.findOne({
    where: { tokenHash: calendarFeedHash(secret), revokedAt: null },
    include: [{ model: User, as: 'user' }],
  });
  const owner = (feed as (CalendarFeed & { user?: User }) | null)?.user;
  if (!feed || !owner || !owner.active) return null;
  if (!feed.lastUsedAt || now.getTime() - feed.lastUsedAt.getTime() >= LAST_USED_GRANULARITY_MS) {
    await feed.update({ lastUsedAt: now });
  }
  return owner;
}

/** A visit as a feed shows it. */
export interface FeedVisit {
  id: string;
  state: string;
  plannedStartAt: Date;
  plannedEndAt: Date;
  notes: string;
  stateReason: string;
  version: number;
  updatedAt: Date;
  cabinetTag: string;
  cabinetLocation: string;
  driveMake: string;
  driveModel: string;
  markedWaitMinutes: number | null;
  dcBusVolts: number | null;
  siteName: string;
  timeZone: string;
  areaId: string;
  areaName: string;
  banks: Array<{ position: string; bankDesignCode: string }>;
  technicians: string[];
}

/**
 * The visits a person is assigned to whose planned time overlaps [fromAt, toAt), every state,
 * in planned order, with what an event shows: cabinet, site, area, banks and who goes.
 */
export async function listCalendarFeedVisits(
  userId: string,
  fromAt: Date,
  toAt: Date,
): Promise<FeedVisit[]> {
  const rows = await sequelize.query<Record<string, unknown>>(
    `SELECT v.id, v.state, v.planned_start_at, v.planned_end_at, v.notes, v.state_reason, v.version, v.updated_at,
            c.tag AS cabinet_tag, c.location AS cabinet_location, c.drive_make, c.drive_model,
            c.marked_wait_minutes, c.dc_bus_volts,
            s.name AS site_name, s.time_zone, a.id AS area_id, a.name AS area_name,
            COALESCE((SELECT json_agg(json_build_object('position', b.position, 'bankDesignCode', d.code)
                                      ORDER BY b.position)
                        FROM visit_banks vb JOIN banks b ON b.id = vb.bank_id
                        JOIN bank_designs d ON d.id = b.bank_design_id
                       WHERE vb.visit_id = v.id), '[]') AS banks,
            COALESCE((SELECT json_agg(u.name ORDER BY u.name)
                        FROM visit_technicians vt2 JOIN users u ON u.id = vt2.user_id
                       WHERE vt2.visit_id = v.id), '[]') AS technicians
       FROM visits v
       JOIN visit_technicians vt ON vt.visit_id = v.id AND vt.user_id = :userId
       JOIN cabinets c ON c.id = v.cabinet_id
       JOIN areas a ON a.id = c.area_id
       JOIN sites s ON s.id = a.site_id
      WHERE v.planned_end_at > :fromAt AND v.planned_start_at < :toAt
      ORDER BY v.planned_start_at, v.id
      LIMIT 2000`,
    {
      replacements: { userId, fromAt: fromAt.toISOString(), toAt: toAt.toISOString() },
      type: QueryTypes.SELECT,
    },
  );
  return rows.map((r) => ({
    id: r.id as string,
    state: r.state as string,
    plannedStartAt: new Date(r.planned_start_at as string),
    plannedEndAt: new Date(r.planned_end_at as string),
    notes: r.notes as string,
    stateReason: r.state_reason as string,
    version: r.version as number,
    updatedAt: new Date(r.updated_at as string),
    cabinetTag: r.cabinet_tag as string,
    cabinetLocation: r.cabinet_location as string,
    driveMake: r.drive_make as string,
    driveModel: r.drive_model as string,
    markedWaitMinutes: (r.marked_wait_minutes as number | null) ?? null,
    dcBusVolts: (r.dc_bus_volts as number | null) ?? null,
    siteName: r.site_name as string,
    timeZone: r.time_zone as string,
    areaId: r.area_id as string,
    areaName: r.area_name as string,
    banks: r.banks as FeedVisit['banks'],
    technicians: r.technicians as string[],
  }));
}

/** A shutdown window of an area as stored, for finding the occurrence a visit falls in. */
export interface FeedWindow {
  areaId: string;
  title: string;
  startsAt: string;
  endsAt: string;
  recurrence: string | null;
}

/** The shutdown windows in use (not retired) of the given areas. */
export async function listAreaWindows(areaIds: readonly string[]): Promise<FeedWindow[]> {
  if (areaIds.length === 0) return [];
  const rows = await sequelize.query<{
    area_id: string;
    title: string;
    starts_at: Date;
    ends_at: Date;
    recurrence: string | null;
  }>(
    `SELECT area_id, title, starts_at, ends_at, recurrence FROM shutdown_windows
      WHERE area_id IN (:areaIds) AND retired_at IS NULL ORDER BY starts_at`,
    { replacements: { areaIds: [...areaIds] }, type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({
    areaId: r.area_id,
    title: r.title,
    startsAt: new Date(r.starts_at).toISOString(),
    endsAt: new Date(r.ends_at).toISOString(),
    recurrence: r.recurrence,
  }));
}
