import type { QueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { PlusIcon } from '../../../components/ui/icons';
import { EmptyState, PageHeader, Panel } from '../../../components/ui/page';
import { Spinner } from '../../../components/ui/spinner';
import { sitesQuery, useSites } from '../../../features/sites/api/get-sites';
import { SiteForm } from '../../../features/sites/components/site-form';
import { SitesList } from '../../../features/sites/components/sites-list';
import { LoadError } from '../../../components/ui/query-state';

export const loader = (queryClient: QueryClient) => async () => {
  await queryClient.prefetchQuery(sitesQuery());
  return null;
};

export default function SitesPage() {
  const sites = useSites();
  const [adding, setAdding] = useState(false);
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Sites"
        description="Depots, terminals, vessels and workshops where units are kept and serviced."
        actions={
          !adding && (
            <Button onClick={() => setAdding(true)}>
              <PlusIcon className="size-5" /> Add site
            </Button>
          )
        }
      />
      {adding && (
        <Panel className="border-ink-950">
          <SiteForm onSaved={() => setAdding(false)} onCancel={() => setAdding(false)} />
        </Panel>
      )}
      {sites.isPending ? (
        <p role="status" className="flex items-center gap-3 text-lg">
          <Spinner /> Loading sites…
        </p>
      ) : sites.isError ? (
        <LoadError
          title="The sites could not be loaded"
          error={sites.error}
          onRetry={() => void sites.refetch()}
          retrying={sites.isFetching}
        />
      ) : sites.data.length === 0 ? (
        <EmptyState title="No sites yet">
          Add the depots and terminals where your units are, so each unit can name its place.
        </EmptyState>
      ) : (
        <SitesList sites={sites.data} />
      )}
    </div>
  );
}
