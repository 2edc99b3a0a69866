// Alert subscriptions: who hears about which kind of alert at which site.
import { sql } from 'drizzle-orm';
import {
  bigint,
  boolean,
  datetime,
  index,
  int,
  mysqlEnum,
  mysqlTable,
  primaryKey,
  uniqueIndex,
  varchar,
} from 'drizzle-orm/mysql-core';
import { ALERT_KINDS, type AlertKind } from '../../../shared/schemas/alerts';
import { users } from './people';
import { sites } from './sites';
import { createdAndUpdatedAt } from '../columns';

export const alertSubscriptions = mysqlTable(
  'alert_subscriptions',
  {
    id: bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey(),
    userId: varchar('user_id', { length: 32 })
      .notNull()
      .references(() => users.id),
    siteId: int('site_id')
      .notNull()
      .references(() => sites.id),
    kind: mysqlEnum('kind', ALERT_KINDS).notNull(),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [
    uniqueIndex('alert_subscriptions_user_site_kind_uq').on(t.userId, t.siteId, t.kind),
    index('alert_subscriptions_site_kind_idx').on(t.siteId, t.kind),
  ],
);

/**
 * A person's own choice for one kind of alert. No row: the role's default applies (ROLE_ALERT_DEFAULTS), so people who
 * never chose still hear what matters to them. allSites: every site, also those added later; otherwise exactly the
 * person's alert_subscriptions rows of this kind (none = no mails of this kind). Kind is text, not an enum, so a new
 * kind needs no change here.
 */
export const alertKindChoices = mysqlTable(
  'alert_kind_choices',
  {
    userId: varchar('user_id', { length: 32 })
      .notNull()
      .references(() => users.id),
    kind: varchar('kind', { length: 32 }).$type<AlertKind>().notNull(),
    allSites: boolean('all_sites').notNull(),
    ...createdAndUpdatedAt(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.kind] })],
);
