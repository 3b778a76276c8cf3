/** The technicians' week (GET /api/technician-load) and a reassignment from it (PATCH /api/visits/:id). */
import {
  keepPreviousData,
  queryOptions,
  useMutation,
  useQuery,
  useQueryClient,
} from '@tanstack/react-query';
import type { TechnicianLoadList } from '../../../../../shared/schemas/technician-load';
import type { PlanningOverride, Visit } from '../../../../../shared/schemas/visit';
import { apiFetch } from '../../../lib/api-client';

export interface LoadFilters {
  weekOn: string;
  siteId?: string;
  timeZone?: string;
}

export const technicianLoadKeys = {
  all: ['technician-load'] as const,
  weeks: () => [...technicianLoadKeys.all, 'week'] as const,
  week: (filters: LoadFilters) => [...technicianLoadKeys.weeks(), filters] as const,
};

export function getTechnicianLoad(filters: LoadFilters): Promise<TechnicianLoadList> {
  const search = new URLSearchParams({ weekOn: filters.weekOn });
  if (filters.siteId) search.set('siteId', filters.siteId);
  if (filters.timeZone) search.set('timeZone', filters.timeZone);
  return apiFetch<TechnicianLoadList>(`/api/technician-load?${search.toString()}`);
}

export const technicianLoadOptions = (filters: LoadFilters) =>
  queryOptions({
    queryKey: technicianLoadKeys.week(filters),
    queryFn: () => getTechnicianLoad(filters),
    placeholderData: keepPreviousData,
  });

export const useTechnicianLoad = (filters: LoadFilters) => useQuery(technicianLoadOptions(filters));

/** What a reassignment sends: the version read, the reason, the new technicians, and any warnings accepted. */
export interface Reassignment {
  visitId: string;
  version: number;
  reason: string;
  technicianIds: string[];
  overrides?: PlanningOverride[];
}

export function reassignVisit({ visitId, ...change }: Reassignment): Promise<Visit> {
  return apiFetch<Visit>(`/api/visits/${encodeURIComponent(visitId)}`, {
    method: 'PATCH',
    body: JSON.stringify(change),
  });
}

/** Reassigns a visit; the calendar, My visits and the load all show it, so every cached list is marked stale. */
export function useReassignVisit() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: reassignVisit,
    onSuccess: () => queryClient.invalidateQueries(),
  });
}
