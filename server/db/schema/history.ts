// The service history: append-only. Rows are inserted, never updated or deleted; a correction is a 'void' event.
import { sql } from 'drizzle-orm';
import {
  bigint,
  boolean,
  date,
  datetime,
  double,
  index,
  int,
  json,
  mysqlEnum,
  mysqlTable,
  uniqueIndex,
  varchar,
} from 'drizzle-orm/mysql-core';
import { sites } from './sites';
import { units } from './units';
import { users } from './people';

export const EVENT_KINDS = [
  'pti',
  'leak_check',
  'repair',
  'component_replacement',
  'status_change',
  'note',
  'decision',
  'top_up',
  'recovery',
  'recharge',
  'pressure',
  'void',
] as const;

/** One submission of the visit form: everything done at the unit in one go. */
export const visits = mysqlTable(
  'visits',
  {
    id: bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey(),
    unitId: int('unit_id')
      .notNull()
      .references(() => units.id),
    siteId: int('site_id').references(() => sites.id),
    recordedBy: varchar('recorded_by', { length: 32 })
      .notNull()
      .references(() => users.id),
    occurredAt: datetime('occurred_at', { mode: 'date', fsp: 3 }).notNull(),
    enteredAt: datetime('entered_at', { mode: 'date', fsp: 3 }).notNull(),
    // The recorder's refrigerant certificate as it stood when the visit was written (the log shows that, not today's).
    certificateNumber: varchar('certificate_number', { length: 64 }),
    certificateExpiresOn: date('certificate_expires_on', { mode: 'string' }),
    // A retried submission carries the same key and gets the first result back.
    idempotencyKey: varchar('idempotency_key', { length: 64 }).notNull().unique(),
    // SHA-256 of what was submitted under the key: the same key with other content is refused, not replayed.
    contentHash: varchar('content_hash', { length: 64 }),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [index('visits_unit_idx').on(t.unitId, t.occurredAt)],
);

export const events = mysqlTable(
  'events',
  {
    id: bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey(),
    unitId: int('unit_id')
      .notNull()
      .references(() => units.id),
    visitId: bigint('visit_id', { mode: 'number', unsigned: true }).references(() => visits.id),
    siteId: int('site_id').references(() => sites.id),
    recordedBy: varchar('recorded_by', { length: 32 })
      .notNull()
      .references(() => users.id),
    kind: mysqlEnum('kind', EVENT_KINDS).notNull(),
    occurredAt: datetime('occurred_at', { mode: 'date', fsp: 3 }).notNull(),
    enteredAt: datetime('entered_at', { mode: 'date', fsp: 3 }).notNull(),
    // Refrigerant movements (kg, SI) and their traceability.
    kg: double('kg'),
    cylinder: varchar('cylinder', { length: 64 }),
    reusedRecovered: boolean('reused_recovered'),
    // Retrofit or first fill: not made-up refrigerant (40 CFR 82.157(b)).
    excludedFromLeakRate: boolean('excluded_from_leak_rate'),
    // Leak checks, repairs, PTIs.
    method: varchar('method', { length: 32 }),
    leakFound: boolean('leak_found'),
    location: varchar('location', { length: 32 }),
    action: varchar('action', { length: 32 }),
    verified: boolean('verified'),
    passed: boolean('passed'),
    // Pressure snapshot (gauge kPa, °C as stored; `enteredAs` keeps what was typed).
    suctionKPaG: double('suction_kpag'),
    dischargeKPaG: double('discharge_kpag'),
    ambientC: double('ambient_c'),
    setPointC: double('set_point_c'),
    supplyAirC: double('supply_air_c'),
    returnAirC: double('return_air_c'),
    sightGlass: varchar('sight_glass', { length: 16 }),
    // Everything else: free text, the units the user typed, component names, status values, decision figures.
    details: json('details').$type<Record<string, unknown>>(),
    note: varchar('note', { length: 2000 }),
    voidsEventId: bigint('voids_event_id', { mode: 'number', unsigned: true }),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [
    index('events_unit_time_idx').on(t.unitId, t.occurredAt),
    index('events_visit_idx').on(t.visitId),
    // One void per entry: concurrent voids of the same entry cannot both land.
    uniqueIndex('events_voids_unique').on(t.voidsEventId),
    index('events_cylinder_idx').on(t.cylinder, t.occurredAt),
    index('events_site_time_idx').on(t.siteId, t.occurredAt),
    index('events_kind_time_idx').on(t.kind, t.occurredAt),
  ],
);

export const attachments = mysqlTable(
  'attachments',
  {
    id: bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey(),
    eventId: bigint('event_id', { mode: 'number', unsigned: true })
      .notNull()
      .references(() => events.id),
    unitId: int('unit_id')
      .notNull()
      .references(() => units.id),
    // Content-addressed: the SHA-256 of the bytes.
    storageKey: varchar('storage_key', { length: 80 }).notNull(),
    thumbnailKey: varchar('thumbnail_key', { length: 80 }),
    mimeType: varchar('mime_type', { length: 64 }).notNull(),
    sizeBytes: int('size_bytes').notNull(),
    originalName: varchar('original_name', { length: 255 }).notNull(),
    uploadedBy: varchar('uploaded_by', { length: 32 })
      .notNull()
      .references(() => users.id),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 })
      .notNull()
      .default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [index('attachments_event_idx').on(t.eventId)],
);

/**
 * Derived figures per unit, recomputed in the same transaction as every write; the fleet views read only this. Rows
 * stay narrow (about 200 bytes) so that scans over the whole fleet touch few pages; the wide parts live beside it.
 */
export const unitStats = mysqlTable(
  'unit_stats',
  {
    unitId: int('unit_id')
      .primaryKey()
      .references(() => units.id),
    computedAt: datetime('computed_at', { mode: 'date', fsp: 3 }).notNull(),
    rollingLeakRatePct: double('rolling_leak_rate_pct').notNull().default(0),
    calendarYearSharePct: double('calendar_year_share_pct').notNull().default(0),
    score: int('score').notNull().default(0),
    scoreBand: mysqlEnum('score_band', ['tight', 'watch', 'chronic']).notNull().default('tight'),
    forecastDate: date('forecast_date', { mode: 'string' }),
    forecastEarliest: date('forecast_earliest', { mode: 'string' }),
    forecastLatest: date('forecast_latest', { mode: 'string' }),
    forecastOverdue: boolean('forecast_overdue').notNull().default(false),
    co2eTonnes: double('co2e_tonnes').notNull().default(0),
    leakCheckIntervalMonths: int('leak_check_interval_months'),
    lastLeakCheckAt: datetime('last_leak_check_at', { mode: 'date', fsp: 3 }),
    nextLeakCheckDue: date('next_leak_check_due', { mode: 'string' }),
    ptiValidUntil: date('pti_valid_until', { mode: 'string' }),
    ptiPassed: boolean('pti_passed'),
    pressureFlag: mysqlEnum('pressure_flag', ['ok', 'possible_low_charge', 'unknown']).notNull().default('unknown'),
    openLeakFoundAt: datetime('open_leak_found_at', { mode: 'date', fsp: 3 }),
    madeUpKg365: double('made_up_kg_365').notNull().default(0),
    eventCount: int('event_count').notNull().default(0),
    visitCount: int('visit_count').notNull().default(0),
    topUpCount: int('top_up_count').notNull().default(0),
    lastEventAt: datetime('last_event_at', { mode: 'date', fsp: 3 }),
    // Why the engine could not compute this unit's figures (an implausible record); null when it could.
    computeError: varchar('compute_error', { length: 300 }),
  },
  (t) => [
    index('unit_stats_score_idx').on(t.score),
    index('unit_stats_rate_idx').on(t.rollingLeakRatePct),
    index('unit_stats_forecast_idx').on(t.forecastDate),
    index('unit_stats_leak_check_idx').on(t.nextLeakCheckDue),
    index('unit_stats_pti_idx').on(t.ptiValidUntil),
    // Fleet table: band filter with the score sort; CO2e sort.
    index('unit_stats_band_score_idx').on(t.scoreBand, t.score),
    index('unit_stats_co2e_idx').on(t.co2eTonnes),
  ],
);

/** The wide part of a unit's statistics, written with unit_stats and read one unit at a time (unit page, decisions). */
export const unitStatsDetail = mysqlTable('unit_stats_detail', {
  unitId: int('unit_id')
    .primaryKey()
    .references(() => units.id),
  scoreFactors: json('score_factors').$type<Record<string, unknown>>(),
  // The computeUnitStats result without its series, for the unit page (rates, forecast, factor texts).
  detail: json('detail').$type<Record<string, unknown>>(),
});
