import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { unitListDto, type UnitListDto, type UnitListFilters } from '../../../../shared/schemas/units';
import { apiClient } from '../../../lib/api-client';
import { unitKeys } from './keys';

export async function getUnits(filters: UnitListFilters, signal?: AbortSignal): Promise<UnitListDto> {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) {
    if (value !== undefined && value !== null && value !== '') params.set(key, String(value));
  }
  return unitListDto.parse(await apiClient.get(`/api/units?${params}`, { signal }));
}

export function unitsQuery(filters: UnitListFilters) {
  return queryOptions({
    queryKey: unitKeys.list(filters),
    queryFn: ({ signal }) => getUnits(filters, signal),
    // Keep the last page on screen while the next one loads, so the list does not flash empty between pages.
    placeholderData: keepPreviousData,
  });
}

export function useUnits(filters: UnitListFilters) {
  return useQuery(unitsQuery(filters));
}
