import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { formatContainerNumber } from '../../../../shared/domain';
import {
  CYLINDER_KIND_LABELS,
  CYLINDER_STATUS_LABELS,
  GAS_ORIGIN_LABELS,
  type CylinderDetailDto,
} from '../../../../shared/schemas/cylinders';
import { Alert } from '../../../components/ui/alert';
import { Panel } from '../../../components/ui/page';
import { Can } from '../../../lib/can';
import { fmtDateTime as when, fmtKg as kg } from '../../../lib/format';
import { CylinderCaution } from './cylinder-caution';
import { CylinderStatusPanel } from './cylinder-status-panel';
import { FillGauge } from './fill-gauge';
import { ReconciliationBadge } from './reconciliation-badge';
import { WeighingForm } from './weighing-form';

/** A mass that keeps its number and unit on one line when a row wraps. */
const Mass = ({ kg: v }: { kg: number }) => <span className="whitespace-nowrap">{kg(v)}</span>;

function Row({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex justify-between gap-4 border-b border-ink-100 py-1.5 text-base">
      <dt className="text-ink-600">{label}</dt>
      <dd className="text-right font-semibold text-ink-950">{children}</dd>
    </div>
  );
}

export function CylinderDetail({
  data,
  toleranceKg,
  unitHref,
}: {
  data: CylinderDetailDto;
  toleranceKg: number;
  unitHref: (id: number) => string;
}) {
  const c = data.cylinder;
  return (
    <div className="grid gap-4 lg:grid-cols-[2fr_1fr]">
      <div className="flex flex-col gap-4">
        {c.quarantine && (
          <Alert tone="alarm" title="Quarantined: do not use">
            Since {when(c.quarantine.at)}: {c.quarantine.reason}
          </Alert>
        )}
        <Panel>
          <dl>
            <Row label="Kind">{CYLINDER_KIND_LABELS[c.kind]}</Row>
            <Row label="Refrigerant">{c.refrigerant}</Row>
            <Row label="Status">{CYLINDER_STATUS_LABELS[c.status]}</Row>
            {c.gasOrigin && <Row label="Gas">{GAS_ORIGIN_LABELS[c.gasOrigin]}</Row>}
            <Row label="Supplier, lot">
              {c.supplier ?? '—'}, {c.lot ?? '—'}
            </Row>
            <Row label="Site">{c.site?.name ?? '—'}</Row>
            <Row label="Tare / maximum fill">
              <Mass kg={c.tareKg} /> / <Mass kg={c.capacityKg} />
            </Row>
            <Row label="Out to units / in from units">
              <Mass kg={c.ledger.outKg} /> / <Mass kg={c.ledger.inKg} />
            </Row>
          </dl>
          <div className="mt-4 flex flex-col gap-3">
            <FillGauge cylinder={c} />
            <ReconciliationBadge cylinder={c} toleranceKg={toleranceKg} />
          </div>
        </Panel>
        <Panel aria-labelledby="moves-title">
          <h2 id="moves-title" className="mb-2 text-lg font-bold">
            Charges and recoveries
          </h2>
          {data.moves.length === 0 ? (
            <p className="text-ink-600">No visit has used this cylinder yet.</p>
          ) : (
            <ul className="flex flex-col divide-y divide-ink-100">
              {data.moves.map((m) => (
                <li key={m.eventId} className={m.voided ? 'py-2 text-ink-500 line-through' : 'py-2'}>
                  <Link to={unitHref(m.unitId)} className="font-semibold underline-offset-4 hover:underline">
                    {formatContainerNumber(m.containerNumber)}
                  </Link>{' '}
                  {m.direction === 'out' ? 'charged' : 'recovered'} {kg(m.kg)} · {when(m.occurredAt)} ·{' '}
                  {m.technician.name}
                  {m.site ? ` · ${m.site.name}` : ''}
                  {m.voided ? ' (voided)' : ''}
                </li>
              ))}
            </ul>
          )}
        </Panel>
        {data.quarantinedUnits.length > 0 && (
          <Panel aria-labelledby="marked-title">
            <h2 id="marked-title" className="mb-2 text-lg font-bold">
              Units marked by its quarantine
            </h2>
            <ul className="flex flex-wrap gap-2">
              {data.quarantinedUnits.map((u) => (
                <li key={u.unitId}>
                  <Link to={unitHref(u.unitId)} className="rounded bg-alarm-50 px-2 py-1 font-semibold text-alarm-700">
                    {formatContainerNumber(u.containerNumber)}
                  </Link>
                </li>
              ))}
            </ul>
          </Panel>
        )}
      </div>
      <div className="flex flex-col gap-4">
        <Can permission="record:event">
          <Panel aria-labelledby="weigh-title">
            <h2 id="weigh-title" className="mb-2 text-lg font-bold">
              Weigh
            </h2>
            <WeighingForm cylinderId={c.id} tareKg={c.tareKg} />
          </Panel>
        </Can>
        <CylinderCaution recovery={c.kind === 'recovery'} />
        <Panel aria-labelledby="weighings-title">
          <h2 id="weighings-title" className="mb-2 text-lg font-bold">
            Weighings
          </h2>
          {data.weighings.length === 0 ? (
            <p className="text-ink-600">Not weighed yet.</p>
          ) : (
            <ul className="flex flex-col divide-y divide-ink-100 text-base">
              {data.weighings.map((w) => (
                <li key={w.id} className="py-1.5">
                  <span className="font-semibold">{kg(w.grossKg)}</span> gross ({kg(w.netKg)} net) · {when(w.weighedAt)}{' '}
                  · {w.recordedBy.name}
                </li>
              ))}
            </ul>
          )}
        </Panel>
        <Can permission="manage:units">
          <Panel aria-labelledby="status-title">
            <h2 id="status-title" className="mb-2 text-lg font-bold">
              Status
            </h2>
            <CylinderStatusPanel cylinder={c} />
            <a
              href={`/api/cylinders/${c.id}/label`}
              target="_blank"
              rel="noreferrer"
              className="mt-4 inline-block font-semibold text-fjord-700 underline underline-offset-4"
            >
              Print its QR label (PDF)
            </a>
          </Panel>
        </Can>
      </div>
    </div>
  );
}
