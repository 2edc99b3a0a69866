// Everything the API process does on a timer rather than on a request: reads never start jobs or fill anything in.
// Started by server/index.ts next to the mail sender; timers do not keep the process alive. Every API process runs
// the timers, but each task runs under a lease (server/lib/leases.ts): one process at a time does it, and when that
// process dies its lease runs out and the next process whose timer fires takes over.
import type { AppContext } from './lib/app-context';
import { PROCESS_HOLDER, releaseLease, runUnderLease } from './lib/leases';
import { runDailyMailJobs } from './features/alerts/digest.service';
import { refreshRepairEffectivenessIfStale } from './features/fleet/repair-effectiveness.job';
import { FORECAST_CASES_MAX_AGE_MS, refreshForecastIfStale } from './features/forecast/forecast-cases.job';
import { createStatsBackfill, type StatsBackfill } from './features/history/stats-backfill';
import { fillMissingDepotStates } from './lib/record/depot-state';

/** Digests go out from this hour (UTC) on; the dedupe key keeps it to one per person per day. */
export const DIGEST_HOUR_UTC = 6;
const DAILY_CHECK_MS = 3600_000;
const NIGHTLY_HOUR_UTC = 2;
const NIGHTLY_FRESH_MS = 6 * 3600_000;
const FIRST_CHECK_MS = 30_000;
/** How often stale jobs are picked up, old derived tables rebuilt and units without figures filled in. */
const MAINTENANCE_MS = 60_000;

/** How long each task's lease lasts without renewal: longer than its timer's period, so the holder keeps it. */
export const SCHEDULE_LEASES = {
  forecast_refresh: 5 * 60_000,
  daily_mail: 90 * 60_000,
  maintenance: 2.5 * MAINTENANCE_MS,
} as const;

type Stop = { stop(): void };
type Options = { holder?: string };

/** Runs a scheduled task here if this process holds (or can take) its lease. */
function leased(ctx: AppContext, opts: Options, name: keyof typeof SCHEDULE_LEASES, task: () => Promise<void>) {
  return runUnderLease(
    { db: ctx.db, clock: ctx.clock, holder: opts.holder ?? PROCESS_HOLDER },
    name,
    SCHEDULE_LEASES[name],
    task,
  );
}

/**
 * The nightly refresh of the forecast's case base (and with it every unit's forecast), at 02:00 UTC plus a few random
 * minutes per process; and one check shortly after start-up, so a new installation gets its first case base.
 */
export function scheduleForecastRefresh(ctx: AppContext, opts: Options = {}): Stop {
  let timer: NodeJS.Timeout | null = null;
  const run = (maxAgeMs: number) =>
    void leased(ctx, opts, 'forecast_refresh', () => refreshForecastIfStale(ctx, { maxAgeMs }).then(() => {})).catch(
      (err: unknown) => ctx.logger.warn({ err }, 'forecast case base refresh'),
    );
  const arm = () => {
    const now = Date.now();
    const next = new Date(now);
    next.setUTCHours(NIGHTLY_HOUR_UTC, Math.floor(Math.random() * 10), 0, 0);
    if (next.getTime() <= now) next.setUTCDate(next.getUTCDate() + 1);
    timer = setTimeout(() => {
      // Every night, so each date moves on with the wait; one built in the last few hours (another process's, a
      // button press) counts as tonight's.
      run(NIGHTLY_FRESH_MS);
      arm();
    }, next.getTime() - now);
    timer.unref();
  };
  const first = setTimeout(() => run(FORECAST_CASES_MAX_AGE_MS), FIRST_CHECK_MS);
  first.unref();
  arm();
  return {
    stop() {
      clearTimeout(first);
      if (timer) clearTimeout(timer);
    },
  };
}

/** Queues the day's digests and overdue-leak alerts once a day, in the process holding the lease; dedupe keys cover a
 * second run (a takeover the same day). */
export function scheduleDailyMail(ctx: AppContext, opts: Options = {}): Stop & { daily(): Promise<void> } {
  let lastDailyRun = '';
  async function daily() {
    const now = ctx.clock.now();
    const day = now.toISOString().slice(0, 10);
    if (now.getUTCHours() < DIGEST_HOUR_UTC || day === lastDailyRun) return;
    await leased(ctx, opts, 'daily_mail', async () => {
      await runDailyMailJobs(ctx.db, ctx, now);
      lastDailyRun = day;
    });
  }
  const report = (err: unknown) => ctx.logger.error({ err }, 'daily mail jobs failed');
  const timer = setInterval(() => void daily().catch(report), DAILY_CHECK_MS);
  timer.unref();
  void daily().catch(report);
  return { daily, stop: () => clearInterval(timer) };
}

/**
 * Every minute: jobs whose process went away are picked up again, units registered past the
 * API (a bulk load) get their figures, and the repair-effectiveness table and the forecast's case base are rebuilt in
 * the background when old (the case base only once there is one: the first is the start-up check's or the refresh
 * button's to build).
 */
/** Units without a depot-state row (a database from before it, a bulk load) get one; nothing to do costs two counts. */
export async function depotBackfill(ctx: AppContext): Promise<number> {
  return fillMissingDepotStates(ctx.db, ctx.clock.now(), await ctx.caches.settings.get(ctx.db));
}

export async function maintain(ctx: AppContext, backfill: StatsBackfill): Promise<void> {
  const warn = (what: string) => (err: unknown) => ctx.logger.warn({ err }, what);
  await ctx.jobs.resumeStale().catch(warn('resuming stale jobs'));
  await backfill.run(ctx).catch(warn('statistics backfill'));
  await depotBackfill(ctx).catch(warn('depot state backfill'));
  await refreshRepairEffectivenessIfStale(ctx).catch(warn('repair effectiveness refresh'));
  await refreshForecastIfStale(ctx, { firstBuild: false, message: 'Older than a day at the regular check.' }).catch(
    warn('forecast case base refresh'),
  );
}

export function scheduleMaintenance(ctx: AppContext, opts: Options = {}): Stop & { tick(): Promise<boolean> } {
  const backfill = createStatsBackfill();
  const warn = (what: string) => (err: unknown) => ctx.logger.warn({ err }, what);
  const tick = () => leased(ctx, opts, 'maintenance', () => maintain(ctx, backfill));
  const timer = setInterval(() => void tick().catch(warn('maintenance')), MAINTENANCE_MS);
  timer.unref();
  // At start-up only the backfills: a fleet loaded while the server was down shows with its figures at once, and
  // the depot state (quarantine, re-checks) of units that had none before the upgrade.
  void leased(ctx, opts, 'maintenance', async () => {
    await backfill.run(ctx).catch(warn('statistics backfill'));
    await depotBackfill(ctx).catch(warn('depot state backfill'));
  }).catch(warn('maintenance'));
  return { tick, stop: () => clearInterval(timer) };
}

/** Every schedule of the API process; stopping it hands its leases back, so another process need not wait them out. */
export function startSchedules(ctx: AppContext, opts: Options = {}): { stop(): Promise<void> } {
  const all = [scheduleForecastRefresh(ctx, opts), scheduleDailyMail(ctx, opts), scheduleMaintenance(ctx, opts)];
  return {
    async stop() {
      all.forEach((s) => s.stop());
      const deps = { db: ctx.db, clock: ctx.clock, holder: opts.holder ?? PROCESS_HOLDER };
      await Promise.allSettled(Object.keys(SCHEDULE_LEASES).map((name) => releaseLease(deps, name)));
    },
  };
}
