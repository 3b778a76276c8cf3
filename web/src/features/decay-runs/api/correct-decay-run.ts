import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DecayRun, DecayRunCorrectionInput } from '../../../../../shared/schemas/decay-run';
import { apiFetch } from '../../../lib/api-client';
import { decayRunKeys } from './get-decay-runs';

/**
 * Stores a correction of a run as its next version, with the reason. Idempotent by the body's
 * `clientId`: the same body sent again (a retry) answers the same new version.
 */
export async function correctDecayRun(
  runId: string,
  correction: DecayRunCorrectionInput,
): Promise<DecayRun> {
  return apiFetch<DecayRun>(`/api/decay-runs/${encodeURIComponent(runId)}/corrections`, {
    method: 'POST',
    body: JSON.stringify(correction),
  });
}

/** The correction as a mutation; on success every list and the two versions are read again. */
export function useCorrectDecayRun() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ runId, correction }: { runId: string; correction: DecayRunCorrectionInput }) =>
      correctDecayRun(runId, correction),
    onSuccess: async (run, { runId }) => {
      client.setQueryData(decayRunKeys.detail(run.id), run);
      await Promise.all([
        client.invalidateQueries({ queryKey: decayRunKeys.lists() }),
        client.invalidateQueries({ queryKey: decayRunKeys.detail(runId) }),
      ]);
    },
  });
}
