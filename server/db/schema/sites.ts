import { datetime, int, mysqlEnum, mysqlTable, varchar } from 'drizzle-orm/mysql-core';
import { sql } from 'drizzle-orm';
import { JURISDICTIONS, SITE_KINDS } from '../../../shared/schemas/sites';

export { SITE_KINDS };

export const sites = mysqlTable('sites', {
  id: int('id').autoincrement().primaryKey(),
  code: varchar('code', { length: 16 }).notNull().unique(),
  name: varchar('name', { length: 120 }).notNull(),
  kind: mysqlEnum('kind', SITE_KINDS).notNull(),
  country: varchar('country', { length: 2 }),
  // Whose leak-check rule applies here; null = the fleet's policy in settings.
  jurisdiction: mysqlEnum('jurisdiction', JURISDICTIONS),
  // IANA zone the site's times are shown in; null = UTC.
  timeZone: varchar('time_zone', { length: 64 }),
  createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`),
});
