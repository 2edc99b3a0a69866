import type { UseQueryResult } from '@tanstack/react-query';
import { NotFound } from '../../../components/errors/not-found';
import { LoadError } from '../../../components/ui/query-state';
import { Spinner } from '../../../components/ui/spinner';
import { isApiError } from '../../../lib/api-client';

/** What a unit's page shows until its unit is there: a spinner, "not found" for an unknown unit, or the error. */
export function UnitLoadState({ unit, loading }: { unit: UseQueryResult<unknown, Error>; loading: string }) {
  if (unit.isError) {
    if (isApiError(unit.error) && unit.error.status === 404) return <NotFound />;
    return (
      <LoadError
        title="The unit could not be loaded"
        error={unit.error}
        onRetry={() => void unit.refetch()}
        retrying={unit.isFetching}
      />
    );
  }
  return (
    <div
      role="status"
      className="flex items-center gap-3 rounded-lg border-2 border-ink-200 bg-white p-6 text-lg text-ink-700"
    >
      <Spinner /> {loading}
    </div>
  );
}
