/**
 * Use cases of shutdown windows: list (with their occurrences in a range), read, create,
 * change, retire. Each write checks the window's times in its site's time zone
 * (`windowTimesProblems`) and keeps an audit entry.
 */
import { Op, type IncludeOptions, type Transaction, type WhereOptions } from 'sequelize';
import { windowOccurrences, windowTimesProblems, type WindowOccurrence } from '../../../shared/domain/shutdown-windows';
import type { ShutdownWindowData, ShutdownWindowListQuery, ShutdownWindowUpdate } from '../../../shared/schemas/shutdown-window';
import { AppError } from '../errors';
import { Area } from '../models/area';
import { ShutdownWindow } from '../models/shutdown-window';
import { Site } from '../models/site';
import { auditedColumns, recordCreation, saveChange } from './audited-change';
import { changedFields, fieldProblem, lockForChange } from './register-records';
import type { UnitOfWork } from './unit-of-work';

/** The columns of a window kept in the audit trail's before/after snapshots. */
export const SHUTDOWN_WINDOW_AUDITED = ['areaId', 'title', 'startsAt', 'endsAt', 'recurrence', 'notes', 'version', 'retiredAt'] as const;
export const SHUTDOWN_WINDOW_TRAIL = auditedColumns<ShutdownWindow>('shutdown-window', SHUTDOWN_WINDOW_AUDITED);

const withAreaAndSite: IncludeOptions = {
  model: Area,
  as: 'area',
  required: true,
  include: [{ model: Site, as: 'site', required: true }],
};

/** A window with its occurrences in the asked range (none asked: undefined). */
export interface WindowWithOccurrences {
  window: ShutdownWindow;
  occurrences?: WindowOccurrence[];
}

/** The site's time zone of a window read with its area and site. */
export function timeZoneOfWindow(window: ShutdownWindow): string {
  const zone = window.area?.site?.timeZone;
  if (!zone) throw new Error('A shutdown window was read without its area and site.');
  return zone;
}

const timesOf = (window: ShutdownWindow) => ({
  startsAt: window.startsAt.toISOString(),
  endsAt: window.endsAt.toISOString(),
  recurrence: window.recurrence,
});

/**
 * Windows of an area or site, oldest first. With `from` and `to`, only the windows having an
 * occurrence in `[from, to)`, each with those occurrences, ordered by the first of them.
 *
 * @returns the page's windows and the count of all that match
 */
export async function listShutdownWindows(
  query: ShutdownWindowListQuery,
  transaction?: Transaction,
): Promise<{ rows: WindowWithOccurrences[]; count: number }> {
  const where: WhereOptions<ShutdownWindow> = {};
  if (!query.includeRetired) Object.assign(where, { retiredAt: null });
  if (query.areaId) Object.assign(where, { areaId: query.areaId });
  if (query.siteId) Object.assign(where, { '$area.site_id$': query.siteId });
  const { from, to } = query;
  if (from && to) {
    // a window whose first occurrence starts after the range, or a one-off that ended before it, has none in it
    Object.assign(where, {
      startsAt: { [Op.lt]: new Date(to) },
      [Op.or]: [{ recurrence: { [Op.ne]: null } }, { endsAt: { [Op.gt]: new Date(from) } }],
    });
  }
  const windows = await ShutdownWindow.findAll({
    where,
    include: [withAreaAndSite],
    order: [
      ['startsAt', 'ASC'],
      ['id', 'ASC'],
    ],
    transaction,
  });
  let rows: WindowWithOccurrences[];
  if (from && to) {
    rows = windows
      .map((window) => ({ window, occurrences: windowOccurrences(timesOf(window), timeZoneOfWindow(window), from, to) }))
      .filter((row) => row.occurrences.length > 0)
      .sort((a, b) => a.occurrences[0]!.startsAt.localeCompare(b.occurrences[0]!.startsAt) || a.window.id.localeCompare(b.window.id));
  } else {
    rows = windows.map((window) => ({ window }));
  }
  const offset = (query.page - 1) * query.pageSize;
  return { rows: rows.slice(offset, offset + query.pageSize), count: rows.length };
}

/**
 * The occurrences of every window in use of an area that overlap `[fromAt, toAt)`, in time
 * order, each with its window's id and title (for planning checks).
 */
export async function occurrencesInArea(
  areaId: string,
  fromAt: string,
  toAt: string,
  transaction?: Transaction,
): Promise<(WindowOccurrence & { windowId: string; title: string })[]> {
  const { rows } = await listShutdownWindows(
    { areaId, from: fromAt, to: toAt, includeRetired: false, page: 1, pageSize: Number.MAX_SAFE_INTEGER },
    transaction,
  );
  return rows
    .flatMap(({ window, occurrences }) => (occurrences ?? []).map((o) => ({ ...o, windowId: window.id, title: window.title })))
    .sort((a, b) => a.startsAt.localeCompare(b.startsAt));
}

/** A window with its area and site. @throws AppError `not-found` */
export async function getShutdownWindow(id: string, transaction?: Transaction): Promise<ShutdownWindow> {
  const window = await ShutdownWindow.findByPk(id, { include: [withAreaAndSite], transaction });
  if (!window) throw AppError.notFound('Shutdown window');
  return window;
}

/**
 * The area a window is for, in use, with its site; held (FOR SHARE) against a retirement
 * under way. @throws AppError `validation-failed` naming `areaId`
 */
export async function areaForWindow(areaId: string, transaction: Transaction): Promise<Area & { site: Site }> {
  const area = await Area.findByPk(areaId, {
    include: [{ model: Site, as: 'site', required: true }],
    transaction,
    lock: { level: transaction.LOCK.SHARE, of: Area },
  });
  if (!area || area.retiredAt || !area.site || area.site.retiredAt) throw fieldProblem('areaId', 'This area does not exist or is retired.');
  return area as Area & { site: Site };
}

/** Refuses times that are unsound in the site's zone, naming every field at fault. */
function assertSoundTimes(times: { startsAt: string; endsAt: string; recurrence: string | null }, timeZone: string) {
  const problems = windowTimesProblems(times, timeZone);
  if (problems.length > 0)
    throw AppError.badRequest(problems.map((p) => `${p.path}: ${p.message}`).join(' '), problems.map((p) => ({ path: p.path, message: p.message })));
}

/**
 * Adds a shutdown window to an area in use.
 * @throws AppError `validation-failed` naming `areaId`, `endsAt` or `recurrence`
 */
export async function createShutdownWindow(uow: UnitOfWork, input: ShutdownWindowData): Promise<ShutdownWindow> {
  const { transaction } = uow;
  const area = await areaForWindow(input.areaId, transaction);
  assertSoundTimes(input, area.site.timeZone);
  const window = await ShutdownWindow.create(
    {
      areaId: input.areaId,
      title: input.title,
      startsAt: new Date(input.startsAt),
      endsAt: new Date(input.endsAt),
      recurrence: input.recurrence,
      notes: input.notes,
    },
    { transaction },
  );
  await recordCreation(uow, SHUTDOWN_WINDOW_TRAIL, window, `Added shutdown window ${window.title} in ${area.name}`);
  return getShutdownWindow(window.id, transaction);
}

/**
 * Changes a window: only the fields the change names. The times are checked as they will be
 * (the sent ones over the stored ones) in the zone of the window's (new) site.
 * @throws AppError `not-found`, `stale-version`, `retired`, `validation-failed`
 */
export async function updateShutdownWindow(uow: UnitOfWork, id: string, input: ShutdownWindowUpdate): Promise<ShutdownWindow> {
  const { transaction } = uow;
  const { version, startsAt, endsAt, ...rest } = input;
  const window = await lockForChange(ShutdownWindow, id, version, 'shutdown window', transaction);
  const changes: Record<string, unknown> = { ...changedFields(window, rest) };
  if (startsAt !== undefined && startsAt !== window.startsAt.toISOString()) changes.startsAt = new Date(startsAt);
  if (endsAt !== undefined && endsAt !== window.endsAt.toISOString()) changes.endsAt = new Date(endsAt);
  if (Object.keys(changes).length > 0) {
    const area = await areaForWindow((changes.areaId as string | undefined) ?? window.areaId, transaction);
    const times = {
      startsAt: startsAt ?? window.startsAt.toISOString(),
      endsAt: endsAt ?? window.endsAt.toISOString(),
      recurrence: rest.recurrence !== undefined ? rest.recurrence : window.recurrence,
    };
    assertSoundTimes(times, area.site.timeZone);
    await saveChange(uow, SHUTDOWN_WINDOW_TRAIL, window, changes, { action: 'update', summary: (w) => `Changed shutdown window ${w.title}` });
  }
  return getShutdownWindow(id, transaction);
}

/** Retires a window: it no longer shows or counts for planning. @throws AppError `not-found`, `stale-version`, `retired` */
export async function retireShutdownWindow(uow: UnitOfWork, id: string, version: number): Promise<ShutdownWindow> {
  const { transaction } = uow;
  const window = await lockForChange(ShutdownWindow, id, version, 'shutdown window', transaction);
  await saveChange(uow, SHUTDOWN_WINDOW_TRAIL, window, { retiredAt: uow.now }, { action: 'retire', summary: (w) => `Retired shutdown window ${w.title}` });
  return getShutdownWindow(id, transaction);
}
