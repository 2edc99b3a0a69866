import type { QueryClient } from '@tanstack/react-query';
import { Link, useSearchParams } from 'react-router-dom';
import { EmptyState, PageHeader } from '../../../components/ui/page';
import { LoadError, LoadingPanel } from '../../../components/ui/query-state';
import { candidatesQuery, useCandidates } from '../../../features/decisions/api/get-candidates';
import { EstimateNotice } from '../../../features/decisions/components/estimate-notice';
import { useSites } from '../../../features/sites/api/get-sites';
import { ScoreBadge } from '../../../features/fleet/components/band-badge';
import { fmtContainer, fmtMoney, fmtPct } from '../../../lib/format';
import { SiteOptions } from '../../../components/ui/filter-options';

const OPTION_LABELS = {
  keep_topping_up: 'Keep topping up',
  repair: 'Repair the leak',
  new_machinery: 'Fit new machinery',
  retire_and_sell: 'Retire and sell',
} as const;

export const loader = (queryClient: QueryClient) => async () => {
  await queryClient.prefetchQuery(candidatesQuery());
  return null;
};

export default function CandidatesPage() {
  const [sp, setSp] = useSearchParams();
  const siteId = sp.get('siteId') ? Number(sp.get('siteId')) : undefined;
  const list = useCandidates(siteId);
  const sites = useSites();
  return (
    <div className="flex flex-col gap-5">
      <PageHeader
        title="Decisions"
        description="Units where keeping on topping up is not the cheapest way on, ranked by what a change saves a year."
      />
      <EstimateNotice />
      <label className="flex max-w-sm flex-col gap-1 text-sm font-semibold text-ink-700">
        Site
        <select
          className="min-h-touch rounded-md border-2 border-ink-400 bg-white px-3 text-base text-ink-950"
          value={siteId ?? ''}
          onChange={(e) => setSp(e.target.value ? { siteId: e.target.value } : {}, { preventScrollReset: true })}
        >
          <SiteOptions sites={sites.data} />
        </select>
      </label>
      {list.isPending ? (
        <LoadingPanel>Pricing the candidates…</LoadingPanel>
      ) : list.isError ? (
        <LoadError title="The candidates could not be priced" error={list.error} onRetry={() => void list.refetch()} />
      ) : list.data.candidates.length === 0 ? (
        <EmptyState title="No candidates">
          Among the {list.data.considered} highest-scoring units, keeping on topping up is the cheapest for every one.
        </EmptyState>
      ) : (
        <>
          <p className="text-base text-ink-700">
            The {list.data.considered} units with a score in the “slipping” or “repeat leaker” band were priced;{' '}
            {list.data.candidates.length} would save by a change.
          </p>
          <ol className="flex flex-col gap-3" aria-label="Candidates">
            {list.data.candidates.map((c, i) => (
              <li
                key={c.unitId}
                className="grid gap-3 rounded-lg border-2 border-ink-200 bg-white p-4 md:grid-cols-[2.5rem_minmax(0,2fr)_minmax(0,2fr)_minmax(0,1fr)] md:items-center"
                data-testid="candidate"
              >
                <span className="hidden text-lg font-bold text-ink-400 md:block">{i + 1}</span>
                <div>
                  <Link
                    to={`/decisions/${c.unitId}`}
                    className="inline-flex min-h-touch items-center text-lg font-bold tracking-wide text-fjord-700 underline-offset-4 hover:underline"
                  >
                    {fmtContainer(c.containerNumber)}
                  </Link>
                  <p className="text-sm text-ink-600">
                    {c.site ?? 'No site'} · {c.refrigerant} · {c.ageYears} years old
                  </p>
                  <p className="mt-1 flex flex-wrap items-center gap-2 text-sm">
                    <ScoreBadge score={c.score} band={c.scoreBand as 'tight' | 'watch' | 'chronic'} />{' '}
                    {fmtPct(c.rollingLeakRatePct)} leak rate
                  </p>
                </div>
                <div className="text-base">
                  <p>
                    Cheapest: <strong>{OPTION_LABELS[c.cheapestId]}</strong> (
                    {fmtMoney(c.cheapestEac, list.data.currency)} a year)
                  </p>
                  <p className="text-sm text-ink-700">
                    Keep topping up {fmtMoney(c.keepEac, list.data.currency)} · retire{' '}
                    {fmtMoney(c.retireEac, list.data.currency)} a year
                  </p>
                </div>
                <p className="text-right">
                  <span className="block text-sm text-ink-600">saves a year</span>
                  <span className="text-xl font-bold tabular-nums text-okay-700">
                    {fmtMoney(c.yearlySaving, list.data.currency)}
                  </span>
                </p>
              </li>
            ))}
          </ol>
        </>
      )}
    </div>
  );
}
