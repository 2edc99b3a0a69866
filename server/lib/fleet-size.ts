// The whole fleet's size, kept between reads: counting reads every unit, a primary-key lookup does not.
import { count, max } from 'drizzle-orm';
import type { Db } from '../db/client';
import { units } from '../db/schema';

// Units are never deleted (retired ones stay), so the size changes only when units are added. This app adds them
// through registration and import, which call invalidate() after they commit; a kept count taken before that is
// dropped, even when the new unit's id is below the highest one (two registrations committing out of id order).
// Units added by another process (a seed script) show as a new highest id, or after a minute at most.
const FLEET_SIZE_MAX_AGE_MS = 60_000;

export type FleetSizeCache = {
  get(db: Db): Promise<number>;
  /** Call after a transaction that added units has ended (committed or not: a needless recount is harmless). */
  invalidate(): void;
};

export function createFleetSizeCache(maxAgeMs = FLEET_SIZE_MAX_AGE_MS): FleetSizeCache {
  let generation = 0;
  let kept: { generation: number; topId: number; total: number; at: number } | null = null;
  return {
    async get(db) {
      const seen = generation;
      const [{ topId }] = await db.select({ topId: max(units.id) }).from(units);
      const top = Number(topId ?? 0);
      const k = kept;
      if (k && k.generation === seen && k.topId === top && Date.now() - k.at < maxAgeMs) return k.total;
      // Counted after the generation and the highest id were read: a unit committed in between changes one of them,
      // so the next read counts again.
      const [{ n }] = await db.select({ n: count() }).from(units);
      kept = { generation: seen, topId: top, total: Number(n), at: Date.now() };
      return Number(n);
    },
    invalidate() {
      generation++;
    },
  };
}
