import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListPage } from '../../../../../shared/schemas/common';
import type { Site } from '../../../../../shared/schemas/site';
import { apiFetch } from '../../../lib/api-client';

/** The sites in use, by name: what a person may be set to work at. */
export async function getSitesInUse(): Promise<Site[]> {
  const sites: Site[] = [];
  for (let page = 1; ; page += 1) {
    const params = new URLSearchParams({ page: String(page), pageSize: '100', sort: 'name' });
    const answer = await apiFetch<ListPage<Site>>(`/api/sites?${params}`);
    sites.push(...answer.items);
    if (answer.items.length === 0 || sites.length >= answer.total) return sites;
  }
}

export const personSiteKeys = {
  all: ['people', 'sites'] as const,
  inUse: () => [...personSiteKeys.all, 'in-use'] as const,
};

export const sitesInUseQueryOptions = () =>
  queryOptions({ queryKey: personSiteKeys.inUse(), queryFn: getSitesInUse, staleTime: 60_000 });

export const useSitesInUse = () => useQuery(sitesInUseQueryOptions());
