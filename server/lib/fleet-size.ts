// The whole fleet's size, kept between reads: counting reads every unit, a primary-key lookup does not.
import { count, max } from 'drizzle-orm';
import type { Db } from '../db/client';
import { units } from '../db/schema';

// Units are never deleted (retired ones stay), so the size changes only when units are added. This process adds
// them through registration and import, which call unitsAdded after they commit; a kept count taken before that
// is dropped, even when the new unit's id is below the highest one (two registrations committing out of id
// order). Units added by another process (a seed script) show as a new highest id, or after a minute at most.
const FLEET_SIZE_MAX_AGE_MS = 60_000;
const kept = new WeakMap<Db, { generation: number; topId: number; total: number; at: number }>();
const generations = new WeakMap<Db, number>();

/** Call after a transaction that added units has ended (committed or not: a needless recount is harmless). */
export function unitsAdded(db: Db): void {
  generations.set(db, (generations.get(db) ?? 0) + 1);
}

export async function fleetSize(db: Db): Promise<number> {
  const generation = generations.get(db) ?? 0;
  const [{ topId }] = await db.select({ topId: max(units.id) }).from(units);
  const top = Number(topId ?? 0);
  const k = kept.get(db);
  if (k && k.generation === generation && k.topId === top && Date.now() - k.at < FLEET_SIZE_MAX_AGE_MS) return k.total;
  // Counted after the generation and the highest id were read: a unit committed in between changes one of them,
  // so the next read counts again.
  const [{ n }] = await db.select({ n: count() }).from(units);
  kept.set(db, { generation, topId: top, total: Number(n), at: Date.now() });
  return Number(n);
}
