import type { QueryKey } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { Button } from '../../../components/ui/button';
import { useRefreshJob } from '../api/refresh-job';

type RefreshJobProps = {
  /** Answers `{ job }` to a POST. */
  path: string;
  maxSeconds: number;
  /** What the job changes, fetched again when it is done. */
  alsoInvalidate: readonly QueryKey[];
  /** When the figures were last worked out, before the button. */
  note?: ReactNode;
  label: string;
  pendingLabel: string;
};

/** Asks for a background job to work figures out again now, shows that it runs, and reloads when it is done. */
export function RefreshJob({ path, maxSeconds, alsoInvalidate, note, label, pendingLabel }: RefreshJobProps) {
  const refresh = useRefreshJob(path, maxSeconds, alsoInvalidate);
  return (
    <div className="mt-3 flex flex-wrap items-center gap-3 text-sm text-ink-600">
      {note && <span>{note}</span>}
      <Button variant="quiet" onClick={() => refresh.mutate()} pending={refresh.isPending} pendingLabel={pendingLabel}>
        {label}
      </Button>
      {refresh.isError && <span className="text-alarm-700">{refresh.error.message}</span>}
    </div>
  );
}
