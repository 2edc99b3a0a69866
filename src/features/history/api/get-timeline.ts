import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UnitTimelineDto } from '../../../../shared/schemas/history';
import { apiClient } from '../../../lib/api-client';
import { historyKeys } from './keys';

export async function getTimeline(unitId: number, signal?: AbortSignal): Promise<UnitTimelineDto> {
  return apiClient.get<UnitTimelineDto>(`/api/units/${unitId}/timeline`, { signal });
}

/** Every event of the unit, oldest first, compact, and its pressure snapshots: what the timeline and trend draw. */
export function timelineQuery(unitId: number) {
  return queryOptions({
    queryKey: historyKeys.timeline(unitId),
    queryFn: ({ signal }) => getTimeline(unitId, signal),
  });
}

export function useTimeline(unitId: number) {
  return useQuery(timelineQuery(unitId));
}
