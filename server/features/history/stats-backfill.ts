// Units loaded past the API (a bulk load, a row from an old version) have no statistics row, and the fleet views read
// only unit_stats: the scheduler fills them in, at once for a few, by the recompute job for many.
import { and, asc, count, eq, gt, sql } from 'drizzle-orm';
import { units, unitStats } from '../../db/schema';
import { latestJob, type JobContext } from '../../lib/jobs/runner';
import { recomputeOne } from './stats-recompute.job';

const INLINE_BACKFILL_MAX = 200;

export type StatsBackfill = {
  /** Fills in missing statistics rows; concurrent callers share one check. */
  run(ctx: JobContext): Promise<void>;
};

/** One backfill keeps the highest unit id it has checked, so a later check looks only at units added since. */
export function createStatsBackfill(): StatsBackfill {
  let watermark = 0;
  let check: Promise<void> | null = null;

  async function fillIn(ctx: JobContext, missing: { id: number }[]) {
    if (missing.length > INLINE_BACKFILL_MAX) {
      const running = await latestJob(ctx.db, 'stats_recompute');
      if (running?.status !== 'running') {
        await ctx.jobs.start('stats_recompute', {
          fromUnitId: missing[0].id - 1,
          message: 'Figures for newly registered units.',
        });
      }
      return;
    }
    const settings = await ctx.caches.settings.get(ctx.db);
    for (const m of missing) {
      // A unit whose record the engine refuses (an old row from before the date rule) must not stop the others;
      // like the recompute job, it is logged and the rest go on.
      await recomputeOne(ctx, m.id, settings).catch((err: unknown) =>
        ctx.logger.warn({ err, unitId: m.id }, 'statistics backfill skipped a unit'),
      );
    }
  }

  async function checkRows(ctx: JobContext): Promise<void> {
    const [{ maxId }] = await ctx.db.select({ maxId: sql<number | null>`MAX(${units.id})` }).from(units);
    const top = Number(maxId ?? 0);
    if (top <= watermark) return;
    if (watermark === 0) {
      // First look: as many rows as units (each row belongs to a unit) means none is missing, which two index counts
      // tell far sooner than the anti-join over the whole fleet.
      const [[a], [b]] = await Promise.all([
        ctx.db.select({ n: count() }).from(units),
        ctx.db.select({ n: count() }).from(unitStats),
      ]);
      if (Number(a.n) === Number(b.n)) {
        watermark = top;
        return;
      }
    }
    const missing = await ctx.db
      .select({ id: units.id })
      .from(units)
      .leftJoin(unitStats, eq(unitStats.unitId, units.id))
      .where(and(gt(units.id, watermark), sql`${unitStats.unitId} IS NULL`))
      .orderBy(asc(units.id))
      .limit(INLINE_BACKFILL_MAX + 1);
    if (missing.length) await fillIn(ctx, missing);
    watermark = Math.max(watermark, top);
  }

  return {
    run(ctx) {
      check ??= checkRows(ctx).finally(() => {
        check = null;
      });
      return check;
    },
  };
}
