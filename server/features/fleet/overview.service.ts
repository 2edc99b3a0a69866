// The fleet overview: leak-rate distribution, made-up refrigerant per month, the chronic leakers, repair
// effectiveness and leak checks coming due. Every part reads an index or a small pre-aggregated table.
import { and, asc, count, desc, eq, gt, gte, lt, lte, sql, type SQL } from 'drizzle-orm';
import { LRUCache } from 'lru-cache';
import type { Db } from '../../db/client';
import { fleetMonthly, repairEffectivenessRows, sites, units, unitStats, unitStatsDetail } from '../../db/schema';
import { co2eTonnes, type GwpBasis } from '../../../shared/domain';
import { LEAK_CHECK_DUE_DAYS, type FleetOverviewDto, type FleetOverviewQuery } from '../../../shared/schemas/fleet';
import type { AppCaches } from '../../lib/caches';
import { dayPlus, todayOf } from '../../lib/dates';
import { latestForecastAccuracy, type ForecastAccuracyInfo } from '../../lib/record/case-base';

const BIN_PCT = 10;
/** Sums of doubles carry float dust; the screen shows grams and kilograms of CO2e. */
const roundTo = (v: number, d: number) => Math.round(v * 10 ** d) / 10 ** d;
const TOP_BIN = 10; // the last bin holds 100 % and above
const CHRONIC_LIST = 10;
const DUE_LIST = 10;

/** The first month of a window of `months` months ending with the current one, as YYYY-MM. */
export function monthsBack(today: string, months: number): string[] {
  const y = Number(today.slice(0, 4));
  const m = Number(today.slice(5, 7)) - 1;
  const out: string[] = [];
  for (let k = months - 1; k >= 0; k--) {
    const d = new Date(Date.UTC(y, m - k, 1));
    out.push(d.toISOString().slice(0, 7));
  }
  return out;
}

type UnitFigures = Awaited<ReturnType<typeof readUnitFigures>>;
type FiguresContext = { db: Db; q: Pick<FleetOverviewQuery, 'siteId' | 'refrigerant'>; today: string };
type Emissions = Omit<FleetOverviewDto['emissions'], 'months'>;
type EmissionsContext = {
  db: Db;
  q: Pick<FleetOverviewQuery, 'siteId' | 'refrigerant'>;
  fromMonth: string;
  basis: GwpBasis;
};

/**
 * The parts read from every unit's statistics row (distribution, chronic leakers, leak checks due) cost a scan of
 * the fleet, so they are kept for a few seconds and shared by every request in that time; requests arriving while
 * they are being read wait for that one read. The answer says when they were taken.
 * The monthly made-up totals are kept until a write changes them: their key carries the version of fleet_monthly
 * (caches.monthlyTotals, bumped by every such write in any API process), read before the totals are, so an answer is
 * never older than the last write that committed before the request.
 */
export function createOverviewCache(ttlMs = 15_000) {
  return {
    figures: new LRUCache<string, UnitFigures & { at: Date }, FiguresContext>({
      max: 500,
      ttl: ttlMs,
      fetchMethod: async (_key, _stale, { context }) => ({
        ...(await readUnitFigures(context.db, context.q, context.today)),
        at: new Date(),
      }),
    }),
    emissions: new LRUCache<string, Emissions, EmissionsContext>({
      max: 500,
      ttl: 4 * ttlMs,
      fetchMethod: async (_key, _stale, { context }) =>
        readEmissions(context.db, context.q, context.fromMonth, context.basis),
    }),
  };
}
export type OverviewCache = ReturnType<typeof createOverviewCache>;

function unitFilters(q: FiguresContext['q']): SQL[] {
  const unitWhere: SQL[] = [];
  if (q.siteId) unitWhere.push(eq(units.siteId, q.siteId));
  if (q.refrigerant) unitWhere.push(eq(units.refrigerant, q.refrigerant));
  return unitWhere;
}

async function readUnitFigures(db: Db, q: FiguresContext['q'], today: string) {
  const unitWhere = unitFilters(q);
  const filtered = unitWhere.length > 0;
  // Compared, not divided, so that each bar holds exactly the units its fleet-table filter finds (overviewRows.bin).
  const rate = unitStats.rollingLeakRatePct;
  const bin = sql<number>`CASE WHEN ${rate} <= 0 THEN -1 ${sql.join(
    Array.from(
      { length: TOP_BIN },
      (_, i) => sql`WHEN ${rate} < ${sql.raw(String((i + 1) * BIN_PCT))} THEN ${sql.raw(String(i))}`,
    ),
    sql` `,
  )} ELSE ${sql.raw(String(TOP_BIN))} END`;
  const histogramQuery = filtered
    ? db
        .select({ bin, n: count() })
        .from(unitStats)
        .innerJoin(units, eq(units.id, unitStats.unitId))
        .where(and(...unitWhere))
        .groupBy(bin)
    : db.select({ bin, n: count() }).from(unitStats).groupBy(bin);
  const chronicQuery = db
    .select({
      unitId: units.id,
      containerNumber: units.containerNumber,
      refrigerant: units.refrigerant,
      siteName: sites.name,
      score: unitStats.score,
      scoreBand: unitStats.scoreBand,
      rate: unitStats.rollingLeakRatePct,
      factors: unitStatsDetail.scoreFactors,
    })
    .from(unitStats)
    .innerJoin(units, eq(units.id, unitStats.unitId))
    .leftJoin(sites, eq(sites.id, units.siteId))
    .leftJoin(unitStatsDetail, eq(unitStatsDetail.unitId, unitStats.unitId))
    .where(and(gt(unitStats.score, 0), sql`${units.status} <> 'retired'`, ...unitWhere))
    .orderBy(desc(unitStats.score), desc(unitStats.unitId))
    .limit(CHRONIC_LIST);

  const dueUntil = dayPlus(today, LEAK_CHECK_DUE_DAYS);
  const dueWhere = and(
    gte(unitStats.nextLeakCheckDue, today),
    lte(unitStats.nextLeakCheckDue, dueUntil),
    sql`${units.status} <> 'retired'`,
    ...unitWhere,
  );
  const dueListQuery = db
    .select({
      unitId: units.id,
      containerNumber: units.containerNumber,
      siteName: sites.name,
      due: unitStats.nextLeakCheckDue,
    })
    .from(unitStats)
    .innerJoin(units, eq(units.id, unitStats.unitId))
    .leftJoin(sites, eq(sites.id, units.siteId))
    .where(dueWhere)
    .orderBy(asc(unitStats.nextLeakCheckDue), asc(unitStats.unitId))
    .limit(DUE_LIST);
  const dueCountQuery = db
    .select({ n: count() })
    .from(unitStats)
    .innerJoin(units, eq(units.id, unitStats.unitId))
    .where(dueWhere);
  const overdueQuery = db
    .select({ n: count() })
    .from(unitStats)
    .innerJoin(units, eq(units.id, unitStats.unitId))
    .where(and(lt(unitStats.nextLeakCheckDue, today), sql`${units.status} <> 'retired'`, ...unitWhere));

  const [histogram, chronic, dueList, [dueCount], [overdue]] = await Promise.all([
    histogramQuery,
    chronicQuery,
    dueListQuery,
    dueCountQuery,
    overdueQuery,
  ]);
  return { histogram, chronic, dueList, dueCount: Number(dueCount.n), overdue: Number(overdue.n) };
}

/** Made-up kg (and t CO2e) per month from fleet_monthly, summed by site and by refrigerant. */
async function readEmissions(db: Db, q: EmissionsContext['q'], fromMonth: string, basis: GwpBasis): Promise<Emissions> {
  const monthWhere: SQL[] = [gte(fleetMonthly.month, fromMonth)];
  if (q.siteId) monthWhere.push(eq(fleetMonthly.siteId, q.siteId));
  if (q.refrigerant) monthWhere.push(eq(fleetMonthly.refrigerant, q.refrigerant));
  const rows = await db
    .select({
      month: fleetMonthly.month,
      siteId: fleetMonthly.siteId,
      siteName: sites.name,
      refrigerant: fleetMonthly.refrigerant,
      kg: fleetMonthly.madeUpKg,
    })
    .from(fleetMonthly)
    .leftJoin(sites, eq(sites.id, fleetMonthly.siteId))
    .where(and(...monthWhere))
    .orderBy(asc(fleetMonthly.month));
  // The chart stacks either by site or by refrigerant; both sums are made here so the page gets two short series.
  // A site that has gone keeps its months under its id (the name is unknown).
  const bySite = new Map<
    string,
    { month: string; site: { id: number; name: string } | null; madeUpKg: number; co2eTonnes: number }
  >();
  const byRefrigerant = new Map<string, { month: string; refrigerant: string; madeUpKg: number; co2eTonnes: number }>();
  for (const { kg, ...r } of rows) {
    const t = co2eTonnes(r.refrigerant, Math.max(0, kg), basis);
    const siteKey = `${r.month}|${r.siteId}`;
    const perSite = bySite.get(siteKey) ?? {
      month: r.month,
      site: r.siteId ? { id: r.siteId, name: r.siteName ?? `Site ${r.siteId}` } : null,
      madeUpKg: 0,
      co2eTonnes: 0,
    };
    perSite.madeUpKg += kg;
    perSite.co2eTonnes += t;
    bySite.set(siteKey, perSite);
    const gasKey = `${r.month}|${r.refrigerant}`;
    const perGas = byRefrigerant.get(gasKey) ?? {
      month: r.month,
      refrigerant: r.refrigerant,
      madeUpKg: 0,
      co2eTonnes: 0,
    };
    perGas.madeUpKg += kg;
    perGas.co2eTonnes += t;
    byRefrigerant.set(gasKey, perGas);
  }
  const rounded = <T extends { madeUpKg: number; co2eTonnes: number }>(rows: Iterable<T>) =>
    [...rows].map((r) => ({ ...r, madeUpKg: roundTo(r.madeUpKg, 3), co2eTonnes: roundTo(r.co2eTonnes, 4) }));

  return { gwpBasis: basis, bySite: rounded(bySite.values()), byRefrigerant: rounded(byRefrigerant.values()) };
}

export async function fleetOverview(
  db: Db,
  caches: Pick<AppCaches, 'settings' | 'monthlyTotals'>,
  q: FleetOverviewQuery,
  now: Date,
  cache?: OverviewCache,
): Promise<FleetOverviewDto> {
  const today = todayOf(now);
  const settings = await caches.settings.get(db);
  const months = monthsBack(today, q.months);
  const figuresQ = { siteId: q.siteId, refrigerant: q.refrigerant };
  const context: FiguresContext = { db, q: figuresQ, today };
  const figures = cache
    ? await cache.figures.fetch(JSON.stringify([today, figuresQ.siteId ?? null, figuresQ.refrigerant ?? null]), {
        context,
      })
    : { ...(await readUnitFigures(db, figuresQ, today)), at: new Date() };
  const { histogram, chronic, dueList, dueCount, overdue } = figures!;
  const basis = settings.gwpBasis;
  const emissionsContext: EmissionsContext = { db, q: figuresQ, fromMonth: months[0], basis };
  const emissionsKey = JSON.stringify([
    await caches.monthlyTotals.get(db),
    months[0],
    figuresQ.siteId ?? null,
    figuresQ.refrigerant ?? null,
    basis,
  ]);
  const [emissions, repairs, forecast] = await Promise.all([
    cache
      ? cache.emissions.fetch(emissionsKey, { context: emissionsContext })
      : readEmissions(db, figuresQ, months[0], basis),
    db.select().from(repairEffectivenessRows).orderBy(desc(repairEffectivenessRows.repairs)),
    latestForecastAccuracy(db),
  ]);

  let zero = 0;
  let total = 0;
  const bins = Array.from({ length: TOP_BIN + 1 }, (_, i) => ({
    fromPct: i * BIN_PCT,
    toPct: i === TOP_BIN ? null : (i + 1) * BIN_PCT,
    units: 0,
  }));
  for (const h of histogram) {
    const n = Number(h.n);
    total += n;
    const b = Number(h.bin);
    if (b < 0) zero += n;
    else bins[Math.min(TOP_BIN, b)].units += n;
  }

  const computedAt = repairs.length
    ? repairs.reduce((a, r) => (r.computedAt > a ? r.computedAt : a), repairs[0].computedAt)
    : null;

  return {
    asOf: today,
    figuresAt: figures!.at.toISOString(),
    units: total,
    leakRate: { zero, bins, thresholdPct: settings.leakRateThresholdPct },
    emissions: { months, ...emissions! },
    chronicLeakers: chronic.map((c) => ({
      unitId: c.unitId,
      containerNumber: c.containerNumber,
      site: c.siteName,
      refrigerant: c.refrigerant,
      score: c.score,
      scoreBand: c.scoreBand,
      rollingLeakRatePct: c.rate,
      factors: Object.entries((c.factors ?? {}) as Record<string, { points?: number; explanation?: string }>)
        .map(([name, f]) => ({ name, points: Number(f?.points ?? 0), explanation: String(f?.explanation ?? '') }))
        .sort((a, b) => b.points - a.points),
    })),
    repairEffectiveness: {
      computedAt: computedAt ? computedAt.toISOString() : null,
      holdDays: settings.windows.repairHoldDays,
      minRepairs: settings.economics.minRepairsForRate,
      rows: repairs.map((r) => ({
        location: r.location,
        action: r.action === '' ? null : r.action,
        repairs: r.repairs,
        held: r.held,
        recurred: r.recurred,
        pending: r.pending,
        holdRatePct: r.holdRatePct,
      })),
    },
    leakChecksDue: {
      days: LEAK_CHECK_DUE_DAYS,
      count: dueCount,
      overdue,
      units: dueList.map((d) => ({
        unitId: d.unitId,
        containerNumber: d.containerNumber,
        site: d.siteName,
        due: String(d.due).slice(0, 10),
      })),
    },
    forecastAccuracy: forecastAccuracyDto(forecast),
  };
}

/** The whole fleet's measured forecast accuracy (it is not split by site or refrigerant). */
function forecastAccuracyDto(info: ForecastAccuracyInfo | null): FleetOverviewDto['forecastAccuracy'] {
  const a = info?.accuracy;
  if (!info || !a) return null;
  return {
    builtAt: info.builtAt,
    cases: info.cases,
    units: info.units,
    k: a.k,
    all: {
      situation: null,
      cases: a.cases,
      open: a.open,
      maeDays: a.maeDays,
      coveragePct: a.coveragePct,
      pinballDays: a.pinballDays,
    },
    bySituation: a.bySituation.map((s) => ({ ...s })),
  };
}
