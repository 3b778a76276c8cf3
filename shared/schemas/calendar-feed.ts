/**
 * A person's calendar feed (GET/POST/DELETE /api/me/calendar-feed): the secret address a
 * calendar app subscribes to for their visits. The address is shown once, when made; Ebbline
 * keeps only a fingerprint of it.
 */

/** The feed in use, without its address (which only its maker saw, once). */
export interface CalendarFeedView {
  createdAt: string;
  /** When a calendar app last fetched it; null when none has yet. */
  lastUsedAt: string | null;
}

/** GET /api/me/calendar-feed and DELETE: the feed in use, or null when there is none. */
export interface CalendarFeedState {
  feed: CalendarFeedView | null;
}

/** POST /api/me/calendar-feed (201): the new feed with its address, shown this once. */
export interface IssuedCalendarFeed extends CalendarFeedView {
  /** https://…/feeds/visits/<secret>.ics */
  url: string;
  /** The same address for apps that open webcal: links (Apple Calendar, Outlook). */
  webcalUrl: string;
}

/** The path of a feed's address below APP_URL. */
export const CALENDAR_FEED_PATH = '/feeds/visits';
