import { useMutation, useQueryClient, type QueryClient, type QueryKey } from '@tanstack/react-query';
import type { RecordVisitResultDto, UnitOverviewDto, VisitSubmission } from '../../../../shared/schemas/history';
import { apiClient } from '../../../lib/api-client';
import { historyKeys } from './keys';

/**
 * Sends one visit, for a unit or for a label (the server finds the label's unit). The idempotency key makes a retry
 * safe: the server answers a known key with the first result.
 */
export async function recordVisit(input: VisitSubmission): Promise<RecordVisitResultDto> {
  return apiClient.post<RecordVisitResultDto>('/api/visits', input);
}

/** The unit a saved visit went to (a visit has at least one entry, and every entry names its unit). */
export const visitUnitId = (result: RecordVisitResultDto): number => result.events[0].unitId;

/**
 * After a visit is saved: its figures at once (when the answer is at hand; another tab's visit only says which unit),
 * then everything of the unit fresh from the server.
 */
export async function refreshAfterVisit(
  queryClient: QueryClient,
  result: RecordVisitResultDto | null,
  unitId: number,
  alsoInvalidate: QueryKey[] = [],
) {
  if (result) {
    queryClient.setQueryData<UnitOverviewDto>(historyKeys.overview(unitId), (old) =>
      old ? { ...old, stats: result.stats } : old,
    );
  }
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: historyKeys.unit(unitId) }),
    ...alsoInvalidate.map((queryKey) => queryClient.invalidateQueries({ queryKey })),
  ]);
}

/** `alsoInvalidate`: keys of other features that a visit changes (the unit's own record, e.g. its status). */
export function useRecordVisit(options: { alsoInvalidate?: (unitId: number) => QueryKey[] } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: recordVisit,
    // Try even when the browser says it is offline: a failed attempt is what puts the visit in the phone's queue
    // (the default would hold the mutation in memory, lost with the page).
    networkMode: 'always',
    onSuccess: (result) => {
      const unitId = visitUnitId(result);
      // Not awaited: the form shows "saved" at once; the unit page refetches in the background.
      void refreshAfterVisit(queryClient, result, unitId, options.alsoInvalidate?.(unitId));
    },
  });
}
