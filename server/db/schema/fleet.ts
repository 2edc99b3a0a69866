// Small pre-aggregated tables the fleet views read instead of scanning the events.
import { sql } from 'drizzle-orm';
import { bigint, char, datetime, double, index, int, mysqlTable, primaryKey, varchar } from 'drizzle-orm/mysql-core';

/**
 * Made-up refrigerant (DOMAIN.md §4) per month, site and refrigerant, kept up to date in each visit's and void's
 * transaction, so the emissions chart reads a few hundred rows instead of millions of events. site_id 0 = no site.
 */
export const fleetMonthly = mysqlTable(
  'fleet_monthly',
  {
    month: char('month', { length: 7 }).notNull(),
    siteId: int('site_id').notNull(),
    refrigerant: varchar('refrigerant', { length: 16 }).notNull(),
    madeUpKg: double('made_up_kg').notNull().default(0),
    visits: int('visits').notNull().default(0),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [primaryKey({ columns: [t.month, t.siteId, t.refrigerant] })],
);

/** What each visit contributes to fleet_monthly, so a later void can take back exactly its share. */
export const visitMadeUp = mysqlTable(
  'visit_made_up',
  {
    visitId: bigint('visit_id', { mode: 'number', unsigned: true }).primaryKey(),
    unitId: int('unit_id').notNull(),
    month: char('month', { length: 7 }).notNull(),
    siteId: int('site_id').notNull(),
    refrigerant: varchar('refrigerant', { length: 16 }).notNull(),
    madeUpKg: double('made_up_kg').notNull(),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [index('visit_made_up_unit_idx').on(t.unitId)],
);

/** Repair effectiveness by leak location × action (action '' = all actions), rebuilt by a background job. */
export const repairEffectivenessRows = mysqlTable(
  'repair_effectiveness',
  {
    location: varchar('location', { length: 32 }).notNull(),
    action: varchar('action', { length: 32 }).notNull(),
    repairs: int('repairs').notNull(),
    held: int('held').notNull(),
    recurred: int('recurred').notNull(),
    pending: int('pending').notNull(),
    holdRatePct: double('hold_rate_pct'),
    computedAt: datetime('computed_at', { mode: 'date', fsp: 3 }).notNull(),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [primaryKey({ columns: [t.location, t.action] })],
);
