// State that every API process must share (decision record 012): versions of what processes keep in memory, and
// leases that let exactly one process run each scheduled task.
import { sql } from 'drizzle-orm';
import { bigint, datetime, mysqlTable, primaryKey, tinyint, varchar } from 'drizzle-orm/mysql-core';

/**
 * A counter per kept thing (settings, monthly totals, the fleet's units …), bumped in the same transaction as a write
 * that changes it; a process compares it with the value its copy was taken at before serving the copy. Split over a
 * few rows (shards) so that concurrent writers rarely wait on one row lock; the version is the sum.
 */
export const cacheVersions = mysqlTable(
  'cache_versions',
  {
    name: varchar('name', { length: 40 }).notNull(),
    shard: tinyint('shard', { unsigned: true }).notNull(),
    version: bigint('version', { mode: 'number', unsigned: true }).notNull().default(0),
    updatedAt: datetime('updated_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [primaryKey({ columns: [t.name, t.shard] })],
);

/** Who runs a scheduled task until when; a holder that stops renewing loses it when it expires. */
export const leases = mysqlTable('leases', {
  name: varchar('name', { length: 64 }).primaryKey(),
  holder: varchar('holder', { length: 100 }).notNull(),
  expiresAt: datetime('expires_at', { mode: 'date', fsp: 3 }).notNull(),
  acquiredAt: datetime('acquired_at', { mode: 'date', fsp: 3 }).notNull(),
  createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`),
});
