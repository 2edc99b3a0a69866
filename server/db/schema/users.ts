import { bigint, boolean, datetime, index, int, mysqlEnum, mysqlTable, varchar } from 'drizzle-orm/mysql-core';
import { sql } from 'drizzle-orm';
import { ROLES } from '../../../shared/permissions';

export const users = mysqlTable('users', {
  id: varchar('id', { length: 32 }).primaryKey(),
  email: varchar('email', { length: 254 }).notNull().unique(),
  name: varchar('name', { length: 120 }).notNull(),
  role: mysqlEnum('role', ROLES).notNull(),
  // argon2id; null until the person sets a password through an invitation.
  passwordHash: varchar('password_hash', { length: 255 }),
  certificateNumber: varchar('certificate_number', { length: 64 }),
  active: boolean('active').notNull().default(true),
  createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`),
});

export const sessions = mysqlTable(
  'sessions',
  {
    // SHA-256 of the cookie's token: a copy of this table signs no one in, and the id can be shown in device lists.
    id: varchar('id', { length: 255 }).primaryKey(),
    userId: varchar('user_id', { length: 32 })
      .notNull()
      .references(() => users.id),
    // The earlier of the idle deadline and the absolute one (created_at + the absolute lifetime).
    expiresAt: datetime('expires_at', { mode: 'date' }).notNull(),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
    lastSeenAt: datetime('last_seen_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
    // Shown on the "Signed-in devices" list so a person can tell their sessions apart.
    userAgent: varchar('user_agent', { length: 255 }),
    ipAddress: varchar('ip_address', { length: 45 }),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

/**
 * Devices a person has signed in from (a long-lived cookie holding a random token; the SHA-256 is the id). The right
 * password from a known device still signs in while the account's ceiling of failed sign-ins is reached.
 */
export const knownDevices = mysqlTable(
  'known_devices',
  {
    id: varchar('id', { length: 64 }).primaryKey(),
    userId: varchar('user_id', { length: 32 })
      .notNull()
      .references(() => users.id),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
    lastUsedAt: datetime('last_used_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
    expiresAt: datetime('expires_at', { mode: 'date' }).notNull(),
  },
  (t) => [index('known_devices_user_idx').on(t.userId)],
);

/**
 * Counters of rate-limiter-flexible's MySQL store (sign-in and password-reset limits), shared by every API process and
 * kept across restarts. Its layout is the library's: exactly these three columns in this order, no id.
 */
export const rateLimits = mysqlTable('rate_limits', {
  key: varchar('key', { length: 255 }).primaryKey(),
  points: int('points').notNull().default(0),
  // Milliseconds since the epoch; null = never expires.
  expire: bigint('expire', { mode: 'number', unsigned: true }),
});
