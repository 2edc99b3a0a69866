import type { QueryClient } from '@tanstack/react-query';
import { useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { formatContainerNumber } from '../../../../shared/domain';
import { NotFound } from '../../../components/errors/not-found';
import { PageHeader, Panel } from '../../../components/ui/page';
import { paths } from '../../../config/paths';
import { sitesQuery, useSites } from '../../../features/sites/api/get-sites';
import { unitQuery, useUnit } from '../../../features/units/api/get-unit';
import { UnitForm } from '../../../features/units/components/unit-form';
import { UnitLoadState } from '../../../features/units/components/unit-load-state';

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
  if (unit.isPending || unit.isError || sites.isPending) return <UnitLoadState unit={unit} loading="Loading…" />;
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
