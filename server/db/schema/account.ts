// Signing in: sessions, known devices, the sign-in and reset counters, and one-time account links (invitation,
// password reset).
import { sql } from 'drizzle-orm';
import { bigint, char, datetime, index, int, mysqlEnum, mysqlTable, varchar } from 'drizzle-orm/mysql-core';
import { users } from './people';

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

export const ACCOUNT_LINK_PURPOSES = ['invitation', 'password_reset'] as const;

export const accountLinks = mysqlTable(
  'account_links',
  {
    id: bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey(),
    userId: varchar('user_id', { length: 32 })
      .notNull()
      .references(() => users.id),
    purpose: mysqlEnum('purpose', ACCOUNT_LINK_PURPOSES).notNull(),
    // SHA-256 of the token in the link (hex); the token itself is never stored.
    tokenHash: char('token_hash', { length: 64 }).notNull().unique(),
    expiresAt: datetime('expires_at', { mode: 'date', fsp: 3 }).notNull(),
    usedAt: datetime('used_at', { mode: 'date', fsp: 3 }),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [index('account_links_user_idx').on(t.userId, t.purpose)],
);
