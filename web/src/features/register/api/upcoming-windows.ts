/** The shutdown windows of an area over the coming weeks, for a cabinet's page (GET /api/shutdown-windows). */
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListPage } from '../../../../../shared/schemas/common';
import type { ShutdownWindow } from '../../../../../shared/schemas/shutdown-window';
import { apiFetch } from '../../../lib/api-client';

export const upcomingWindowKeys = {
  // under the shutdown windows' root key: a window saved anywhere refreshes this list too
  all: ['shutdown-windows', 'upcoming'] as const,
  area: (areaId: string, fromAt: string, toAt: string) => [...upcomingWindowKeys.all, areaId, fromAt, toAt] as const,
};

export const upcomingWindowsOptions = (areaId: string, fromAt: string, toAt: string) =>
  queryOptions({
    queryKey: upcomingWindowKeys.area(areaId, fromAt, toAt),
    queryFn: () =>
      apiFetch<ListPage<ShutdownWindow>>(
        `/api/shutdown-windows?${new URLSearchParams({ areaId, from: fromAt, to: toAt, pageSize: '200' }).toString()}`,
      ),
  });

export const useUpcomingWindows = (areaId: string, fromAt: string, toAt: string) => useQuery(upcomingWindowsOptions(areaId, fromAt, toAt));
