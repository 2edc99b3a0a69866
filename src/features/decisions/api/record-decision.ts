import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DecisionRecordDto, RecordDecisionBody } from '../../../../shared/schemas/decisions';
import { apiClient } from '../../../lib/api-client';
import { decisionKeys } from './keys';

export function useRecordDecision(unitId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: RecordDecisionBody) =>
      apiClient.post<{ decision: DecisionRecordDto; replayed: boolean }>(`/api/decisions/units/${unitId}`, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: decisionKeys.unit(unitId) }),
  });
}
