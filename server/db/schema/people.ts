// People: who may sign in, with which role.
import { sql } from 'drizzle-orm';
import { boolean, date, datetime, mysqlEnum, mysqlTable, varchar } from 'drizzle-orm/mysql-core';
import { ROLES } from '../../../shared/permissions';

export const users = mysqlTable('users', {
  id: varchar('id', { length: 32 }).primaryKey(),
  email: varchar('email', { length: 254 }).notNull().unique(),
  name: varchar('name', { length: 120 }).notNull(),
  role: mysqlEnum('role', ROLES).notNull(),
  // argon2id; null until the person sets a password through an invitation.
  passwordHash: varchar('password_hash', { length: 255 }),
  certificateNumber: varchar('certificate_number', { length: 64 }),
  // The certificate's last valid day; null when not known.
  certificateExpiresOn: date('certificate_expires_on', { mode: 'string' }),
  active: boolean('active').notNull().default(true),
  createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`),
});
