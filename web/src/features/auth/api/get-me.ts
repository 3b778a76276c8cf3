import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Me } from '../../../../../shared/schemas/me';
import { apiFetch, setCsrfToken } from '../../../lib/api-client';

/** Who is signed in; keeps the session's CSRF token for the API client. */
export async function getMe(): Promise<Me> {
  const me = await apiFetch<Me>('/api/me');
  setCsrfToken(me.csrfToken ?? undefined);
  return me;
}

export const meKeys = { all: ['me'] as const };

export const meQueryOptions = () =>
  queryOptions({ queryKey: meKeys.all, queryFn: getMe, staleTime: 60_000, retry: false });

export const useMe = () => useQuery(meQueryOptions());
