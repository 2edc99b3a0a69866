import type { ReactNode } from 'react';
import { findRefrigerant, formatContainerNumber } from '../../../../shared/domain';
import { SITE_KIND_LABELS } from '../../../../shared/schemas/sites';
import type { UnitDto } from '../../../../shared/schemas/units';
import { Badge } from '../../../components/ui/page';
import { Can } from '../../../lib/can';
import { UnitStatusBadge } from './unit-status-badge';
import { fmtDay, fmtKg, fmtMoney } from '../../../lib/format';

/** "HRLU 100001" and the check digit boxed, the way ISO 6346 marks it on the unit (and our label prints it). */
export function ContainerNumber({ value, className }: { value: string; className?: string }) {
  const [owner, serial, check] = formatContainerNumber(value).split(' ');
  return (
    <span className={className}>
      <span className="sr-only">{formatContainerNumber(value)}</span>
      <span aria-hidden="true" className="inline-flex items-center gap-[0.3em] tabular-nums">
        <span>
          {owner} {serial}
        </span>
        {check && <span className="rounded-sm border-[3px] border-current px-[0.15em] leading-none">{check}</span>}
      </span>
    </span>
  );
}

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-0.5">
      <dt className="text-sm font-semibold text-ink-600">{label}</dt>
      <dd className="text-lg text-ink-950">{children}</dd>
    </div>
  );
}

const none = <span className="text-ink-400">—</span>;

/** Who the unit is: number, status, site, refrigerant and charge up front; the rest of its registry data below. */
export function UnitIdentity({ unit, actions }: { unit: UnitDto; actions?: ReactNode }) {
  const refrigerant = findRefrigerant(unit.refrigerant);
  return (
    <section
      aria-labelledby="unit-title"
      className="flex flex-col gap-5 rounded-lg border-2 border-ink-950 bg-white p-4 md:p-6"
    >
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 id="unit-title" className="text-3xl font-bold tracking-wide md:text-4xl">
          <ContainerNumber value={unit.containerNumber} />
        </h1>
        <div className="flex flex-wrap items-center gap-3">
          <UnitStatusBadge status={unit.status} />
          {actions}
        </div>
      </div>

      <div className="grid grid-cols-2 gap-3 md:flex md:flex-wrap">
        <div className="rounded-md bg-ink-950 px-4 py-3 text-white md:min-w-56">
          <p className="text-sm font-semibold text-lime-300">Refrigerant</p>
          <p className="text-figure font-bold">{unit.refrigerant}</p>
        </div>
        <div className="rounded-md bg-ink-950 px-4 py-3 text-white md:min-w-56">
          <p className="text-sm font-semibold text-lime-300">Full charge</p>
          <p className="text-figure font-bold tabular-nums">{fmtKg(unit.nominalChargeKg)}</p>
        </div>
      </div>
      {refrigerant && (refrigerant.flammable || refrigerant.highPressure) && (
        <p className="flex flex-wrap gap-2">
          {refrigerant.flammable && (
            <Badge tone="neutral">{refrigerant.safetyClass}: mildly flammable refrigerant</Badge>
          )}
          {refrigerant.highPressure && <Badge tone="neutral">CO2 system: very high pressures</Badge>}
        </p>
      )}

      <dl className="grid grid-cols-2 gap-x-6 gap-y-4 md:grid-cols-3">
        <Fact label="Site">
          {unit.site ? (
            <>
              {unit.site.code} · {unit.site.name}
              <span className="block text-base text-ink-600">{SITE_KIND_LABELS[unit.site.kind]}</span>
            </>
          ) : (
            none
          )}
        </Fact>
        <Fact label="Commissioned">{unit.commissionedOn ? fmtDay(unit.commissionedOn) : none}</Fact>
        <Fact label="Model">{unit.model ?? none}</Fact>
        <Fact label="Machinery serial">{unit.machinerySerial ?? none}</Fact>
        <Fact label="Year of manufacture">{unit.manufactureYear ?? none}</Fact>
        <Can permission="view:fleet">
          <Fact label="Purchase cost">{unit.purchaseCost == null ? none : fmtMoney(unit.purchaseCost)}</Fact>
          <Fact label="Residual value">{unit.residualValue == null ? none : fmtMoney(unit.residualValue)}</Fact>
        </Can>
      </dl>
      {unit.notes && (
        <div>
          <p className="text-sm font-semibold text-ink-600">Notes</p>
          <p className="whitespace-pre-line text-base">{unit.notes}</p>
        </div>
      )}
    </section>
  );
}
