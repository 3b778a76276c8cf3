import {
  CALENDAR_FEED_PATH,
  type CalendarFeedView,
  type IssuedCalendarFeed,
} from '../../../../shared/schemas/calendar-feed';
import type { CalendarFeed } from '../../models/calendar-feed';

export function presentCalendarFeed(feed: CalendarFeed): CalendarFeedView {
  return {
    createdAt: feed.createdAt.toISOString(),
    lastUsedAt: feed.lastUsedAt?.toISOString() ?? null,
  };
}

/** A new feed with its address (https://… and webcal://…), shown this once. */
export function presentIssuedCalendarFeed(
  feed: CalendarFeed,
  secret: string,
  appUrl: string,
): IssuedCalendarFeed {
  const url = `${appUrl}${CALENDAR_FEED_PATH}/${secret}.ics`;
  return { ...presentCalendarFeed(feed), url, webcalUrl: url.replace(/^https?:/, 'webcal:') };
}
