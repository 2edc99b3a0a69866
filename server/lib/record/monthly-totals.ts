// Keeps fleet_monthly (made-up kg per month × site × refrigerant) in step with the history, inside the caller's
// write transaction, so the emissions chart never scans the events.
import { and, asc, eq, gt, inArray, lte, sql } from 'drizzle-orm';
import type { Db, DbOrTx } from '../../db/client';
import { events, fleetMonthly, units, visitMadeUp, visits } from '../../db/schema';
import { groupVisits, type UnitEvent } from '../../../shared/domain';
import { bumpVersion, readVersion } from '../cache-versions';

const MOVEMENTS = ['top_up', 'recovery', 'recharge'] as const;
/** What the made-up share of a visit is computed from, per refrigerant movement. */
const MOVEMENT_COLUMNS = {
  visitId: events.visitId,
  kind: events.kind,
  kg: events.kg,
  excludedFromLeakRate: events.excludedFromLeakRate,
  occurredAt: events.occurredAt,
};
const notVoided = sql`NOT EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = ${events.id})`;

type MovementRow = {
  visitId: number | null;
  kind: string;
  kg: number | null;
  excludedFromLeakRate: boolean | null;
  occurredAt: Date;
};

/** Made-up kg of one visit by the domain rule (top-ups + max(0, recharged − recovered), DOMAIN.md §4). */
function madeUpOf(rows: readonly MovementRow[]): number {
  if (!rows.length) return 0;
  const evs = rows.map((r): UnitEvent => ({
    kind: r.kind as (typeof MOVEMENTS)[number],
    at: r.occurredAt.toISOString(),
    visitId: 'v',
    kg: r.kg ?? 0,
    excluded: Boolean(r.excludedFromLeakRate),
  }));
  return groupVisits(evs).reduce((s, v) => s + v.madeUpKg, 0);
}

export type MonthlyTotalsVersion = {
  /**
   * The version of fleet_monthly that cached monthly totals are keyed by: bumped in every transaction that changes
   * the table, in whichever API process (cache_versions), so a cached total is never older than the last commit.
   */
  get(db: DbOrTx): Promise<number>;
};

export function createMonthlyTotalsVersion(): MonthlyTotalsVersion {
  return { get: (db) => readVersion(db, 'monthly_totals') };
}

/** YYYY-MM of a moment, UTC (the domain's month of a visit). */
const monthOf = (d: Date) => d.toISOString().slice(0, 7);

async function addToMonth(
  tx: DbOrTx,
  key: { month: string; siteId: number; refrigerant: string },
  kg: number,
  visitCount: number,
) {
  if (kg === 0 && visitCount === 0) return;
  await tx
    .insert(fleetMonthly)
    .values({ ...key, madeUpKg: kg, visits: visitCount })
    .onDuplicateKeyUpdate({
      set: {
        madeUpKg: sql`${fleetMonthly.madeUpKg} + ${kg}`,
        visits: sql`${fleetMonthly.visits} + ${visitCount}`,
      },
    });
}

/**
 * Brings fleet_monthly up to date for the given visits after their events changed (a visit recorded, an event of
 * it voided). Call it inside the write's transaction, after the events and voids are inserted. Idempotent: each
 * visit's share is kept in visit_made_up and only the difference is applied. Runs from the unit write path
 * (write-path.ts) with the unit row locked.
 */
export async function applyToFleetMonthly(tx: DbOrTx, visitIds: readonly number[]): Promise<void> {
  let changed = false;
  for (const visitId of [...new Set(visitIds)].sort((a, b) => a - b)) {
    const [visit] = await tx
      .select({
        id: visits.id,
        siteId: visits.siteId,
        occurredAt: visits.occurredAt,
        refrigerant: units.refrigerant,
        unitId: visits.unitId,
      })
      .from(visits)
      .innerJoin(units, eq(units.id, visits.unitId))
      .where(eq(visits.id, visitId));
    if (!visit) continue;
    // No lock of its own: the caller holds the unit's row, and only writes to that unit touch its visits' shares.
    const [prev] = await tx.select().from(visitMadeUp).where(eq(visitMadeUp.visitId, visitId));
    const rows = await tx
      .select(MOVEMENT_COLUMNS)
      .from(events)
      .where(and(eq(events.visitId, visitId), inArray(events.kind, [...MOVEMENTS]), notVoided));
    const kg = madeUpOf(rows);
    // The month, site and refrigerant a visit counted under stay fixed, even if the unit is later retrofitted.
    const key = prev
      ? { month: prev.month, siteId: prev.siteId, refrigerant: prev.refrigerant }
      : { month: monthOf(visit.occurredAt), siteId: visit.siteId ?? 0, refrigerant: visit.refrigerant };
    const before = prev?.madeUpKg ?? 0;
    if (kg === before) continue;
    if (prev) await tx.update(visitMadeUp).set({ madeUpKg: kg }).where(eq(visitMadeUp.visitId, visitId));
    else await tx.insert(visitMadeUp).values({ visitId, unitId: visit.unitId, ...key, madeUpKg: kg });
    await addToMonth(tx, key, kg - before, (kg > 0 ? 1 : 0) - (before > 0 ? 1 : 0));
    changed = true;
  }
  if (changed) await bumpVersion(tx, 'monthly_totals');
}

/**
 * Rebuilds visit_made_up and fleet_monthly from the whole history (after a bulk load that bypassed the API, such as
 * the demo fleet simulator). Reads the refrigerant movements in visit-id batches; safe to run again.
 */
export async function rebuildFleetMonthly(
  db: Db,
  opts: { batchVisits?: number; onProgress?: (visitId: number) => void } = {},
) {
  const batch = opts.batchVisits ?? 5000;
  await db.delete(visitMadeUp);
  await db.delete(fleetMonthly);
  const [{ maxId }] = await db.select({ maxId: sql<number | null>`MAX(${visits.id})` }).from(visits);
  let from = 0;
  const top = Number(maxId ?? 0);
  while (from < top) {
    const to = from + batch;
    const rows = await db
      .select(MOVEMENT_COLUMNS)
      .from(events)
      .where(and(gt(events.visitId, from), lte(events.visitId, to), inArray(events.kind, [...MOVEMENTS]), notVoided))
      .orderBy(asc(events.visitId));
    const byVisit = new Map<number, MovementRow[]>();
    for (const r of rows) {
      const list = byVisit.get(r.visitId!) ?? [];
      list.push(r);
      byVisit.set(r.visitId!, list);
    }
    const ids = [...byVisit.keys()];
    if (ids.length) {
      const info = await db
        .select({
          id: visits.id,
          unitId: visits.unitId,
          siteId: visits.siteId,
          occurredAt: visits.occurredAt,
          refrigerant: units.refrigerant,
        })
        .from(visits)
        .innerJoin(units, eq(units.id, visits.unitId))
        .where(inArray(visits.id, ids));
      const values = info
        .map((v) => ({
          visitId: v.id,
          unitId: v.unitId,
          month: monthOf(v.occurredAt),
          siteId: v.siteId ?? 0,
          refrigerant: v.refrigerant,
          madeUpKg: madeUpOf(byVisit.get(v.id)!),
        }))
        .filter((v) => v.madeUpKg > 0);
      if (values.length) await db.insert(visitMadeUp).values(values);
    }
    from = to;
    opts.onProgress?.(Math.min(to, top));
  }
  await db.execute(sql`INSERT INTO fleet_monthly (month, site_id, refrigerant, made_up_kg, visits)
    SELECT month, site_id, refrigerant, SUM(made_up_kg), COUNT(*) FROM visit_made_up GROUP BY month, site_id, refrigerant`);
  await bumpVersion(db, 'monthly_totals');
}
