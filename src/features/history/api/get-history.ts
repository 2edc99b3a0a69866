import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import { HISTORY_PAGE_SIZE, type UnitHistoryDto } from '../../../../shared/schemas/history';
import { apiClient } from '../../../lib/api-client';
import { historyKeys } from './keys';

export async function getHistoryPage(
  unitId: number,
  before: number | null,
  signal?: AbortSignal,
): Promise<UnitHistoryDto> {
  const q = new URLSearchParams({ limit: String(HISTORY_PAGE_SIZE) });
  if (before) q.set('before', String(before));
  return apiClient.get<UnitHistoryDto>(`/api/units/${unitId}/history?${q}`, { signal });
}

/** The unit's events, newest first, a page at a time ("Load more"). */
export function historyInfiniteQuery(unitId: number) {
  return infiniteQueryOptions({
    queryKey: historyKeys.events(unitId),
    queryFn: ({ pageParam, signal }) => getHistoryPage(unitId, pageParam, signal),
    initialPageParam: null as number | null,
    getNextPageParam: (last) => last.nextBefore,
  });
}

export function useHistory(unitId: number) {
  return useInfiniteQuery(historyInfiniteQuery(unitId));
}
