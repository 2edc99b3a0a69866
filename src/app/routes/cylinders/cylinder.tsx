import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../../components/ui/page';
import { LoadError } from '../../../components/ui/query-state';
import { Spinner } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { cylinderQuery, useCylinder } from '../../../features/cylinders/api/get-cylinder';
import { useCylinders } from '../../../features/cylinders/api/get-cylinders';
import { CylinderDetail } from '../../../features/cylinders/components/cylinder-detail';

export const loader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const id = Number(params.id);
    if (Number.isInteger(id) && id > 0) await queryClient.prefetchQuery(cylinderQuery(id));
    return null;
  };

export default function CylinderPage() {
  const id = Number(useParams().id);
  const detail = useCylinder(id);
  // The register's tolerance comes with the list (cached from the register page, or fetched once).
  const list = useCylinders({});
  return (
    <div className="flex flex-col gap-6">
      <Link
        to={paths.cylinders.getHref()}
        className="text-base font-semibold text-fjord-700 underline-offset-4 hover:underline"
      >
        ← All cylinders
      </Link>
      {detail.isPending ? (
        <p role="status" className="flex items-center gap-3 text-lg">
          <Spinner /> Loading the cylinder…
        </p>
      ) : detail.isError ? (
        <LoadError
          title="The cylinder could not be loaded"
          error={detail.error}
          onRetry={() => void detail.refetch()}
          retrying={detail.isFetching}
        />
      ) : (
        <>
          <PageHeader
            title={`Cylinder ${detail.data.cylinder.code}`}
            description={`${detail.data.cylinder.refrigerant} · ${detail.data.cylinder.kind === 'recovery' ? 'recovery cylinder' : 'refrigerant supply'}`}
          />
          <CylinderDetail
            data={detail.data}
            toleranceKg={list.data?.toleranceKg ?? 0.5}
            unitHref={(unitId) => paths.unit.getHref(unitId)}
          />
        </>
      )}
    </div>
  );
}
