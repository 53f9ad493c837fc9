import { MutationCache, QueryCache, QueryClient, type DefaultOptions } from '@tanstack/react-query';
import { isApiError } from './api-client';

/** Statuses where asking again will not change the answer. */
function isFinal(error: unknown): boolean {
  return (
    isApiError(error) &&
    error.status >= 400 &&
    error.status < 500 &&
    error.status !== 408 &&
    error.status !== 429
  );
}

export const queryConfig = {
  queries: {
    staleTime: 30_000,
    refetchOnWindowFocus: false,
    retry: (failureCount, error) => !isFinal(error) && failureCount < 2,
  },
  mutations: {
    retry: false,
  },
} satisfies DefaultOptions;

export interface QueryClientOptions {
  /**
   * Called when any query or mutation answers 401. The app decides whether the person was signed
   * in (their session ended elsewhere) and, if so, clears the cache and sends them to sign in.
   */
  onUnauthenticated?: (client: QueryClient) => void;
}

export function createQueryClient(options: QueryClientOptions = {}): QueryClient {
  const on401 = (error: unknown) => {
    if (isApiError(error) && error.status === 401) options.onUnauthenticated?.(client);
  };
  const client: QueryClient = new QueryClient({
    defaultOptions: queryConfig,
    queryCache: new QueryCache({ onError: on401 }),
    mutationCache: new MutationCache({ onError: on401 }),
  });
  return client;
}
