import type { DecayRun, DecayRunInput } from '../../../../../shared/schemas/decay-run';
import { apiFetch } from '../../../lib/api-client';

/**
 * Sends one decay run of a visit (POST /api/visits/:visitId/decay-runs). The server answers
 * 201 with the stored run, or 200 with the same run when it has this clientId already (a
 * retry); throws ApiError otherwise (status 0 when the network is down).
 */
export async function submitDecayRun(visitId: string, body: DecayRunInput): Promise<DecayRun> {
  return apiFetch<DecayRun>(`/api/visits/${encodeURIComponent(visitId)}/decay-runs`, {
    method: 'POST',
    body: JSON.stringify(body),
  });
}
