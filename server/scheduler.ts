// Everything the API process does on a timer rather than on a request: reads never start jobs or fill anything in.
// Started by server/index.ts next to the mail sender; timers do not keep the process alive.
import type { AppContext } from './lib/app-context';
import { runDailyMailJobs } from './features/alerts/digest.service';
import { refreshRepairEffectivenessIfStale } from './features/fleet/repair-effectiveness.job';
import { FORECAST_CASES_MAX_AGE_MS, refreshForecastIfStale } from './features/forecast/forecast-cases.job';
import { createStatsBackfill, type StatsBackfill } from './features/history/stats-backfill';

/** Digests go out from this hour (UTC) on; the dedupe key keeps it to one per person per day. */
export const DIGEST_HOUR_UTC = 6;
const DAILY_CHECK_MS = 3600_000;
const NIGHTLY_HOUR_UTC = 2;
const NIGHTLY_FRESH_MS = 6 * 3600_000;
const FIRST_CHECK_MS = 30_000;
/** How often stale jobs are picked up, old derived tables rebuilt and units without figures filled in. */
const MAINTENANCE_MS = 60_000;

type Stop = { stop(): void };

/**
 * The nightly refresh of the forecast's case base (and with it every unit's forecast), at 02:00 UTC plus a few random
 * minutes per process; and one check shortly after start-up, so a new installation gets its first case base.
 */
export function scheduleForecastRefresh(ctx: AppContext): Stop {
  let timer: NodeJS.Timeout | null = null;
  const run = (maxAgeMs: number) =>
    void refreshForecastIfStale(ctx, { maxAgeMs }).catch((err: unknown) =>
      ctx.logger.warn({ err }, 'forecast case base refresh'),
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

/** Queues the day's digests and overdue-leak alerts once per process and day; dedupe keys cover other servers. */
export function scheduleDailyMail(ctx: AppContext): Stop & { daily(): Promise<void> } {
  let lastDailyRun = '';
  async function daily() {
    const now = ctx.clock.now();
    const day = now.toISOString().slice(0, 10);
    if (now.getUTCHours() < DIGEST_HOUR_UTC || day === lastDailyRun) return;
    await runDailyMailJobs(ctx.db, ctx, now);
    lastDailyRun = day;
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
export async function maintain(ctx: AppContext, backfill: StatsBackfill): Promise<void> {
  const warn = (what: string) => (err: unknown) => ctx.logger.warn({ err }, what);
  await ctx.jobs.resumeStale().catch(warn('resuming stale jobs'));
  await backfill.run(ctx).catch(warn('statistics backfill'));
  await refreshRepairEffectivenessIfStale(ctx).catch(warn('repair effectiveness refresh'));
  await refreshForecastIfStale(ctx, { firstBuild: false, message: 'Older than a day at the regular check.' }).catch(
    warn('forecast case base refresh'),
  );
}

export function scheduleMaintenance(ctx: AppContext): Stop {
  const backfill = createStatsBackfill();
  const timer = setInterval(() => void maintain(ctx, backfill), MAINTENANCE_MS);
  timer.unref();
  // At start-up only the backfill: a fleet loaded while the server was down shows with its figures at once.
  void backfill.run(ctx).catch((err: unknown) => ctx.logger.warn({ err }, 'statistics backfill'));
  return { stop: () => clearInterval(timer) };
}

/** Every schedule of the API process. */
export function startSchedules(ctx: AppContext): Stop {
  const all = [scheduleForecastRefresh(ctx), scheduleDailyMail(ctx), scheduleMaintenance(ctx)];
  return { stop: () => all.forEach((s) => s.stop()) };
}
