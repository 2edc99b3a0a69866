import { char, date, datetime, double, index, int, mysqlEnum, mysqlTable, varchar } from 'drizzle-orm/mysql-core';
import { sql } from 'drizzle-orm';
import { sites } from './sites';

export const UNIT_STATUSES = ['in_service', 'out_of_service', 'retired'] as const;

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
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [index('units_site_idx').on(t.siteId), index('units_status_idx').on(t.status)],
);
