import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UnitOverviewDto } from '../../../../shared/schemas/history';
import { apiClient } from '../../../lib/api-client';
import { historyKeys } from './keys';

export async function getOverview(unitId: number, signal?: AbortSignal): Promise<UnitOverviewDto> {
  return apiClient.get<UnitOverviewDto>(`/api/units/${unitId}/overview`, { signal });
}

/** The unit's figures (score, forecast, leak rate, PTI, pressure health) and the first page of its history. */
export function overviewQuery(unitId: number) {
  return queryOptions({
    queryKey: historyKeys.overview(unitId),
    queryFn: ({ signal }) => getOverview(unitId, signal),
  });
}

export function useOverview(unitId: number) {
  return useQuery(overviewQuery(unitId));
}
