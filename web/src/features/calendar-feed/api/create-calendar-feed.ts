import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { IssuedCalendarFeed } from '../../../../../shared/schemas/calendar-feed';
import { apiFetch } from '../../../lib/api-client';
import { calendarFeedKeys } from './get-calendar-feed';

/** Makes a new address (the one in use stops working); the answer is the only time it is shown. */
export async function createCalendarFeed(): Promise<IssuedCalendarFeed> {
  return apiFetch<IssuedCalendarFeed>('/api/me/calendar-feed', { method: 'POST', body: '{}' });
}

export function useCreateCalendarFeed() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: createCalendarFeed,
    onSuccess: () => client.invalidateQueries({ queryKey: calendarFeedKeys.all }),
  });
}
