// CSV imports of units.
import { sql } from 'drizzle-orm';
import { datetime, index, int, mysqlEnum, mysqlTable, varchar } from 'drizzle-orm/mysql-core';
import { IMPORT_STATUSES } from '../../../shared/schemas/imports';
import { users } from './people';

/** A fleet CSV import: who ran it, and its progress while the one transaction runs (read from other connections). */
export const unitImports = mysqlTable(
  'unit_imports',
  {
    id: int('id').autoincrement().primaryKey(),
    // Chosen by the client before upload so that it can poll progress while its request is still running.
    importKey: varchar('import_key', { length: 43 }).notNull().unique(),
    userId: varchar('user_id', { length: 32 })
      .notNull()
      .references(() => users.id),
    fileName: varchar('file_name', { length: 255 }).notNull(),
    status: mysqlEnum('status', IMPORT_STATUSES).notNull().default('running'),
    totalRows: int('total_rows').notNull().default(0),
    processedRows: int('processed_rows').notNull().default(0),
    insertedRows: int('inserted_rows').notNull().default(0),
    message: varchar('message', { length: 500 }),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
    finishedAt: datetime('finished_at', { mode: 'date', fsp: 3 }),
  },
  (t) => [index('unit_imports_user_idx').on(t.userId)],
);
