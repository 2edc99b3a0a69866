// Alert subscriptions: who hears about which kind of alert at which site.
import { sql } from 'drizzle-orm';
import { bigint, datetime, index, int, mysqlEnum, mysqlTable, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';
import { ALERT_KINDS } from '../../../shared/schemas/alerts';
import { users } from './people';
import { sites } from './sites';

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
