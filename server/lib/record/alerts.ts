// What a unit's new figures set off by mail, inside its write transaction: alerts to the people who follow the unit's
// site (a crossing into the chronic band or over the leak-rate threshold, a leak left open too long). The daily digest
// uses the same recipients and footer.
import { eq } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { sites, type unitStats } from '../../db/schema';
import { followersOf } from '../alert-recipients';
import type { AppContext } from '../app-context';
import { ALERT_KIND_LABELS, type AlertKind } from '../../../shared/schemas/alerts';
import { MAIL_PAGE_PATHS } from '../../../shared/schemas/mail';
import { formatContainerNumber } from '../../../shared/domain/container-number';
import { dayOf, isoDate, MS_PER_DAY } from '../../../shared/domain/dates';
import { fmtDayInZone } from '../../../shared/format-dates';
import { fmtPct } from '../../../shared/format';
import { enqueueMail } from '../mail/outbox';
import { renderMail, type MailContent } from '../mail/layout';
import { unsubscribeUrl } from '../mail/unsubscribe-link';

/** Days a found leak may stay unrepaired before the engineers hear about it (policy; not in the settings yet). */
export const OPEN_LEAK_ALERT_DAYS = 14;

export type UnitStatsRow = typeof unitStats.$inferSelect;
export type AlertContext = Pick<AppContext, 'publicUrl' | 'clock' | 'caches'>;
export type StatsChange = {
  unitId: number;
  siteId: number | null;
  containerNumber: string;
  before: UnitStatsRow | null;
  after: UnitStatsRow | null;
};

type Recipient = { id: string; email: string; name: string };
export type AlertUnit = { id: number; containerNumber: string; siteId: number };

/** Active people who follow this kind of alert at this site (own choice or role default) and may still see the fleet. */
export async function subscribersOf(tx: DbOrTx, siteId: number, kind: AlertKind, now: Date): Promise<Recipient[]> {
  const rows = await followersOf(tx, kind, now, siteId);
  return rows.map((r) => ({ id: r.userId, email: r.email, name: r.name }));
}

/** The footer every alert and digest carries: why the mail came, one link to stop this kind, one to the settings. */
export async function subscriptionFooter(
  tx: DbOrTx,
  ctx: AlertContext,
  userId: string,
  kind: AlertKind,
  where: string,
) {
  const title = ALERT_KIND_LABELS[kind].title;
  const stopUrl = await unsubscribeUrl(tx, ctx.publicUrl, userId, kind);
  return {
    stopUrl,
    footer: [
      { text: `You receive this because you follow “${title}” for ${where}.` },
      { text: `Stop “${title}” mails:`, url: stopUrl, linkLabel: 'unsubscribe' },
      {
        text: 'Choose sites and alerts:',
        url: `${ctx.publicUrl}${MAIL_PAGE_PATHS.alertSettings}`,
        linkLabel: 'alert settings',
      },
    ],
  };
}

async function queueUnitAlert(
  tx: DbOrTx,
  ctx: AlertContext,
  kind: Exclude<AlertKind, 'digest'>,
  unit: AlertUnit,
  /** Identifies the crossing, so the same one is never mailed twice. */
  occurrence: string,
  content: (siteName: string, timeZone: string | null) => { subject: string; paragraphs: string[] },
): Promise<number> {
  const people = await subscribersOf(tx, unit.siteId, kind, ctx.clock.now());
  if (people.length === 0) return 0;
  const [site] = await tx
    .select({ name: sites.name, timeZone: sites.timeZone })
    .from(sites)
    .where(eq(sites.id, unit.siteId));
  const siteName = site?.name ?? 'your site';
  const { subject, paragraphs } = content(siteName, site?.timeZone ?? null);
  let queued = 0;
  for (const p of people) {
    const { stopUrl, footer } = await subscriptionFooter(tx, ctx, p.id, kind, siteName);
    const mail: MailContent = {
      heading: subject,
      paragraphs,
      action: { label: 'Open the unit', url: `${ctx.publicUrl}/units/${unit.id}` },
      footer,
    };
    const inserted = await enqueueMail(
      tx,
      {
        dedupeKey: `alert:${kind}:${unit.id}:${p.id}:${occurrence}`,
        kind: 'alert',
        to: p.email,
        subject,
        ...renderMail(mail),
        headers: { 'List-Unsubscribe': `<${stopUrl}>` },
      },
      ctx.clock.now(),
    );
    if (inserted) queued++;
  }
  return queued;
}

export function openLeakDays(foundAt: Date, now: Date): number {
  return Math.floor((now.getTime() - foundAt.getTime()) / MS_PER_DAY);
}

/** One mail per found leak that stays unrepaired past the allowed days (from a stats change or the daily run). */
export function queueOpenLeakAlert(
  tx: DbOrTx,
  ctx: AlertContext,
  unit: AlertUnit,
  foundAt: Date,
  now = ctx.clock.now(),
) {
  const days = openLeakDays(foundAt, now);
  if (days < OPEN_LEAK_ALERT_DAYS) return Promise.resolve(0);
  const shown = formatContainerNumber(unit.containerNumber);
  return queueUnitAlert(tx, ctx, 'open_leak', unit, foundAt.toISOString(), (siteName, timeZone) => ({
    subject: `${shown}: leak found ${days} days ago and still not repaired`,
    paragraphs: [
      `A leak was found on unit ${shown} at ${siteName} on ${fmtDayInZone(foundAt, timeZone)}, and no repair has been recorded since.`,
      `The policy allows ${OPEN_LEAK_ALERT_DAYS} days between finding a leak and repairing it. Plan the repair, or record it if it was done.`,
    ],
  }));
}

const pct = fmtPct;

/**
 * Call inside the write transaction, after recomputing a unit's statistics. Mails a subscriber once when the unit
 * crosses into the chronic band or over the leak-rate threshold (before vs after; later events in the same state
 * send nothing) and once per leak left open too long. Returns how many mails were queued.
 */
export async function queueAlertsForStatsChange(tx: DbOrTx, ctx: AlertContext, change: StatsChange): Promise<number> {
  const { before, after, siteId } = change;
  if (!after || siteId == null) return 0;
  const unit: AlertUnit = { id: change.unitId, containerNumber: change.containerNumber, siteId };
  const shown = formatContainerNumber(change.containerNumber);
  // One crossing per unit, person and day: a band that flaps within a day mails once.
  const day = isoDate(dayOf(after.computedAt.getTime()));
  const threshold = (await ctx.caches.settings.get(tx)).leakRateThresholdPct;
  let queued = 0;

  if (after.scoreBand === 'chronic' && before?.scoreBand !== 'chronic') {
    queued += await queueUnitAlert(tx, ctx, 'chronic', unit, day, (siteName) => ({
      subject: `${shown} is now a repeat leaker (score ${after.score} of 100)`,
      paragraphs: [
        `Unit ${shown} at ${siteName} now scores ${after.score} of 100 on the repeat-leak score, which puts it in the “repeat leaker” band.`,
        `Rolling 365-day leak rate: ${pct(after.rollingLeakRatePct)}. The unit page shows which factors drive the score and what a repair or retirement would cost.`,
      ],
    }));
  }
  const wasOver = before != null && before.rollingLeakRatePct >= threshold;
  if (after.rollingLeakRatePct >= threshold && !wasOver) {
    queued += await queueUnitAlert(tx, ctx, 'leak_rate', unit, day, (siteName) => ({
      subject: `${shown}: rolling leak rate ${pct(after.rollingLeakRatePct)} reached the ${pct(threshold)} threshold`,
      paragraphs: [
        `Unit ${shown} at ${siteName} has lost refrigerant at an annualized ${pct(after.rollingLeakRatePct)} over the last 365 days, at or above the policy threshold of ${pct(threshold)}.`,
        'Find and repair the leak before the next top-up; local regulations may set a deadline for the repair.',
      ],
    }));
  }
  if (after.openLeakFoundAt) queued += await queueOpenLeakAlert(tx, ctx, unit, after.openLeakFoundAt);
  return queued;
}
