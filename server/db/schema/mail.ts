// E-mail: the outbox (written in the same transaction as the event that causes a message), the key that signs links
// in mails, and the development mailbox of the fake SMTP server.
import { sql } from 'drizzle-orm';
import {
  bigint,
  char,
  datetime,
  index,
  int,
  json,
  mediumtext,
  mysqlEnum,
  mysqlTable,
  varchar,
} from 'drizzle-orm/mysql-core';

export const MAIL_KINDS = ['invitation', 'password_reset', 'alert', 'digest', 'password_changed'] as const;

export const mailOutbox = mysqlTable(
  'mail_outbox',
  {
    id: bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey(),
    // One logical message, one row: queueing the same alert again is a no-op.
    dedupeKey: varchar('dedupe_key', { length: 191 }).notNull().unique(),
    kind: mysqlEnum('kind', MAIL_KINDS).notNull(),
    toAddress: varchar('to_address', { length: 254 }).notNull(),
    subject: varchar('subject', { length: 300 }).notNull(),
    textBody: mediumtext('text_body').notNull(),
    htmlBody: mediumtext('html_body').notNull(),
    headers: json('headers').$type<Record<string, string>>(),
    attempts: int('attempts').notNull().default(0),
    nextAttemptAt: datetime('next_attempt_at', { mode: 'date', fsp: 3 }).notNull(),
    // A worker holds a row while it talks to SMTP; an expired lease (crashed worker) frees it again.
    lockedUntil: datetime('locked_until', { mode: 'date', fsp: 3 }),
    sentAt: datetime('sent_at', { mode: 'date', fsp: 3 }),
    lastError: varchar('last_error', { length: 1000 }),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [index('mail_outbox_due_idx').on(t.sentAt, t.nextAttemptAt)],
);

/** Keys that sign links in mails; created on first use so every server behind the balancer shares them. */
export const mailKeys = mysqlTable('mail_keys', {
  id: varchar('id', { length: 32 }).primaryKey(),
  secret: char('secret', { length: 64 }).notNull(),
  createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`),
});

/** What the local fake SMTP server received (development only), for the admin mailbox page. */
export const devMailbox = mysqlTable(
  'dev_mailbox',
  {
    id: bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey(),
    receivedAt: datetime('received_at', { mode: 'date', fsp: 3 }).notNull(),
    fromHeader: varchar('from_header', { length: 400 }).notNull(),
    toHeader: varchar('to_header', { length: 1000 }).notNull(),
    subject: varchar('subject', { length: 400 }).notNull(),
    textBody: mediumtext('text_body').notNull(),
    htmlBody: mediumtext('html_body'),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [index('dev_mailbox_received_idx').on(t.receivedAt)],
);
