import type { CylinderDto } from '../../../../shared/schemas/cylinders';
import { cx } from '../../../components/ui/cx';
import { fmtKg, fmtPct } from '../../../lib/format';

/** What the cylinder holds against the maker's marked maximum fill, as a bar with its numbers. */
export function FillGauge({ cylinder }: { cylinder: CylinderDto }) {
  const { contentKg, fillPct, nearFull } = cylinder.ledger;
  if (contentKg == null || fillPct == null) {
    return <p className="text-sm text-ink-600">Not weighed yet: content unknown.</p>;
  }
  const pct = Math.min(100, Math.max(0, fillPct));
  return (
    <div className="flex flex-col gap-1">
      <div
        className="h-3 w-full overflow-hidden rounded-full bg-ink-100"
        role="meter"
        aria-label="Fill"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={Math.round(pct)}
      >
        <div
          className={cx('h-full rounded-full', nearFull ? 'bg-alarm-700' : 'bg-fjord-700')}
          style={{ width: `${pct}%` }}
        />
      </div>
      <p className={cx('text-sm', nearFull ? 'font-semibold text-alarm-700' : 'text-ink-700')}>
        About {fmtKg(Math.max(0, contentKg))} of {fmtKg(cylinder.capacityKg)} ({fmtPct(pct)})
        {nearFull ? ' · near the maximum fill' : ''}
      </p>
    </div>
  );
}
