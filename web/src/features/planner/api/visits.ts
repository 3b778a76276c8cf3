/**
 * /api/visits for the Planner: the visits of the shown range, one visit, the planning check, and
 * the writes (create, replan, state actions). Keys go from general to specific.
 */
import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ListPage } from '../../../../../shared/schemas/common';
import { apiFetch } from '../../../lib/api-client';
import type { PlanningWarning, Visit, VisitChange, VisitInput, VisitState, VisitTransitionAction } from './shapes';

/** The API's largest page of visits. */
export const VISITS_PAGE_SIZE = 200;

export interface VisitRangeFilters {
  from: string;
  to: string;
  siteId?: string;
  areaId?: string;
  states?: readonly VisitState[];
}

export const visitKeys = {
  all: ['visits'] as const,
  lists: () => [...visitKeys.all, 'list'] as const,
  list: (filters: VisitRangeFilters) => [...visitKeys.lists(), filters] as const,
  details: () => [...visitKeys.all, 'detail'] as const,
  detail: (visitId: string) => [...visitKeys.details(), visitId] as const,
  checks: () => [...visitKeys.all, 'check'] as const,
  check: (body: VisitInput & { visitId?: string }) => [...visitKeys.checks(), body] as const,
};

/** The query string of a range: empty filters left out. */
export function visitListQuery(filters: VisitRangeFilters): string {
  const search = new URLSearchParams({ from: filters.from, to: filters.to, pageSize: String(VISITS_PAGE_SIZE), sort: 'plannedStartAt' });
  if (filters.siteId) search.set('siteId', filters.siteId);
  if (filters.areaId) search.set('areaId', filters.areaId);
  if (filters.states && filters.states.length > 0) search.set('state', filters.states.join(','));
  return search.toString();
}

export const getVisits = (filters: VisitRangeFilters) => apiFetch<ListPage<Visit>>(`/api/visits?${visitListQuery(filters)}`);
export const getVisit = (visitId: string) => apiFetch<Visit>(`/api/visits/${visitId}`);
export const checkVisit = (body: VisitInput & { visitId?: string }) =>
  apiFetch<{ warnings: PlanningWarning[] }>('/api/visits/check', { method: 'POST', body: JSON.stringify(body) });
export const createVisit = (input: VisitInput) => apiFetch<Visit>('/api/visits', { method: 'POST', body: JSON.stringify(input) });
export const changeVisit = (visitId: string, change: VisitChange) =>
  apiFetch<Visit>(`/api/visits/${visitId}`, { method: 'PATCH', body: JSON.stringify(change) });
export const transitionVisit = (visitId: string, body: { action: VisitTransitionAction; version: number; reason?: string }) =>
  apiFetch<Visit>(`/api/visits/${visitId}/transitions`, { method: 'POST', body: JSON.stringify(body) });

export const visitListOptions = (filters: VisitRangeFilters) =>
  queryOptions({ queryKey: visitKeys.list(filters), queryFn: () => getVisits(filters), placeholderData: keepPreviousData });

export const visitOptions = (visitId: string) => queryOptions({ queryKey: visitKeys.detail(visitId), queryFn: () => getVisit(visitId) });

/** The warnings a visit would raise; asked again whenever the body changes. */
export const visitCheckOptions = (body: VisitInput & { visitId?: string }) =>
  queryOptions({ queryKey: visitKeys.check(body), queryFn: () => checkVisit(body), staleTime: 0 });

export const useVisits = (filters: VisitRangeFilters, enabled = true) => useQuery({ ...visitListOptions(filters), enabled });
export const useVisit = (visitId: string | null) => useQuery({ ...visitOptions(visitId ?? ''), enabled: visitId !== null });
export const useVisitCheck = (body: (VisitInput & { visitId?: string }) | null) =>
  useQuery({ ...visitCheckOptions(body ?? ({} as VisitInput)), enabled: body !== null });

/** After a write: every visit list, the visit itself, and the week's load (other features' keys by name). */
function useInvalidateVisits() {
  const client = useQueryClient();
  return (visit?: Visit) => {
    if (visit) client.setQueryData(visitKeys.detail(visit.id), visit);
    return Promise.all([
      client.invalidateQueries({ queryKey: visitKeys.lists() }),
      client.invalidateQueries({ queryKey: visitKeys.checks() }),
      client.invalidateQueries({ queryKey: ['technician-load'] }),
      client.invalidateQueries({ queryKey: ['due'] }),
    ]);
  };
}

export function useCreateVisit() {
  const invalidate = useInvalidateVisits();
  return useMutation({ mutationFn: createVisit, onSuccess: (visit) => invalidate(visit) });
}

export function useChangeVisit() {
  const invalidate = useInvalidateVisits();
  return useMutation({
    mutationFn: ({ visitId, change }: { visitId: string; change: VisitChange }) => changeVisit(visitId, change),
    onSuccess: (visit) => invalidate(visit),
  });
}

export function useTransitionVisit() {
  const invalidate = useInvalidateVisits();
  return useMutation({
    mutationFn: ({ visitId, ...body }: { visitId: string; action: VisitTransitionAction; version: number; reason?: string }) =>
      transitionVisit(visitId, body),
    onSuccess: (visit) => invalidate(visit),
  });
}
