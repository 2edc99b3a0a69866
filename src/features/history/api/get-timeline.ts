import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TimelineEventDto } from '../../../../shared/schemas/history';
import { apiClient } from '../../../lib/api-client';
import { historyKeys } from './keys';

export async function getTimeline(unitId: number, signal?: AbortSignal): Promise<TimelineEventDto[]> {
  return (await apiClient.get<{ events: TimelineEventDto[] }>(`/api/units/${unitId}/timeline`, { signal })).events;
}

/** Every event of the unit, oldest first, compact: what the timeline draws. */
export function timelineQuery(unitId: number) {
  return queryOptions({
    queryKey: historyKeys.timeline(unitId),
    queryFn: ({ signal }) => getTimeline(unitId, signal),
  });
}

export function useTimeline(unitId: number) {
  return useQuery(timelineQuery(unitId));
}
