import type { QueryKey } from '@tanstack/react-query';
import type { JobDto } from '../../../../shared/schemas/jobs';
import { Alert } from '../../../components/ui/alert';
import { useJob } from '../api/get-job';
import { fmtCount } from '../../../lib/format';

/**
 * Progress of the statistics recompute that follows a settings change; the app stays usable meanwhile. When it ends,
 * what shows unit figures (`alsoInvalidate`) is fetched again.
 */
export function RecomputeProgress({
  job,
  alsoInvalidate,
}: {
  job: JobDto | null;
  alsoInvalidate: readonly QueryKey[];
}) {
  const live = useJob(job, alsoInvalidate);
  const j = live.data ?? job;
  if (!j) return null;
  if (j.status === 'running') {
    const pct = j.total ? Math.floor((j.processed / j.total) * 100) : 0;
    return (
      <div
        role="status"
        className="rounded-lg border-2 border-fjord-700 bg-fjord-50 p-4"
        data-testid="recompute-progress"
      >
        <p className="font-semibold text-fjord-900">
          Recomputing every unit's figures with the new settings: {fmtCount(j.processed)} of {fmtCount(j.total)}
        </p>
        <div className="mt-2 h-3 overflow-hidden rounded-full bg-white" aria-hidden="true">
          <div className="h-full bg-fjord-700 transition-[width]" style={{ width: `${pct}%` }} />
        </div>
        <p className="mt-2 text-sm text-ink-700">
          Everything stays usable; figures of units not yet done still follow the old settings.
        </p>
      </div>
    );
  }
  if (j.status === 'failed')
    return (
      <Alert tone="alarm" title="The recompute stopped">
        {j.message ?? 'Save the settings again to retry.'}
      </Alert>
    );
  if (j.status === 'done' && j.finishedAt && Date.now() - Date.parse(j.finishedAt) < 10 * 60_000) {
    return (
      <Alert tone="okay" title="Every unit's figures follow the current settings">
        {fmtCount(j.total)} units recomputed{j.message ? `. ${j.message}` : '.'}
      </Alert>
    );
  }
  return null;
}
