import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  LiftQuarantineInput,
  LiftQuarantineResultDto,
  QuarantineUnitsInput,
  QuarantineUnitsResultDto,
} from '../../../../shared/schemas/quarantine';
import { apiClient } from '../../../lib/api-client';
import { queryRoots } from '../../../lib/query-roots';

function useRefresh() {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: queryRoots.history }),
      queryClient.invalidateQueries({ queryKey: queryRoots.units }),
      queryClient.invalidateQueries({ queryKey: queryRoots.fleet }),
    ]);
}

export function useQuarantineUnits() {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (input: QuarantineUnitsInput) => apiClient.post<QuarantineUnitsResultDto>('/api/quarantine', input),
    onSuccess: refresh,
  });
}

export function useLiftQuarantine(unitId: number) {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (input: LiftQuarantineInput) =>
      apiClient.post<LiftQuarantineResultDto>(`/api/units/${unitId}/quarantine/lift`, input),
    onSuccess: refresh,
  });
}
