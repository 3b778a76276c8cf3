import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ListPage } from '../../../../../shared/schemas/common';
import type { Visit } from '../../../../../shared/schemas/visit';
import { apiFetch } from '../../../lib/api-client';
import { myVisitKeys } from './get-my-visits';

/** Keys of "my visit under way at a cabinet", under My visits' own. */
export const underWayAtCabinetKey = (cabinetId: string) => [...myVisitKeys.lists(), 'under-way-at', cabinetId] as const;

/** My visit under way at the cabinet, if any (the newest). */
export async function getMyVisitUnderWayAt(cabinetId: string): Promise<Visit | null> {
  const params = new URLSearchParams({ cabinetId, mine: 'true', state: 'under-way', sort: '-plannedStartAt', pageSize: '10' });
  return (await apiFetch<ListPage<Visit>>(`/api/visits?${params}`)).items[0] ?? null;
}

export const underWayAtCabinetQueryOptions = (cabinetId: string) =>
  queryOptions({ queryKey: underWayAtCabinetKey(cabinetId), queryFn: () => getMyVisitUnderWayAt(cabinetId) });

export function useMyVisitUnderWayAt(cabinetId: string) {
  return useQuery(underWayAtCabinetQueryOptions(cabinetId));
}

/** Starts an unplanned visit at the cabinet, of every bank in service, assigned to me and under way. */
export async function startUnplannedVisit(cabinetId: string): Promise<Visit> {
  return apiFetch<Visit>(`/api/cabinets/${encodeURIComponent(cabinetId)}/unplanned-visits`, {
    method: 'POST',
    body: JSON.stringify({}),
  });
}

export function useStartUnplannedVisit(cabinetId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: () => startUnplannedVisit(cabinetId),
    onSuccess: async (visit) => {
      client.setQueryData(myVisitKeys.detail(visit.id), visit);
      client.setQueryData(underWayAtCabinetKey(cabinetId), visit);
      await client.invalidateQueries({ queryKey: myVisitKeys.lists() });
    },
  });
}
