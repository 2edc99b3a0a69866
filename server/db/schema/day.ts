// The depot's working day: per unit, what the history says needs doing or blocks release (re-check due, quarantine).
// Derived rows, written by the unit write path (server/lib/record/depot-state.ts) in the same transaction as every
// write, so My day and the fleet filter are index lookups.
import { bigint, date, datetime, index, int, mysqlEnum, mysqlTable, varchar } from 'drizzle-orm/mysql-core';
import { units } from './units';

export const unitDepotState = mysqlTable(
  'unit_depot_state',
  {
    unitId: int('unit_id')
      .primaryKey()
      .references(() => units.id),
    computedAt: datetime('computed_at', { mode: 'date', fsp: 3 }).notNull(),
    // The open re-check due first (after a top-up or a repair), or null.
    recheckDue: date('recheck_due', { mode: 'string' }),
    recheckReason: mysqlEnum('recheck_reason', ['top_up', 'repair']),
    recheckSourceEventId: bigint('recheck_source_event_id', { mode: 'number', unsigned: true }),
    missedRechecks365: int('missed_rechecks_365').notNull().default(0),
    // In quarantine since (the first mark after the last lift), or null.
    quarantinedSince: datetime('quarantined_since', { mode: 'date', fsp: 3 }),
    quarantineReason: varchar('quarantine_reason', { length: 300 }),
    quarantineEventId: bigint('quarantine_event_id', { mode: 'number', unsigned: true }),
  },
  (t) => [
    index('unit_depot_state_recheck_idx').on(t.recheckDue),
    index('unit_depot_state_quarantine_idx').on(t.quarantinedSince),
  ],
);
