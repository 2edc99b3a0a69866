// Background jobs with progress.
import { sql } from 'drizzle-orm';
import { datetime, index, int, mysqlEnum, mysqlTable, varchar } from 'drizzle-orm/mysql-core';
import { users } from './people';
import { JOB_KINDS, JOB_STATUSES } from '../../../shared/schemas/jobs';

export { JOB_KINDS, JOB_STATUSES };

/** A background job and its progress (read by other requests while it runs). */
export const backgroundJobs = mysqlTable(
  'background_jobs',
  {
    id: int('id').autoincrement().primaryKey(),
    kind: mysqlEnum('kind', JOB_KINDS).notNull(),
    status: mysqlEnum('status', JOB_STATUSES).notNull().default('running'),
    // The settings version a recompute applies.
    settingsId: int('settings_id'),
    total: int('total').notNull().default(0),
    processed: int('processed').notNull().default(0),
    // Units are done in id order; a job picked up again after a restart carries on after this id.
    cursorUnitId: int('cursor_unit_id').notNull().default(0),
    message: varchar('message', { length: 500 }),
    createdBy: varchar('created_by', { length: 32 }).references(() => users.id),
    startedAt: datetime('started_at', { mode: 'date', fsp: 3 }).notNull(),
    heartbeatAt: datetime('heartbeat_at', { mode: 'date', fsp: 3 }).notNull(),
    finishedAt: datetime('finished_at', { mode: 'date', fsp: 3 }),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [index('background_jobs_kind_idx').on(t.kind, t.id)],
);
