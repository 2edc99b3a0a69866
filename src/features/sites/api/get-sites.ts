import { queryOptions, useQuery } from '@tanstack/react-query';
import { sitesListDto, type SiteDto } from '../../../../shared/schemas/sites';
import { apiClient } from '../../../lib/api-client';
import { siteKeys } from './keys';

export async function getSites(signal?: AbortSignal): Promise<SiteDto[]> {
  return sitesListDto.parse(await apiClient.get('/api/sites', { signal })).sites;
}

export function sitesQuery() {
  return queryOptions({
    queryKey: siteKeys.list(),
    queryFn: ({ signal }) => getSites(signal),
    staleTime: 5 * 60_000,
  });
}

export function useSites() {
  return useQuery(sitesQuery());
}
