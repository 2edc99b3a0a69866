import type { RepairOptionsResult } from '../../../../shared/domain';
import { Caution } from '../../../components/ui/caution';
import { cx } from '../../../components/ui/cx';
import { fmtMoney } from '../../../lib/format';

/** The four options side by side (stacked on phones), the cheapest marked in words. */
export function OptionsGrid({ result }: { result: RepairOptionsResult }) {
  const c = result.currency;
  return (
    <ul className="grid gap-3 sm:grid-cols-2 xl:grid-cols-4" aria-label="Options">
      {result.options.map((o) => (
        <li
          key={o.id}
          data-testid={`option-${o.id}`}
          className={cx(
            'flex flex-col gap-2 rounded-lg border-2 bg-white p-4',
            o.cheapest ? 'border-okay-700 shadow-raised ring-2 ring-okay-700/30' : 'border-ink-200',
          )}
        >
          <div className="flex items-start justify-between gap-2">
            <h3 className="text-lg font-bold">{o.label}</h3>
            {o.cheapest && (
              <span className="rounded-full bg-okay-700 px-2.5 py-0.5 text-sm font-semibold text-white">Cheapest</span>
            )}
          </div>
          <p className="text-sm text-ink-700">{o.description}</p>
          {o.id === 'keep_topping_up' && (
            // Source: Regulation (EU) 2024/573 (F-gas), Art. 4 — a leak found is to be repaired without undue delay.
            <Caution title="A known leak">
              Many regulations, the EU F-gas regulation among them, require a leak that has been found to be repaired,
              not only topped up.
            </Caution>
          )}
          <dl className="mt-auto grid grid-cols-2 gap-x-3 gap-y-1 text-base">
            <dt className="text-ink-600">Up front</dt>
            <dd className="text-right tabular-nums">{fmtMoney(o.upfront, c)}</dd>
            <dt className="text-ink-600">Per year</dt>
            <dd className="text-right tabular-nums">{fmtMoney(o.yearlyCost, c)}</dd>
            <dt className="text-ink-600">NPV, {o.years} y</dt>
            <dd className="text-right tabular-nums">{fmtMoney(o.npv, c)}</dd>
            <dt className="font-semibold">Equivalent a year</dt>
            <dd className="text-right font-bold tabular-nums" data-testid={`eac-${o.id}`}>
              {fmtMoney(o.eac, c)}
            </dd>
          </dl>
        </li>
      ))}
    </ul>
  );
}
