import type { QueryClient } from '@tanstack/react-query';
import { useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { formatContainerNumber } from '../../../../shared/domain';
import { NotFound } from '../../../components/errors/not-found';
import { PageHeader, Panel } from '../../../components/ui/page';
import { Spinner } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { sitesQuery, useSites } from '../../../features/sites/api/get-sites';
import { unitQuery, useUnit } from '../../../features/units/api/get-unit';
import { UnitForm } from '../../../features/units/components/unit-form';
import { isApiError } from '../../../lib/api-client';
import { LoadError } from '../../../components/ui/query-state';

const idOf = (raw: string | undefined) => (raw && /^\d{1,10}$/.test(raw) ? Number(raw) : null);

export const loader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const id = idOf(params.id);
    await Promise.all([
      id !== null ? queryClient.prefetchQuery(unitQuery(id)) : null,
      queryClient.prefetchQuery(sitesQuery()),
    ]);
    return null;
  };

export default function EditUnitPage() {
  const id = idOf(useParams().id);
  return id === null ? <NotFound /> : <EditUnit id={id} />;
}

function EditUnit({ id }: { id: number }) {
  const navigate = useNavigate();
  const unit = useUnit(id);
  const sites = useSites();
  if (unit.isPending || sites.isPending) {
    return (
      <p role="status" className="flex items-center gap-3 text-lg">
        <Spinner /> Loading…
      </p>
    );
  }
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
  const back = () => void navigate(paths.unit.getHref(id));
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title={`Edit ${formatContainerNumber(unit.data.containerNumber)}`}
        description="Every change is kept in the unit’s record changes, with your name."
      />
      <Panel>
        <UnitForm unit={unit.data} sites={sites.data ?? []} onSaved={back} onCancel={back} />
      </Panel>
    </div>
  );
}
