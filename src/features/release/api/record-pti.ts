import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  RecordPtiInput,
  RecordPtiResultDto,
  ReleaseResultDto,
  ReleaseUnitInput,
} from '../../../../shared/schemas/release';
import { apiClient } from '../../../lib/api-client';
import { queryRoots } from '../../../lib/query-roots';

// A PTI or a release is an entry in the unit's history and changes its figures (PTI validity): both roots refresh.
function useRefreshUnit() {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: queryRoots.history }),
      queryClient.invalidateQueries({ queryKey: queryRoots.units }),
    ]);
}

export function useRecordPti(unitId: number) {
  const refresh = useRefreshUnit();
  return useMutation({
    mutationFn: (input: RecordPtiInput) => apiClient.post<RecordPtiResultDto>(`/api/units/${unitId}/pti`, input),
    onSuccess: refresh,
  });
}

export function useReleaseUnit(unitId: number) {
  const refresh = useRefreshUnit();
  return useMutation({
    mutationFn: (input: ReleaseUnitInput) => apiClient.post<ReleaseResultDto>(`/api/units/${unitId}/release`, input),
    onSuccess: refresh,
  });
}
