import { useSearchParams } from 'react-router-dom';
import { UnitsIcon } from '../../../components/ui/icons';
import { EmptyState, PageHeader, Panel } from '../../../components/ui/page';
import { FindUnitForm, formatContainerNumber, normalizeContainerQuery } from '../../../features/units/components/find-unit-form';

export default function UnitsPage() {
  const [searchParams] = useSearchParams();
  const q = normalizeContainerQuery(searchParams.get('q') ?? '');

  return (
    <div className="flex flex-col gap-6">
      <PageHeader title="Units" description="Every reefer unit in the registry, found by its container number." />
      <Panel aria-labelledby="units-search-title">
        <h2 id="units-search-title" className="sr-only">
          Find a unit
        </h2>
        {/* key: a new search from elsewhere (Home) refills the box. */}
        <FindUnitForm key={q} defaultValue={formatContainerNumber(q)} />
      </Panel>
      <section aria-live="polite" aria-label="Search result">
        {q ? (
          <EmptyState icon={<UnitsIcon className="size-10" />} title={<>No unit matches <span className="whitespace-nowrap tabular-nums">{formatContainerNumber(q)}</span></>}>
            No units are registered in Tightloop yet, so there is nothing to find. Once units are registered, a search
            by container number lands here.
          </EmptyState>
        ) : (
          <EmptyState icon={<UnitsIcon className="size-10" />} title="No units are registered yet">
            Units will be listed here once they are added to the registry.
          </EmptyState>
        )}
      </section>
    </div>
  );
}
