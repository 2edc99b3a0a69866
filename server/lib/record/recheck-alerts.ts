// Re-check alerts: a re-check after a top-up or a repair (shared/domain/rechecks.ts) mailed to the people who follow
// "Re-checks due or missed" at the unit's site — once on its day, once when the day has passed without one. From the
// write path (a re-check that is already due when written) and from the daily run; a reading or leak check that
// answers the re-check takes it out of the unit's depot state, so nothing more is mailed about it.
import { and, asc, eq, gte, isNotNull, lte, ne } from 'drizzle-orm';
import type { Db, DbOrTx } from '../../db/client';
import { events, sites, unitDepotState, units } from '../../db/schema';
import { formatContainerNumber } from '../../../shared/domain/container-number';
import { dayOf, isoDate } from '../../../shared/domain/dates';
import { recheckRuleWords, type SiteRule } from '../../../shared/domain/rule-words';
import { fmtDateTimeInZone, fmtIsoDay } from '../../../shared/format-dates';
import type { Settings } from '../../../shared/schemas/settings';
import { enqueueMail } from '../mail/outbox';
import { renderMail } from '../mail/layout';
import { subscribersOf, subscriptionFooter, type AlertContext } from './alerts';

/** A missed re-check is mailed only while its day is this recent; older ones stay in My day and the digest. */
export const RECHECK_MISSED_ALERT_DAYS = 7;

type Recipient = Awaited<ReturnType<typeof subscribersOf>>[number];
type RecheckSite = { id: number; name: string; jurisdiction: SiteRule | null; timeZone: string | null };
export type OpenRecheck = { sourceEventId: number; reason: 'top_up' | 'repair'; sourceAt: string; dueOn: string };
type RecheckUnit = { id: number; containerNumber: string };

const dayOfDate = (d: Date) => isoDate(dayOf(d.getTime()));

/** The mail about one re-check, in the words of the site's rule; times in the site's zone with its offset. */
export function recheckMail(
  site: RecheckSite,
  unit: RecheckUnit,
  c: OpenRecheck,
  today: string,
  settings: Settings,
): { subject: string; paragraphs: string[]; entry: 'pressure' | 'leak_check' } {
  const shown = formatContainerNumber(unit.containerNumber);
  const rule: SiteRule = site.jurisdiction ?? settings.policy;
  const days = c.reason === 'top_up' ? settings.rechecks.afterTopUpDays : settings.rechecks.afterRepairDays;
  const what = c.reason === 'top_up' ? 'Re-check after the top-up' : 'Leak check after the repair';
  const sourceDay = fmtIsoDay(c.sourceAt.slice(0, 10));
  const subject =
    c.dueOn === today
      ? `${shown}: ${what.toLowerCase()} of ${sourceDay} is due today`
      : `${shown}: ${what.toLowerCase()} of ${sourceDay} missed (due ${fmtIsoDay(c.dueOn)})`;
  const done =
    c.reason === 'top_up'
      ? 'Take a pressure reading (note the sight glass) or do a leak check: the unit page then says whether the charge held.'
      : 'Do a leak check and record it on the unit: it answers the re-check and says whether the repair held.';
  return {
    subject,
    paragraphs: [
      `Unit ${shown} at ${site.name} had a ${c.reason === 'top_up' ? 'top-up' : 'repair'} on ${fmtDateTimeInZone(c.sourceAt, site.timeZone)}. ` +
        (c.dueOn === today
          ? `Its re-check is due today, ${fmtIsoDay(c.dueOn)}.`
          : `Its re-check was due on ${fmtIsoDay(c.dueOn)} and nobody has recorded one since.`),
      recheckRuleWords(rule, c.reason, days),
      done,
    ],
    entry: c.reason === 'top_up' ? 'pressure' : 'leak_check',
  };
}

async function mailRecheck(
  tx: DbOrTx,
  ctx: AlertContext,
  people: readonly Recipient[],
  site: RecheckSite,
  unit: RecheckUnit,
  c: OpenRecheck,
  today: string,
  settings: Settings,
  now: Date,
): Promise<number> {
  const occurrence = c.dueOn === today ? 'due' : 'missed';
  const { subject, paragraphs, entry } = recheckMail(site, unit, c, today, settings);
  let queued = 0;
  for (const p of people) {
    const { stopUrl, footer } = await subscriptionFooter(tx, ctx, p.id, 'recheck', site.name);
    const inserted = await enqueueMail(
      tx,
      {
        dedupeKey: `alert:recheck:${unit.id}:${p.id}:${c.sourceEventId}:${occurrence}`,
        kind: 'alert',
        to: p.email,
        subject,
        ...renderMail({
          heading: subject,
          paragraphs,
          action: { label: 'Record the re-check', url: `${ctx.publicUrl}/units/${unit.id}/visit?entry=${entry}` },
          footer,
        }),
        headers: { 'List-Unsubscribe': `<${stopUrl}>` },
      },
      now,
    );
    if (inserted) queued++;
  }
  return queued;
}

const mailable = (dueOn: string, today: string) =>
  dueOn <= today && dueOn >= isoDate(dayOf(Date.parse(`${today}T00:00:00Z`)) - RECHECK_MISSED_ALERT_DAYS);

async function siteOf(tx: DbOrTx, siteId: number): Promise<RecheckSite | null> {
  const [site] = await tx
    .select({ id: sites.id, name: sites.name, jurisdiction: sites.jurisdiction, timeZone: sites.timeZone })
    .from(sites)
    .where(eq(sites.id, siteId));
  return site ?? null;
}

/**
 * Step of writeEffects after the depot state: the unit's open re-check, when its day has come (a backdated top-up, a
 * write on the day), is mailed now rather than at the next daily run. Returns how many mails were queued.
 */
export async function queueRecheckAlertForUnit(
  tx: DbOrTx,
  ctx: AlertContext,
  unit: RecheckUnit & { siteId: number | null },
  open: OpenRecheck | null,
  now: Date,
  settings: Settings,
): Promise<number> {
  const today = dayOfDate(now);
  if (!open || unit.siteId == null || !mailable(open.dueOn, today)) return 0;
  const people = await subscribersOf(tx, unit.siteId, 'recheck', now);
  if (people.length === 0) return 0;
  const site = await siteOf(tx, unit.siteId);
  if (!site) return 0;
  return mailRecheck(tx, ctx, people, site, unit, open, today, settings, now);
}

/** The daily run: every open re-check due today or missed in the last days, at sites where someone follows them. */
export async function queueRecheckAlerts(db: Db, ctx: AlertContext, asOf: Date): Promise<number> {
  const today = dayOfDate(asOf);
  const from = isoDate(dayOf(asOf.getTime()) - RECHECK_MISSED_ALERT_DAYS);
  const rows = await db
    .select({
      unitId: units.id,
      containerNumber: units.containerNumber,
      siteId: units.siteId,
      sourceEventId: unitDepotState.recheckSourceEventId,
      reason: unitDepotState.recheckReason,
      dueOn: unitDepotState.recheckDue,
      sourceAt: events.occurredAt,
    })
    .from(unitDepotState)
    .innerJoin(units, eq(units.id, unitDepotState.unitId))
    .innerJoin(events, eq(events.id, unitDepotState.recheckSourceEventId))
    .where(
      and(
        gte(unitDepotState.recheckDue, from),
        lte(unitDepotState.recheckDue, today),
        isNotNull(units.siteId),
        ne(units.status, 'retired'),
      ),
    )
    .orderBy(asc(units.siteId), asc(unitDepotState.recheckDue));
  if (rows.length === 0) return 0;
  const settings = await ctx.caches.settings.get(db);
  const bySite = new Map<number, typeof rows>();
  for (const r of rows) (bySite.get(r.siteId!) ?? bySite.set(r.siteId!, []).get(r.siteId!)!).push(r);
  let queued = 0;
  for (const [siteId, list] of bySite) {
    const people = await subscribersOf(db, siteId, 'recheck', asOf);
    const site = people.length ? await siteOf(db, siteId) : null;
    if (!site) continue;
    for (const r of list) {
      const open: OpenRecheck = {
        sourceEventId: r.sourceEventId!,
        reason: r.reason!,
        sourceAt: r.sourceAt.toISOString(),
        dueOn: r.dueOn!,
      };
      queued += await db.transaction((tx) =>
        mailRecheck(
          tx,
          ctx,
          people,
          site,
          { id: r.unitId, containerNumber: r.containerNumber },
          open,
          today,
          settings,
          asOf,
        ),
      );
    }
  }
  return queued;
}
