import { useQuery } from '@tanstack/react-query';
import { apiClient } from './api-client';

export const devToolsKeys = { probe: () => ['dev-tools', 'probe'] as const };

/**
 * Whether the server runs its development helpers. The built client is the same in development and production,
 * so it asks: the mailbox route exists only in development (404 in production). Only admins may ask.
 */
export function useDevTools(enabled: boolean): boolean {
  const probe = useQuery({
    queryKey: devToolsKeys.probe(),
    queryFn: ({ signal }) => apiClient.get('/api/dev/mailbox?limit=1', { signal }).then(() => true),
    enabled,
    retry: false,
    staleTime: Infinity,
  });
  return probe.data === true;
}
