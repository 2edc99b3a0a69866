import { useParams } from 'react-router-dom';
import { NotFound } from '../../../components/errors/not-found';
import { ButtonLink } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { ServiceHistory } from '../../../features/history/components/service-history';
import { useUnit } from '../../../features/units/api/get-unit';
import { unitKeys } from '../../../features/units/api/keys';
import { UnitChanges } from '../../../features/units/components/unit-changes';
import { UnitIdentity } from '../../../features/units/components/unit-identity';
import { UnitLabelActions } from '../../../features/labels/components/unit-label-actions';
import { HandoverDownload } from '../../../features/handover/components/handover-download';
import { UnitDepotPanel } from '../../../features/day/components/unit-depot-panel';
import { isApiError } from '../../../lib/api-client';
import { Can } from '../../../lib/can';
import { LoadError } from '../../../components/ui/query-state';
import { unitIdOf } from './unit-data';

// A visit or a void can change the unit's own record (its status), so the registry's copy is refreshed too.
const historyChangesUnit = (unitId: number) => [unitKeys.detail(unitId)];

/** Loaded on first visit by the router, alongside its data (unit-data.ts): no Suspense fallback in between. */
export default function UnitPage() {
  const id = unitIdOf(useParams().id);
  return id === null ? <NotFound /> : <UnitRecord id={id} />;
}

function UnitRecord({ id }: { id: number }) {
  const unit = useUnit(id);

  if (unit.isPending) {
    return (
      <div
        role="status"
        className="flex items-center gap-3 rounded-lg border-2 border-ink-200 bg-white p-6 text-lg text-ink-700"
      >
        <Spinner /> Opening the unit…
      </div>
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

  return (
    <div className="flex flex-col gap-6">
      <UnitIdentity
        unit={unit.data}
        actions={
          <Can permission="manage:units">
            <ButtonLink to={paths.editUnit.getHref(unit.data.id)} variant="secondary">
              Edit
            </ButtonLink>
          </Can>
        }
      />

      <div className="flex flex-col gap-3">
        <UnitDepotPanel unitId={unit.data.id} />
        <ButtonLink to={paths.unitRelease.getHref(unit.data.id)} variant="secondary" className="self-start">
          PTI and release
        </ButtonLink>
      </div>

      {/*
        ── SERVICE HISTORY SLOT ─────────────────────────────────────────────────────────────────────────────
        The unit's timeline, figures and entries go here (features/history), between who the unit is and the
        registry actions below. `unit.data` carries id and commissionedOn.
        ──────────────────────────────────────────────────────────────────────────────────────────────────────
      */}
      <ServiceHistory
        unitId={unit.data.id}
        commissionedOn={unit.data.commissionedOn}
        recordHref={paths.unitVisit.getHref(unit.data.id)}
        alsoInvalidate={historyChangesUnit}
      />

      <Can permission="manage:units">
        <UnitLabelActions unit={unit.data} />
      </Can>
      <Can permission="view:fleet">
        <HandoverDownload unitId={unit.data.id} />
      </Can>
      <UnitChanges unitId={unit.data.id} />
    </div>
  );
}
