import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { PlusIcon } from '../../../components/ui/icons';
import { EmptyState, PageHeader, Panel } from '../../../components/ui/page';
import { LoadError } from '../../../components/ui/query-state';
import { Spinner } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { Can } from '../../../lib/can';
import { fmtKg } from '../../../lib/format';
import { cylindersQuery, useCylinders } from '../../../features/cylinders/api/get-cylinders';
import { CylinderForm } from '../../../features/cylinders/components/cylinder-form';
import { CylinderImport } from '../../../features/cylinders/components/cylinder-import';
import { CylinderRegister } from '../../../features/cylinders/components/cylinder-register';
import { useSites } from '../../../features/sites/api/get-sites';
import { SiteOptions } from '../../../components/ui/filter-options';

export const loader = (queryClient: QueryClient) => async () => {
  await queryClient.prefetchQuery(cylindersQuery());
  return null;
};

export default function CylindersPage() {
  const [siteId, setSiteId] = useState<number | undefined>();
  const list = useCylinders({ siteId });
  const sites = useSites();
  const navigate = useNavigate();
  const [open, setOpen] = useState<'form' | 'import' | null>(null);
  const flagged = list.data?.cylinders.filter((c) => c.ledger.reconciliation?.flagged).length ?? 0;
  const nearFull = list.data?.cylinders.filter((c) => c.ledger.nearFull).length ?? 0;
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Cylinders"
        description="Refrigerant and recovery cylinders: what each holds, where its gas went, and whether the kilograms written on visits match the scale."
        actions={
          <Can permission="manage:units">
            <Button onClick={() => setOpen('form')}>
              <PlusIcon className="size-5" /> Register cylinder
            </Button>
            <Button variant="secondary" onClick={() => setOpen('import')}>
              Import CSV
            </Button>
          </Can>
        }
      />
      {open && (
        <Panel className="border-ink-950">
          {open === 'form' ? (
            <CylinderForm
              sites={sites.data ?? []}
              onSaved={(id) => navigate(paths.cylinder.getHref(id))}
              onCancel={() => setOpen(null)}
            />
          ) : (
            <CylinderImport onDone={() => setOpen(null)} />
          )}
        </Panel>
      )}
      <div className="flex flex-wrap items-end gap-4">
        <label className="flex flex-col gap-1 text-base font-semibold">
          Site
          <select
            className="min-h-12 rounded-md border-2 border-ink-400 px-3"
            value={siteId ?? ''}
            onChange={(e) => setSiteId(e.target.value ? Number(e.target.value) : undefined)}
          >
            <SiteOptions sites={sites.data} />
          </select>
        </label>
        {list.data && (
          <p className="text-base text-ink-700" role="status">
            {list.data.cylinders.length} cylinders · <strong>{flagged}</strong> with a mismatch over{' '}
            {fmtKg(list.data.toleranceKg)} · <strong>{nearFull}</strong> recovery cylinders near the maximum fill
          </p>
        )}
      </div>
      {list.isPending ? (
        <p role="status" className="flex items-center gap-3 text-lg">
          <Spinner /> Loading cylinders…
        </p>
      ) : list.isError ? (
        <LoadError
          title="The register could not be loaded"
          error={list.error}
          onRetry={() => void list.refetch()}
          retrying={list.isFetching}
        />
      ) : list.data.cylinders.length === 0 ? (
        <EmptyState title="No cylinders yet">
          Register the cylinders at your depots, or import them from a CSV.
        </EmptyState>
      ) : (
        <CylinderRegister data={list.data} hrefOf={(id) => paths.cylinder.getHref(id)} />
      )}
    </div>
  );
}
