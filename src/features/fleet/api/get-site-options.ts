import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client';
import { fleetKeys } from './keys';

export type SiteOption = { id: number; code: string; name: string };

export function siteOptionsQuery() {
  return queryOptions({
    queryKey: fleetKeys.sites(),
    queryFn: async ({ signal }) =>
      (await apiClient.get<{ sites: SiteOption[] }>('/api/sites', { signal })).sites.map((s) => ({
        id: s.id,
        code: s.code,
        name: s.name,
      })),
    staleTime: 5 * 60_000,
  });
}

/** Sites for the filters; the filters still work (without names) if the list cannot be loaded. */
export const useSiteOptions = () => useQuery(siteOptionsQuery());
