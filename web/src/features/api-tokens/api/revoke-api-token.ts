import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ApiTokenView } from '../../../../../shared/schemas/api-token';
import { apiFetch } from '../../../lib/api-client';
import { apiTokenKeys } from './get-api-tokens';

/** Revokes one of the person's tokens; it stops working at once. */
export async function revokeApiToken(tokenId: string): Promise<ApiTokenView> {
  return apiFetch<ApiTokenView>(`/api/me/tokens/${tokenId}`, { method: 'DELETE' });
}

export function useRevokeApiToken() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: revokeApiToken,
    onSuccess: () => client.invalidateQueries({ queryKey: apiTokenKeys.all }),
  });
}
