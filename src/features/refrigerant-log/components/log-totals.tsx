import type { RefrigerantLogDto } from '../../../../shared/schemas/refrigerant-log';
import { Panel } from '../../../components/ui/page';
import { fmtKg, fmtTonnes } from '../../../lib/format';

/** Added, recovered and leak checks per refrigerant over the period. */
export function LogTotals({ totals }: { totals: RefrigerantLogDto['totals'] }) {
  if (!totals.length) return null;
  return (
    <Panel aria-labelledby="log-totals">
      <h2 id="log-totals" className="text-xl font-bold">
        Totals
      </h2>
      <div className="mt-2 overflow-x-auto">
        <table className="w-full text-left text-base" data-testid="log-totals">
          <thead className="text-sm text-ink-700">
            <tr>
              <th className="py-2 pr-3">Refrigerant</th>
              <th className="py-2 pr-3 text-right">Added</th>
              <th className="py-2 pr-3 text-right">Recovered</th>
              <th className="py-2 text-right">Leak checks</th>
            </tr>
          </thead>
          <tbody>
            {totals.map((t) => (
              <tr key={t.refrigerant} className="border-t border-ink-100">
                <td className="py-2 pr-3 font-semibold">{t.refrigerant}</td>
                <td className="py-2 pr-3 text-right tabular-nums">
                  {fmtKg(t.addedKg)}
                  <span className="block text-sm text-ink-600">
                    {t.addedCo2eTonnes === null ? 'CO2e cannot be computed' : `${fmtTonnes(t.addedCo2eTonnes)} CO2e`} ·{' '}
                    {t.additions}×
                  </span>
                </td>
                <td className="py-2 pr-3 text-right tabular-nums">
                  {fmtKg(t.recoveredKg)}
                  <span className="block text-sm text-ink-600">{t.recoveries}×</span>
                </td>
                <td className="py-2 text-right tabular-nums">
                  {t.leakChecks}
                  <span className="block text-sm text-ink-600">{t.leaksFound} found a leak</span>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </Panel>
  );
}
