/**
 * The plan-a-window calls: upcoming occurrences of shutdown windows to pick from, the proposal
 * for one occurrence, and its confirmation as one batch of visits.
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ListPage } from '../../../../../shared/schemas/common';
import type { WindowProposal } from '../../../../../shared/schemas/plan-window';
import type { ShutdownWindow } from '../../../../../shared/schemas/shutdown-window';
import type { Visit } from '../../../../../shared/schemas/visit';
import { apiFetch } from '../../../lib/api-client';
import type { batchBody } from '../utils/proposal-rows';

/** What the occurrence picker lists. */
export interface OccurrenceFilters {
  from: string;
  to: string;
  siteId?: string;
  areaId?: string;
}

export const planWindowKeys = {
  all: ['plan-window'] as const,
  occurrences: (filters: OccurrenceFilters) =>
    [...planWindowKeys.all, 'occurrences', filters] as const,
  proposals: () => [...planWindowKeys.all, 'proposal'] as const,
  proposal: (windowId: string, occurrenceStartsAt: string) =>
    [...planWindowKeys.proposals(), windowId, occurrenceStartsAt] as const,
};

/** GET /api/shutdown-windows with a range: the windows with an occurrence in it, each with its occurrences. */
export function getWindowsWithOccurrences(
  filters: OccurrenceFilters,
): Promise<ListPage<ShutdownWindow>> {
  const search = new URLSearchParams({ from: filters.from, to: filters.to, pageSize: '200' });
  if (filters.siteId) search.set('siteId', filters.siteId);
  if (filters.areaId) search.set('areaId', filters.areaId);
  return apiFetch<ListPage<ShutdownWindow>>(`/api/shutdown-windows?${search.toString()}`);
}

export const occurrencesOptions = (filters: OccurrenceFilters) =>
  queryOptions({
    queryKey: planWindowKeys.occurrences(filters),
    queryFn: () => getWindowsWithOccurrences(filters),
  });

export const useWindowOccurrences = (filters: OccurrenceFilters) =>
  useQuery(occurrencesOptions(filters));

/** POST /api/shutdown-windows/:windowId/proposal: reads only, so it is a query. */
export function getWindowProposal(
  windowId: string,
  occurrenceStartsAt: string,
): Promise<WindowProposal> {
  return apiFetch<WindowProposal>(
    `/api/shutdown-windows/${encodeURIComponent(windowId)}/proposal`,
    {
      method: 'POST',
      body: JSON.stringify({ occurrenceStartsAt }),
    },
  );
}

export const proposalOptions = (windowId: string, occurrenceStartsAt: string) =>
  queryOptions({
    queryKey: planWindowKeys.proposal(windowId, occurrenceStartsAt),
    queryFn: () => getWindowProposal(windowId, occurrenceStartsAt),
    // a proposal is taken as it is when the dialog opens: edits are the planner's, not a refetch's
    staleTime: Infinity,
    refetchOnWindowFocus: false,
  });

export const useWindowProposal = (windowId: string | null, occurrenceStartsAt: string | null) =>
  useQuery({
    ...proposalOptions(windowId ?? '', occurrenceStartsAt ?? ''),
    enabled: Boolean(windowId && occurrenceStartsAt),
  });

/** POST /api/visits/batch: the plan's visits, all or none. */
export function confirmWindowPlan(body: ReturnType<typeof batchBody>): Promise<{ items: Visit[] }> {
  return apiFetch<{ items: Visit[] }>('/api/visits/batch', {
    method: 'POST',
    body: JSON.stringify(body),
  });
}

/**
 * Confirms a plan; afterwards every cached list may show the new visits (calendar, load, due,
 * proposals), so all queries are marked stale.
 */
export function useConfirmWindowPlan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: confirmWindowPlan,
    onSuccess: () => queryClient.invalidateQueries(),
  });
}
