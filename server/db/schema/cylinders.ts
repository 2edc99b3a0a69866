// The cylinder register. A cylinder's row is locked (SELECT … FOR UPDATE) by every write that changes what it holds:
// weighings, the visits that charge from it or recover into it, status changes.
import { sql } from 'drizzle-orm';
import { bigint, datetime, double, index, int, mysqlEnum, mysqlTable, varchar } from 'drizzle-orm/mysql-core';
import { CYLINDER_KINDS, CYLINDER_STATUSES, GAS_ORIGINS } from '../../../shared/schemas/cylinders';
import { events, visits } from './history';
import { users } from './people';
import { sites } from './sites';
import { units } from './units';
import { createdAndUpdatedAt } from '../columns';

export const cylinders = mysqlTable(
  'cylinders',
  {
    id: int('id').autoincrement().primaryKey(),
    // The number printed on its label (and in its QR code); the depot's own or one Tightloop gives it.
    code: varchar('code', { length: 24 }).notNull().unique(),
    kind: mysqlEnum('kind', CYLINDER_KINDS).notNull(),
    refrigerant: varchar('refrigerant', { length: 16 }).notNull(),
    tareKg: double('tare_kg').notNull(),
    // The cylinder maker's marked maximum fill, kg of refrigerant.
    capacityKg: double('capacity_kg').notNull(),
    supplier: varchar('supplier', { length: 80 }),
    lot: varchar('lot', { length: 64 }),
    gasOrigin: mysqlEnum('gas_origin', GAS_ORIGINS),
    siteId: int('site_id').references(() => sites.id),
    status: mysqlEnum('status', CYLINDER_STATUSES).notNull(),
    notes: varchar('notes', { length: 500 }),
    quarantinedAt: datetime('quarantined_at', { mode: 'date', fsp: 3 }),
    quarantineReason: varchar('quarantine_reason', { length: 500 }),
    quarantinedBy: varchar('quarantined_by', { length: 32 }).references(() => users.id),
    createdBy: varchar('created_by', { length: 32 })
      .notNull()
      .references(() => users.id),
    ...createdAndUpdatedAt(),
  },
  (t) => [index('cylinders_site_idx').on(t.siteId, t.status), index('cylinders_lot_idx').on(t.lot)],
);

/** Gross weighings (cylinder + contents), append-only. */
export const cylinderWeighings = mysqlTable(
  'cylinder_weighings',
  {
    id: int('id').autoincrement().primaryKey(),
    cylinderId: int('cylinder_id')
      .notNull()
      .references(() => cylinders.id),
    grossKg: double('gross_kg').notNull(),
    weighedAt: datetime('weighed_at', { mode: 'date', fsp: 3 }).notNull(),
    recordedBy: varchar('recorded_by', { length: 32 })
      .notNull()
      .references(() => users.id),
    note: varchar('note', { length: 500 }),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [index('cylinder_weighings_cylinder_idx').on(t.cylinderId, t.weighedAt)],
);

/**
 * Which cylinder a visit's refrigerant movement came from or went into, written with the event in the visit's
 * transaction. A voided event's move stays and stops counting (the void is the record of why).
 */
export const cylinderMoves = mysqlTable(
  'cylinder_moves',
  {
    id: bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey(),
    cylinderId: int('cylinder_id')
      .notNull()
      .references(() => cylinders.id),
    eventId: bigint('event_id', { mode: 'number', unsigned: true })
      .notNull()
      .unique()
      .references(() => events.id),
    visitId: bigint('visit_id', { mode: 'number', unsigned: true }).references(() => visits.id),
    unitId: int('unit_id')
      .notNull()
      .references(() => units.id),
    direction: mysqlEnum('direction', ['in', 'out']).notNull(),
    kg: double('kg').notNull(),
    occurredAt: datetime('occurred_at', { mode: 'date', fsp: 3 }).notNull(),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [
    index('cylinder_moves_cylinder_idx').on(t.cylinderId, t.occurredAt),
    index('cylinder_moves_unit_idx').on(t.unitId),
  ],
);
