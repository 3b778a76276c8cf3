import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CalendarFeedState } from '../../../../../shared/schemas/calendar-feed';
import { apiFetch } from '../../../lib/api-client';
import { calendarFeedKeys } from './get-calendar-feed';

/** Turns the address off: calendar apps get nothing more from it. */
export async function revokeCalendarFeed(): Promise<CalendarFeedState> {
  return apiFetch<CalendarFeedState>('/api/me/calendar-feed', { method: 'DELETE' });
}

export function useRevokeCalendarFeed() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: revokeCalendarFeed,
    onSuccess: () => client.invalidateQueries({ queryKey: calendarFeedKeys.all }),
  });
}
