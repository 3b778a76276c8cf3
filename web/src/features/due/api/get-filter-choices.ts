/**
 * What the Due list's filters offer: sites, the areas of a site and bank designs (the
 * register's first hundred of each, by name).
 */
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Area } from '../../../../../shared/schemas/area';
import type { BankDesign } from '../../../../../shared/schemas/bank-design';
import type { ListPage } from '../../../../../shared/schemas/common';
import type { Site } from '../../../../../shared/schemas/site';
import { apiFetch } from '../../../lib/api-client';

const PAGE = 100;
const STALE_MS = 5 * 60_000;

export const dueChoiceKeys = {
  all: ['due-choices'] as const,
  sites: () => [...dueChoiceKeys.all, 'sites'] as const,
  areas: (siteId: string) => [...dueChoiceKeys.all, 'areas', siteId] as const,
  designs: () => [...dueChoiceKeys.all, 'designs'] as const,
};

export const dueSitesOptions = () =>
  queryOptions({
    queryKey: dueChoiceKeys.sites(),
    queryFn: () => apiFetch<ListPage<Site>>(`/api/sites?pageSize=${PAGE}&sort=name`),
    staleTime: STALE_MS,
  });

export const dueAreasOptions = (siteId: string) =>
  queryOptions({
    queryKey: dueChoiceKeys.areas(siteId),
    queryFn: () =>
      apiFetch<ListPage<Area>>(
        `/api/areas?pageSize=${PAGE}&sort=name&siteId=${encodeURIComponent(siteId)}`,
      ),
    staleTime: STALE_MS,
    enabled: siteId !== '',
  });

export const dueDesignsOptions = () =>
  queryOptions({
    queryKey: dueChoiceKeys.designs(),
    queryFn: () => apiFetch<ListPage<BankDesign>>(`/api/bank-designs?pageSize=${PAGE}&sort=code`),
    staleTime: STALE_MS,
  });

export const useDueSites = () => useQuery(dueSitesOptions());
export const useDueAreas = (siteId: string) => useQuery(dueAreasOptions(siteId));
export const useDueDesigns = () => useQuery(dueDesignsOptions());
