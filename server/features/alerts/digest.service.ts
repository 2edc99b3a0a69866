// The once-a-day mails: a digest per engineer for the sites they follow, alerts for leaks left open too long and for
// re-checks due or missed. Days are written the app's way (4 Mar 2026); leak checks in the words of each site's rule.
import { and, asc, count, eq, gte, inArray, isNotNull, lt, lte, ne, sql, type SQL } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { events, mailOutbox, sites, unitDepotState, units, unitStats } from '../../db/schema';
import { can } from '../../../shared/permissions';
import { formatContainerNumber } from '../../../shared/domain/container-number';
import { dayOf, isoDate, MS_PER_DAY } from '../../../shared/domain/dates';
import { leakCheckRuleShort, type SiteRule } from '../../../shared/domain/rule-words';
import { fmtIsoDay } from '../../../shared/format-dates';
import type { Settings } from '../../../shared/schemas/settings';
import { queueRecheckAlerts, RECHECK_MISSED_ALERT_DAYS } from '../../lib/record/recheck-alerts';
import { writeUnit } from '../../lib/record/write-path';
import { followersOf } from '../../lib/alert-recipients';
import { enqueueMail } from '../../lib/mail/outbox';
import { renderMail, type MailSection } from '../../lib/mail/layout';
import {
  OPEN_LEAK_ALERT_DAYS,
  queueOpenLeakAlert,
  subscriptionFooter,
  type AlertContext,
} from '../../lib/record/alerts';

export const DIGEST_LEAK_CHECK_DAYS = 30;
export const DIGEST_FORECAST_DAYS = 14;
export const DIGEST_PTI_DAYS = 7;
/** Rows per section; the rest is counted and left to the app. */
export const DIGEST_SECTION_LIMIT = 25;

const dayPlus = (asOf: Date, days: number) => isoDate(dayOf(asOf.getTime()) + days);

/** The line under a full section: how many more units it holds than it lists (counted only then). */
async function moreLine(found: number, countAll: () => Promise<{ n: number }[]>): Promise<string | undefined> {
  if (found <= DIGEST_SECTION_LIMIT) return undefined;
  const [{ n }] = await countAll();
  return `…and ${n - DIGEST_SECTION_LIMIT} more in Tightloop.`;
}

async function section(
  db: Db,
  ctx: AlertContext,
  siteIds: number[],
  heading: string,
  where: SQL,
  order: SQL | typeof unitStats.nextLeakCheckDue,
  detail: (s: typeof unitStats.$inferSelect, site: { name: string; rule: SiteRule }) => string,
  settings: Settings,
): Promise<MailSection | null> {
  const scope = and(inArray(units.siteId, siteIds), ne(units.status, 'retired'), where);
  const rows = await db
    .select({ unit: units, stats: unitStats, siteName: sites.name, jurisdiction: sites.jurisdiction })
    .from(unitStats)
    .innerJoin(units, eq(units.id, unitStats.unitId))
    .innerJoin(sites, eq(sites.id, units.siteId))
    .where(scope)
    .orderBy(order, asc(units.containerNumber))
    .limit(DIGEST_SECTION_LIMIT + 1);
  if (rows.length === 0) return null;
  const more = await moreLine(rows.length, () =>
    db.select({ n: count() }).from(unitStats).innerJoin(units, eq(units.id, unitStats.unitId)).where(scope),
  );
  return {
    heading,
    rows: rows.slice(0, DIGEST_SECTION_LIMIT).map((r) => ({
      label: formatContainerNumber(r.unit.containerNumber),
      detail: detail(r.stats, { name: r.siteName, rule: r.jurisdiction ?? settings.policy }),
      url: `${ctx.publicUrl}/units/${r.unit.id}`,
    })),
    more,
  };
}

/** Open re-checks due today or missed at these sites (the unit's depot state), most overdue first. */
async function recheckSection(
  db: Db,
  ctx: AlertContext,
  siteIds: number[],
  today: string,
): Promise<MailSection | null> {
  const scope = and(inArray(units.siteId, siteIds), ne(units.status, 'retired'), lte(unitDepotState.recheckDue, today));
  const rows = await db
    .select({
      unitId: units.id,
      containerNumber: units.containerNumber,
      siteName: sites.name,
      reason: unitDepotState.recheckReason,
      dueOn: unitDepotState.recheckDue,
      sourceAt: events.occurredAt,
    })
    .from(unitDepotState)
    .innerJoin(units, eq(units.id, unitDepotState.unitId))
    .innerJoin(sites, eq(sites.id, units.siteId))
    .innerJoin(events, eq(events.id, unitDepotState.recheckSourceEventId))
    .where(scope)
    .orderBy(asc(unitDepotState.recheckDue), asc(units.containerNumber))
    .limit(DIGEST_SECTION_LIMIT + 1);
  if (rows.length === 0) return null;
  const more = await moreLine(rows.length, () =>
    db.select({ n: count() }).from(unitDepotState).innerJoin(units, eq(units.id, unitDepotState.unitId)).where(scope),
  );
  return {
    heading: 'Re-checks due or missed',
    rows: rows.slice(0, DIGEST_SECTION_LIMIT).map((r) => ({
      label: formatContainerNumber(r.containerNumber),
      detail:
        `${r.reason === 'repair' ? 'leak check after the repair' : 're-check after the top-up'} of ` +
        `${fmtIsoDay(isoDate(dayOf(r.sourceAt.getTime())))}, ` +
        `${r.dueOn === today ? 'due today' : `missed (due ${fmtIsoDay(r.dueOn)})`} · ${r.siteName}`,
      url: `${ctx.publicUrl}/units/${r.unitId}`,
    })),
    more,
  };
}

async function digestSections(db: Db, ctx: AlertContext, siteIds: number[], asOf: Date): Promise<MailSection[]> {
  const today = dayPlus(asOf, 0);
  const settings = await ctx.caches.settings.get(db);
  const found = await Promise.all([
    recheckSection(db, ctx, siteIds, today),
    section(
      db,
      ctx,
      siteIds,
      `Leak checks due within ${DIGEST_LEAK_CHECK_DAYS} days or overdue`,
      lte(unitStats.nextLeakCheckDue, dayPlus(asOf, DIGEST_LEAK_CHECK_DAYS)),
      asc(unitStats.nextLeakCheckDue),
      (s, site) =>
        `${s.nextLeakCheckDue! < today ? 'overdue since' : 'due'} ${fmtIsoDay(s.nextLeakCheckDue)} · ` +
        `${leakCheckRuleShort(site.rule, s.leakCheckIntervalMonths)} · ${site.name}`,
      settings,
    ),
    section(
      db,
      ctx,
      siteIds,
      `Top-ups forecast within ${DIGEST_FORECAST_DAYS} days`,
      lte(unitStats.forecastDate, dayPlus(asOf, DIGEST_FORECAST_DAYS)),
      asc(unitStats.forecastDate),
      (s, site) =>
        `${s.forecastDate! < today || s.forecastOverdue ? 'expected already, since' : 'around'} ${fmtIsoDay(s.forecastDate)}` +
        `${s.forecastEarliest && s.forecastLatest ? ` (${fmtIsoDay(s.forecastEarliest)} – ${fmtIsoDay(s.forecastLatest)})` : ''} · ${site.name}`,
      settings,
    ),
    section(
      db,
      ctx,
      siteIds,
      `PTIs running out within ${DIGEST_PTI_DAYS} days`,
      and(gte(unitStats.ptiValidUntil, today), lte(unitStats.ptiValidUntil, dayPlus(asOf, DIGEST_PTI_DAYS)))!,
      asc(unitStats.ptiValidUntil),
      (s, site) => `PTI valid until ${fmtIsoDay(s.ptiValidUntil)} · ${site.name}`,
      settings,
    ),
  ]);
  return found.filter((s): s is MailSection => s != null);
}

/** Queues today's digest for every person who follows it at some site (once per person and day). */
export async function queueDailyDigest(db: Db, ctx: AlertContext, asOf: Date): Promise<number> {
  const today = dayPlus(asOf, 0);
  const subs = await followersOf(db, 'digest', asOf);
  const people = new Map<string, { email: string; siteIds: number[]; siteNames: string[] }>();
  for (const s of subs) {
    if (!can(s, 'view:fleet')) continue;
    const p = people.get(s.userId) ?? { email: s.email, siteIds: [], siteNames: [] };
    p.siteIds.push(s.siteId);
    p.siteNames.push(s.siteName);
    people.set(s.userId, p);
  }
  if (people.size === 0) return 0;
  const keyOf = (userId: string) => `digest:${userId}:${today}`;
  const done = new Set(
    (
      await db
        .select({ key: mailOutbox.dedupeKey })
        .from(mailOutbox)
        .where(inArray(mailOutbox.dedupeKey, [...people.keys()].map(keyOf)))
    ).map((r) => r.key),
  );

  let queued = 0;
  for (const [userId, p] of people) {
    if (done.has(keyOf(userId))) continue;
    const sections = await digestSections(db, ctx, p.siteIds, asOf);
    if (sections.length === 0) continue;
    const where = p.siteNames.length === 1 ? p.siteNames[0] : `${p.siteNames.length} sites`;
    const subject = `Tightloop daily digest for ${where}, ${fmtIsoDay(today)}`;
    await db.transaction(async (tx) => {
      const { stopUrl, footer } = await subscriptionFooter(tx, ctx, userId, 'digest', p.siteNames.join(', '));
      const mail = renderMail({
        heading: subject,
        paragraphs: ['What needs planning at the sites you follow. Each unit links to its record.'],
        action: { label: 'Open Tightloop', url: `${ctx.publicUrl}/` },
        sections,
        footer,
      });
      const inserted = await enqueueMail(
        tx,
        {
          dedupeKey: keyOf(userId),
          kind: 'digest',
          to: p.email,
          subject,
          ...mail,
          headers: { 'List-Unsubscribe': `<${stopUrl}>` },
        },
        asOf,
      );
      if (inserted) queued++;
    });
  }
  return queued;
}

/** Leaks found more than the allowed days ago and not repaired, at sites someone follows for this alert. */
export async function queueOverdueLeakAlerts(db: Db, ctx: AlertContext, asOf: Date): Promise<number> {
  const followed = [...new Set((await followersOf(db, 'open_leak', asOf)).map((f) => f.siteId))];
  if (followed.length === 0) return 0;
  const rows = await db
    .select({
      id: units.id,
      containerNumber: units.containerNumber,
      siteId: units.siteId,
      foundAt: unitStats.openLeakFoundAt,
    })
    .from(unitStats)
    .innerJoin(units, eq(units.id, unitStats.unitId))
    .where(
      and(
        isNotNull(unitStats.openLeakFoundAt),
        lte(unitStats.openLeakFoundAt, new Date(asOf.getTime() - OPEN_LEAK_ALERT_DAYS * MS_PER_DAY)),
        ne(units.status, 'retired'),
        inArray(units.siteId, followed),
      ),
    );
  let queued = 0;
  for (const r of rows) {
    queued += await db.transaction((tx) =>
      queueOpenLeakAlert(
        tx,
        ctx,
        { id: r.id, containerNumber: r.containerNumber, siteId: r.siteId! },
        r.foundAt!,
        asOf,
      ),
    );
  }
  return queued;
}

/**
 * Units whose re-check was missed since their figures were last computed: written again through the write path (no
 * change), so the score's reasons and the missed count show it without waiting for the next visit. Bounded to re-checks
 * missed in the last days; older ones show at the unit's next write.
 */
export async function refreshMissedRechecks(db: Db, ctx: AlertContext, asOf: Date): Promise<number> {
  const today = dayPlus(asOf, 0);
  const rows = await db
    .select({ unitId: unitDepotState.unitId })
    .from(unitDepotState)
    .where(
      and(
        gte(unitDepotState.recheckDue, dayPlus(asOf, -RECHECK_MISSED_ALERT_DAYS)),
        lt(unitDepotState.recheckDue, today),
        // Computed before the day after the re-check's day: the missed re-check is not in its figures yet.
        lt(unitDepotState.computedAt, sql`DATE_ADD(${unitDepotState.recheckDue}, INTERVAL 1 DAY)`),
      ),
    );
  for (const r of rows) await writeUnit({ ...ctx, db }, r.unitId, async () => ({ result: null }));
  return rows.length;
}

export async function runDailyMailJobs(db: Db, ctx: AlertContext, asOf: Date) {
  return {
    openLeaks: await queueOverdueLeakAlerts(db, ctx, asOf),
    rechecks: await queueRecheckAlerts(db, ctx, asOf),
    refreshed: await refreshMissedRechecks(db, ctx, asOf),
    digests: await queueDailyDigest(db, ctx, asOf),
  };
}
