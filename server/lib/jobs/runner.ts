// Background jobs with progress in background_jobs: recomputing every unit's statistics after a settings change
// (or for newly registered units), and rebuilding the repair-effectiveness table. They run in the API process,
// chunk by chunk, each unit in its own short transaction, so reads are never blocked.
import { and, asc, count, desc, eq, gt, inArray, lt, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { backgroundJobs, events, repairEffectivenessRows, settingsVersions, units, unitStats } from '../../db/schema';
import type { Clock } from '../../lib/clock';
import type { Logger } from '../../lib/logger';
import { notFound } from '../../lib/http-error';
import {
  mergeRepairEffectiveness,
  repairEffectiveness,
  type RepairEffectiveness,
  type UnitHistory,
} from '../../../shared/domain';
import { settingsSchema, type Settings } from '../../../shared/schemas/settings';
import type { JobDto } from '../../../shared/schemas/settings-api';
import { getSettings } from '../settings/settings.service';
import { ENGINE_EVENT_COLUMNS, toEngineEvent } from '../history/stats.service';
import { writeUnit } from '../history/write-path';
import { collectFleetCases, latestCaseBaseAt, learnFromTable, storeCaseBase } from '../forecast/case-base.service';
import { retryTransaction } from '../../lib/retry';

export type JobContext = { db: Db; clock: Clock; logger: Logger; publicUrl: string };
type JobRow = typeof backgroundJobs.$inferSelect;
type JobKind = JobRow['kind'];

const CHUNK_UNITS = 200;
const PARALLEL_UNITS = 4;
/** A running job whose heartbeat is older than this lost its process (restart, crash) and is picked up again. */
const STALE_AFTER_MS = 60_000;
/** Repair effectiveness is rebuilt when older than this (and after settings that change it). */
export const REPAIR_EFFECTIVENESS_MAX_AGE_MS = 3600_000;

// Jobs this process is running, so a job is never run twice here, and tests can wait for them.
const active = new Map<number, Promise<void>>();

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

export async function getJob(db: Db, id: number): Promise<JobDto> {
  const [j] = await db.select().from(backgroundJobs).where(eq(backgroundJobs.id, id));
  if (!j) throw notFound('No such job.');
  return toJobDto(j);
}

export async function latestJob(db: Db, kind: JobKind): Promise<JobDto | null> {
  const [j] = await db
    .select()
    .from(backgroundJobs)
    .where(eq(backgroundJobs.kind, kind))
    .orderBy(desc(backgroundJobs.id))
    .limit(1);
  return j ? toJobDto(j) : null;
}

/** Resolves when every job this process started has finished (tests, shutdown). */
export async function waitForJobs(): Promise<void> {
  while (active.size) await Promise.allSettled([...active.values()]);
}

const RUNNERS: Record<JobKind, (ctx: JobContext, jobId: number) => Promise<void>> = {
  stats_recompute: (ctx, id) => runStatsRecompute(ctx, id),
  repair_effectiveness: (ctx, id) => runRepairEffectiveness(ctx, id),
  forecast_cases: (ctx, id) => runForecastCases(ctx, id),
};

function launch(ctx: JobContext, job: JobRow) {
  if (active.has(job.id)) return;
  const run = RUNNERS[job.kind];
  const p = run(ctx, job.id)
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

/** Starts a job of this kind; running ones of the same kind are superseded (a newer settings version wins). */
async function startJob(
  ctx: JobContext,
  kind: JobKind,
  values: Partial<typeof backgroundJobs.$inferInsert>,
): Promise<JobDto> {
  const now = ctx.clock.now();
  const job = await ctx.db.transaction(async (tx) => {
    await tx
      .update(backgroundJobs)
      .set({ status: 'superseded', finishedAt: now, message: 'A newer job replaced this one.' })
      .where(and(eq(backgroundJobs.kind, kind), eq(backgroundJobs.status, 'running')));
    const [{ id }] = await tx
      .insert(backgroundJobs)
      .values({ kind, startedAt: now, heartbeatAt: now, ...values })
      .$returningId();
    const [row] = await tx.select().from(backgroundJobs).where(eq(backgroundJobs.id, id));
    return row;
  });
  launch(ctx, job);
  return toJobDto(job);
}

/** Picks up running jobs whose process went away (their heartbeat stopped). Cheap; called from status reads. */
export async function resumeStaleJobs(ctx: JobContext): Promise<void> {
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
    if (res.affectedRows === 1) launch(ctx, job);
  }
}

async function stillRunning(db: Db, id: number): Promise<boolean> {
  const [j] = await db.select({ status: backgroundJobs.status }).from(backgroundJobs).where(eq(backgroundJobs.id, id));
  return j?.status === 'running';
}

async function settingsOf(db: Db, settingsId: number | null): Promise<Settings> {
  if (!settingsId) return getSettings(db);
  const [row] = await db
    .select({ data: settingsVersions.data })
    .from(settingsVersions)
    .where(eq(settingsVersions.id, settingsId));
  const parsed = settingsSchema.safeParse(row?.data);
  return parsed.success ? parsed.data : getSettings(db);
}

// --- statistics recompute ------------------------------------------------------------------------------------

/** Recomputes every unit's statistics with the given settings version (after a settings change). */
export async function startStatsRecompute(
  ctx: JobContext,
  opts: { settingsId: number | null; userId?: string | null; fromUnitId?: number; message?: string },
) {
  const [{ n }] = await ctx.db
    .select({ n: sql<number>`COUNT(*)` })
    .from(units)
    .where(gt(units.id, opts.fromUnitId ?? 0));
  return startJob(ctx, 'stats_recompute', {
    settingsId: opts.settingsId,
    createdBy: opts.userId ?? null,
    total: Number(n),
    cursorUnitId: opts.fromUnitId ?? 0,
    message: opts.message ?? null,
  });
}

/** One unit through the unit write path (its own transaction, the unit row locked first, the same effects). */
async function recomputeOne(ctx: JobContext, unitId: number, settings: Settings): Promise<void> {
  await writeUnit(ctx, unitId, async () => ({ result: null }), { settings });
}

async function runStatsRecompute(ctx: JobContext, jobId: number): Promise<void> {
  const [job] = await ctx.db.select().from(backgroundJobs).where(eq(backgroundJobs.id, jobId));
  if (!job || job.status !== 'running') return;
  const settings = await settingsOf(ctx.db, job.settingsId);
  let cursor = job.cursorUnitId;
  let failed = 0;
  let firstError: string | null = null;
  for (;;) {
    if (!(await stillRunning(ctx.db, jobId))) return;
    const ids = (
      await ctx.db
        .select({ id: units.id })
        .from(units)
        .where(gt(units.id, cursor))
        .orderBy(asc(units.id))
        .limit(CHUNK_UNITS)
    ).map((r) => r.id);
    if (!ids.length) break;
    for (let i = 0; i < ids.length; i += PARALLEL_UNITS) {
      await Promise.all(
        ids.slice(i, i + PARALLEL_UNITS).map((id) =>
          recomputeOne(ctx, id, settings).catch((err: unknown) => {
            // A unit whose record the engine refuses (a bad charge, say) keeps its old figures; the job goes on.
            failed++;
            firstError ??= `${id}: ${String((err as Error)?.message ?? err)}`;
          }),
        ),
      );
    }
    cursor = ids[ids.length - 1];
    await ctx.db
      .update(backgroundJobs)
      .set({
        processed: sql`${backgroundJobs.processed} + ${ids.length}`,
        cursorUnitId: cursor,
        heartbeatAt: ctx.clock.now(),
      })
      .where(and(eq(backgroundJobs.id, jobId), eq(backgroundJobs.status, 'running')));
  }
  await ctx.db
    .update(backgroundJobs)
    .set({
      status: 'done',
      finishedAt: ctx.clock.now(),
      message: failed ? `${failed} unit(s) kept their old figures; first: ${firstError}`.slice(0, 500) : job.message,
    })
    .where(and(eq(backgroundJobs.id, jobId), eq(backgroundJobs.status, 'running')));
}

// Units registered without a visit (the registry, the CSV import) have no statistics row yet; the fleet views read
// only unit_stats, so they are filled in on the next fleet read: at once for a few, by a job for many.
let statsWatermark = 0;
let statsCheck: Promise<void> | null = null;
const INLINE_BACKFILL_MAX = 200;

/** Fills in missing statistics rows; concurrent callers share one check. */
export function ensureStatsRows(ctx: JobContext): Promise<void> {
  statsCheck ??= checkStatsRows(ctx).finally(() => {
    statsCheck = null;
  });
  return statsCheck;
}

async function checkStatsRows(ctx: JobContext): Promise<void> {
  const [{ maxId }] = await ctx.db.select({ maxId: sql<number | null>`MAX(${units.id})` }).from(units);
  const top = Number(maxId ?? 0);
  if (top <= statsWatermark) return;
  if (statsWatermark === 0) {
    // First look in this process: as many rows as units (each row belongs to a unit) means none is missing, which
    // two index counts tell far sooner than the anti-join over the whole fleet.
    const [[a], [b]] = await Promise.all([
      ctx.db.select({ n: count() }).from(units),
      ctx.db.select({ n: count() }).from(unitStats),
    ]);
    if (Number(a.n) === Number(b.n)) {
      statsWatermark = top;
      return;
    }
  }
  const from = statsWatermark;
  const missing = await ctx.db
    .select({ id: units.id })
    .from(units)
    .leftJoin(unitStats, eq(unitStats.unitId, units.id))
    .where(and(gt(units.id, from), sql`${unitStats.unitId} IS NULL`))
    .orderBy(asc(units.id))
    .limit(INLINE_BACKFILL_MAX + 1);
  if (missing.length > INLINE_BACKFILL_MAX) {
    const running = await latestJob(ctx.db, 'stats_recompute');
    if (running?.status !== 'running') {
      await startStatsRecompute(ctx, {
        settingsId: null,
        fromUnitId: missing[0].id - 1,
        message: 'Figures for newly registered units.',
      });
    }
  } else if (missing.length) {
    const settings = await getSettings(ctx.db);
    for (const m of missing) {
      // A unit whose record the engine refuses (an old row from before the date rule) must not fail the fleet read
      // that happened to fill it in; like the recompute job, it is logged and the rest go on.
      await recomputeOne(ctx, m.id, settings).catch((err: unknown) =>
        ctx.logger.warn({ err, unitId: m.id }, 'statistics backfill skipped a unit'),
      );
    }
  }
  statsWatermark = Math.max(statsWatermark, top);
}

// --- repair effectiveness ------------------------------------------------------------------------------------

export async function startRepairEffectiveness(ctx: JobContext, userId?: string | null): Promise<JobDto> {
  return startJob(ctx, 'repair_effectiveness', { createdBy: userId ?? null });
}

/** Starts a rebuild when the table is older than the maximum age and none is running. */
export async function refreshRepairEffectivenessIfStale(ctx: JobContext): Promise<void> {
  const [row] = await ctx.db
    .select({ at: sql<Date | null>`MAX(${repairEffectivenessRows.computedAt})` })
    .from(repairEffectivenessRows);
  const at = row?.at ? new Date(row.at).getTime() : 0;
  if (ctx.clock.now().getTime() - at < REPAIR_EFFECTIVENESS_MAX_AGE_MS) return;
  const last = await latestJob(ctx.db, 'repair_effectiveness');
  if (last?.status === 'running') return;
  // Nothing to rebuild from yet: no job, and an empty table stays empty.
  if (
    last &&
    last.status === 'done' &&
    ctx.clock.now().getTime() - Date.parse(last.startedAt) < REPAIR_EFFECTIVENESS_MAX_AGE_MS
  )
    return;
  await startRepairEffectiveness(ctx);
}

const notVoided = sql`NOT EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = ${events.id})`;

async function runRepairEffectiveness(ctx: JobContext, jobId: number): Promise<void> {
  const settings = await getSettings(ctx.db);
  const asOf = ctx.clock.now().toISOString();
  const unitIds = (
    await ctx.db
      .selectDistinct({ unitId: events.unitId })
      .from(events)
      .where(and(eq(events.kind, 'repair'), notVoided))
      .orderBy(asc(events.unitId))
  ).map((r) => r.unitId);
  await ctx.db.update(backgroundJobs).set({ total: unitIds.length }).where(eq(backgroundJobs.id, jobId));
  const parts: RepairEffectiveness[] = [];
  for (let i = 0; i < unitIds.length; i += CHUNK_UNITS) {
    if (!(await stillRunning(ctx.db, jobId))) return;
    const chunk = unitIds.slice(i, i + CHUNK_UNITS);
    const rows = await ctx.db
      .select({ unitId: events.unitId, refrigerant: units.refrigerant, ...ENGINE_EVENT_COLUMNS })
      .from(events)
      .innerJoin(units, eq(units.id, events.unitId))
      .where(
        and(
          inArray(events.unitId, chunk),
          inArray(events.kind, ['top_up', 'recovery', 'recharge', 'leak_check', 'repair']),
          notVoided,
        ),
      )
      .orderBy(asc(events.unitId), asc(events.occurredAt), asc(events.id));
    const histories = new Map<number, UnitHistory & { events: NonNullable<ReturnType<typeof toEngineEvent>>[] }>();
    for (const r of rows) {
      let h = histories.get(r.unitId);
      if (!h) histories.set(r.unitId, (h = { unitId: r.unitId, refrigerant: r.refrigerant, events: [] }));
      const e = toEngineEvent(r);
      if (e) h.events.push(e);
    }
    try {
      parts.push(repairEffectiveness([...histories.values()], asOf, settings));
    } catch (err) {
      // One unit's history the engine refuses should not hide the rest of the fleet: judge the chunk unit by unit.
      for (const h of histories.values()) {
        try {
          parts.push(repairEffectiveness([h], asOf, settings));
        } catch {
          ctx.logger.warn({ err, unitId: h.unitId }, 'repair effectiveness skipped a unit');
        }
      }
    }
    await ctx.db
      .update(backgroundJobs)
      .set({ processed: Math.min(unitIds.length, i + chunk.length), heartbeatAt: ctx.clock.now() })
      .where(eq(backgroundJobs.id, jobId));
  }
  const merged = mergeRepairEffectiveness(parts, settings);
  const computedAt = ctx.clock.now();
  const toRow = (r: RepairEffectiveness['rows'][number], all: boolean) => ({
    location: r.location ?? 'other',
    action: all ? '' : (r.action ?? 'other'),
    repairs: r.repairs,
    held: r.held,
    recurred: r.recurred,
    pending: r.pending,
    holdRatePct: r.holdRatePct,
    computedAt,
  });
  // Repairs recorded without a location or action count under "other"; merge rows that meet there.
  const rows = new Map<string, ReturnType<typeof toRow>>();
  for (const [list, all] of [
    [merged.rows, false],
    [merged.byLocation, true],
  ] as const) {
    for (const r of list) {
      const row = toRow(r, all);
      const key = `${row.location}|${row.action}`;
      const prev = rows.get(key);
      if (!prev) rows.set(key, row);
      else {
        prev.repairs += row.repairs;
        prev.held += row.held;
        prev.recurred += row.recurred;
        prev.pending += row.pending;
        prev.holdRatePct = null;
      }
    }
  }
  await ctx.db.transaction(async (tx) => {
    if (!(await stillRunning(ctx.db, jobId))) return;
    // A derived cache, not history: replaced whole.
    await tx.delete(repairEffectivenessRows);
    if (rows.size) await tx.insert(repairEffectivenessRows).values([...rows.values()]);
    await tx
      .update(backgroundJobs)
      .set({ status: 'done', finishedAt: computedAt, processed: unitIds.length })
      .where(eq(backgroundJobs.id, jobId));
  });
}

// --- forecast case base ----------------------------------------------------------------------------------------

/** The case base is rebuilt when older than this (the nightly refresh, and a check on overview reads). */
export const FORECAST_CASES_MAX_AGE_MS = 24 * 3600_000;

/** Rebuilds the forecast case base now (a running rebuild is superseded), then every unit's forecast. */
export async function startForecastCases(
  ctx: JobContext,
  opts: { userId?: string | null; message?: string } = {},
): Promise<JobDto> {
  return startJob(ctx, 'forecast_cases', { createdBy: opts.userId ?? null, message: opts.message ?? null });
}

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
  launch(ctx, job);
  return toJobDto(job);
}

async function runForecastCases(ctx: JobContext, jobId: number): Promise<void> {
  const started = Date.now();
  const settings = await getSettings(ctx.db);
  const asOf = ctx.clock.now();
  const [{ n }] = await ctx.db.select({ n: count() }).from(units);
  await ctx.db
    .update(backgroundJobs)
    .set({ total: Number(n), processed: 0 })
    .where(eq(backgroundJobs.id, jobId));
  const beat = async (processed?: number) => {
    if (!(await stillRunning(ctx.db, jobId))) return false;
    await ctx.db
      .update(backgroundJobs)
      .set({ heartbeatAt: ctx.clock.now(), ...(processed === undefined ? {} : { processed }) })
      .where(and(eq(backgroundJobs.id, jobId), eq(backgroundJobs.status, 'running')));
    return true;
  };
  const collected = await collectFleetCases(ctx.db, asOf, settings, (done) => beat(done));
  if (!collected) return;
  const learned = await learnFromTable(collected.table, asOf, settings, () => beat());
  if (!learned) return;
  if (!(await stillRunning(ctx.db, jobId))) return;
  await storeCaseBase(ctx.db, learned.caseBase, {
    cases: learned.cases,
    units: collected.units,
    buildMs: Date.now() - started,
  });
  const acc = learned.caseBase.accuracy;
  await ctx.db
    .update(backgroundJobs)
    .set({
      status: 'done',
      finishedAt: ctx.clock.now(),
      processed: collected.units,
      message:
        `${learned.cases.toLocaleString('en')} cases from ${collected.units.toLocaleString('en')} units` +
        (acc?.maeDays != null ? `; measured MAE ${acc.maeDays} d, 80 % range held ${acc.coveragePct} %` : '') +
        (collected.skipped ? `; ${collected.skipped} unit(s) the engine refuses left out` : ''),
    })
    .where(and(eq(backgroundJobs.id, jobId), eq(backgroundJobs.status, 'running')));
  // Every unit's forecast from the new case base.
  await startStatsRecompute(ctx, { settingsId: null, message: 'Forecasts from the new case base.' });
}
