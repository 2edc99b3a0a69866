import type { RepairOptionsResult } from '../../../../../shared/domain';
import { fmtMoney } from '../../../../lib/format';

/** The cheapest option over the unit's remaining years, and what it saves against topping up. */
export function Recommendation({ result, valid }: { result: RepairOptionsResult; valid: boolean }) {
  const cheapest = result.options.find((o) => o.cheapest)!;
  const keep = result.options[0];
  const c = result.currency;
  return (
    <section aria-labelledby="recommendation" className="rounded-lg border-2 border-okay-700 bg-okay-50 p-4">
      <h2 id="recommendation" className="text-sm font-semibold tracking-wide text-okay-700 uppercase">
        Cheapest over the remaining {result.assumptions.remainingYears} years
      </h2>
      <p className="mt-1 text-xl font-bold" data-testid="recommendation">
        {cheapest.label} — {fmtMoney(cheapest.eac, c)} a year
      </p>
      {cheapest.id !== keep.id && (
        <p className="text-base text-ink-800">
          {fmtMoney(keep.eac - cheapest.eac, c)} a year less than keeping on topping up ({fmtMoney(keep.eac, c)}).
        </p>
      )}
      {!valid && (
        <p className="mt-1 text-sm font-semibold text-alarm-700">
          Some assumptions are not valid; the figures shown use the saved settings until they are.
        </p>
      )}
    </section>
  );
}
