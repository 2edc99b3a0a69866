import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  MarkForInspectionInput,
  MarkForInspectionResultDto,
  TraceQuery,
  TraceResultDto,
} from '../../../../shared/schemas/trace';
import { apiClient } from '../../../lib/api-client';
import { toSearch } from '../../../lib/query-string';
import { traceKeys } from './keys';

export function traceQuery(q: TraceQuery | null) {
  return queryOptions({
    queryKey: traceKeys.result(q ?? {}),
    queryFn: ({ signal }) => apiClient.get<TraceResultDto>(`/api/traceability?${toSearch(q ?? {})}`, { signal }),
    enabled: q !== null,
  });
}

export const useTrace = (q: TraceQuery | null) => useQuery(traceQuery(q));
export const traceExportHref = (q: TraceQuery) => `/api/traceability/export.csv?${toSearch(q)}`;

export function useMarkForInspection() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: MarkForInspectionInput) =>
      apiClient.post<MarkForInspectionResultDto>('/api/traceability/mark-for-inspection', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: traceKeys.all }),
  });
}
