// Columns several tables share, written once (Drizzle builds each table's own column from these builders).
import { sql } from 'drizzle-orm';
import { datetime } from 'drizzle-orm/mysql-core';

/** When the row was made and last changed, to the millisecond; the database fills both in on insert. */
export const createdAndUpdatedAt = () => ({
  createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`),
  updatedAt: datetime('updated_at', { mode: 'date', fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`),
});
