import { useParams } from 'react-router-dom';
import { NotFound } from '../../../components/errors/not-found';
import { ButtonLink } from '../../../components/ui/button';
import { paths } from '../../../config/paths';
import { ServiceHistory } from '../../../features/history/components/service-history';
import { useUnit } from '../../../features/units/api/get-unit';
import { unitKeys } from '../../../features/units/api/keys';
import { UnitChanges } from '../../../features/units/components/unit-changes';
import { UnitIdentity } from '../../../features/units/components/unit-identity';
import { UnitLabelActions } from '../../../features/labels/components/unit-label-actions';
import { HandoverDownload } from '../../../features/handover/components/handover-download';
import { UnitDepotPanel } from '../../../features/day/components/unit-depot-panel';
import { Can } from '../../../lib/can';
import { unitIdOf } from './unit-data';
import { UnitLoadState } from '../../../features/units/components/unit-load-state';

// A visit or a void can change the unit's own record (its status), so the registry's copy is refreshed too.
const historyChangesUnit = (unitId: number) => [unitKeys.detail(unitId)];

/** Loaded on first visit by the router, alongside its data (unit-data.ts): no Suspense fallback in between. */
export default function UnitPage() {
  const id = unitIdOf(useParams().id);
  return id === null ? <NotFound /> : <UnitRecord id={id} />;
}

function UnitRecord({ id }: { id: number }) {
  const unit = useUnit(id);

  if (unit.isPending || unit.isError) return <UnitLoadState unit={unit} loading="Opening the unit…" />;

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
