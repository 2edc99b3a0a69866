import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DayDto } from '../../../../shared/schemas/day';
import { apiClient } from '../../../lib/api-client';
import { dayKeys } from './keys';

export function dayQuery(siteId: number | null) {
  return queryOptions({
    queryKey: dayKeys.day(siteId),
    // What needs doing changes with every visit anyone records: read it again each time the list is opened.
    refetchOnMount: 'always',
    queryFn: ({ signal }) => apiClient.get<DayDto>(siteId ? `/api/day?siteId=${siteId}` : '/api/day', { signal }),
  });
}

export const useDay = (siteId: number | null) => useQuery(dayQuery(siteId));
