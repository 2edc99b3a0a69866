import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import type { JobDto } from '../../../../shared/schemas/settings-api';
import { Button } from '../../../components/ui/button';
import { apiClient } from '../../../lib/api-client';
import { fleetKeys } from '../api/keys';

/** Repair effectiveness is worked out by a background job; this asks for a fresh one and reloads when it is done. */
export function RefreshRepairs({ computedAt }: { computedAt: string | null }) {
  const queryClient = useQueryClient();
  const refresh = useMutation({
    mutationFn: async () => {
      let { job } = await apiClient.post<{ job: JobDto }>('/api/fleet/repair-effectiveness/refresh');
      for (let i = 0; i < 120 && job.status === 'running'; i++) {
        await new Promise((r) => setTimeout(r, 1000));
        job = (await apiClient.get<{ job: JobDto }>(`/api/jobs/${job.id}`)).job;
      }
      return job;
    },
  });
  useEffect(() => {
    if (refresh.isSuccess) void queryClient.invalidateQueries({ queryKey: [...fleetKeys.all, 'overview'] });
  }, [refresh.isSuccess, queryClient]);
  return (
    <div className="mt-3 flex flex-wrap items-center gap-3 text-sm text-ink-600">
      {computedAt && <span>Worked out {new Date(computedAt).toLocaleString('en-GB')}.</span>}
      <Button variant="quiet" onClick={() => refresh.mutate()} pending={refresh.isPending} pendingLabel="Working it out…">
        Work it out again
      </Button>
      {refresh.isError && <span className="text-alarm-700">{refresh.error.message}</span>}
    </div>
  );
}
