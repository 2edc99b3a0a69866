import { useQuery, useQueryClient, type QueryKey } from '@tanstack/react-query';
import type { JobDto } from '../../../../shared/schemas/jobs';
import { apiClient } from '../../../lib/api-client';
import { jobKeys } from './keys';

export async function getJob(id: number, signal?: AbortSignal): Promise<JobDto> {
  return (await apiClient.get<{ job: JobDto }>(`/api/jobs/${id}`, { signal })).job;
}

/** Follows a running job once a second; when it ends, what it changed (`alsoInvalidate`) is fetched again. */
export function useJob(job: JobDto | null, alsoInvalidate: readonly QueryKey[] = []) {
  const queryClient = useQueryClient();
  return useQuery({
    queryKey: jobKeys.detail(job?.id ?? 0),
    queryFn: async ({ signal }) => {
      const next = await getJob(job!.id, signal);
      if (next.status !== 'running')
        for (const queryKey of alsoInvalidate) void queryClient.invalidateQueries({ queryKey });
      return next;
    },
    enabled: job !== null && job.status === 'running',
    initialData: job ?? undefined,
    refetchInterval: (q) => (q.state.data?.status === 'running' ? 1000 : false),
  });
}
