import { Router } from 'express';
import type { CalendarFeedState } from '../../../../shared/schemas/calendar-feed';
import { getConfig } from '../../config/env';
import { requestOrigin } from '../../middleware/request-origin';
import { requireAnyRole, requireSessionCaller } from '../../middleware/require-role';
import {
  createCalendarFeed,
  findActiveCalendarFeed,
  revokeCalendarFeed,
} from '../../services/calendar-feeds';
import { withUnitOfWork } from '../../services/unit-of-work';
import { actingUser } from '../params';
import { presentCalendarFeed, presentIssuedCalendarFeed } from './presenter';

/**
 * `/api/me/calendar-feed`: a person's own calendar feed address. Made and turned off from a
 * signed-in browser only (like API tokens: a token cannot hand out credentials).
 */
export const calendarFeedRouter = Router();

calendarFeedRouter.get('/', requireAnyRole, requireSessionCaller, async (req, res) => {
  const feed = await findActiveCalendarFeed(actingUser(req).id);
  const body: CalendarFeedState = { feed: feed ? presentCalendarFeed(feed) : null };
  res.json(body);
});

/** Makes a new address (the one in use stops working); the answer is the only time it is shown. */
calendarFeedRouter.post('/', requireAnyRole, requireSessionCaller, async (req, res) => {
  const origin = requestOrigin(req);
  const { feed, secret } = await withUnitOfWork(actingUser(req), (uow) =>
    createCalendarFeed(uow, origin),
  );
  res.status(201).json(presentIssuedCalendarFeed(feed, secret, getConfig().APP_URL));
});

/** Turns the address off: calendar apps get 404 from their next fetch. */
calendarFeedRouter.delete('/', requireAnyRole, requireSessionCaller, async (req, res) => {
  const origin = requestOrigin(req);
  await withUnitOfWork(actingUser(req), (uow) => revokeCalendarFeed(uow, origin));
  const body: CalendarFeedState = { feed: null };
  res.json(body);
});
