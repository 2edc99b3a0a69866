import { Button } from '../../../components/ui/button';
import { useRefreshJob } from '../../jobs/api/refresh-job';

/** Repair effectiveness is worked out by a background job; this asks for a fresh one and reloads when it is done. */
export function RefreshRepairs({ computedAt }: { computedAt: string | null }) {
  const refresh = useRefreshJob('/api/fleet/repair-effectiveness/refresh', 120);
  return (
    <div className="mt-3 flex flex-wrap items-center gap-3 text-sm text-ink-600">
      {computedAt && <span>Worked out {new Date(computedAt).toLocaleString('en-GB')}.</span>}
      <Button
        variant="quiet"
        onClick={() => refresh.mutate()}
        pending={refresh.isPending}
        pendingLabel="Working it out…"
      >
        Work it out again
      </Button>
      {refresh.isError && <span className="text-alarm-700">{refresh.error.message}</span>}
    </div>
  );
}
