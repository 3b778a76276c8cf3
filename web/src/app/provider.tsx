import { MutationCache, QueryCache, QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { ApiError, retryDelayWhileUnavailable } from '../lib/api-client';
import { goToSignIn } from '../lib/sign-in';

/** A 401 anywhere means the session has ended (idle, time limit, deactivation): sign in again. */
function onApiError(error: unknown): void {
  if (error instanceof ApiError && error.status === 401) goToSignIn();
}

export function AppProvider({ children }: { children: ReactNode }) {
  const [queryClient] = useState(
    () =>
      new QueryClient({
        queryCache: new QueryCache({ onError: onApiError }),
        mutationCache: new MutationCache({ onError: onApiError }),
        defaultOptions: {
          queries: {
            staleTime: 30_000,
            // a 4xx will not change by asking again
            retry: (count, error) => !(error instanceof ApiError && error.status >= 400 && error.status < 500) && count < 2,
            // a page showing "can't reach its database" asks again by itself and recovers
            refetchInterval: (query) => retryDelayWhileUnavailable(query.state.error),
          },
        },
      }),
  );
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
