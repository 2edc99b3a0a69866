import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import type { JobDto } from '../../../../shared/schemas/settings-api';
import { apiClient } from '../../../lib/api-client';
import { fleetKeys } from '../../fleet/api/keys';

/**
 * Starts a background job of the fleet views (`path` answers `{ job }`), follows it once a second for at most
 * `maxSeconds`, and reloads the overview when it is done.
 */
export function useRefreshJob(path: string, maxSeconds: number) {
  const queryClient = useQueryClient();
  const refresh = useMutation({
    mutationFn: async () => {
      let { job } = await apiClient.post<{ job: JobDto }>(path);
      for (let i = 0; i < maxSeconds && job.status === 'running'; i++) {
        await new Promise((r) => setTimeout(r, 1000));
        job = (await apiClient.get<{ job: JobDto }>(`/api/jobs/${job.id}`)).job;
      }
      return job;
    },
  });
  useEffect(() => {
    if (refresh.isSuccess) void queryClient.invalidateQueries({ queryKey: [...fleetKeys.all, 'overview'] });
  }, [refresh.isSuccess, queryClient]);
  return refresh;
}
