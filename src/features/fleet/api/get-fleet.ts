import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { FleetCountDto, FleetFilters, FleetPageDto, FleetQuery } from '../../../../shared/schemas/fleet';
import { apiClient } from '../../../lib/api-client';
import { filtersSearch, fleetSearch } from '../utils/fleet-params';
import { fleetKeys } from './keys';

export function fleetQuery(q: FleetQuery) {
  return queryOptions({
    queryKey: fleetKeys.list(q),
    queryFn: ({ signal }) => apiClient.get<FleetPageDto>(`/api/fleet?${fleetSearch(q)}`, { signal }),
    // The last page stays on screen while the next one loads.
    placeholderData: keepPreviousData,
  });
}

export const useFleet = (q: FleetQuery) => useQuery(fleetQuery(q));

export function fleetCountQuery(f: FleetFilters) {
  return queryOptions({
    queryKey: fleetKeys.count(f),
    queryFn: ({ signal }) => apiClient.get<FleetCountDto>(`/api/fleet/count?${filtersSearch(f)}`, { signal }),
    staleTime: 60_000,
    placeholderData: keepPreviousData,
  });
}

export const useFleetCount = (f: FleetFilters) => useQuery(fleetCountQuery(f));

/** The CSV of the current view: same filters and sort, every page. */
export const fleetExportHref = (q: FleetQuery) =>
  `/api/fleet/export.csv?${fleetSearch({ ...q, page: undefined, pageSize: undefined })}`;
