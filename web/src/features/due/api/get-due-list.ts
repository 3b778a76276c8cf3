/**
 * The Due list: `GET /api/due` with its query-key factory, options and hook (one file per
 * endpoint). Keys go from general to specific: all, lists, list(params).
 */
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { DueList } from '../../../../../shared/schemas/due';
import { apiFetch } from '../../../lib/api-client';

/** What the Due list asks for: page, size, sort and the filters, as the address bar keeps them. */
export type DueListParams = Record<string, string | number | undefined>;

/** The query string of `params`, leaving out empty values. */
export function dueQueryString(params: DueListParams): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value === undefined || value === '') continue;
    search.set(key, String(value));
  }
  return search.toString();
}

export const dueKeys = {
  all: ['due'] as const,
  lists: () => [...dueKeys.all, 'list'] as const,
  list: (params: DueListParams) => [...dueKeys.lists(), params] as const,
};

/** One page of the Due list; throws ApiError on a non-2xx answer. */
export function getDueList(params: DueListParams): Promise<DueList> {
  return apiFetch<DueList>(`/api/due?${dueQueryString(params)}`);
}

export const dueListOptions = (params: DueListParams) =>
  queryOptions({
    queryKey: dueKeys.list(params),
    queryFn: () => getDueList(params),
    // the old page stays while the next loads, so the tabs and the table do not jump
    placeholderData: keepPreviousData,
  });

export const useDueList = (params: DueListParams) => useQuery(dueListOptions(params));
