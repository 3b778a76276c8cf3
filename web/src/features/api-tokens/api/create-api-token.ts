import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ApiTokenData, IssuedApiToken } from '../../../../../shared/schemas/api-token';
import { apiFetch } from '../../../lib/api-client';
import { apiTokenKeys } from './get-api-tokens';

/** Makes a token; the answer carries its secret, the only time it is shown. */
export async function createApiToken(input: ApiTokenData): Promise<IssuedApiToken> {
  return apiFetch<IssuedApiToken>('/api/me/tokens', {
    method: 'POST',
    body: JSON.stringify(input),
  });
}

export function useCreateApiToken() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: createApiToken,
    onSuccess: () => client.invalidateQueries({ queryKey: apiTokenKeys.all }),
  });
}
