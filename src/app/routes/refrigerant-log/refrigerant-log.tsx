import { useSearchParams } from 'react-router-dom';
import { refrigerantLogQuerySchema, type RefrigerantLogQuery } from '../../../../shared/schemas/refrigerant-log';
import { Button, buttonClasses } from '../../../components/ui/button';
import { EmptyState, PageHeader } from '../../../components/ui/page';
import { LoadError, LoadingPanel } from '../../../components/ui/query-state';
import { useSites } from '../../../features/sites/api/get-sites';
import { toSearch } from '../../../lib/query-string';
import { logExportHref, useRefrigerantLog } from '../../../features/refrigerant-log/api/get-log';
import { PERIODS, periodRange, type Period } from '../../../features/refrigerant-log/components/period';
import { LogCards, LogTable } from '../../../features/refrigerant-log/components/log-entries';
import { LogFilters } from '../../../features/refrigerant-log/components/log-filters';
import { LogTotals } from '../../../features/refrigerant-log/components/log-totals';

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
      <LogFilters
        period={period}
        q={q}
        from={sp.get('from') ?? q.from}
        to={sp.get('to') ?? q.to}
        sites={sites.data ?? []}
        notes={first}
        error={error}
        onChange={set}
      />

      {log.isPending ? (
        <LoadingPanel>Loading the log…</LoadingPanel>
      ) : log.isError && !log.data ? (
        <LoadError title="The log could not be loaded" error={log.error} onRetry={() => void log.refetch()} />
      ) : (
        <>
          <LogTotals totals={first?.totals ?? []} />
          {entries.length === 0 ? (
            <EmptyState title="Nothing recorded in this period">
              No refrigerant was added or recovered and no leak check was recorded here.
            </EmptyState>
          ) : (
            <section aria-label="Entries" className={log.isPlaceholderData ? 'opacity-70' : undefined}>
              <LogCards entries={entries} />
              <LogTable entries={entries} />
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
