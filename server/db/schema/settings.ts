// The settings in force: append-only versions.
import { sql } from 'drizzle-orm';
import { datetime, int, json, mysqlTable, varchar } from 'drizzle-orm/mysql-core';
import { users } from './people';

/** Every saved version of the settings; the row with the highest id is in force. Rows are never updated. */
export const settingsVersions = mysqlTable('settings', {
  id: int('id').autoincrement().primaryKey(),
  // The whole settings object, valid against settingsSchema when written.
  data: json('data').$type<Record<string, unknown>>().notNull(),
  // Which sections this version changed, for the change history.
  changedSections: json('changed_sections').$type<string[]>().notNull(),
  updatedBy: varchar('updated_by', { length: 32 })
    .notNull()
    .references(() => users.id),
  updatedAt: datetime('updated_at', { mode: 'date', fsp: 3 }).notNull(),
  createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`),
});
