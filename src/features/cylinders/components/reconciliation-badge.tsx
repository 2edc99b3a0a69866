import type { CylinderDto } from '../../../../shared/schemas/cylinders';
import { cx } from '../../../components/ui/cx';
import { fmtKg as kg } from '../../../lib/format';

/** Kilograms written on visits against kilograms the scale says left (or entered) the cylinder. */
export function ReconciliationBadge({ cylinder, toleranceKg }: { cylinder: CylinderDto; toleranceKg: number }) {
  const r = cylinder.ledger.reconciliation;
  if (!r) return <span className="text-sm text-ink-600">Weigh twice to reconcile</span>;
  const recovery = cylinder.kind === 'recovery';
  const visits = recovery ? -r.visitsOutKg : r.visitsOutKg;
  const scale = recovery ? -r.weighedLossKg : r.weighedLossKg;
  return (
    <span
      data-testid="reconciliation"
      data-flagged={r.flagged}
      className={cx(
        'inline-flex flex-wrap gap-x-2 rounded-md px-2 py-1 text-sm',
        r.flagged ? 'bg-alarm-50 font-semibold text-alarm-700' : 'bg-okay-50 text-okay-700',
      )}
    >
      <span>
        {recovery ? 'In by visits' : 'Out by visits'} {kg(visits)}
      </span>
      <span>
        · {recovery ? 'gained on the scale' : 'lost on the scale'} {kg(scale)}
      </span>
      <span>· {r.flagged ? `mismatch ${kg(Math.abs(r.differenceKg))} (over ${kg(toleranceKg)})` : 'matches'}</span>
    </span>
  );
}
