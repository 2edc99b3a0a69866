import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UnitDecisionDto } from '../../../../shared/schemas/decisions';
import { apiClient } from '../../../lib/api-client';
import { decisionKeys } from './keys';

export function unitDecisionQuery(unitId: number) {
  return queryOptions({
    queryKey: decisionKeys.unit(unitId),
    queryFn: ({ signal }) => apiClient.get<UnitDecisionDto>(`/api/decisions/units/${unitId}`, { signal }),
  });
}

export const useUnitDecision = (unitId: number) => useQuery(unitDecisionQuery(unitId));
