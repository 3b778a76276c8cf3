import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import type { AccessEventKind, AccessEventView } from '../../../../../shared/schemas/access-event';
import { apiFetch } from '../../../lib/api-client';

export interface AccessEventFilters {
  kind: AccessEventKind | '';
}

const PAGE = 50;

/** One page of the sign-in log, newest first, before an instant. */
export async function getAccessEvents(
  filters: AccessEventFilters,
  before?: string,
): Promise<AccessEventView[]> {
  const params = new URLSearchParams({ limit: String(PAGE) });
  if (filters.kind) params.set('kind', filters.kind);
  if (before) params.set('before', before);
  return (await apiFetch<{ items: AccessEventView[] }>(`/api/access-events?${params}`)).items;
}

export const accessEventKeys = {
  all: ['access-events'] as const,
  lists: () => [...accessEventKeys.all, 'list'] as const,
  list: (filters: AccessEventFilters) => [...accessEventKeys.lists(), filters] as const,
};

export const accessEventsQueryOptions = (filters: AccessEventFilters) =>
  infiniteQueryOptions({
    queryKey: accessEventKeys.list(filters),
    queryFn: ({ pageParam }) => getAccessEvents(filters, pageParam),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (last) => (last.length === PAGE ? last.at(-1)?.at : undefined),
  });

export const useAccessEvents = (filters: AccessEventFilters) =>
  useInfiniteQuery(accessEventsQueryOptions(filters));
