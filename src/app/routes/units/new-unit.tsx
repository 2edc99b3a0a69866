import type { QueryClient } from '@tanstack/react-query';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { formatContainerNumber, normalizeContainerNumber } from '../../../../shared/domain';
import { PageHeader, Panel } from '../../../components/ui/page';
import { paths } from '../../../config/paths';
import { sitesQuery, useSites } from '../../../features/sites/api/get-sites';
import { UnitForm } from '../../../features/units/components/unit-form';

export const loader = (queryClient: QueryClient) => async () => {
  await queryClient.prefetchQuery(sitesQuery());
  return null;
};

export default function NewUnitPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const sites = useSites();
  // From the scan page: the number that found nothing.
  const number = normalizeContainerNumber(params.get('number') ?? '').slice(0, 11);
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Register a unit"
        description="The unit gets its record and a QR label code; print the label from its page."
      />
      <Panel>
        <UnitForm
          sites={sites.data ?? []}
          defaultContainerNumber={number ? formatContainerNumber(number) : ''}
          onSaved={(unit) => void navigate(paths.unit.getHref(unit.id), { replace: true })}
          onCancel={() => void navigate(-1)}
        />
      </Panel>
    </div>
  );
}
