import type { QueryClient } from '@tanstack/react-query';
import { Link, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import {
  fleetOverviewQuerySchema,
  overviewRows,
  type FleetOverviewDto,
  type FleetOverviewQuery,
} from '../../../../shared/schemas/fleet';
import { EmptyState, PageHeader, Panel } from '../../../components/ui/page';
import { LoadError, LoadingPanel } from '../../../components/ui/query-state';
import { fleetOverviewQuery, useFleetOverview } from '../../../features/fleet/api/get-overview';
import { useSites } from '../../../features/sites/api/get-sites';
import { FleetTabs } from '../../../features/fleet/components/fleet-tabs';
import { EmissionsChart, LeakRateHistogram } from '../../../features/fleet/components/overview-charts';
import { toSearch } from '../../../lib/query-string';
import {
  ChronicLeakersList,
  CountTile,
  fleetRowsHref,
  LeakChecksDueList,
  LeakRateBars,
  RepairEffectivenessTable,
} from '../../../features/fleet/components/overview-panels';
import { ForecastAccuracy } from '../../../features/forecast/components/forecast-accuracy';
import { RefreshJob } from '../../../features/jobs/components/refresh-job';
import { fleetKeys } from '../../../features/fleet/api/keys';
import { fmtDateTime, fmtTime } from '../../../lib/format';
import { FilterSelect, RefrigerantOptions, SiteOptions } from '../../../components/ui/filter-options';

function readQuery(sp: URLSearchParams): FleetOverviewQuery {
  const parsed = fleetOverviewQuerySchema.safeParse(Object.fromEntries(sp.entries()));
  return parsed.success ? parsed.data : fleetOverviewQuerySchema.parse({});
}

export const loader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await queryClient.prefetchQuery(fleetOverviewQuery(readQuery(new URL(request.url).searchParams)));
    return null;
  };

const select = 'min-h-touch rounded-md border-2 border-ink-400 bg-white px-3 text-base text-ink-950';

export default function FleetOverviewPage() {
  const [sp, setSp] = useSearchParams();
  const q = readQuery(sp);
  const overview = useFleetOverview(q);
  const sites = useSites();
  const set = (patch: Partial<FleetOverviewQuery>) =>
    setSp(toSearch({ ...q, ...patch }, { months: 12 }), { preventScrollReset: true });

  return (
    <div className="flex flex-col gap-5">
      <PageHeader title="Fleet overview" description="How much the fleet leaks, where, and which repairs hold." />
      <FleetTabs />
      <div className="flex flex-wrap gap-3">
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
          Period
          <select className={select} value={q.months} onChange={(e) => set({ months: Number(e.target.value) })}>
            {[6, 12, 24, 36].map((m) => (
              <option key={m} value={m}>
                Last {m} months
              </option>
            ))}
          </select>
        </label>
        <FilterSelect
          label="Site"
          className={select}
          value={q.siteId ?? ''}
          onChange={(e) => set({ siteId: e.target.value ? Number(e.target.value) : undefined })}
        >
          <SiteOptions sites={sites.data} />
        </FilterSelect>
        <FilterSelect
          label="Refrigerant"
          className={select}
          value={q.refrigerant ?? ''}
          onChange={(e) => set({ refrigerant: (e.target.value || undefined) as FleetOverviewQuery['refrigerant'] })}
        >
          <RefrigerantOptions />
        </FilterSelect>
      </div>
      {overview.isPending ? (
        <LoadingPanel>Loading the overview…</LoadingPanel>
      ) : overview.isError && !overview.data ? (
        <LoadError
          title="The overview could not be loaded"
          error={overview.error}
          onRetry={() => void overview.refetch()}
        />
      ) : overview.data.units === 0 ? (
        <EmptyState title="No units to show">
          There are no units here yet, or none match the site and refrigerant chosen.
        </EmptyState>
      ) : (
        <OverviewBody o={overview.data} q={q} busy={overview.isPlaceholderData} />
      )}
    </div>
  );
}

// A background job's new figures show in the overview.
const OVERVIEWS = [fleetKeys.overviews()];

function OverviewBody({ o, q, busy }: { o: FleetOverviewDto; q: FleetOverviewQuery; busy: boolean }) {
  const scope = { siteId: q.siteId, refrigerant: q.refrigerant };
  const computedAt = o.repairEffectiveness.computedAt;
  const builtAt = o.forecastAccuracy?.builtAt ?? null;
  return (
    <div className={busy ? 'opacity-70' : undefined}>
      <div className="grid grid-cols-1 gap-5 lg:grid-cols-2">
        <Panel aria-labelledby="ov-rate">
          <h2 id="ov-rate" className="text-xl font-bold">
            Leak-rate distribution
          </h2>
          <div className="mt-3 grid grid-cols-2 gap-3">
            <CountTile count={o.units} label={o.units === 1 ? 'unit' : 'units'} filters={overviewRows.units(scope)} />
            <CountTile
              count={o.leakRate.zero}
              label="needed no refrigerant in 365 days"
              filters={overviewRows.noRefrigerant(scope)}
            />
          </div>
          <p className="mt-3 text-base text-ink-700">
            Units that needed no refrigerant are not drawn. Bars at or above the alert threshold are red.
          </p>
          <p className="mt-1 text-sm text-ink-600">
            The distribution, repeat leakers and checks due are read at most every 15 seconds; these are from{' '}
            {fmtTime(o.figuresAt)}.
          </p>
          <div className="mt-3">
            <LeakRateHistogram data={o.leakRate} />
          </div>
          <LeakRateBars leakRate={o.leakRate} scope={scope} />
        </Panel>
        <Panel aria-labelledby="ov-due">
          <h2 id="ov-due" className="text-xl font-bold">
            Leak checks due
          </h2>
          <div className="mt-3 grid grid-cols-2 gap-3">
            <CountTile
              count={o.leakChecksDue.overdue}
              label="overdue"
              alarm
              filters={overviewRows.leakChecksOverdue(scope)}
            />
            <CountTile
              count={o.leakChecksDue.count}
              label={`due in the next ${o.leakChecksDue.days} days`}
              filters={overviewRows.leakChecksDue(scope)}
            />
          </div>
          {o.leakChecksDue.units.length > 0 && <p className="mt-3 text-base text-ink-700">Falling due soonest:</p>}
          <LeakChecksDueList due={o.leakChecksDue} />
        </Panel>
      </div>
      <Panel aria-labelledby="ov-emissions" className="mt-5">
        <h2 id="ov-emissions" className="text-xl font-bold">
          Refrigerant made up per month
        </h2>
        <p className="mt-1 text-base text-ink-700">
          Top-ups plus recharges beyond what was recovered in the same visit: what leaked out. An estimate of emissions.
        </p>
        <div className="mt-3">
          <EmissionsChart data={o.emissions} />
        </div>
      </Panel>
      <div className="mt-5 grid grid-cols-1 gap-5 lg:grid-cols-2">
        <Panel aria-labelledby="ov-chronic">
          <h2 id="ov-chronic" className="text-xl font-bold">
            Repeat leakers
          </h2>
          <p className="mt-1 text-base text-ink-700">The highest repeat-leak scores, with what drives each.</p>
          <ChronicLeakersList leakers={o.chronicLeakers} />
          <Link
            to={fleetRowsHref(overviewRows.units(scope))}
            className="mt-3 inline-flex min-h-touch items-center text-sm font-semibold text-fjord-700 underline underline-offset-4"
          >
            Every unit by repeat-leak score
          </Link>
        </Panel>
        <Panel aria-labelledby="ov-repairs">
          <h2 id="ov-repairs" className="text-xl font-bold">
            Repair effectiveness
          </h2>
          <p className="mt-1 text-base text-ink-700">
            Share of repairs with no top-up and no leak found for {o.repairEffectiveness.holdDays} days after. Fewer
            than {o.repairEffectiveness.minRepairs} repairs is too few to give a share.
          </p>
          <RepairEffectivenessTable effectiveness={o.repairEffectiveness} />
          <RefreshJob
            path="/api/fleet/repair-effectiveness/refresh"
            maxSeconds={120}
            alsoInvalidate={OVERVIEWS}
            note={computedAt && `Worked out ${fmtDateTime(computedAt)}.`}
            label="Work it out again"
            pendingLabel="Working it out…"
          />
        </Panel>
      </div>
      <Panel aria-labelledby="ov-forecast" className="mt-5">
        <h2 id="ov-forecast" className="text-xl font-bold">
          Forecast accuracy on this fleet
        </h2>
        <ForecastAccuracy
          accuracy={o.forecastAccuracy}
          refresh={
            <RefreshJob
              path="/api/fleet/forecast/refresh"
              maxSeconds={600}
              alsoInvalidate={OVERVIEWS}
              note={builtAt && `Learned ${fmtDateTime(builtAt)}; again every night.`}
              label="Learn again now"
              pendingLabel="Learning from the fleet…"
            />
          }
        />
      </Panel>
    </div>
  );
}
