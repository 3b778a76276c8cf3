/** GET /api/shutdown-windows for the calendar: the windows with an occurrence in the shown range. */
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListPage } from '../../../../../shared/schemas/common';
import { apiFetch } from '../../../lib/api-client';
import type { ShutdownWindow } from './shapes';

export interface WindowRangeFilters {
  from: string;
  to: string;
  siteId?: string;
  areaId?: string;
}

export const plannerWindowKeys = {
  all: ['shutdown-windows'] as const,
  lists: () => [...plannerWindowKeys.all, 'list'] as const,
  range: (filters: WindowRangeFilters) => [...plannerWindowKeys.lists(), 'range', filters] as const,
};

export function windowRangeQuery(filters: WindowRangeFilters): string {
  const search = new URLSearchParams({ from: filters.from, to: filters.to, pageSize: '200' });
  if (filters.siteId) search.set('siteId', filters.siteId);
  if (filters.areaId) search.set('areaId', filters.areaId);
  return search.toString();
}

export const getWindowsInRange = (filters: WindowRangeFilters) =>
  apiFetch<ListPage<ShutdownWindow>>(`/api/shutdown-windows?${windowRangeQuery(filters)}`);

export const windowRangeOptions = (filters: WindowRangeFilters) =>
  queryOptions({ queryKey: plannerWindowKeys.range(filters), queryFn: () => getWindowsInRange(filters), placeholderData: keepPreviousData });

export const useWindowsInRange = (filters: WindowRangeFilters, enabled = true) => useQuery({ ...windowRangeOptions(filters), enabled });
