import { Router } from 'express';
import { getConfig } from '../../config/env';
import {
  calendarFeedOwner,
  listAreaWindows,
  listCalendarFeedVisits,
} from '../../services/calendar-feeds';
import { visitsCalendar } from './ics';

/**
 * `/feeds`: what calendar apps fetch, outside the API and without a session: the secret in the
 * address is the credential. An unknown, turned-off or deactivated person's address answers the
 * same 404, so the answer never tells which. Never cached: a turned-off address stops at once.
 */
export const calendarFeedPublicRouter = Router();

const DAY_MS = 86_400_000;
/** The feed holds the visits from 60 days back to 400 days ahead. */
const DAYS_BACK = 60;
const DAYS_AHEAD = 400;

const NOT_FOUND_TEXT =
  'There is no calendar at this address. It may have been turned off: make a new address on your profile page in Ebbline.';

calendarFeedPublicRouter.get('/visits/:file', async (req, res) => {
  res.setHeader('Cache-Control', 'no-store');
  const match = /^([A-Za-z0-9_-]{10,200})\.ics$/.exec(req.params.file);
  // the clock is read here, at the edge: the feed's range and the last-use note
  const now = new Date();
  const owner = match ? await calendarFeedOwner(match[1]!, now) : null;
  if (!owner) {
    res.status(404).type('text/plain; charset=utf-8').send(NOT_FOUND_TEXT);
    return;
  }
  const fromAt = new Date(now.getTime() - DAYS_BACK * DAY_MS);
  const toAt = new Date(now.getTime() + DAYS_AHEAD * DAY_MS);
  const visits = await listCalendarFeedVisits(owner.id, fromAt, toAt);
  const windows = await listAreaWindows([...new Set(visits.map((v) => v.areaId))]);
  const body = visitsCalendar({
    ownerName: owner.name,
    visits,
    windows,
    fromAt,
    toAt,
    appUrl: getConfig().APP_URL,
  });
  res
    .status(200)
    .type('text/calendar; charset=utf-8')
    .setHeader('Content-Disposition', 'inline; filename="ebbline-visits.ics"')
    .send(body);
});
