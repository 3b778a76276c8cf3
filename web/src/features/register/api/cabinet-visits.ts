/** The visits of one cabinet, newest first, for its page (GET /api/visits?cabinetId=…). */
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ListPage } from '../../../../../shared/schemas/common';
import type { Visit } from '../../../../../shared/schemas/visit';
import { apiFetch } from '../../../lib/api-client';

/** How many of a cabinet's visits its page lists; the Planner holds the rest. */
export const CABINET_VISITS_SHOWN = 8;

export const cabinetVisitKeys = {
  // under the visits' root key: a visit planned, started or reviewed anywhere refreshes this list
  all: ['visits', 'cabinet'] as const,
  cabinet: (cabinetId: string) => [...cabinetVisitKeys.all, cabinetId] as const,
};

export const cabinetVisitsOptions = (cabinetId: string) =>
  queryOptions({
    queryKey: cabinetVisitKeys.cabinet(cabinetId),
    queryFn: () =>
      apiFetch<ListPage<Visit>>(
        `/api/visits?${new URLSearchParams({ cabinetId, sort: '-plannedStartAt', pageSize: String(CABINET_VISITS_SHOWN) }).toString()}`,
      ),
  });

export const useCabinetVisits = (cabinetId: string) => useQuery(cabinetVisitsOptions(cabinetId));
