// Who follows which kind of alert at which site: a person's own choice per kind (every site, or the sites they ticked),
// else their role's default (ROLE_ALERT_DEFAULTS). Every mail that goes out by subscription asks here, so defaults and
// "all sites" reach the same people in the alerts, the digest and the settings screen.
import { and, asc, eq, gte, inArray, isNotNull, sql } from 'drizzle-orm';
import type { DbOrTx } from '../db/client';
import { alertKindChoices, alertSubscriptions, sites, units, users, visits } from '../db/schema';
import { can, type Role } from '../../shared/permissions';
import { MS_PER_DAY } from '../../shared/domain/dates';
import {
  MY_SITES_DAYS,
  ROLE_ALERT_DEFAULTS,
  type AlertKind,
  type AlertScope,
  type DefaultReach,
} from '../../shared/schemas/alerts';

export type Follower = { userId: string; email: string; name: string; role: Role; siteId: number; siteName: string };

export const defaultReachOf = (role: Role, kind: AlertKind): DefaultReach | null =>
  ROLE_ALERT_DEFAULTS[role][kind] ?? null;

const mySitesSince = (now: Date) => new Date(now.getTime() - MY_SITES_DAYS * MS_PER_DAY);

/**
 * Sites where each of these people recorded a visit in the last MY_SITES_DAYS days ("my sites"): the visit's site, or
 * for one recorded away from a site (an engineer's note from the office) the site of the unit it is about.
 */
export async function mySitesOf(
  db: DbOrTx,
  userIds: string[],
  now: Date,
  siteId?: number,
): Promise<Map<string, Set<number>>> {
  const bySite = new Map<string, Set<number>>();
  if (userIds.length === 0) return bySite;
  const siteOfVisit = sql<number | null>`coalesce(${visits.siteId}, ${units.siteId})`;
  const rows = await db
    .selectDistinct({ userId: visits.recordedBy, siteId: siteOfVisit })
    .from(visits)
    .innerJoin(units, eq(units.id, visits.unitId))
    .where(
      and(
        inArray(visits.recordedBy, userIds),
        gte(visits.occurredAt, mySitesSince(now)),
        siteId == null ? isNotNull(siteOfVisit) : eq(siteOfVisit, siteId),
      ),
    );
  for (const r of rows) {
    const set = bySite.get(r.userId) ?? new Set<number>();
    set.add(r.siteId!);
    bySite.set(r.userId, set);
  }
  return bySite;
}

/** How a person follows each kind: the kinds they chose for, and whether the choice is every site. */
export async function choicesOf(db: DbOrTx, userId: string): Promise<Map<AlertKind, AlertScope>> {
  const rows = await db
    .select({ kind: alertKindChoices.kind, allSites: alertKindChoices.allSites })
    .from(alertKindChoices)
    .where(eq(alertKindChoices.userId, userId));
  return new Map(rows.map((r) => [r.kind, r.allSites ? 'all_sites' : 'sites']));
}

/**
 * Active people who may see the fleet and follow `kind` — at `siteId`, or at every site when it is left out — one row
 * per person and site, in site-name order. `now` dates "my sites".
 */
export async function followersOf(db: DbOrTx, kind: AlertKind, now: Date, siteId?: number): Promise<Follower[]> {
  const [people, choices, siteRows, ticked] = await Promise.all([
    db
      .select({ id: users.id, email: users.email, name: users.name, role: users.role })
      .from(users)
      .where(eq(users.active, true)),
    db
      .select({ userId: alertKindChoices.userId, allSites: alertKindChoices.allSites })
      .from(alertKindChoices)
      .where(eq(alertKindChoices.kind, kind)),
    db
      .select({ id: sites.id, name: sites.name })
      .from(sites)
      .where(siteId == null ? undefined : eq(sites.id, siteId))
      .orderBy(asc(sites.name), asc(sites.id)),
    db
      .select({ userId: alertSubscriptions.userId, siteId: alertSubscriptions.siteId })
      .from(alertSubscriptions)
      .where(
        siteId == null
          ? eq(alertSubscriptions.kind, kind)
          : and(eq(alertSubscriptions.kind, kind), eq(alertSubscriptions.siteId, siteId)),
      ),
  ]);
  const choiceOf = new Map(choices.map((c) => [c.userId, c.allSites]));
  const allSites = new Set<string>();
  const mine: string[] = [];
  for (const p of people) {
    const chosen = choiceOf.get(p.id);
    const reach = chosen === undefined ? defaultReachOf(p.role, kind) : chosen ? 'all_sites' : null;
    if (reach === 'all_sites') allSites.add(p.id);
    if (reach === 'my_sites') mine.push(p.id);
  }
  const mySites = await mySitesOf(db, mine, now, siteId);
  const tickedBy = new Map<string, Set<number>>();
  for (const t of ticked) tickedBy.set(t.userId, (tickedBy.get(t.userId) ?? new Set()).add(t.siteId));

  const out: Follower[] = [];
  for (const site of siteRows) {
    for (const p of people) {
      if (!can(p, 'view:fleet')) continue;
      const follows =
        allSites.has(p.id) || mySites.get(p.id)?.has(site.id) === true || tickedBy.get(p.id)?.has(site.id) === true;
      if (follows)
        out.push({ userId: p.id, email: p.email, name: p.name, role: p.role, siteId: site.id, siteName: site.name });
    }
  }
  return out;
}
