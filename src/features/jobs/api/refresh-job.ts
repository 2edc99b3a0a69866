import { useMutation, useQueryClient, type QueryKey } from '@tanstack/react-query';
import type { JobDto } from '../../../../shared/schemas/jobs';
import { apiClient } from '../../../lib/api-client';
import { getJob } from './get-job';

/**
 * Starts a background job (`path` answers `{ job }`), follows it once a second for at most `maxSeconds`, and fetches
 * what it changed (`alsoInvalidate`) again when it is done.
 */
export function useRefreshJob(path: string, maxSeconds: number, alsoInvalidate: readonly QueryKey[]) {
  const queryClient = useQueryClient();
  const refresh = useMutation({
    mutationFn: async () => {
      let { job } = await apiClient.post<{ job: JobDto }>(path);
      for (let i = 0; i < maxSeconds && job.status === 'running'; i++) {
        await new Promise((r) => setTimeout(r, 1000));
        job = await getJob(job.id);
      }
      return job;
    },
    onSuccess: () => {
      for (const queryKey of alsoInvalidate) void queryClient.invalidateQueries({ queryKey });
    },
  });
  return refresh;
}
