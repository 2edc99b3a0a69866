import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RetirementCandidatesDto } from '../../../../shared/schemas/decisions';
import { apiClient } from '../../../lib/api-client';
import { decisionKeys } from './keys';

export function candidatesQuery(siteId?: number) {
  return queryOptions({
    queryKey: decisionKeys.candidates(siteId),
    queryFn: ({ signal }) =>
      apiClient.get<RetirementCandidatesDto>(`/api/decisions/candidates${siteId ? `?siteId=${siteId}` : ''}`, {
        signal,
      }),
  });
}

export const useCandidates = (siteId?: number) => useQuery(candidatesQuery(siteId));
