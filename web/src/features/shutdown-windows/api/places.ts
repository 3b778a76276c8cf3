/** Sites and areas in use, for the window form's choices (GET /api/sites, /api/areas). */
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Area } from '../../../../../shared/schemas/area';
import type { ListPage } from '../../../../../shared/schemas/common';
import type { Site } from '../../../../../shared/schemas/site';
import { apiFetch } from '../../../lib/api-client';

export const placeKeys = {
  all: ['shutdown-windows', 'places'] as const,
  sites: () => [...placeKeys.all, 'sites'] as const,
  areas: (siteId: string) => [...placeKeys.all, 'areas', siteId] as const,
};

export const sitesOptions = () =>
  queryOptions({ queryKey: placeKeys.sites(), queryFn: () => apiFetch<ListPage<Site>>('/api/sites?pageSize=100&sort=name'), staleTime: 60_000 });

export const areasOptions = (siteId: string) =>
  queryOptions({
    queryKey: placeKeys.areas(siteId),
    queryFn: () => apiFetch<ListPage<Area>>(`/api/areas?siteId=${siteId}&pageSize=100&sort=name`),
    staleTime: 60_000,
  });

export const useSitesInUse = () => useQuery(sitesOptions());
export const useAreasOfSite = (siteId: string) => useQuery({ ...areasOptions(siteId), enabled: Boolean(siteId) });
