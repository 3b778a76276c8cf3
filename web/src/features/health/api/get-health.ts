import { queryOptions, useQuery } from '@tanstack/react-query';

export interface Health {
  /** unavailable: the database does not answer; stopping: the server is shutting down. */
  status: 'ok' | 'unavailable' | 'stopping';
  version: string;
  database: 'up' | 'down';
  uptimeSeconds: number;
}

/** The health endpoint answers 503 with a body when the database is down: keep that body. */
export async function getHealth(): Promise<Health> {
  const response = await fetch('/api/health', { headers: { Accept: 'application/json' } });
  if (response.status !== 200 && response.status !== 503) {
    throw new Error(`The server answered ${response.status}.`);
  }
  return (await response.json()) as Health;
}

export const healthKeys = { all: ['health'] as const };

export const healthQueryOptions = () =>
  queryOptions({
    queryKey: healthKeys.all,
    queryFn: getHealth,
    // while something is wrong, look again sooner, so the status clears soon after it is fixed
    refetchInterval: (query) => (query.state.data?.status === 'ok' ? 30_000 : 5_000),
  });

export const useHealth = () => useQuery(healthQueryOptions());
