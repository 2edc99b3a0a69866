// The forecast's learned case base (DOMAIN.md §7b).
import { sql } from 'drizzle-orm';
import { customType, datetime, int, json, mysqlTable } from 'drizzle-orm/mysql-core';

const longblob = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'longblob' });

/**
 * The next top-up forecast's case base (DOMAIN.md §7b), learned from the fleet's history by a background job: the
 * encoded cases (gzip) and the accuracy measured on the fleet's own record. Each process loads the newest row once
 * and again when a newer one appears; older rows are pruned.
 */
export const forecastCaseBases = mysqlTable('forecast_case_bases', {
  id: int('id').autoincrement().primaryKey(),
  builtAt: datetime('built_at', { mode: 'date', fsp: 3 }).notNull(),
  // Cut-offs with a known next top-up (before sampling) and the units they came from.
  cases: int('cases').notNull(),
  units: int('units').notNull(),
  buildMs: int('build_ms').notNull(),
  accuracy: json('accuracy').$type<Record<string, unknown>>(),
  data: longblob('data').notNull(),
  createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`),
});
