// My day: the units at a site that need something today, grouped by urgency; and one unit's depot state (re-checks,
// quarantine, whether its PTI allows release). Reads only: the rows come from unit_stats and unit_depot_state, which
// the unit write path keeps.
import { and, asc, count, desc, eq, gte, isNotNull, isNull, lt, lte, ne, or, type SQL } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { sites, unitDepotState, units, unitStats, visits } from '../../db/schema';
import { notFound } from '../../lib/http-error';
import { depotStateOf, loadDepotHistory } from '../../lib/record/depot-state';
import type { SessionUser } from '../../lib/session';
import { dayOf, isoDate } from '../../../shared/domain/dates';
import { ptiBlockers } from '../../../shared/domain/pti';
import { recheckWords } from '../../../shared/domain/rechecks';
import { leakCheckDueShort, repairRecheckShort, type SiteRule } from '../../../shared/domain/rule-words';
import {
  DAY_AHEAD,
  DAY_GROUP_LIMIT,
  DAY_GROUPS,
  type DayAction,
  type DayDto,
  type DayGroupId,
  type DayRowDto,
  type UnitDepotDto,
} from '../../../shared/schemas/day';
import { DEFAULT_SETTINGS, type Settings } from '../../../shared/schemas/settings';
import { fmtIsoDay } from '../../../shared/format-dates';

const dayPlus = (today: string, n: number) => isoDate(dayOf(Date.parse(`${today}T00:00:00Z`)) + n);

export async function unitDepot(db: Db, unitId: number, now: Date, settings: Settings): Promise<UnitDepotDto> {
  const [row] = await db
    .select({ unit: units, stats: unitStats })
    .from(units)
    .leftJoin(unitStats, eq(unitStats.unitId, units.id))
    .where(eq(units.id, unitId));
  if (!row) throw notFound('No such unit.');
  const { unit, stats } = row;
  const state = depotStateOf(unit, await loadDepotHistory(db, unitId), now, settings);
  const withWords = <T extends Parameters<typeof recheckWords>[0]>(c: T) => ({ ...c, words: recheckWords(c) });
  const today = now.toISOString().slice(0, 10);
  const q = state.quarantine;
  const passedAndCurrent = Boolean(stats?.ptiPassed) && stats?.ptiValidUntil != null && stats.ptiValidUntil >= today;
  const invalidBecause = q
    ? 'The unit is in quarantine: its PTI does not count until an engineer lifts the quarantine.'
    : !stats?.ptiValidUntil
      ? 'No PTI recorded.'
      : !stats.ptiPassed
        ? 'The latest PTI did not pass.'
        : stats.ptiValidUntil < today
          ? `The PTI expired on ${fmtIsoDay(stats.ptiValidUntil)}.`
          : null;
  return {
    rechecks: state.rechecks.rechecks.map(withWords),
    openRecheck: state.rechecks.open ? withWords(state.rechecks.open) : null,
    missedRechecks365: state.rechecks.missed365,
    quarantine: q,
    pti: {
      validUntil: stats?.ptiValidUntil ?? null,
      passed: stats?.ptiPassed == null ? null : Boolean(stats.ptiPassed),
      valid: passedAndCurrent && !q,
      invalidBecause,
      blockers: ptiBlockers({
        openLeakFoundAt: stats?.openLeakFoundAt ? stats.openLeakFoundAt.toISOString() : null,
        pressureFlag: stats?.pressureFlag ?? 'unknown',
        quarantined: q != null,
      }),
    },
  };
}

type GroupSpec = {
  where: SQL;
  order: SQL[];
  row: (r: GroupRow) => { why: string; dueOn: string | null; action: DayAction };
};
type GroupRow = {
  unitId: number;
  containerNumber: string;
  nextLeakCheckDue: string | null;
  leakCheckIntervalMonths: number | null;
  ptiValidUntil: string | null;
  openLeakFoundAt: Date | null;
  forecastDate: string | null;
  forecastEarliest: string | null;
  forecastLatest: string | null;
  recheckDue: string | null;
  recheckReason: 'top_up' | 'repair' | null;
  quarantinedSince: Date | null;
  quarantineReason: string | null;
};

/** The words of each row follow the site's leak-check rule (its own, else the fleet's policy). */
function groupSpecs(today: string, rule: SiteRule, settings: Settings): Record<DayGroupId, GroupSpec> {
  const leakCheckWhy = (r: GroupRow) =>
    leakCheckDueShort(rule, { dueOn: r.nextLeakCheckDue!, today, intervalMonths: r.leakCheckIntervalMonths });
  const s = unitStats;
  const d = unitDepotState;
  return {
    quarantine: {
      where: isNotNull(d.quarantinedSince),
      order: [asc(d.quarantinedSince)],
      row: (r) => ({
        why: `In quarantine since ${fmtIsoDay(r.quarantinedSince!.toISOString().slice(0, 10))}: ${r.quarantineReason ?? ''}. Not to be released.`,
        dueOn: null,
        action: 'quarantine',
      }),
    },
    recheck: {
      where: lte(d.recheckDue, today),
      order: [asc(d.recheckDue)],
      row: (r) => ({
        why:
          r.recheckReason === 'repair'
            ? `Leak check after a repair${r.recheckDue! < today ? `, overdue since ${fmtIsoDay(r.recheckDue!)}` : ', due today'} — ${repairRecheckShort(rule, settings.rechecks.afterRepairDays)}.`
            : `Re-check after a top-up: see that the charge held${r.recheckDue! < today ? ` (was due ${fmtIsoDay(r.recheckDue!)})` : ' (due today)'}.`,
        dueOn: r.recheckDue,
        action: r.recheckReason === 'repair' ? 'leak_check' : 'pressure',
      }),
    },
    leak_check_overdue: {
      where: lt(s.nextLeakCheckDue, today),
      order: [asc(s.nextLeakCheckDue)],
      row: (r) => ({
        why: leakCheckWhy(r),
        dueOn: r.nextLeakCheckDue,
        action: 'leak_check',
      }),
    },
    open_leak: {
      where: isNotNull(s.openLeakFoundAt),
      order: [asc(s.openLeakFoundAt)],
      row: (r) => ({
        why: `Leak found on ${fmtIsoDay(r.openLeakFoundAt!.toISOString().slice(0, 10))} and not repaired yet.`,
        dueOn: null,
        action: 'repair',
      }),
    },
    pti_expired: {
      where: and(gte(s.ptiValidUntil, dayPlus(today, -30)), lt(s.ptiValidUntil, today))!,
      order: [desc(s.ptiValidUntil)],
      row: (r) => ({
        why: `PTI expired on ${fmtIsoDay(r.ptiValidUntil!)}: a new PTI before release.`,
        dueOn: r.ptiValidUntil,
        action: 'pti',
      }),
    },
    leak_check_due: {
      where: and(gte(s.nextLeakCheckDue, today), lte(s.nextLeakCheckDue, dayPlus(today, DAY_AHEAD.leakCheckDays)))!,
      order: [asc(s.nextLeakCheckDue)],
      row: (r) => ({
        why: leakCheckWhy(r),
        dueOn: r.nextLeakCheckDue,
        action: 'leak_check',
      }),
    },
    pti_expiring: {
      where: and(gte(s.ptiValidUntil, today), lte(s.ptiValidUntil, dayPlus(today, DAY_AHEAD.ptiDays)))!,
      order: [asc(s.ptiValidUntil)],
      row: (r) => ({
        why: `PTI valid until ${fmtIsoDay(r.ptiValidUntil!)}: renew it if the unit goes out after that.`,
        dueOn: r.ptiValidUntil,
        action: 'pti',
      }),
    },
    forecast: {
      where: and(
        lte(s.forecastEarliest, dayPlus(today, DAY_AHEAD.forecastDays)),
        or(isNull(s.forecastLatest), gte(s.forecastLatest, today)),
      )!,
      order: [asc(s.forecastDate)],
      row: (r) => ({
        why: `Top-up forecast around ${fmtIsoDay(r.forecastDate!)} (range ${r.forecastEarliest ? fmtIsoDay(r.forecastEarliest) : '?'} to ${r.forecastLatest ? fmtIsoDay(r.forecastLatest) : '?'}): check the charge.`,
        dueOn: r.forecastDate,
        action: 'pressure',
      }),
    },
  };
}

/** The site My day shows: the one asked for, else where the person last recorded work. */
async function siteFor(db: Db, user: SessionUser, siteId: number | undefined) {
  let id = siteId;
  if (id == null) {
    const [last] = await db
      .select({ siteId: visits.siteId })
      .from(visits)
      .where(and(eq(visits.recordedBy, user.id), isNotNull(visits.siteId)))
      .orderBy(desc(visits.id))
      .limit(1);
    id = last?.siteId ?? undefined;
  }
  if (id == null) return null;
  const [site] = await db
    .select({ id: sites.id, name: sites.name, code: sites.code })
    .from(sites)
    .where(eq(sites.id, id));
  if (!site) throw notFound('No such site.');
  return site;
}

export async function myDay(
  db: Db,
  user: SessionUser,
  siteId: number | undefined,
  now: Date,
  // The seed counts rows only; the API passes the settings in force.
  settings: Settings = DEFAULT_SETTINGS,
): Promise<DayDto> {
  const today = now.toISOString().slice(0, 10);
  const site = await siteFor(db, user, siteId);
  const allSites = await db.select({ id: sites.id, name: sites.name }).from(sites).orderBy(asc(sites.name));
  if (!site) return { site: null, sites: allSites, today, groups: [] };
  const [{ jurisdiction }] = await db
    .select({ jurisdiction: sites.jurisdiction })
    .from(sites)
    .where(eq(sites.id, site.id));
  const specs = groupSpecs(today, jurisdiction ?? settings.policy, settings);
  const base = and(eq(units.siteId, site.id), ne(units.status, 'retired'));
  const groups = [];
  for (const g of DAY_GROUPS) {
    const spec = specs[g.id];
    const from = () =>
      db
        .select({
          unitId: units.id,
          containerNumber: units.containerNumber,
          nextLeakCheckDue: unitStats.nextLeakCheckDue,
          leakCheckIntervalMonths: unitStats.leakCheckIntervalMonths,
          ptiValidUntil: unitStats.ptiValidUntil,
          openLeakFoundAt: unitStats.openLeakFoundAt,
          forecastDate: unitStats.forecastDate,
          forecastEarliest: unitStats.forecastEarliest,
          forecastLatest: unitStats.forecastLatest,
          recheckDue: unitDepotState.recheckDue,
          recheckReason: unitDepotState.recheckReason,
          quarantinedSince: unitDepotState.quarantinedSince,
          quarantineReason: unitDepotState.quarantineReason,
        })
        .from(units)
        .innerJoin(unitStats, eq(unitStats.unitId, units.id))
        .leftJoin(unitDepotState, eq(unitDepotState.unitId, units.id))
        .where(and(base, spec.where));
    const rows = (await from()
      .orderBy(...spec.order, asc(units.containerNumber))
      .limit(DAY_GROUP_LIMIT)) as GroupRow[];
    const [{ n }] = await db
      .select({ n: count() })
      .from(units)
      .innerJoin(unitStats, eq(unitStats.unitId, units.id))
      .leftJoin(unitDepotState, eq(unitDepotState.unitId, units.id))
      .where(and(base, spec.where));
    groups.push({
      id: g.id,
      label: g.label,
      total: Number(n),
      rows: rows.map((r): DayRowDto => ({ unitId: r.unitId, containerNumber: r.containerNumber, ...spec.row(r) })),
    });
  }
  return { site, sites: allSites, today, groups };
}
