import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CalendarFeedState } from '../../../../../shared/schemas/calendar-feed';
import { apiFetch } from '../../../lib/api-client';

/** The signed-in person's calendar feed in use (without its address), or null. */
export async function getCalendarFeed(): Promise<CalendarFeedState> {
  return apiFetch<CalendarFeedState>('/api/me/calendar-feed');
}

export const calendarFeedKeys = {
  all: ['calendar-feed'] as const,
  current: () => [...calendarFeedKeys.all, 'current'] as const,
};

export const calendarFeedQueryOptions = () =>
  queryOptions({ queryKey: calendarFeedKeys.current(), queryFn: getCalendarFeed });

export const useCalendarFeed = () => useQuery(calendarFeedQueryOptions());
