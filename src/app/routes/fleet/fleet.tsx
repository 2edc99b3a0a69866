import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { useSearchParams } from 'react-router-dom';
import { FLEET_SORTS, type FleetFilters, type FleetQuery, type FleetSort } from '../../../../shared/schemas/fleet';
import { Button, buttonClasses } from '../../../components/ui/button';
import { UnitsIcon } from '../../../components/ui/icons';
import { EmptyState, PageHeader } from '../../../components/ui/page';
import { LoadError, LoadingPanel } from '../../../components/ui/query-state';
import { fleetExportHref, fleetQuery, useFleet, useFleetCount } from '../../../features/fleet/api/get-fleet';
import { useSites } from '../../../features/sites/api/get-sites';
import { FleetFiltersPanel } from '../../../features/fleet/components/fleet-filters';
import { FleetTable, SORT_LABELS } from '../../../features/fleet/components/fleet-table';
import { FleetTabs } from '../../../features/fleet/components/fleet-tabs';
import { Pager } from '../../../features/fleet/components/pager';
import { filtersOf, fleetSearch, readFleetParams } from '../../../features/fleet/utils/fleet-params';

export const loader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await queryClient.prefetchQuery(fleetQuery(readFleetParams(new URL(request.url).searchParams)));
    return null;
  };

export default function FleetPage() {
  const [searchParams, setSearchParams] = useSearchParams();
  const q = readFleetParams(searchParams);
  const filters = filtersOf(q);
  const fleet = useFleet(q);
  const count = useFleetCount(filters);
  const sites = useSites();

  const go = (next: Partial<FleetQuery>) =>
    setSearchParams(fleetSearch({ ...q, ...next }), { preventScrollReset: true });
  const setFilters = (f: FleetFilters) =>
    setSearchParams(fleetSearch({ ...f, sort: q.sort, dir: q.dir, pageSize: q.pageSize, page: 1 }), {
      preventScrollReset: true,
    });

  return (
    <div className="flex flex-col gap-5">
      <PageHeader
        title="Fleet"
        description="Every unit with its figures, worst first. Filter, sort and export what you see."
        actions={
          <a className={buttonClasses({ variant: 'secondary' })} href={fleetExportHref(q)} download>
            Export CSV
          </a>
        }
      />
      <FleetTabs />
      <FleetFiltersPanel filters={filters} sites={sites.data ?? []} onChange={setFilters} />

      <div className="flex items-end gap-2 md:hidden">
        <label className="flex flex-1 flex-col gap-1 text-sm font-semibold text-ink-700">
          Sort by
          <select
            className="min-h-touch rounded-md border-2 border-ink-400 bg-white px-3 text-base text-ink-950"
            value={q.sort}
            onChange={(e) => go({ sort: e.target.value as FleetSort, page: 1 })}
          >
            {FLEET_SORTS.map((s) => (
              <option key={s} value={s}>
                {SORT_LABELS[s]}
              </option>
            ))}
          </select>
        </label>
        <Button
          variant="secondary"
          onClick={() => go({ dir: q.dir === 'asc' ? 'desc' : 'asc', page: 1 })}
          aria-label={`Order: ${q.dir === 'asc' ? 'ascending' : 'descending'}, change`}
        >
          <span className="whitespace-nowrap">{q.dir === 'asc' ? '▲ Lowest' : '▼ Highest'}</span>
        </Button>
      </div>

      <section aria-label="Fleet units" className="flex flex-col gap-4">
        {fleet.isPending ? (
          <LoadingPanel>Loading the fleet…</LoadingPanel>
        ) : fleet.isError && !fleet.data ? (
          <LoadError
            title="The fleet could not be loaded"
            error={fleet.error}
            onRetry={() => void fleet.refetch()}
            retrying={fleet.isFetching}
          />
        ) : fleet.data.rows.length === 0 ? (
          <EmptyState
            icon={<UnitsIcon className="size-10" />}
            title={Object.keys(filters).length ? 'No unit matches these filters' : 'No units in the fleet yet'}
          >
            {Object.keys(filters).length
              ? 'Loosen a filter or clear them all.'
              : 'Units appear here once they are registered.'}
          </EmptyState>
        ) : (
          <>
            <FleetTable
              rows={fleet.data.rows}
              sort={q.sort}
              dir={q.dir}
              busy={fleet.isPlaceholderData}
              onSort={(sort, dir) => go({ sort, dir, page: 1 })}
            />
            <Pager
              page={q.page}
              pageSize={q.pageSize}
              hasMore={fleet.data.hasMore}
              count={count.data}
              onPage={(page) => go({ page })}
              onPageSize={(pageSize) => go({ pageSize, page: 1 })}
            />
          </>
        )}
      </section>
    </div>
  );
}
