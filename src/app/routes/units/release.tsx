import { Link, useParams } from 'react-router-dom';
import { formatContainerNumber } from '../../../../shared/domain';
import { NotFound } from '../../../components/errors/not-found';
import { PageHeader, Panel } from '../../../components/ui/page';
import { paths } from '../../../config/paths';
import { useUnitDepot } from '../../../features/day/api/get-unit-depot';
import { UnitDepotPanel } from '../../../features/day/components/unit-depot-panel';
import { LiftQuarantineForm } from '../../../features/quarantine/components/lift-quarantine-form';
import { QuarantineUnitsButton } from '../../../features/quarantine/components/quarantine-units-button';
import { PtiChecklist } from '../../../features/release/components/pti-checklist';
import { ReleaseButton } from '../../../features/release/components/release-button';
import { useUnit } from '../../../features/units/api/get-unit';
import { Can } from '../../../lib/can';
import { UnitLoadState } from '../../../features/units/components/unit-load-state';

const unitIdOf = (raw: string | undefined) => {
  const n = Number(raw);
  return Number.isInteger(n) && n > 0 ? n : null;
};

/** PTI and release: the unit's depot state, the structured PTI, the release, and quarantine for engineers. */
export default function UnitReleasePage() {
  const unitId = unitIdOf(useParams().id);
  const unit = useUnit(unitId ?? 0);
  const depot = useUnitDepot(unitId ?? 0);
  if (!unitId) return <NotFound />;
  if (unit.isPending || unit.isError) return <UnitLoadState unit={unit} loading="Loading the unit…" />;
  const u = unit.data;
  const quarantined = depot.data?.quarantine != null;
  return (
    <div className="flex flex-col gap-4">
      <PageHeader
        title="PTI and release"
        description={
          <>
            <Link
              to={paths.unit.getHref(u.id)}
              className="font-semibold text-fjord-700 tabular-nums underline underline-offset-4"
            >
              {formatContainerNumber(u.containerNumber)}
            </Link>{' '}
            · {u.refrigerant} · {u.site?.name ?? 'no site'}
          </>
        }
      />
      <UnitDepotPanel unitId={u.id} />
      {quarantined && (
        <Can permission="lift:quarantine">
          <Panel aria-labelledby="lift-title">
            <h2 id="lift-title" className="mb-2 text-lg font-bold">
              Lift the quarantine
            </h2>
            <LiftQuarantineForm unitId={u.id} />
          </Panel>
        </Can>
      )}
      <Panel aria-labelledby="pti-title">
        <h2 id="pti-title" className="mb-3 text-lg font-bold">
          Pre-trip inspection
        </h2>
        <PtiChecklist unitId={u.id} />
      </Panel>
      <Panel aria-labelledby="release-title">
        <h2 id="release-title" className="mb-3 text-lg font-bold">
          Release
        </h2>
        <ReleaseButton unitId={u.id} />
      </Panel>
      {!quarantined && depot.isSuccess && (
        <Can permission="manage:units">
          <QuarantineUnitsButton unitIds={[u.id]} />
        </Can>
      )}
    </div>
  );
}
