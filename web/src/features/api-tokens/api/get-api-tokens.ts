import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ApiTokenView } from '../../../../../shared/schemas/api-token';
import { apiFetch } from '../../../lib/api-client';

/** The signed-in person's own API tokens, newest first. */
export async function getApiTokens(): Promise<ApiTokenView[]> {
  return (await apiFetch<{ items: ApiTokenView[] }>('/api/me/tokens')).items;
}

export const apiTokenKeys = {
  all: ['api-tokens'] as const,
  lists: () => [...apiTokenKeys.all, 'list'] as const,
};

export const apiTokensQueryOptions = () =>
  queryOptions({ queryKey: apiTokenKeys.lists(), queryFn: getApiTokens });

export const useApiTokens = () => useQuery(apiTokensQueryOptions());
