import { Link, useSearchParams } from 'react-router-dom';
import { LEAK_CHECK_METHODS, LEAK_LOCATIONS, REFRIGERANT_CODES, termLabel } from '../../../../shared/domain';
import {
  refrigerantLogQuerySchema,
  type RefrigerantLogEntryDto,
  type RefrigerantLogQuery,
} from '../../../../shared/schemas/refrigerant-log';
import { Alert } from '../../../components/ui/alert';
import { Button, buttonClasses } from '../../../components/ui/button';
import { EmptyState, PageHeader, Panel } from '../../../components/ui/page';
import { LoadError, LoadingPanel } from '../../../components/ui/query-state';
import { useSites } from '../../../features/sites/api/get-sites';
import { toSearch } from '../../../lib/query-string';
import { logExportHref, useRefrigerantLog } from '../../../features/refrigerant-log/api/get-log';
import { PERIOD_LABELS, PERIODS, periodRange, type Period } from '../../../features/refrigerant-log/components/period';
import { fmtContainer, fmtKg, fmtNumber, fmtTonnes } from '../../../lib/format';
import { paths } from '../../../config/paths';

const KIND_LABELS = { top_up: 'Top-up', recharge: 'Recharge', recovery: 'Recovery', leak_check: 'Leak check' } as const;
const select = 'min-h-touch w-full rounded-md border-2 border-ink-400 bg-white px-3 text-base text-ink-950';

function readLog(sp: URLSearchParams): {
  period: Period;
  q: Omit<RefrigerantLogQuery, 'before'>;
  error: string | null;
} {
  const period = (PERIODS as readonly string[]).includes(sp.get('period') ?? '')
    ? (sp.get('period') as Period)
    : 'this_month';
  const range = period === 'custom' ? { from: sp.get('from') ?? '', to: sp.get('to') ?? '' } : periodRange(period);
  const parsed = refrigerantLogQuerySchema.safeParse({
    ...range,
    siteId: sp.get('siteId') || undefined,
    refrigerant: sp.get('refrigerant') || undefined,
  });
  if (parsed.success)
    return { period, q: { ...parsed.data, before: undefined } as Omit<RefrigerantLogQuery, 'before'>, error: null };
  return { period, q: { ...periodRange('this_month') }, error: parsed.error.issues[0]?.message ?? 'Check the period' };
}

export default function RefrigerantLogPage() {
  const [sp, setSp] = useSearchParams();
  const { period, q, error } = readLog(sp);
  const log = useRefrigerantLog(q);
  const sites = useSites();
  const set = (patch: Record<string, string | undefined>) => {
    const next = {
      period,
      from: sp.get('from') ?? q.from,
      to: sp.get('to') ?? q.to,
      siteId: q.siteId,
      refrigerant: q.refrigerant,
      ...patch,
    };
    setSp(toSearch(next.period === 'custom' ? next : { ...next, from: undefined, to: undefined }), {
      preventScrollReset: true,
    });
  };
  const first = log.data?.pages[0];
  const entries = log.data?.pages.flatMap((p) => p.entries) ?? [];

  return (
    <div className="flex flex-col gap-5">
      <PageHeader
        title="Refrigerant log"
        description="Every kilogram added and recovered, with who did it and their certificate, and every leak check — the record an inspector asks for."
        actions={
          <a className={buttonClasses({ variant: 'secondary' })} href={logExportHref(q)} download>
            Export CSV
          </a>
        }
      />
      <Panel as="div">
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-5">
          <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
            Period
            <select className={select} value={period} onChange={(e) => set({ period: e.target.value })}>
              {PERIODS.map((p) => (
                <option key={p} value={p}>
                  {PERIOD_LABELS[p]}
                </option>
              ))}
            </select>
          </label>
          {period === 'custom' && (
            <>
              <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
                First day
                <input
                  type="date"
                  className={select}
                  value={sp.get('from') ?? q.from}
                  onChange={(e) => set({ from: e.target.value })}
                />
              </label>
              <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
                Last day
                <input
                  type="date"
                  className={select}
                  value={sp.get('to') ?? q.to}
                  onChange={(e) => set({ to: e.target.value })}
                />
              </label>
            </>
          )}
          <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
            Site
            <select
              className={select}
              value={q.siteId ?? ''}
              onChange={(e) => set({ siteId: e.target.value || undefined })}
            >
              <option value="">All sites</option>
              {(sites.data ?? []).map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name}
                </option>
              ))}
            </select>
          </label>
          <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
            Refrigerant
            <select
              className={select}
              value={q.refrigerant ?? ''}
              onChange={(e) => set({ refrigerant: e.target.value || undefined })}
            >
              <option value="">All refrigerants</option>
              {REFRIGERANT_CODES.map((r) => (
                <option key={r}>{r}</option>
              ))}
            </select>
          </label>
        </div>
        <p className="mt-3 text-base text-ink-700">
          {q.from} to {q.to} (UTC days). Voided entries are left out
          {first && first.voidedExcluded > 0 ? `: ${first.voidedExcluded} in this period` : ''}. CO2e uses GWP{' '}
          {first?.gwpBasis ?? 'AR4'}.
        </p>
        {error && (
          <Alert tone="heed" className="mt-3">
            {error} — showing this month instead.
          </Alert>
        )}
      </Panel>

      {log.isPending ? (
        <LoadingPanel>Loading the log…</LoadingPanel>
      ) : log.isError && !log.data ? (
        <LoadError title="The log could not be loaded" error={log.error} onRetry={() => void log.refetch()} />
      ) : (
        <>
          <Totals totals={first?.totals ?? []} />
          {entries.length === 0 ? (
            <EmptyState title="Nothing recorded in this period">
              No refrigerant was added or recovered and no leak check was recorded here.
            </EmptyState>
          ) : (
            <section aria-label="Entries" className={log.isPlaceholderData ? 'opacity-70' : undefined}>
              <ul className="flex flex-col gap-2 md:hidden">
                {entries.map((e) => (
                  <EntryCard key={e.eventId} e={e} />
                ))}
              </ul>
              <div className="hidden overflow-x-auto rounded-lg border-2 border-ink-200 bg-white md:block">
                <table className="w-full text-left text-sm" aria-label="Refrigerant log entries">
                  <thead className="bg-ink-50 text-sm text-ink-700">
                    <tr>
                      {[
                        'Date',
                        'Entry',
                        'Unit',
                        'kg',
                        't CO2e',
                        'Cylinder / result',
                        'Site',
                        'Technician · certificate',
                      ].map((h) => (
                        <th key={h} className="border-b-2 border-ink-200 px-3 py-2">
                          {h}
                        </th>
                      ))}
                    </tr>
                  </thead>
                  <tbody>
                    {entries.map((e) => (
                      <tr key={e.eventId} className="border-b border-ink-100 align-top" data-testid="log-row">
                        <td className="px-3 py-2 whitespace-nowrap tabular-nums">{e.occurredAt.slice(0, 10)}</td>
                        <td className="px-3 py-2 whitespace-nowrap">{KIND_LABELS[e.kind]}</td>
                        <td className="px-3 py-2 whitespace-nowrap">
                          <Link
                            to={paths.unit.getHref(e.unit.id)}
                            className="font-semibold text-fjord-700 underline-offset-4 hover:underline"
                          >
                            {fmtContainer(e.unit.containerNumber)}
                          </Link>
                          <span className="block text-sm text-ink-600">{e.refrigerant}</span>
                        </td>
                        <td className="px-3 py-2 text-right tabular-nums">{e.kg == null ? '' : fmtNumber(e.kg, 2)}</td>
                        <td className="px-3 py-2 text-right tabular-nums">
                          {e.co2eTonnes == null ? '' : fmtNumber(e.co2eTonnes, 2)}
                        </td>
                        <td className="px-3 py-2">{detailOf(e)}</td>
                        <td className="px-3 py-2">{e.site?.name ?? '—'}</td>
                        <td className="px-3 py-2">
                          {e.technician.name}
                          <span className="block tabular-nums text-ink-600">
                            {e.technician.certificateNumber ?? (
                              <span className="text-alarm-700">no certificate on file</span>
                            )}
                          </span>
                        </td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
              {log.hasNextPage && (
                <Button
                  variant="secondary"
                  className="mt-3"
                  onClick={() => void log.fetchNextPage()}
                  pending={log.isFetchingNextPage}
                >
                  Show more
                </Button>
              )}
            </section>
          )}
        </>
      )}
    </div>
  );
}

function detailOf(e: RefrigerantLogEntryDto): string {
  if (e.kind === 'leak_check') {
    const how = e.method ? termLabel(LEAK_CHECK_METHODS, e.method) : '';
    return `${how}: ${e.leakFound ? `leak at ${e.location ? termLabel(LEAK_LOCATIONS, e.location).toLowerCase() : 'unknown location'}` : 'no leak'}`;
  }
  const extras = [
    e.reusedRecovered ? 'recycled/reclaimed gas' : null,
    e.excludedFromLeakRate ? 'first fill or retrofit' : null,
  ].filter(Boolean);
  return [e.cylinder, ...extras].filter(Boolean).join(' · ');
}

function EntryCard({ e }: { e: RefrigerantLogEntryDto }) {
  return (
    <li className="rounded-lg border-2 border-ink-200 bg-white p-4" data-testid="log-card">
      <div className="flex items-baseline justify-between gap-2">
        <span className="font-bold">{KIND_LABELS[e.kind]}</span>
        <span className="tabular-nums text-ink-700">{e.occurredAt.slice(0, 10)}</span>
      </div>
      <Link to={paths.unit.getHref(e.unit.id)} className="font-semibold text-fjord-700">
        {fmtContainer(e.unit.containerNumber)}
      </Link>{' '}
      <span className="text-sm text-ink-600">{e.refrigerant}</span>
      {e.kg !== null && (
        <p className="text-figure tabular-nums">
          {fmtKg(e.kg)} <span className="text-base text-ink-700">{fmtTonnes(e.co2eTonnes ?? 0)} CO2e</span>
        </p>
      )}
      <p className="text-sm text-ink-800">{detailOf(e)}</p>
      <p className="text-sm text-ink-600">
        {e.site?.name ?? 'No site'} · {e.technician.name} · cert. {e.technician.certificateNumber ?? 'none on file'}
      </p>
    </li>
  );
}

function Totals({
  totals,
}: {
  totals: NonNullable<ReturnType<typeof useRefrigerantLog>['data']>['pages'][number]['totals'];
}) {
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
