import { queryOptions, useQueries, useQuery } from '@tanstack/react-query';
import type { ListPage } from '../../../../../shared/schemas/common';
import type { ShutdownWindow } from '../../../../../shared/schemas/shutdown-window';
import type { Visit } from '../../../../../shared/schemas/visit';
import { apiFetch } from '../../../lib/api-client';

/** The span My visits asks for: from two weeks back (still open, missed) to six weeks ahead. */
export interface VisitRange {
  from: string;
  to: string;
}

const DAY_MS = 86_400_000;

/** The range of the list at `now`, to the hour so the query key stays put while the screen is open. */
export function myVisitRange(now: Date): VisitRange {
  const hour = Math.floor(now.getTime() / 3_600_000) * 3_600_000;
  return {
    from: new Date(hour - 14 * DAY_MS).toISOString(),
    to: new Date(hour + 42 * DAY_MS).toISOString(),
  };
}

export const myVisitKeys = {
  all: ['my-visits'] as const,
  lists: () => [...myVisitKeys.all, 'list'] as const,
  list: (range: VisitRange) => [...myVisitKeys.lists(), 'mine', range] as const,
  atMySites: (range: VisitRange) => [...myVisitKeys.lists(), 'at-my-sites', range] as const,
  details: () => [...myVisitKeys.all, 'detail'] as const,
  detail: (visitId: string) => [...myVisitKeys.details(), visitId] as const,
  windows: (areaId: string, range: VisitRange) => [...myVisitKeys.all, 'windows', areaId, range] as const,
};

/** The visits assigned to me whose planned times overlap the range, earliest first. */
export async function getMyVisits(range: VisitRange): Promise<ListPage<Visit>> {
  const params = new URLSearchParams({ mine: 'true', ...range, sort: 'plannedStartAt', pageSize: '200' });
  return apiFetch<ListPage<Visit>>(`/api/visits?${params}`);
}

/**
 * Every visit I may read in the range: mine and those at my sites (the API keeps a technician
 * to these).
 */
export async function getVisitsAtMySites(range: VisitRange): Promise<ListPage<Visit>> {
  const params = new URLSearchParams({ ...range, sort: 'plannedStartAt', pageSize: '200' });
  return apiFetch<ListPage<Visit>>(`/api/visits?${params}`);
}

export async function getVisit(visitId: string): Promise<Visit> {
  return apiFetch<Visit>(`/api/visits/${encodeURIComponent(visitId)}`);
}

/** The shutdown windows of an area with their occurrences in the range. */
export async function getAreaWindows(areaId: string, range: VisitRange): Promise<ShutdownWindow[]> {
  const params = new URLSearchParams({ areaId, ...range, pageSize: '200' });
  return (await apiFetch<ListPage<ShutdownWindow>>(`/api/shutdown-windows?${params}`)).items;
}

export const myVisitsQueryOptions = (range: VisitRange) =>
  queryOptions({ queryKey: myVisitKeys.list(range), queryFn: () => getMyVisits(range) });

export const visitsAtMySitesQueryOptions = (range: VisitRange) =>
  queryOptions({ queryKey: myVisitKeys.atMySites(range), queryFn: () => getVisitsAtMySites(range) });

export const visitQueryOptions = (visitId: string) =>
  queryOptions({ queryKey: myVisitKeys.detail(visitId), queryFn: () => getVisit(visitId) });

export const areaWindowsQueryOptions = (areaId: string, range: VisitRange) =>
  queryOptions({
    queryKey: myVisitKeys.windows(areaId, range),
    queryFn: () => getAreaWindows(areaId, range),
    staleTime: 5 * 60_000,
  });

export const useMyVisits = (range: VisitRange) => useQuery(myVisitsQueryOptions(range));

export const useVisitsAtMySites = (range: VisitRange, enabled: boolean) =>
  useQuery({ ...visitsAtMySitesQueryOptions(range), enabled });

export const useVisit = (visitId: string) => useQuery(visitQueryOptions(visitId));

/**
 * The windows of each area; `loaded` only once every area's have come (until then a visit's
 * window is unknown, never "none").
 */
export function useWindowsOfAreas(
  areaIds: readonly string[],
  range: VisitRange,
): { windows: ShutdownWindow[]; loaded: boolean } {
  const answers = useQueries({ queries: areaIds.map((areaId) => areaWindowsQueryOptions(areaId, range)) });
  return {
    windows: answers.flatMap((answer) => answer.data ?? []),
    loaded: answers.every((answer) => answer.isSuccess),
  };
}
