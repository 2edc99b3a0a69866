import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { unitListQuerySchema, type UnitListFilters } from '../../../../shared/schemas/units';
import { Button, ButtonLink } from '../../../components/ui/button';
import { PlusIcon, UnitsIcon } from '../../../components/ui/icons';
import { EmptyState, PageHeader, Panel } from '../../../components/ui/page';
import { Spinner } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { sitesQuery, useSites } from '../../../features/sites/api/get-sites';
import { unitsQuery, useUnits } from '../../../features/units/api/get-units';
import { usePrintLabelSheet } from '../../../features/labels/api/print-labels';
import { UnitsFilters, type UnitFilterValues } from '../../../features/units/components/units-filters';
import { Pager, UnitsList } from '../../../features/units/components/units-list';
import { Can, useCan } from '../../../lib/can';
import { LoadError } from '../../../components/ui/query-state';
import { fmtCount } from '../../../lib/format';

const PAGE_SIZE = 25;

/** The list's filters live in the URL (shareable, and Back restores them); anything unreadable falls back to defaults. */
function filtersFrom(params: URLSearchParams): UnitListFilters & UnitFilterValues & { page: number } {
  const raw = Object.fromEntries(params);
  const parsed = unitListQuerySchema.safeParse({ ...raw, pageSize: PAGE_SIZE });
  const v = parsed.success ? parsed.data : unitListQuerySchema.parse({ pageSize: PAGE_SIZE });
  return {
    q: v.q ?? '',
    siteId: v.siteId,
    status: v.status,
    refrigerant: v.refrigerant,
    sort: v.sort,
    dir: v.dir,
    page: v.page,
    pageSize: PAGE_SIZE,
  };
}

export const loader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const filters = filtersFrom(new URL(request.url).searchParams);
    await Promise.all([queryClient.prefetchQuery(unitsQuery(filters)), queryClient.prefetchQuery(sitesQuery())]);
    return null;
  };

export default function UnitsPage() {
  const [params, setParams] = useSearchParams();
  const filters = filtersFrom(params);
  const units = useUnits(filters);
  const sites = useSites();
  const canPrint = useCan('manage:units');
  const printLabels = usePrintLabelSheet();
  const [selected, setSelected] = useState<ReadonlySet<number>>(new Set());

  const update = (next: Partial<UnitFilterValues & { page: number }>) => {
    const merged = { ...filters, page: 1, ...next };
    const out = new URLSearchParams();
    if (merged.q) out.set('q', merged.q);
    if (merged.siteId) out.set('siteId', String(merged.siteId));
    if (merged.status) out.set('status', merged.status);
    if (merged.refrigerant) out.set('refrigerant', merged.refrigerant);
    if (merged.sort !== 'containerNumber' || merged.dir !== 'asc') {
      out.set('sort', merged.sort);
      out.set('dir', merged.dir);
    }
    if (merged.page > 1) out.set('page', String(merged.page));
    setParams(out, { preventScrollReset: true });
  };

  const toggle = (id: number) =>
    setSelected((s) => {
      const n = new Set(s);
      if (!n.delete(id)) n.add(id);
      return n;
    });
  const togglePage = (ids: number[], on: boolean) =>
    setSelected((s) => {
      const n = new Set(s);
      for (const id of ids)
        if (on) n.add(id);
        else n.delete(id);
      return n;
    });

  const filtered = Boolean(filters.q || filters.siteId || filters.status || filters.refrigerant);
  const data = units.data;

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Units"
        description="Every reefer unit in the registry. Search by the start of the container number."
        actions={
          <Can permission="manage:units">
            <ButtonLink to={paths.newUnit.getHref()}>
              <PlusIcon className="size-5" />
              Register unit
            </ButtonLink>
            <ButtonLink to={paths.unitImport.getHref()} variant="secondary">
              Import fleet
            </ButtonLink>
            <ButtonLink to={paths.sites.getHref()} variant="secondary">
              Sites
            </ButtonLink>
          </Can>
        }
      />
      <Panel aria-label="Search and filters">
        {/* key: a search from elsewhere (Home) refills the box. */}
        <UnitsFilters key={filters.q} values={filters} sites={sites.data ?? []} onChange={update} />
      </Panel>

      {canPrint && selected.size > 0 && (
        <div className="sticky top-20 z-10 flex flex-wrap items-center gap-3 rounded-lg border-2 border-fjord-700 bg-fjord-50 p-3">
          <p className="text-base font-semibold">{selected.size} selected</p>
          <Button
            onClick={() => printLabels.mutate([...selected])}
            pending={printLabels.isPending}
            pendingLabel="Making labels…"
          >
            Print labels ({selected.size})
          </Button>
          <Button variant="quiet" onClick={() => setSelected(new Set())}>
            Clear selection
          </Button>
          {printLabels.isError && (
            <p className="w-full text-base font-semibold text-alarm-700">{printLabels.error.message}</p>
          )}
        </div>
      )}

      <section aria-label="Units found" aria-busy={units.isFetching || undefined} className="flex flex-col gap-4">
        {units.isPending ? (
          <div className="flex items-center gap-3 rounded-lg border-2 border-ink-200 bg-white p-6 text-ink-700">
            <Spinner /> Loading units…
          </div>
        ) : units.isError && !data ? (
          <LoadError
            title="The units could not be loaded"
            error={units.error}
            onRetry={() => void units.refetch()}
            retrying={units.isFetching}
          />
        ) : !data || data.total === 0 ? (
          filtered ? (
            <EmptyState icon={<UnitsIcon className="size-10" />} title="No unit matches">
              Nothing starts with “{filters.q}”
              {filters.siteId || filters.status || filters.refrigerant ? ' with these filters' : ''}. Check the number,
              or clear the filters.
            </EmptyState>
          ) : (
            <EmptyState icon={<UnitsIcon className="size-10" />} title="No units are registered yet">
              <Can
                permission="manage:units"
                fallback="A fleet engineer registers units or imports the fleet from a CSV file."
              >
                Register the first unit, or import the whole fleet from a CSV file.
              </Can>
            </EmptyState>
          )
        ) : (
          <>
            <p className="text-base text-ink-700" aria-live="polite">
              {fmtCount(data.total)} unit{data.total === 1 ? '' : 's'}
            </p>
            <UnitsList
              units={data.units}
              hrefOf={paths.unit.getHref}
              selection={canPrint ? { selected, onToggle: toggle, onTogglePage: togglePage } : undefined}
            />
            <Pager
              page={data.page}
              pageSize={data.pageSize}
              total={data.total}
              busy={units.isFetching}
              onPage={(page) => update({ page })}
            />
          </>
        )}
      </section>
    </div>
  );
}
