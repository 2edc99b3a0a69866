import {
  char,
  date,
  datetime,
  decimal,
  double,
  index,
  int,
  mysqlEnum,
  mysqlTable,
  smallint,
  text,
  varchar,
} from 'drizzle-orm/mysql-core';
import { sql } from 'drizzle-orm';
import { sites } from './sites';
import { users } from './people';
import { IMPORT_STATUSES } from '../../../shared/schemas/imports';
import { UNIT_STATUSES } from '../../../shared/schemas/units';
import { createdAndUpdatedAt } from '../columns';

export { IMPORT_STATUSES, UNIT_STATUSES };

export const units = mysqlTable(
  'units',
  {
    id: int('id').autoincrement().primaryKey(),
    // ISO 6346, stored as the 11-character upper-case form.
    containerNumber: char('container_number', { length: 11 }).notNull().unique(),
    refrigerant: varchar('refrigerant', { length: 16 }).notNull(),
    nominalChargeKg: double('nominal_charge_kg').notNull(),
    commissionedOn: date('commissioned_on', { mode: 'string' }),
    siteId: int('site_id').references(() => sites.id),
    status: mysqlEnum('status', UNIT_STATUSES).notNull().default('in_service'),
    qrToken: varchar('qr_token', { length: 43 }).notNull().unique(),
    // The refrigeration machine's own serial, which outlives a box when the machinery is moved to another one.
    machinerySerial: varchar('machinery_serial', { length: 40 }),
    model: varchar('model', { length: 60 }),
    manufactureYear: smallint('manufacture_year'),
    // Money in the owner's accounting currency; decimal so that sums are exact.
    purchaseCost: decimal('purchase_cost', { precision: 12, scale: 2, mode: 'number' }),
    residualValue: decimal('residual_value', { precision: 12, scale: 2, mode: 'number' }),
    notes: text('notes'),
    qrIssuedAt: datetime('qr_issued_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
    ...createdAndUpdatedAt(),
  },
  (t) => [
    index('units_site_idx').on(t.siteId),
    index('units_status_idx').on(t.status),
    index('units_refrigerant_idx').on(t.refrigerant),
    index('units_updated_at_idx').on(t.updatedAt),
    // Fleet table: a site's units by container number (filter + sort, and the number-prefix search within a site).
    index('units_site_number_idx').on(t.siteId, t.containerNumber),
  ],
);

/** One row per changed field of a unit edit: the unit's record of who changed what, and when. */
export const unitChanges = mysqlTable(
  'unit_changes',
  {
    id: int('id').autoincrement().primaryKey(),
    unitId: int('unit_id')
      .notNull()
      .references(() => units.id),
    userId: varchar('user_id', { length: 32 })
      .notNull()
      .references(() => users.id),
    at: datetime('at', { mode: 'date', fsp: 3 }).notNull(),
    field: varchar('field', { length: 40 }).notNull(),
    before: text('before'),
    after: text('after'),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [index('unit_changes_unit_at_idx').on(t.unitId, t.at)],
);
