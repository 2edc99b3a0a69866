import { FORECAST_SITUATION_LABELS, MIN_JUDGED_FOR_COVERAGE } from '../../../../shared/domain';
import type { FleetOverviewDto } from '../../../../shared/schemas/fleet';
import type { ReactNode } from 'react';
import { fmtCount, fmtNumber, fmtPct } from '../../../lib/format';

const days = (v: number | null, unit: string) => (v === null ? '—' : `${fmtNumber(v, 1)} ${unit}`);
const pct = (v: number | null) => (v === null ? '—' : fmtPct(v));

function Measure({ label, value, testId }: { label: string; value: string; testId?: string }) {
  return (
    <div className="flex items-baseline justify-between gap-3 rounded-md border-2 border-ink-200 px-3 py-2 sm:block">
      <dt className="text-sm font-semibold text-ink-600">{label}</dt>
      <dd className="text-lg font-bold whitespace-nowrap tabular-nums" data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}

/**
 * How good the next top-up forecast is on this fleet (DOMAIN.md §7b): measured on the fleet's own record, each half
 * of the units forecast from the other half's cases.
 */
export function ForecastAccuracy({
  accuracy,
  refresh,
}: {
  accuracy: FleetOverviewDto['forecastAccuracy'];
  /** The button that learns the case base again (a background job). */
  refresh: ReactNode;
}) {
  if (!accuracy) {
    return (
      <div data-testid="forecast-accuracy">
        <p className="mt-1 text-base text-ink-700">
          Not learned yet. The forecast learns from the fleet’s own record every night; until then each unit shows its
          own rhythm.
        </p>
        {refresh}
      </div>
    );
  }
  const a = accuracy.all;
  return (
    <div data-testid="forecast-accuracy">
      <p className="mt-1 text-base text-ink-700">
        Each half of the units forecast from the other half’s past, at {fmtCount(a.cases)} past days whose next top-up
        is known
        {a.open ? ` (${fmtCount(a.open)} more still open, not judged yet)` : ''}.
      </p>
      <dl className="mt-3 grid gap-2 sm:grid-cols-3 sm:gap-3">
        <Measure label="Off by, on average" testId="forecast-accuracy-mae" value={days(a.maeDays, 'days')} />
        <Measure label="80 % ranges that held" testId="forecast-accuracy-coverage" value={pct(a.coveragePct)} />
        <Measure label="Range-end loss" value={days(a.pinballDays, 'days')} />
      </dl>
      <div className="mt-3 overflow-x-auto">
        <table className="w-full text-left text-base">
          <thead className="text-sm text-ink-700">
            <tr>
              <th className="py-2 pr-3">Situation</th>
              <th className="py-2 pr-3 text-right">Cases</th>
              <th className="py-2 pr-3 text-right">Off by</th>
              <th className="py-2 text-right">Held</th>
            </tr>
          </thead>
          <tbody>
            {accuracy.bySituation.map((s) => (
              <tr key={s.situation} className="border-t border-ink-100">
                <td className="py-2 pr-3">{s.situation ? FORECAST_SITUATION_LABELS[s.situation] : 'All'}</td>
                <td className="py-2 pr-3 text-right tabular-nums">{fmtCount(s.cases)}</td>
                {s.cases >= MIN_JUDGED_FOR_COVERAGE ? (
                  <>
                    <td className="py-2 pr-3 text-right whitespace-nowrap tabular-nums">{days(s.maeDays, 'd')}</td>
                    <td className="py-2 text-right whitespace-nowrap tabular-nums">{pct(s.coveragePct)}</td>
                  </>
                ) : (
                  <td colSpan={2} className="py-2 text-right text-sm text-ink-600">
                    too few to say
                  </td>
                )}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-sm text-ink-600">
        “Off by” is the mean absolute error of the forecast date; “held” how often the next top-up fell inside the 80 %
        range; the range-end loss (pinball loss of its 10 % and 90 % ends) is lower for ranges that are both right and
        narrow. A still-open interval counts once it has outlasted its range. Fewer than {MIN_JUDGED_FOR_COVERAGE}{' '}
        judged cases are too few to give figures. {accuracy.k} most similar cases per forecast.
      </p>
      {refresh}
    </div>
  );
}
