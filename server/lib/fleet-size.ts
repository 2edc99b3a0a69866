// The whole fleet's size, kept between reads: counting reads every unit, a primary-key lookup does not.
import { count, max } from 'drizzle-orm';
import type { Db } from '../db/client';
import { units } from '../db/schema';
import { readVersion } from './cache-versions';

// Units are never deleted (retired ones stay), so the size changes only when units are added. The app adds them
// through registration and import, which bump the 'units' version in their transaction (registerNewUnits), so every
// API process counts again after any of them added units. Units loaded past the app (a seed script) show as a new
// highest id, or after a minute at most.
const FLEET_SIZE_MAX_AGE_MS = 60_000;

export type FleetSizeCache = {
  get(db: Db): Promise<number>;
  /** Forgets the kept count (this process just added units; the version tells the others). */
  invalidate(): void;
};

export function createFleetSizeCache(maxAgeMs = FLEET_SIZE_MAX_AGE_MS): FleetSizeCache {
  let kept: { version: number; topId: number; total: number; at: number } | null = null;
  return {
    async get(db) {
      const version = await readVersion(db, 'units');
      const [{ topId }] = await db.select({ topId: max(units.id) }).from(units);
      const top = Number(topId ?? 0);
      const k = kept;
      if (k && k.version === version && k.topId === top && Date.now() - k.at < maxAgeMs) return k.total;
      // Counted after the version and the highest id were read: units committed in between change one of them, so the
      // next read counts again.
      const [{ n }] = await db.select({ n: count() }).from(units);
      kept = { version, topId: top, total: Number(n), at: Date.now() };
      return Number(n);
    },
    invalidate() {
      kept = null;
    },
  };
}
