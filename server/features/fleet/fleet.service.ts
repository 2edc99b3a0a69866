// The fleet table: units ⨝ unit_stats, filtered, sorted and paged in SQL, every sort backed by an index.
import {
  and,
  asc,
  count,
  desc,
  eq,
  gt,
  gte,
  inArray,
  isNotNull,
  isNull,
  like,
  lt,
  lte,
  ne,
  or,
  sql,
  type SQL,
} from 'drizzle-orm';
import type { MySqlColumn } from 'drizzle-orm/mysql-core';
import type { Db } from '../../db/client';
import type { AppCaches } from '../../lib/caches';
import { dayPlus, todayOf } from '../../lib/dates';
import { sites, units, unitStats } from '../../db/schema';
import {
  FLEET_COUNT_CAP,
  type FleetCountDto,
  type FleetFilters,
  type FleetPageDto,
  type FleetQuery,
  type FleetRowDto,
  type FleetSort,
} from '../../../shared/schemas/fleet';

const SORT_COLUMNS: Record<FleetSort, MySqlColumn> = {
  score: unitStats.score,
  rate: unitStats.rollingLeakRatePct,
  forecast: unitStats.forecastDate,
  leakCheck: unitStats.nextLeakCheckDue,
  pti: unitStats.ptiValidUntil,
  containerNumber: units.containerNumber,
  co2e: unitStats.co2eTonnes,
};
/** The index that returns unit_stats rows in each sort's order (InnoDB appends the unit id, the tie-breaker). */
const SORT_INDEXES: Partial<Record<FleetSort, string>> = {
  score: 'unit_stats_score_idx',
  rate: 'unit_stats_rate_idx',
  forecast: 'unit_stats_forecast_idx',
  leakCheck: 'unit_stats_leak_check_idx',
  pti: 'unit_stats_pti_idx',
  co2e: 'unit_stats_co2e_idx',
};
/** Sorts whose column may be empty; empties go last in both directions. */
const NULLABLE_SORTS: ReadonlySet<FleetSort> = new Set(['forecast', 'leakCheck', 'pti']);

export function fleetWhere(f: FleetFilters, today: string): SQL[] {
  const w: SQL[] = [];
  if (f.siteId) w.push(eq(units.siteId, f.siteId));
  if (f.refrigerant) w.push(eq(units.refrigerant, f.refrigerant));
  if (f.status) w.push(eq(units.status, f.status));
  if (f.band) w.push(eq(unitStats.scoreBand, f.band));
  if (f.rateAbove !== undefined) w.push(gt(unitStats.rollingLeakRatePct, f.rateAbove));
  if (f.rateFrom !== undefined) w.push(gte(unitStats.rollingLeakRatePct, f.rateFrom));
  if (f.rateBelow !== undefined) w.push(lt(unitStats.rollingLeakRatePct, f.rateBelow));
  if (f.rateAtMost !== undefined) w.push(lte(unitStats.rollingLeakRatePct, f.rateAtMost));
  if (f.forecastDays !== undefined) w.push(lte(unitStats.forecastDate, dayPlus(today, f.forecastDays)));
  if (f.forecastOverdue) w.push(lt(unitStats.forecastDate, today));
  // A retired unit's leak check is not due (the overview and My day leave retired units out the same way).
  if (f.leakCheckOverdue) w.push(lt(unitStats.nextLeakCheckDue, today), ne(units.status, 'retired'));
  if (f.leakCheckDueDays !== undefined)
    w.push(
      gte(unitStats.nextLeakCheckDue, today),
      lte(unitStats.nextLeakCheckDue, dayPlus(today, f.leakCheckDueDays)),
      ne(units.status, 'retired'),
    );
  if (f.ptiExpired) w.push(or(isNull(unitStats.ptiValidUntil), lt(unitStats.ptiValidUntil, today))!);
  if (f.quarantined)
    w.push(
      sql`EXISTS (SELECT 1 FROM unit_depot_state d WHERE d.unit_id = ${units.id} AND d.quarantined_since IS NOT NULL)`,
    );
  // My day's groups (server/features/day): the same conditions, retired units left out as there.
  const active = ne(units.status, 'retired');
  if (f.recheckDue)
    w.push(
      sql`EXISTS (SELECT 1 FROM unit_depot_state d WHERE d.unit_id = ${units.id} AND d.recheck_due <= ${today})`,
      active,
    );
  if (f.openLeak) w.push(isNotNull(unitStats.openLeakFoundAt), active);
  if (f.ptiExpiredDays !== undefined)
    w.push(gte(unitStats.ptiValidUntil, dayPlus(today, -f.ptiExpiredDays)), lt(unitStats.ptiValidUntil, today), active);
  if (f.ptiExpiringDays !== undefined)
    w.push(
      gte(unitStats.ptiValidUntil, today),
      lte(unitStats.ptiValidUntil, dayPlus(today, f.ptiExpiringDays)),
      active,
    );
  if (f.forecastRangeDays !== undefined)
    w.push(
      lte(unitStats.forecastEarliest, dayPlus(today, f.forecastRangeDays)),
      or(isNull(unitStats.forecastLatest), gte(unitStats.forecastLatest, today))!,
      active,
    );
  // A prefix LIKE on the unique index; the normalised query has letters and digits only, so no wildcard escapes.
  if (f.q) w.push(like(units.containerNumber, `${f.q}%`));
  return w;
}

const hasRateFilters = (f: FleetFilters) =>
  f.rateAbove !== undefined || f.rateFrom !== undefined || f.rateBelow !== undefined || f.rateAtMost !== undefined;

const hasDayFilters = (f: FleetFilters) =>
  Boolean(f.recheckDue || f.openLeak) ||
  f.ptiExpiredDays !== undefined ||
  f.ptiExpiringDays !== undefined ||
  f.forecastRangeDays !== undefined;

const hasFilters = (f: FleetFilters) =>
  Boolean(
    f.siteId ||
    f.refrigerant ||
    f.status ||
    f.band ||
    f.q ||
    f.forecastOverdue ||
    f.leakCheckOverdue ||
    f.ptiExpired ||
    f.quarantined,
  ) ||
  hasRateFilters(f) ||
  f.forecastDays !== undefined ||
  f.leakCheckDueDays !== undefined ||
  hasDayFilters(f);

const rowFields = {
  unitId: units.id,
  containerNumber: units.containerNumber,
  refrigerant: units.refrigerant,
  nominalChargeKg: units.nominalChargeKg,
  status: units.status,
  siteId: sites.id,
  siteCode: sites.code,
  siteName: sites.name,
  score: unitStats.score,
  scoreBand: unitStats.scoreBand,
  rollingLeakRatePct: unitStats.rollingLeakRatePct,
  co2eTonnes: unitStats.co2eTonnes,
  forecastDate: unitStats.forecastDate,
  nextLeakCheckDue: unitStats.nextLeakCheckDue,
  ptiValidUntil: unitStats.ptiValidUntil,
  ptiPassed: unitStats.ptiPassed,
  pressureFlag: unitStats.pressureFlag,
  lastEventAt: unitStats.lastEventAt,
  computeError: unitStats.computeError,
};
/** Column order of a CSV/stream row (rowsAsArray follows the select list). */
export const ROW_FIELD_NAMES = Object.keys(rowFields) as (keyof typeof rowFields)[];

type RawRow = {
  unitId: number;
  containerNumber: string;
  refrigerant: string;
  nominalChargeKg: number;
  status: FleetRowDto['status'];
  siteId: number | null;
  siteCode: string | null;
  siteName: string | null;
  score: number;
  scoreBand: FleetRowDto['scoreBand'];
  rollingLeakRatePct: number;
  co2eTonnes: number;
  forecastDate: string | Date | null;
  nextLeakCheckDue: string | Date | null;
  ptiValidUntil: string | Date | null;
  ptiPassed: boolean | number | null;
  pressureFlag: FleetRowDto['pressureFlag'];
  lastEventAt: Date | string | null;
  computeError: string | null;
};

const dayText = (v: string | Date | null): string | null =>
  v == null ? null : typeof v === 'string' ? v.slice(0, 10) : v.toISOString().slice(0, 10);

export function toFleetRow(r: RawRow, today: string): FleetRowDto {
  const forecastDate = dayText(r.forecastDate);
  const nextLeakCheckDue = dayText(r.nextLeakCheckDue);
  const ptiValidUntil = dayText(r.ptiValidUntil);
  return {
    unitId: r.unitId,
    containerNumber: r.containerNumber,
    refrigerant: r.refrigerant,
    nominalChargeKg: r.nominalChargeKg,
    status: r.status,
    site: r.siteId != null ? { id: r.siteId, code: r.siteCode ?? '', name: r.siteName ?? '' } : null,
    score: r.score,
    scoreBand: r.scoreBand,
    rollingLeakRatePct: r.rollingLeakRatePct,
    co2eTonnes: r.co2eTonnes,
    forecastDate,
    forecastOverdue: forecastDate !== null && forecastDate < today,
    nextLeakCheckDue,
    leakCheckOverdue: nextLeakCheckDue !== null && nextLeakCheckDue < today,
    ptiValidUntil,
    ptiValid: ptiValidUntil !== null && ptiValidUntil >= today,
    pressureFlag: r.pressureFlag,
    lastEventAt: r.lastEventAt == null ? null : new Date(r.lastEventAt).toISOString(),
    computeError: r.computeError ?? null,
  };
}

/** The select of one part of the list; `nulls` picks the rows with or without a value in a nullable sort column. */
type ListPart = Pick<FleetQuery, 'sort' | 'dir'> & FleetFilters;

function partWhere(q: ListPart, today: string, nulls?: 'only' | 'none'): SQL[] {
  const col = SORT_COLUMNS[q.sort];
  const where = fleetWhere(q, today);
  if (nulls === 'only') where.push(isNull(col));
  if (nulls === 'none') where.push(isNotNull(col));
  return where;
}

function partOrder(q: ListPart, nulls?: 'only' | 'none') {
  const order = q.dir === 'asc' ? asc : desc;
  // Ties broken by the unit id in the same direction, so the (column, unit_id) index order serves the sort.
  if (nulls === 'only') return [order(unitStats.unitId)];
  if (q.sort === 'containerNumber') return [order(units.containerNumber)];
  return [order(SORT_COLUMNS[q.sort]), order(unitStats.unitId)];
}

export function fleetSelect(
  db: Db,
  q: ListPart,
  today: string,
  nulls?: 'only' | 'none',
  forceSortIndex = false,
  onlyIds?: number[],
) {
  const where = partWhere(q, today, nulls);
  if (onlyIds) where.push(inArray(unitStats.unitId, onlyIds));
  const index = forceSortIndex && nulls !== 'only' ? SORT_INDEXES[q.sort] : undefined;
  return db
    .select(rowFields)
    .from(unitStats, index ? { forceIndex: index } : undefined)
    .innerJoin(units, eq(units.id, unitStats.unitId))
    .leftJoin(sites, eq(sites.id, units.siteId))
    .where(where.length ? and(...where) : undefined)
    .orderBy(...partOrder(q, nulls))
    .$dynamic();
}

/**
 * One page of one part of the list. Walking a sort index, or reading the few units a narrow filter on the unit
 * keeps and sorting them, the unit ids come first (the unit row is read only for its filters, from its own index),
 * then the page's rows: a deep page or a number search reads and sorts (sort key, id) pairs instead of whole rows
 * joined with their sites (a search keeping 1 % of 100,000 units: ~7 ms → ~3 ms in MariaDB).
 */
async function fleetPart(
  db: Db,
  q: ListPart,
  today: string,
  nulls: 'only' | 'none' | undefined,
  force: boolean,
  limit: number,
  offset: number,
): Promise<RawRow[]> {
  const index = force && nulls !== 'only' ? SORT_INDEXES[q.sort] : undefined;
  if (!index && !hasUnitFilters(q))
    return (await fleetSelect(db, q, today, nulls).limit(limit).offset(offset)) as RawRow[];
  const where = partWhere(q, today, nulls);
  const walk = db
    .select({ id: unitStats.unitId })
    .from(unitStats, index ? { forceIndex: index } : undefined)
    .$dynamic();
  const ids = await (hasUnitFilters(q) ? walk.innerJoin(units, eq(units.id, unitStats.unitId)) : walk)
    .where(where.length ? and(...where) : undefined)
    .orderBy(...partOrder(q, nulls))
    .limit(limit)
    .offset(offset);
  if (!ids.length) return [];
  return (await fleetSelect(
    db,
    q,
    today,
    nulls,
    false,
    ids.map((r) => r.id),
  )) as RawRow[];
}

const hasStatsFilters = (f: FleetFilters) =>
  Boolean(f.band || f.forecastOverdue || f.leakCheckOverdue || f.ptiExpired || f.quarantined) ||
  hasRateFilters(f) ||
  f.forecastDays !== undefined ||
  f.leakCheckDueDays !== undefined ||
  hasDayFilters(f);
/**
 * Filters that read the unit's row (the leak-check and My day ones read its status, retired units have nothing due;
 * quarantine looks up its depot state by the unit's id).
 */
const hasUnitFilters = (f: FleetFilters) =>
  Boolean(f.siteId || f.refrigerant || f.status || f.q || f.leakCheckOverdue || f.quarantined) ||
  f.leakCheckDueDays !== undefined ||
  hasDayFilters(f);

/** What the fleet table keeps between requests (the app's caches). */
export type FleetCaches = Pick<AppCaches, 'fleetSize' | 'filterShares'>;
/** Below this share, reading the filter's own index and sorting the few rows beats walking the sort index. */
const WIDE_FILTER_SHARE = 0.02;

async function unitFilterShare(db: Db, shares: FleetCaches['filterShares'], f: FleetFilters): Promise<number> {
  const key = JSON.stringify([f.siteId, f.refrigerant, f.status, f.q]);
  const hit = shares.get(key);
  if (hit !== undefined) return hit;
  const w: SQL[] = [];
  if (f.siteId) w.push(eq(units.siteId, f.siteId));
  if (f.refrigerant) w.push(eq(units.refrigerant, f.refrigerant));
  if (f.status) w.push(eq(units.status, f.status));
  if (f.q) w.push(like(units.containerNumber, `${f.q}%`));
  const [[{ n }], [{ total }]] = await Promise.all([
    db
      .select({ n: count() })
      .from(units)
      .where(and(...w)),
    db.select({ total: count() }).from(units),
  ]);
  const share = Number(total) ? Number(n) / Number(total) : 1;
  shares.set(key, share);
  return share;
}

/**
 * Whether to walk the sort column's index (and stop after one page) rather than let the optimizer read a filter's
 * rows and sort them. MariaDB picks the filesort for a site filter or a deep page, which is slow on a big fleet;
 * with only wide filters on the unit, the sort index reaches a page after a few hundred rows.
 */
export async function shouldForceSortIndex(
  db: Db,
  caches: FleetCaches,
  q: Pick<FleetQuery, 'sort'> & FleetFilters,
): Promise<boolean> {
  if (!SORT_INDEXES[q.sort] || hasStatsFilters(q)) return false;
  if (!hasUnitFilters(q)) return true;
  return (await unitFilterShare(db, caches.filterShares, q)) >= WIDE_FILTER_SHARE;
}

export async function countFleet(db: Db, caches: FleetCaches, f: FleetFilters, today: string): Promise<FleetCountDto> {
  if (!hasFilters(f)) return { total: await caches.fleetSize.get(db), capped: false };
  const where = fleetWhere(f, today);
  // Count at most one past the cap: the screen says "more than 10,000" instead of scanning the whole fleet. Each
  // side's filters alone are counted on that table's own indexes, without the join (every unit has its statistics
  // row: registration writes it, and the scheduler fills in units loaded past the API).
  const onStats = db
    .select({ one: sql`1` })
    .from(unitStats)
    .$dynamic();
  const matches = !hasStatsFilters(f)
    ? db
        .select({ one: sql`1` })
        .from(units)
        .$dynamic()
    : hasUnitFilters(f)
      ? onStats.innerJoin(units, eq(units.id, unitStats.unitId))
      : onStats;
  const inner = matches
    .where(and(...where))
    .limit(FLEET_COUNT_CAP + 1)
    .as('matches');
  const [{ n }] = await db.select({ n: count() }).from(inner);
  const total = Number(n);
  return total > FLEET_COUNT_CAP ? { total: FLEET_COUNT_CAP, capped: true } : { total, capped: false };
}

export async function listFleet(db: Db, caches: FleetCaches, q: FleetQuery, now: Date): Promise<FleetPageDto> {
  const today = todayOf(now);
  const offset = (q.page - 1) * q.pageSize;
  const limit = q.pageSize + 1;
  const force = await shouldForceSortIndex(db, caches, q);
  let rows: RawRow[];
  if (NULLABLE_SORTS.has(q.sort) && q.dir === 'asc') {
    // Ascending, MariaDB puts empty values first; read the filled ones first and the empty ones after them.
    const filled = await fleetPart(db, q, today, 'none', force, limit, offset);
    rows = filled;
    if (filled.length < limit) {
      let filledTotal = offset + filled.length;
      if (filled.length === 0 && offset > 0) {
        const [{ n }] = await db
          .select({ n: count() })
          .from(unitStats)
          .innerJoin(units, eq(units.id, unitStats.unitId))
          .where(and(...fleetWhere(q, today), isNotNull(SORT_COLUMNS[q.sort])));
        filledTotal = Number(n);
      }
      const empty = await fleetPart(
        db,
        q,
        today,
        'only',
        false,
        limit - filled.length,
        Math.max(0, offset - filledTotal),
      );
      rows = [...filled, ...empty];
    }
  } else {
    rows = await fleetPart(db, q, today, undefined, force, limit, offset);
  }
  const hasMore = rows.length > q.pageSize;
  const page: FleetPageDto = {
    rows: rows.slice(0, q.pageSize).map((r) => toFleetRow(r, today)),
    page: q.page,
    pageSize: q.pageSize,
    hasMore,
    asOf: today,
  };
  if (q.count) page.count = await countFleet(db, caches, q, today);
  return page;
}
