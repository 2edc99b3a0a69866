// Recomputes a unit's statistics from its whole history with the domain engine and stores them in unit_stats (and the
// wide part in unit_stats_detail).
// Runs inside the caller's transaction so the figures always match the events they came from.
import { and, asc, eq, getTableColumns, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { notFound } from '../http-error';
import { events, sites, units, unitStats, unitStatsDetail } from '../../db/schema';
import { computeUnitStats, type ForecastCaseBase } from '../../../shared/domain';
import type { Settings } from '../../../shared/schemas/settings';
import { EARLIEST_RECORD_DAY } from '../../../shared/schemas/common';
import type { UnitStatsDto, UnitStatsSummary } from '../../../shared/schemas/history';
import { fmtIsoDay } from '../../../shared/format-dates';

type EngineEvent = Parameters<typeof computeUnitStats>[1][number];
type EngineUnit = Parameters<typeof computeUnitStats>[0];
export type UnitStatsRow = typeof unitStats.$inferSelect;
export type UnitStatsDetailRow = typeof unitStatsDetail.$inferSelect;
/** A unit's statistics as written: the narrow row the fleet views scan and the wide part read per unit. */
export type UnitStatsRows = { stats: UnitStatsRow; detail: UnitStatsDetailRow };

const iso = (d: Date) => d.toISOString();

/** The engine's view of one stored event, or null for kinds the figures do not use. */
export function toEngineEvent(e: {
  kind: string;
  occurredAt: Date;
  visitId: number | null;
  kg: number | null;
  excludedFromLeakRate: boolean | null;
  leakFound: boolean | null;
  location: string | null;
  action: string | null;
  verified: boolean | null;
  passed: boolean | null;
  suctionKPaG: number | null;
  dischargeKPaG: number | null;
  ambientC: number | null;
  sightGlass: string | null;
}): EngineEvent | null {
  const at = iso(e.occurredAt);
  const visitId = e.visitId == null ? undefined : String(e.visitId);
  switch (e.kind) {
    case 'top_up':
    case 'recovery':
    case 'recharge':
      return { kind: e.kind, at, visitId, kg: e.kg ?? 0, excluded: Boolean(e.excludedFromLeakRate) } as EngineEvent;
    case 'leak_check':
      return {
        kind: 'leak_check',
        at,
        visitId,
        leakFound: Boolean(e.leakFound),
        location: e.location ?? undefined,
      } as EngineEvent;
    case 'repair':
      return {
        kind: 'repair',
        at,
        visitId,
        location: e.location ?? undefined,
        action: e.action ?? undefined,
        verified: Boolean(e.verified),
      } as EngineEvent;
    case 'pti':
      return { kind: 'pti', at, visitId, passed: Boolean(e.passed) } as EngineEvent;
    case 'pressure':
      return {
        kind: 'pressure',
        at,
        visitId,
        suctionKPaG: e.suctionKPaG ?? undefined,
        dischargeKPaG: e.dischargeKPaG ?? undefined,
        ambientC: e.ambientC ?? undefined,
        sightGlass: e.sightGlass ?? undefined,
      } as EngineEvent;
    default:
      return null;
  }
}

/** The event columns the engine reads (see toEngineEvent). */
export const ENGINE_EVENT_COLUMNS = {
  kind: events.kind,
  occurredAt: events.occurredAt,
  visitId: events.visitId,
  kg: events.kg,
  excludedFromLeakRate: events.excludedFromLeakRate,
  leakFound: events.leakFound,
  location: events.location,
  action: events.action,
  verified: events.verified,
  passed: events.passed,
  suctionKPaG: events.suctionKPaG,
  dischargeKPaG: events.dischargeKPaG,
  ambientC: events.ambientC,
  sightGlass: events.sightGlass,
};

/** Every event of the unit that counts: voided ones and the void markers themselves drop out. */
export async function loadEngineHistory(db: DbOrTx, unitId: number): Promise<EngineEvent[]> {
  const rows = await db
    .select(ENGINE_EVENT_COLUMNS)
    .from(events)
    .where(
      and(
        eq(events.unitId, unitId),
        sql`${events.kind} <> 'void'`,
        sql`NOT EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = \`events\`.\`id\`)`,
      ),
    )
    .orderBy(asc(events.occurredAt), asc(events.id));
  const out: EngineEvent[] = [];
  for (const r of rows) {
    const e = toEngineEvent(r);
    if (e) out.push(e);
  }
  return out;
}

export function engineUnit(u: {
  refrigerant: string;
  nominalChargeKg: number;
  commissionedOn: string | null;
  createdAt: Date;
}): EngineUnit {
  // Without a commissioning date the record's start stands in for it (DOMAIN.md §4).
  return {
    refrigerant: u.refrigerant,
    nominalChargeKg: u.nominalChargeKg,
    commissionedOn: u.commissionedOn ?? iso(u.createdAt).slice(0, 10),
  } as EngineUnit;
}

type EngineResult = ReturnType<typeof computeUnitStats>;

/** The engine result without its series: what the row keeps (the timeline derives the series on read). */
export function statsSummary(r: EngineResult): UnitStatsSummary {
  const { visits: _visits, snapshots: _snapshots, ...summary } = r;
  return summary;
}

export function statsRowsFrom(
  unitId: number,
  r: EngineResult,
  computedAt: Date,
  lastEventAt: Date | null,
): UnitStatsRows {
  const stats: UnitStatsRow = {
    unitId,
    computedAt,
    rollingLeakRatePct: r.rollingLeakRatePct ?? 0,
    calendarYearSharePct: r.calendarYearSharePct ?? 0,
    score: r.score.value,
    scoreBand: r.score.band,
    forecastDate: r.forecast?.date ?? null,
    forecastEarliest: r.forecast?.earliest ?? null,
    forecastLatest: r.forecast?.latest ?? null,
    forecastOverdue: r.forecast?.overdue ?? false,
    co2eTonnes: r.co2eTonnes,
    leakCheckIntervalMonths: r.leakCheckIntervalMonths,
    lastLeakCheckAt: r.lastLeakCheckAt ? new Date(r.lastLeakCheckAt) : null,
    nextLeakCheckDue: r.nextLeakCheckDue ?? null,
    ptiValidUntil: r.ptiValidUntil ?? null,
    ptiPassed: r.ptiPassed ?? null,
    pressureFlag: r.pressureHealth.flag,
    openLeakFoundAt: r.openLeak ? new Date(r.openLeak.foundAt) : null,
    madeUpKg365: r.totalMadeUpKg365 ?? 0,
    eventCount: r.counts.events,
    visitCount: r.counts.visits,
    topUpCount: r.counts.topUps,
    lastEventAt,
    computeError: null,
  };
  const detail: UnitStatsDetailRow = {
    unitId,
    scoreFactors: r.score.factors as unknown as Record<string, unknown>,
    detail: statsSummary(r) as unknown as Record<string, unknown>,
  };
  return { stats, detail };
}

// On a key clash every column takes the value just sent, so the row's text travels once.
function upsertSet(table: typeof unitStats | typeof unitStatsDetail) {
  return Object.fromEntries(
    Object.entries(getTableColumns(table))
      .filter(([key]) => key !== 'unitId')
      .map(([key, column]) => [key, sql`values(${column})`]),
  );
}
const STATS_UPSERT_SET = upsertSet(unitStats);
const DETAIL_UPSERT_SET = upsertSet(unitStatsDetail);

type StatsUnit = Parameters<typeof engineUnit>[0] & { id: number; siteId?: number | null };

/**
 * The settings a unit's figures follow: the fleet's, with the leak-check rule of the unit's site when the site has its
 * own jurisdiction (a fleet spans several). Every figure, alert and My day row reads the interval stored from this.
 */
export async function settingsForSite(db: DbOrTx, siteId: number | null | undefined, settings: Settings) {
  if (siteId == null) return settings;
  const [site] = await db.select({ jurisdiction: sites.jurisdiction }).from(sites).where(eq(sites.id, siteId));
  return site?.jurisdiction ? { ...settings, policy: site.jurisdiction } : settings;
}

/**
 * The unit row locked for a write to its history (only that row: nothing that may not exist is locked), then its
 * statistics row as it stands (null before the first).
 */
export async function lockUnitForHistory(tx: DbOrTx, unitId: number) {
  const [unit] = await tx.select().from(units).where(eq(units.id, unitId)).for('update');
  if (!unit) return null;
  const [stats = null] = await tx.select().from(unitStats).where(eq(unitStats.unitId, unitId));
  return { unit, stats };
}

/**
 * Recomputes and stores the statistics of a unit the caller has locked (the unit write path), from its history.
 * `caseBase` is the fleet's forecast case base (DOMAIN.md §7b), read by the caller outside the transaction.
 */
export async function recomputeUnitStats(
  tx: DbOrTx,
  unit: StatsUnit,
  asOf: Date,
  settings: Settings,
  caseBase: ForecastCaseBase | null = null,
): Promise<UnitStatsRows> {
  const rules = await settingsForSite(tx, unit.siteId, settings);
  const rows = computeStatsRows(unit, unit.id, await loadEngineHistory(tx, unit.id), asOf, rules, caseBase);
  await storeStatsRows(tx, [rows]);
  return rows;
}

/** The rows a unit's figures are stored in, from its counted history; the reason in words when the engine refuses it. */
export function computeStatsRows(
  unit: StatsUnit | Parameters<typeof engineUnit>[0],
  unitId: number,
  history: EngineEvent[],
  asOf: Date,
  settings: Settings,
  caseBase: ForecastCaseBase | null = null,
): UnitStatsRows {
  const last = history.length ? new Date(history[history.length - 1].at) : null;
  try {
    return statsRowsFrom(
      unitId,
      computeUnitStats(engineUnit(unit), history, iso(asOf), settings, caseBase),
      asOf,
      last,
    );
  } catch (err) {
    // The engine is pure: a throw means this record breaks one of its rules (a date it cannot place, a charge of 0).
    // The unit keeps a row that says so, and every fleet-wide read goes on. A commissioning date outside the date rule
    // (an old row) is said in the rule's words rather than the engine's.
    const day = unit.commissionedOn?.slice(0, 10);
    const outside = day && (day < EARLIEST_RECORD_DAY || day > iso(asOf).slice(0, 10));
    const reason = outside
      ? new Error(`the commissioning date (${fmtIsoDay(day)}) is outside ${fmtIsoDay(EARLIEST_RECORD_DAY)} to today.`)
      : err;
    return uncomputableRows(unitId, asOf, last, history.length, reason);
  }
}

/** Upserts statistics rows (narrow part, then wide part: the fixed order every writer uses). */
export async function storeStatsRows(tx: DbOrTx, rows: readonly UnitStatsRows[]): Promise<void> {
  if (!rows.length) return;
  await tx
    .insert(unitStats)
    .values(rows.map((r) => r.stats))
    .onDuplicateKeyUpdate({ set: STATS_UPSERT_SET });
  await tx
    .insert(unitStatsDetail)
    .values(rows.map((r) => r.detail))
    .onDuplicateKeyUpdate({ set: DETAIL_UPSERT_SET });
}

/** The row of a unit the engine cannot compute: neutral figures that sort last, and the reason in words. */
export function uncomputableRows(
  unitId: number,
  computedAt: Date,
  lastEventAt: Date | null,
  events: number,
  err: unknown,
): UnitStatsRows {
  const reason = err instanceof Error && err.message ? err.message : 'the record breaks a rule of the computation';
  return {
    stats: {
      unitId,
      computedAt,
      rollingLeakRatePct: 0,
      calendarYearSharePct: 0,
      score: 0,
      scoreBand: 'tight',
      forecastDate: null,
      forecastEarliest: null,
      forecastLatest: null,
      forecastOverdue: false,
      co2eTonnes: 0,
      leakCheckIntervalMonths: null,
      lastLeakCheckAt: null,
      nextLeakCheckDue: null,
      ptiValidUntil: null,
      ptiPassed: null,
      pressureFlag: 'unknown',
      openLeakFoundAt: null,
      madeUpKg365: 0,
      eventCount: events,
      visitCount: 0,
      topUpCount: 0,
      lastEventAt,
      computeError: reason.slice(0, 300),
    },
    detail: { unitId, scoreFactors: null, detail: null },
  };
}

export function toStatsDto(row: UnitStatsRow, detail: UnitStatsDetailRow['detail'] | null): UnitStatsDto {
  return {
    computedAt: row.computedAt.toISOString(),
    rollingLeakRatePct: row.rollingLeakRatePct,
    calendarYearSharePct: row.calendarYearSharePct,
    score: row.score,
    scoreBand: row.scoreBand,
    co2eTonnes: row.co2eTonnes,
    leakCheckIntervalMonths: row.leakCheckIntervalMonths,
    lastLeakCheckAt: row.lastLeakCheckAt ? new Date(row.lastLeakCheckAt).toISOString() : null,
    nextLeakCheckDue: row.nextLeakCheckDue,
    ptiValidUntil: row.ptiValidUntil,
    ptiPassed: row.ptiPassed == null ? null : Boolean(row.ptiPassed),
    pressureFlag: row.pressureFlag,
    forecast: row.forecastDate
      ? {
          date: row.forecastDate,
          earliest: row.forecastEarliest,
          latest: row.forecastLatest,
          overdue: Boolean(row.forecastOverdue),
        }
      : null,
    detail: row.computeError ? null : ((detail as unknown as UnitStatsSummary | null) ?? null),
    computeError: row.computeError ?? null,
  };
}

/** A unit with its site's name and both parts of its stored figures; a 404 when there is no such unit. */
export async function loadUnitWithStats(db: DbOrTx, unitId: number) {
  const [row] = await db
    .select({ u: units, siteName: sites.name, stats: unitStats, detail: unitStatsDetail.detail })
    .from(units)
    .leftJoin(sites, eq(sites.id, units.siteId))
    .leftJoin(unitStats, eq(unitStats.unitId, units.id))
    .leftJoin(unitStatsDetail, eq(unitStatsDetail.unitId, units.id))
    .where(eq(units.id, unitId));
  if (!row) throw notFound('No such unit.');
  return row;
}
