import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { FleetOverviewDto, FleetOverviewQuery } from '../../../../shared/schemas/fleet';
import { apiClient } from '../../../lib/api-client';
import { toSearch } from '../../../lib/query-string';
import { fleetKeys } from './keys';

export function fleetOverviewQuery(q: FleetOverviewQuery) {
  return queryOptions({
    queryKey: fleetKeys.overview(q),
    queryFn: ({ signal }) =>
      apiClient.get<FleetOverviewDto>(`/api/fleet/overview?${toSearch(q, { months: 12 })}`, { signal }),
    placeholderData: keepPreviousData,
  });
}

export const useFleetOverview = (q: FleetOverviewQuery) => useQuery(fleetOverviewQuery(q));
