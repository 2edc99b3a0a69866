// The 'stats_recompute' job: every unit's figures again, through the unit write path, after a settings change, for a
// new forecast case base, or for units loaded without figures. Each unit is its own short transaction.
import { asc, eq, gt, sql } from 'drizzle-orm';
import { backgroundJobs, units } from '../../db/schema';
import { finishJob, heartbeat, stillRunning, type JobContext, type JobDefinition } from '../../lib/jobs/runner';
import { writeUnit } from '../../lib/record/write-path';
import { settingsOfVersion } from '../../lib/settings';
import type { Settings } from '../../../shared/schemas/settings';

const CHUNK_UNITS = 200;
const PARALLEL_UNITS = 4;

/** One unit through the unit write path (its own transaction, the unit row locked first, the same effects). */
export async function recomputeOne(ctx: JobContext, unitId: number, settings: Settings): Promise<void> {
  await writeUnit(ctx, unitId, async () => ({ result: null }), { settings });
}

/** Recomputes one chunk of units a few at a time; a unit the engine refuses keeps its old figures. */
async function recomputeChunk(ctx: JobContext, ids: number[], settings: Settings, failures: string[]) {
  for (let i = 0; i < ids.length; i += PARALLEL_UNITS) {
    await Promise.all(
      ids.slice(i, i + PARALLEL_UNITS).map((id) =>
        recomputeOne(ctx, id, settings).catch((err: unknown) => {
          failures.push(`${id}: ${String((err as Error)?.message ?? err)}`);
        }),
      ),
    );
  }
}

async function run(ctx: JobContext, jobId: number): Promise<void> {
  const [job] = await ctx.db.select().from(backgroundJobs).where(eq(backgroundJobs.id, jobId));
  if (!job || job.status !== 'running') return;
  const settings = await settingsOfVersion(ctx.db, job.settingsId);
  let cursor = job.cursorUnitId;
  const failures: string[] = [];
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
    await recomputeChunk(ctx, ids, settings, failures);
    cursor = ids[ids.length - 1];
    await heartbeat(ctx, jobId, { processed: sql`${backgroundJobs.processed} + ${ids.length}`, cursorUnitId: cursor });
  }
  await finishJob(ctx, jobId, {
    message: failures.length
      ? `${failures.length} unit(s) kept their old figures; first: ${failures[0]}`.slice(0, 500)
      : job.message,
  });
}

export const statsRecomputeJob: JobDefinition = {
  /** From `fromUnitId` on (all units by default), with the settings version `settingsId` (the one in force: null). */
  async prepare(ctx, start) {
    const from = start.fromUnitId ?? 0;
    const [{ n }] = await ctx.db
      .select({ n: sql<number>`COUNT(*)` })
      .from(units)
      .where(gt(units.id, from));
    return { settingsId: start.settingsId ?? null, total: Number(n), cursorUnitId: from };
  },
  run,
};
