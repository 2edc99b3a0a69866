// The 'repair_effectiveness' job: the fleet-wide table of how repairs held, by leak location × action, rebuilt whole
// from the history (a derived cache no unit's figures read). The scheduler rebuilds it when old.
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { backgroundJobs, events, repairEffectivenessRows, units } from '../../db/schema';
import { heartbeat, latestJob, stillRunning, type JobContext, type JobDefinition } from '../../lib/jobs/runner';
import { ENGINE_EVENT_COLUMNS, toEngineEvent } from '../../lib/record/stats';
import {
  mergeRepairEffectiveness,
  repairEffectiveness,
  type RepairEffectiveness,
  type UnitHistory,
} from '../../../shared/domain';
import type { Settings } from '../../../shared/schemas/settings';

const CHUNK_UNITS = 200;
/** Repair effectiveness is rebuilt when older than this (and after settings that change it). */
export const REPAIR_EFFECTIVENESS_MAX_AGE_MS = 3600_000;

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
  await ctx.jobs.start('repair_effectiveness');
}

const notVoided = sql`NOT EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = ${events.id})`;
type EngineEvent = NonNullable<ReturnType<typeof toEngineEvent>>;

/** The counted refrigerant, leak-check and repair entries of a chunk of units, as the engine's histories. */
async function chunkHistories(ctx: JobContext, chunk: number[]) {
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
  const histories = new Map<number, UnitHistory & { events: EngineEvent[] }>();
  for (const r of rows) {
    let h = histories.get(r.unitId);
    if (!h) histories.set(r.unitId, (h = { unitId: r.unitId, refrigerant: r.refrigerant, events: [] }));
    const e = toEngineEvent(r);
    if (e) h.events.push(e);
  }
  return [...histories.values()];
}

/** One chunk's part of the table; a unit whose history the engine refuses is left out, not the whole chunk. */
function chunkPart(ctx: JobContext, histories: UnitHistory[], asOf: string, settings: Settings): RepairEffectiveness[] {
  try {
    return [repairEffectiveness(histories, asOf, settings)];
  } catch (err) {
    const parts: RepairEffectiveness[] = [];
    for (const h of histories) {
      try {
        parts.push(repairEffectiveness([h], asOf, settings));
      } catch {
        ctx.logger.warn({ err, unitId: h.unitId }, 'repair effectiveness skipped a unit');
      }
    }
    return parts;
  }
}

/** The stored rows of the merged table; repairs recorded without a location or action count under "other". */
function tableRows(merged: RepairEffectiveness, computedAt: Date) {
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
  // Rows that meet under "other" are merged.
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
  return [...rows.values()];
}

async function run(ctx: JobContext, jobId: number): Promise<void> {
  const settings = await ctx.caches.settings.get(ctx.db);
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
    parts.push(...chunkPart(ctx, await chunkHistories(ctx, chunk), asOf, settings));
    await heartbeat(ctx, jobId, { processed: Math.min(unitIds.length, i + chunk.length) });
  }
  const computedAt = ctx.clock.now();
  const rows = tableRows(mergeRepairEffectiveness(parts, settings), computedAt);
  await ctx.db.transaction(async (tx) => {
    if (!(await stillRunning(ctx.db, jobId))) return;
    // A derived cache, not history: replaced whole.
    await tx.delete(repairEffectivenessRows);
    if (rows.length) await tx.insert(repairEffectivenessRows).values(rows);
    await tx
      .update(backgroundJobs)
      .set({ status: 'done', finishedAt: computedAt, processed: unitIds.length })
      .where(eq(backgroundJobs.id, jobId));
  });
}

export const repairEffectivenessJob: JobDefinition = { run };
