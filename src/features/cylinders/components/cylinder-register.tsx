import { Link } from 'react-router-dom';
import {
  CYLINDER_KIND_LABELS,
  CYLINDER_STATUS_LABELS,
  type CylinderListDto,
} from '../../../../shared/schemas/cylinders';
import { cx } from '../../../components/ui/cx';
import { FillGauge } from './fill-gauge';
import { ReconciliationBadge } from './reconciliation-badge';

/** The register: one card per cylinder with what it holds, its reconciliation and its status. */
export function CylinderRegister({ data, hrefOf }: { data: CylinderListDto; hrefOf: (id: number) => string }) {
  return (
    <ul className="grid gap-3 md:grid-cols-2 xl:grid-cols-3" aria-label="Cylinders">
      {data.cylinders.map((c) => (
        <li
          key={c.id}
          data-testid="cylinder-row"
          data-code={c.code}
          className={cx(
            'flex flex-col gap-2 rounded-lg border-2 bg-white p-4',
            c.status === 'quarantined' ? 'border-alarm-700' : 'border-ink-200',
          )}
        >
          <div className="flex items-baseline justify-between gap-2">
            <Link to={hrefOf(c.id)} className="text-lg font-bold text-ink-950 underline-offset-4 hover:underline">
              {c.code}
            </Link>
            <span
              className={cx(
                'rounded px-2 py-0.5 text-sm font-semibold',
                c.status === 'quarantined' ? 'bg-alarm-700 text-white' : 'bg-ink-100 text-ink-800',
              )}
            >
              {CYLINDER_STATUS_LABELS[c.status]}
            </span>
          </div>
          <p className="text-base text-ink-700">
            {CYLINDER_KIND_LABELS[c.kind]} · {c.refrigerant}
            {c.lot ? ` · lot ${c.lot}` : ''}
            {c.site ? ` · ${c.site.name}` : ''}
          </p>
          <FillGauge cylinder={c} />
          <ReconciliationBadge cylinder={c} toleranceKg={data.toleranceKg} />
        </li>
      ))}
    </ul>
  );
}
