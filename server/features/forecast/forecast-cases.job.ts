// The 'forecast_cases' job: learns the forecast's case base from the whole fleet, measures it, stores it, then has
// every unit's forecast worked out again from it (the 'stats_recompute' job). The scheduler runs it every night.
import { count, desc, eq } from 'drizzle-orm';
import { backgroundJobs, units } from '../../db/schema';
import {
  finishJob,
  heartbeat,
  STALE_AFTER_MS,
  stillRunning,
  toJobDto,
  type JobContext,
  type JobDefinition,
} from '../../lib/jobs/runner';
import { latestCaseBaseAt } from '../../lib/record/case-base';
import { retryTransaction } from '../../lib/retry';
import type { JobDto } from '../../../shared/schemas/jobs';
import { collectFleetCases, learnFromTable, storeCaseBase } from './case-base.service';

/** The case base is rebuilt when older than this (the nightly refresh, and the scheduler's regular check). */
export const FORECAST_CASES_MAX_AGE_MS = 24 * 3600_000;

/**
 * Starts a rebuild when the newest case base is older than `maxAgeMs` and none is running, claiming it so that of
 * several processes only one runs it: the newest job row of the kind is read under a lock, so a second claimant waits
 * and then sees the first one's row. Returns the job, or null when nothing was due.
 */
export async function refreshForecastIfStale(
  ctx: JobContext,
  opts: { maxAgeMs?: number; message?: string; firstBuild?: boolean } = {},
): Promise<JobDto | null> {
  const maxAgeMs = opts.maxAgeMs ?? FORECAST_CASES_MAX_AGE_MS;
  const job = await retryTransaction(() =>
    ctx.db.transaction(async (tx) => {
      const now = ctx.clock.now();
      const [last] = await tx
        .select()
        .from(backgroundJobs)
        .where(eq(backgroundJobs.kind, 'forecast_cases'))
        .orderBy(desc(backgroundJobs.id))
        .limit(1)
        .for('update');
      if (last?.status === 'running' && now.getTime() - last.heartbeatAt.getTime() < STALE_AFTER_MS) return null;
      const builtAt = await latestCaseBaseAt(tx);
      if (builtAt ? now.getTime() - builtAt.getTime() < maxAgeMs : opts.firstBuild === false) return null;
      if (last?.status === 'running') {
        await tx
          .update(backgroundJobs)
          .set({ status: 'superseded', finishedAt: now, message: 'Its process stopped; a newer job replaced it.' })
          .where(eq(backgroundJobs.id, last.id));
      }
      const [{ id }] = await tx
        .insert(backgroundJobs)
        .values({
          kind: 'forecast_cases',
          startedAt: now,
          heartbeatAt: now,
          message: opts.message ?? 'Nightly refresh.',
        })
        .$returningId();
      const [row] = await tx.select().from(backgroundJobs).where(eq(backgroundJobs.id, id));
      return row;
    }),
  );
  if (!job) return null;
  ctx.jobs.launch(job);
  return toJobDto(job);
}

async function run(ctx: JobContext, jobId: number): Promise<void> {
  const started = Date.now();
  const settings = await ctx.caches.settings.get(ctx.db);
  const asOf = ctx.clock.now();
  const [{ n }] = await ctx.db.select({ n: count() }).from(units);
  await ctx.db
    .update(backgroundJobs)
    .set({ total: Number(n), processed: 0 })
    .where(eq(backgroundJobs.id, jobId));
  const beat = async (processed?: number) => {
    if (!(await stillRunning(ctx.db, jobId))) return false;
    await heartbeat(ctx, jobId, processed === undefined ? {} : { processed });
    return true;
  };
  const collected = await collectFleetCases(ctx.db, asOf, settings, (done) => beat(done));
  if (!collected) return;
  const learned = await learnFromTable(collected.table, asOf, settings, () => beat());
  if (!learned) return;
  if (!(await stillRunning(ctx.db, jobId))) return;
  await storeCaseBase(ctx.db, ctx.caches.caseBase, learned.caseBase, {
    cases: learned.cases,
    units: collected.units,
    buildMs: Date.now() - started,
  });
  const acc = learned.caseBase.accuracy;
  await finishJob(ctx, jobId, {
    processed: collected.units,
    message:
      `${learned.cases.toLocaleString('en')} cases from ${collected.units.toLocaleString('en')} units` +
      (acc?.maeDays != null ? `; measured MAE ${acc.maeDays} d, 80 % range held ${acc.coveragePct} %` : '') +
      (collected.skipped ? `; ${collected.skipped} unit(s) the engine refuses left out` : ''),
  });
  // Every unit's forecast from the new case base.
  await ctx.jobs.start('stats_recompute', { message: 'Forecasts from the new case base.' });
}

export const forecastCasesJob: JobDefinition = { run };
