// The background-job runner: jobs with progress in background_jobs, run in the API process chunk by chunk so reads are
// never blocked. What each kind does lives with its feature (a JobDefinition); the app registers them when it builds
// its context, and anything may start one by its kind (ctx.jobs.start) without importing the feature.
import { and, desc, eq, lt, type SQL } from 'drizzle-orm';
import type { Db, DbOrTx } from '../../db/client';
import { backgroundJobs, type JOB_KINDS } from '../../db/schema';
import type { AppCaches } from '../caches';
import type { Clock } from '../clock';
import type { Logger } from '../logger';
import type { JobDto } from '../../../shared/schemas/jobs';

export type JobKind = (typeof JOB_KINDS)[number];
export type JobRow = typeof backgroundJobs.$inferSelect;
type JobInsert = typeof backgroundJobs.$inferInsert;
export type JobValues = { [K in keyof JobInsert]?: JobInsert[K] | SQL };

/** What a job may use: the app's context without the request-facing parts. */
export type JobContext = {
  db: Db;
  clock: Clock;
  logger: Logger;
  publicUrl: string;
  caches: AppCaches;
  jobs: JobRunner;
};

/** Why a job is started and by whom; each kind reads what it needs. */
export type JobStart = { userId?: string | null; settingsId?: number | null; fromUnitId?: number; message?: string };

export type JobDefinition = {
  /** The row's first values (its total, where it starts); nothing by default. */
  prepare?(ctx: JobContext, start: JobStart): Promise<JobValues>;
  /** Does the work for the row `jobId`, which is 'running'; stops early when the row no longer is. */
  run(ctx: JobContext, jobId: number): Promise<void>;
};

export type JobRunner = {
  /** Starts a job of this kind; running ones of the same kind are superseded (a newer settings version wins). */
  start(kind: JobKind, start?: JobStart): Promise<JobDto>;
  /** Runs a job row already inserted and claimed by the caller (a claim in its own transaction). */
  launch(job: JobRow): void;
  /** Picks up running jobs whose process went away (their heartbeat stopped). Cheap; called by the scheduler. */
  resumeStale(): Promise<void>;
  /** Resolves when every job this app started has finished (tests, shutdown). */
  waitForAll(): Promise<void>;
};

/** A running job whose heartbeat is older than this lost its process (restart, crash) and is picked up again. */
export const STALE_AFTER_MS = 60_000;

export function toJobDto(j: JobRow): JobDto {
  return {
    id: j.id,
    kind: j.kind,
    status: j.status,
    total: j.total,
    processed: j.processed,
    message: j.message,
    startedAt: j.startedAt.toISOString(),
    finishedAt: j.finishedAt?.toISOString() ?? null,
  };
}

export async function latestJob(db: DbOrTx, kind: JobKind): Promise<JobDto | null> {
  const [j] = await db
    .select()
    .from(backgroundJobs)
    .where(eq(backgroundJobs.kind, kind))
    .orderBy(desc(backgroundJobs.id))
    .limit(1);
  return j ? toJobDto(j) : null;
}

/** Whether the job is still to be run (a newer one of its kind supersedes it). */
export async function stillRunning(db: Db, id: number): Promise<boolean> {
  const [j] = await db.select({ status: backgroundJobs.status }).from(backgroundJobs).where(eq(backgroundJobs.id, id));
  return j?.status === 'running';
}

/** Records progress (and that the job's process is alive) while it is still running. */
export async function heartbeat(ctx: Pick<JobContext, 'db' | 'clock'>, jobId: number, values: JobValues = {}) {
  await ctx.db
    .update(backgroundJobs)
    .set({ heartbeatAt: ctx.clock.now(), ...values })
    .where(and(eq(backgroundJobs.id, jobId), eq(backgroundJobs.status, 'running')));
}

/** Marks a still-running job done. */
export async function finishJob(ctx: Pick<JobContext, 'db' | 'clock'>, jobId: number, values: JobValues = {}) {
  await ctx.db
    .update(backgroundJobs)
    .set({ status: 'done', finishedAt: ctx.clock.now(), ...values })
    .where(and(eq(backgroundJobs.id, jobId), eq(backgroundJobs.status, 'running')));
}

/** The runner of one app; `context` is the app's context, read when a job runs. */
export function createJobRunner(context: () => JobContext, definitions: Record<JobKind, JobDefinition>): JobRunner {
  // Jobs this app is running, so a job is never run twice here, and tests can wait for them.
  const active = new Map<number, Promise<void>>();

  function launch(job: JobRow) {
    if (active.has(job.id)) return;
    const ctx = context();
    const p = definitions[job.kind]
      .run(ctx, job.id)
      .catch(async (err: unknown) => {
        ctx.logger.error({ err, jobId: job.id }, 'background job failed');
        await ctx.db
          .update(backgroundJobs)
          .set({
            status: 'failed',
            message: String((err as Error)?.message ?? err).slice(0, 500),
            finishedAt: ctx.clock.now(),
          })
          .where(eq(backgroundJobs.id, job.id))
          .catch(() => undefined);
      })
      .finally(() => active.delete(job.id));
    active.set(job.id, p);
  }

  async function start(kind: JobKind, why: JobStart = {}): Promise<JobDto> {
    const ctx = context();
    const values = (await definitions[kind].prepare?.(ctx, why)) ?? {};
    const now = ctx.clock.now();
    const job = await ctx.db.transaction(async (tx) => {
      await tx
        .update(backgroundJobs)
        .set({ status: 'superseded', finishedAt: now, message: 'A newer job replaced this one.' })
        .where(and(eq(backgroundJobs.kind, kind), eq(backgroundJobs.status, 'running')));
      const [{ id }] = await tx
        .insert(backgroundJobs)
        .values({
          kind,
          startedAt: now,
          heartbeatAt: now,
          createdBy: why.userId ?? null,
          message: why.message ?? null,
          ...values,
        })
        .$returningId();
      const [row] = await tx.select().from(backgroundJobs).where(eq(backgroundJobs.id, id));
      return row;
    });
    launch(job);
    return toJobDto(job);
  }

  async function resumeStale(): Promise<void> {
    const ctx = context();
    const cutoff = new Date(ctx.clock.now().getTime() - STALE_AFTER_MS);
    const stale = await ctx.db
      .select()
      .from(backgroundJobs)
      .where(and(eq(backgroundJobs.status, 'running'), lt(backgroundJobs.heartbeatAt, cutoff)));
    for (const job of stale) {
      if (active.has(job.id)) continue;
      // Claim it: only one process wins the heartbeat update.
      const [res] = (await ctx.db
        .update(backgroundJobs)
        .set({ heartbeatAt: ctx.clock.now() })
        .where(and(eq(backgroundJobs.id, job.id), eq(backgroundJobs.heartbeatAt, job.heartbeatAt)))) as unknown as [
        { affectedRows: number },
      ];
      if (res.affectedRows === 1) launch(job);
    }
  }

  return {
    start,
    launch,
    resumeStale,
    async waitForAll() {
      while (active.size) await Promise.allSettled([...active.values()]);
    },
  };
}
