import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './api-client';

type UnauthenticatedHandler = () => void;
let onUnauthenticated: UnauthenticatedHandler | null = null;

/** The router registers how to send the user to sign-in; the caches below call it on any 401. */
export function setUnauthenticatedHandler(handler: UnauthenticatedHandler | null): void {
  onUnauthenticated = handler;
}

function handleError(error: unknown): void {
  // A wrong password is a 401 too, but it belongs to the sign-in form, not to a redirect.
  if (isApiError(error) && error.status === 401 && error.code !== 'invalid_credentials') onUnauthenticated?.();
}

export function createQueryClient(): QueryClient {
  return new QueryClient({
    queryCache: new QueryCache({ onError: handleError }),
    mutationCache: new MutationCache({ onError: handleError }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        // Kept as long as the offline copy (lib/persist-queries): only what is in the cache is written to the phone.
        gcTime: 14 * 24 * 3600_000,
        // Retry only what may pass on a second try: a dropped connection or a server hiccup. A 4xx will not change.
        retry: (failureCount, error) =>
          isApiError(error) && (error.status === 0 || error.status >= 500) && failureCount < 2,
      },
      mutations: { retry: false },
    },
  });
}
