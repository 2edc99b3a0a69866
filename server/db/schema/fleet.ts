// Fleet-level tables: the settings in force (append-only versions), background jobs with progress, and small
// pre-aggregated tables the fleet views read instead of scanning the events.
import { sql } from 'drizzle-orm';
import {
  bigint,
  char,
  customType,
  datetime,
  double,
  index,
  int,
  json,
  mysqlEnum,
  mysqlTable,
  primaryKey,
  varchar,
} from 'drizzle-orm/mysql-core';
import { users } from './users';

/** Every saved version of the settings; the row with the highest id is in force. Rows are never updated. */
export const settingsVersions = mysqlTable('settings', {
  id: int('id').autoincrement().primaryKey(),
  // The whole settings object, valid against settingsSchema when written.
  data: json('data').$type<Record<string, unknown>>().notNull(),
  // Which sections this version changed, for the change history.
  changedSections: json('changed_sections').$type<string[]>().notNull(),
  updatedBy: varchar('updated_by', { length: 32 })
    .notNull()
    .references(() => users.id),
  updatedAt: datetime('updated_at', { mode: 'date', fsp: 3 }).notNull(),
  createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`),
});

export const JOB_KINDS = ['stats_recompute', 'repair_effectiveness', 'forecast_cases'] as const;
export const JOB_STATUSES = ['running', 'done', 'failed', 'superseded'] as const;

/** A background job and its progress (read by other requests while it runs). */
export const backgroundJobs = mysqlTable(
  'background_jobs',
  {
    id: int('id').autoincrement().primaryKey(),
    kind: mysqlEnum('kind', JOB_KINDS).notNull(),
    status: mysqlEnum('status', JOB_STATUSES).notNull().default('running'),
    // The settings version a recompute applies.
    settingsId: int('settings_id'),
    total: int('total').notNull().default(0),
    processed: int('processed').notNull().default(0),
    // Units are done in id order; a job picked up again after a restart carries on after this id.
    cursorUnitId: int('cursor_unit_id').notNull().default(0),
    message: varchar('message', { length: 500 }),
    createdBy: varchar('created_by', { length: 32 }).references(() => users.id),
    startedAt: datetime('started_at', { mode: 'date', fsp: 3 }).notNull(),
    heartbeatAt: datetime('heartbeat_at', { mode: 'date', fsp: 3 }).notNull(),
    finishedAt: datetime('finished_at', { mode: 'date', fsp: 3 }),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [index('background_jobs_kind_idx').on(t.kind, t.id)],
);

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

const longblob = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'longblob' });

/**
 * The next top-up forecast's case base (DOMAIN.md §7b), learned from the fleet's history by a background job: the
 * encoded cases (gzip) and the accuracy measured on the fleet's own record. Each process loads the newest row once
 * and again when a newer one appears; older rows are pruned.
 */
export const forecastCaseBases = mysqlTable('forecast_case_bases', {
  id: int('id').autoincrement().primaryKey(),
  builtAt: datetime('built_at', { mode: 'date', fsp: 3 }).notNull(),
  // Cut-offs with a known next top-up (before sampling) and the units they came from.
  cases: int('cases').notNull(),
  units: int('units').notNull(),
  buildMs: int('build_ms').notNull(),
  accuracy: json('accuracy').$type<Record<string, unknown>>(),
  data: longblob('data').notNull(),
  createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`),
});
