/**
 * /api/shutdown-windows: the key factory (shared root with the Planner's calendar, so a saved
 * window refreshes it), the fetchers, query options and hooks.
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ListPage } from '../../../../../shared/schemas/common';
import type { ShutdownWindow, ShutdownWindowInput, ShutdownWindowUpdate } from '../../../../../shared/schemas/shutdown-window';
import { apiFetch } from '../../../lib/api-client';

export interface WindowListFilters {
  areaId?: string;
  siteId?: string;
  from?: string;
  to?: string;
}

export const shutdownWindowKeys = {
  all: ['shutdown-windows'] as const,
  lists: () => [...shutdownWindowKeys.all, 'list'] as const,
  list: (filters: WindowListFilters) => [...shutdownWindowKeys.lists(), filters] as const,
  details: () => [...shutdownWindowKeys.all, 'detail'] as const,
  detail: (id: string) => [...shutdownWindowKeys.details(), id] as const,
};

export function listShutdownWindows(filters: WindowListFilters): Promise<ListPage<ShutdownWindow>> {
  const search = new URLSearchParams({ pageSize: '200' });
  for (const [key, value] of Object.entries(filters)) if (value) search.set(key, value);
  return apiFetch<ListPage<ShutdownWindow>>(`/api/shutdown-windows?${search.toString()}`);
}

export const shutdownWindowListOptions = (filters: WindowListFilters) =>
  queryOptions({ queryKey: shutdownWindowKeys.list(filters), queryFn: () => listShutdownWindows(filters) });

export const shutdownWindowOptions = (id: string) =>
  queryOptions({ queryKey: shutdownWindowKeys.detail(id), queryFn: () => apiFetch<ShutdownWindow>(`/api/shutdown-windows/${id}`) });

export const useShutdownWindows = (filters: WindowListFilters, enabled = true) => useQuery({ ...shutdownWindowListOptions(filters), enabled });

export const useShutdownWindow = (id: string | undefined) => useQuery({ ...shutdownWindowOptions(id ?? ''), enabled: Boolean(id) });

/** Adds a window, or changes one (with the version it was read at); every window list refreshes. */
export function useSaveShutdownWindow(existing?: { id: string }) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: ShutdownWindowInput | ShutdownWindowUpdate) =>
      existing
        ? apiFetch<ShutdownWindow>(`/api/shutdown-windows/${existing.id}`, { method: 'PATCH', body: JSON.stringify(body) })
        : apiFetch<ShutdownWindow>('/api/shutdown-windows', { method: 'POST', body: JSON.stringify(body) }),
    onSuccess: () => client.invalidateQueries({ queryKey: shutdownWindowKeys.all }),
  });
}

/** Retires a window (it leaves the calendar; its record stays). */
export function useRetireShutdownWindow() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ id, version }: { id: string; version: number }) =>
      apiFetch<ShutdownWindow>(`/api/shutdown-windows/${id}?version=${version}`, { method: 'DELETE' }),
    onSuccess: () => client.invalidateQueries({ queryKey: shutdownWindowKeys.all }),
  });
}
