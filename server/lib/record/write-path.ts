// The single write path for a unit's history and for the inputs of its figures: visits, voids, unit edits,
// registration and the settings recompute all go through writeUnit. One transaction per attempt:
//   1. lock the unit row (SELECT … FOR UPDATE) before any other read, so writers of one unit queue here;
//   2. the caller's change (events, voids, unit fields), reading the history after the lock;
//   3. what every write sets off, always in this order (writeEffects): statistics, monthly made-up totals,
//      alerts, the depot state (re-checks, quarantine) and its re-check alert; and after the commit, this process's
//      cache versions.
// Derived rows are upserts keyed by the locked unit or its visits, never locks on rows that may not exist. READ
// COMMITTED: each read after the lock sees what the writers before it committed, and inserts take no gap locks.
// A deadlock or lock-wait timeout runs the attempt again (retryTransaction); each write is idempotent by its
// submission key or its unique keys, so a retry cannot record anything twice.
import { eq, inArray } from 'drizzle-orm';
import type { Db, Tx } from '../../db/client';
import { unitChanges, units } from '../../db/schema';
import { bumpVersion } from '../cache-versions';
import type { Clock } from '../clock';
import { notFound } from '../http-error';
import { retryTransaction } from '../retry';
import type { Settings } from '../../../shared/schemas/settings';
import { queueAlertsForStatsChange } from './alerts';
import { applyToFleetMonthly } from './monthly-totals';
import { applyDepotState } from './depot-state';
import { queueRecheckAlertForUnit } from './recheck-alerts';
import {
  computeStatsRows,
  lockUnitForHistory,
  recomputeUnitStats,
  storeStatsRows,
  type UnitStatsRow,
  type UnitStatsRows,
} from './stats';
import type { AppCaches } from '../caches';
import type { ForecastCaseBase } from '../../../shared/domain';

export type WriteContext = { db: Db; clock: Clock; publicUrl: string; caches: AppCaches };
export type LockedUnit = NonNullable<Awaited<ReturnType<typeof lockUnitForHistory>>>;

/** What the caller's change reports back, so the path knows which derived rows follow. */
export type UnitChange<T> = {
  result: T;
  /** Visits whose refrigerant movements were added or voided: their monthly totals follow. */
  movedVisitIds?: readonly number[];
  /** The unit row itself changed (refrigerant, charge, commissioning date, site): read again before computing. */
  unitChanged?: boolean;
};

export type UnitWriteResult<T> = { result: T; before: UnitStatsRow | null } & UnitStatsRows;

export const WRITE_ISOLATION = { isolationLevel: 'read committed' } as const;

/**
 * Runs `change` on one unit through the write path and returns its result with the unit's new statistics.
 * `settings` pins the settings version (the recompute job); otherwise the settings in force are used.
 */
export async function writeUnit<T>(
  ctx: WriteContext,
  unitId: number,
  change: (tx: Tx, locked: LockedUnit, now: Date) => Promise<UnitChange<T>>,
  opts: { settings?: Settings } = {},
): Promise<UnitWriteResult<T>> {
  // Held in memory by the process (loaded once, refreshed by the case-base job): read outside the transaction.
  const caseBase = await ctx.caches.caseBase.get(ctx.db);
  return retryTransaction(() =>
    ctx.db.transaction(async (tx) => {
      const locked = await lockUnitForHistory(tx, unitId);
      if (!locked) throw notFound('No such unit.');
      const now = ctx.clock.now();
      const done = await change(tx, locked, now);
      const unit = done.unitChanged ? (await tx.select().from(units).where(eq(units.id, unitId)))[0] : locked.unit;
      const written = await writeEffects(
        tx,
        ctx,
        unit,
        locked.stats,
        now,
        opts.settings ?? (await ctx.caches.settings.get(tx)),
        done.movedVisitIds ?? [],
        caseBase,
      );
      return { result: done.result, ...written };
    }, WRITE_ISOLATION),
  );
}

/**
 * Step 3 of the path for a unit already locked (or just inserted) in `tx`: statistics, monthly totals, alerts, depot
 * state.
 */
export async function writeEffects(
  tx: Tx,
  ctx: Pick<WriteContext, 'publicUrl' | 'clock' | 'caches'>,
  unit: typeof units.$inferSelect,
  before: UnitStatsRow | null,
  now: Date,
  settings: Settings,
  movedVisitIds: readonly number[],
  caseBase: ForecastCaseBase | null = null,
) {
  const { stats: after, detail } = await recomputeUnitStats(tx, unit, now, settings, caseBase);
  if (movedVisitIds.length) await applyToFleetMonthly(tx, movedVisitIds);
  await queueAlertsForStatsChange(tx, ctx, {
    unitId: unit.id,
    siteId: unit.siteId,
    containerNumber: unit.containerNumber,
    before,
    after,
  });
  const depot = await applyDepotState(tx, unit, now, settings);
  await queueRecheckAlertForUnit(tx, ctx, unit, depot.rechecks.open, now, settings);
  return { before, stats: after, detail };
}

/** Rows per statement when registering many units at once (the wide part is a few kB a unit). */
const REGISTER_CHUNK = 500;

/**
 * Units just inserted in `tx` (the insert holds their rows): their first figures and a change record each, in the
 * same transaction, so a registered unit is never without figures. A unit with no history moves no refrigerant and
 * crosses no alert threshold, so of writeEffects only the statistics apply.
 */
export async function registerNewUnits(
  tx: Tx,
  ctx: Pick<WriteContext, 'caches'>,
  actorId: string,
  unitIds: readonly number[],
  now: Date,
  how: string,
): Promise<void> {
  const settings = await ctx.caches.settings.get(tx);
  for (let i = 0; i < unitIds.length; i += REGISTER_CHUNK) {
    const chunk = unitIds.slice(i, i + REGISTER_CHUNK);
    const rows = await tx.select().from(units).where(inArray(units.id, chunk));
    await storeStatsRows(
      tx,
      rows.map((u) => computeStatsRows(u, u.id, [], now, settings)),
    );
    await tx
      .insert(unitChanges)
      .values(
        rows.map((u) => ({ unitId: u.id, userId: actorId, at: now, field: 'registered', before: null, after: how })),
      );
  }
  // Every API process counts the fleet again from its next read on (server/lib/fleet-size.ts).
  if (unitIds.length) await bumpVersion(tx, 'units');
}
