import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';

function isSignedOutError(error: unknown): boolean {
  return isApiError(error) && error.status === 401;
}

/** Client errors will not change by asking again; network and server trouble might. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

export function createQueryClient(): QueryClient {
  const client: QueryClient = new QueryClient({
    // A 401 anywhere means the session is gone: the guards then send the person to sign in.
    queryCache: new QueryCache({
      onError: (error) => {
        if (isSignedOutError(error)) client.setQueryData(queryKeys.me(), null);
      },
    }),
    mutationCache: new MutationCache({
      onError: (error) => {
        if (isSignedOutError(error)) client.setQueryData(queryKeys.me(), null);
      },
    }),
    defaultOptions: {
      queries: { staleTime: 30_000, retry: shouldRetry, refetchOnWindowFocus: false },
      mutations: { retry: false },
    },
  });
  return client;
}
