import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UnitDepotDto } from '../../../../shared/schemas/day';
import { apiClient } from '../../../lib/api-client';
import { dayKeys } from './keys';

export function unitDepotQuery(unitId: number) {
  return queryOptions({
    queryKey: dayKeys.unit(unitId),
    // What needs doing changes with every visit anyone records: read it again each time the list is opened.
    refetchOnMount: 'always',
    queryFn: ({ signal }) => apiClient.get<UnitDepotDto>(`/api/units/${unitId}/depot`, { signal }),
  });
}

export const useUnitDepot = (unitId: number) => useQuery(unitDepotQuery(unitId));
