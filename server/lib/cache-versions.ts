// Versions of what API processes keep in memory, in MariaDB (table cache_versions): a write that changes a kept thing
// bumps its version in the same transaction; a process reads the version (one primary-key range read) before serving
// its copy and reloads when it moved. So every process behind the balancer answers from the same data at once.
import { inArray, sql } from 'drizzle-orm';
import type { DbOrTx } from '../db/client';
import { cacheVersions } from '../db/schema';

export const CACHE_VERSION_NAMES = ['monthly_totals', 'units'] as const;
export type CacheVersionName = (typeof CACHE_VERSION_NAMES)[number];

/** Rows per version: concurrent writers pick one at random, so they seldom wait on the same row lock. */
export const VERSION_SHARDS = 8;

/** Adds one to the version, inside the caller's transaction (it takes effect when that commits). */
export async function bumpVersion(tx: DbOrTx, name: CacheVersionName): Promise<void> {
  const shard = Math.floor(Math.random() * VERSION_SHARDS);
  await tx
    .insert(cacheVersions)
    .values({ name, shard, version: 1 })
    .onDuplicateKeyUpdate({
      set: { version: sql`${cacheVersions.version} + 1`, updatedAt: sql`CURRENT_TIMESTAMP(3)` },
    });
}

/** The current version (0 before the first bump): it only ever grows. */
export async function readVersion(db: DbOrTx, name: CacheVersionName): Promise<number> {
  return (await readVersions(db, [name]))[name];
}

export async function readVersions<N extends CacheVersionName>(
  db: DbOrTx,
  names: readonly N[],
): Promise<Record<N, number>> {
  const rows = await db
    .select({ name: cacheVersions.name, version: sql<string>`SUM(${cacheVersions.version})` })
    .from(cacheVersions)
    .where(inArray(cacheVersions.name, [...names]))
    .groupBy(cacheVersions.name);
  const out = Object.fromEntries(names.map((n) => [n, 0])) as Record<N, number>;
  for (const r of rows) out[r.name as N] = Number(r.version);
  return out;
}
