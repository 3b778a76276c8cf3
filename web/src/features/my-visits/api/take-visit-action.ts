import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Visit } from '../../../../../shared/schemas/visit';
import { apiFetch } from '../../../lib/api-client';
import type { MyVisitAction } from '../utils/visit-actions';
import { myVisitKeys } from './get-my-visits';

/** Starts a visit or marks it as logged, naming the version read (a stale one is refused). */
export async function takeVisitAction(visit: Pick<Visit, 'id' | 'version'>, action: MyVisitAction): Promise<Visit> {
  return apiFetch<Visit>(`/api/visits/${encodeURIComponent(visit.id)}/transitions`, {
    method: 'POST',
    body: JSON.stringify({ action, version: visit.version }),
  });
}

export function useTakeVisitAction() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ visit, action }: { visit: Pick<Visit, 'id' | 'version'>; action: MyVisitAction }) =>
      takeVisitAction(visit, action),
    onSuccess: async (visit) => {
      client.setQueryData(myVisitKeys.detail(visit.id), visit);
      await client.invalidateQueries({ queryKey: myVisitKeys.lists() });
    },
    onError: async (_error, { visit }) => {
      // someone else moved it (a planner replanned or cancelled): show it as it is now
      await client.invalidateQueries({ queryKey: myVisitKeys.detail(visit.id) });
    },
  });
}
