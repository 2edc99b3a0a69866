// A person's alert subscriptions (own choice per kind, else the role's default), and the signed unsubscribe link.
import { and, asc, eq, inArray } from 'drizzle-orm';
import type { Db, DbOrTx } from '../../db/client';
import { alertKindChoices, alertSubscriptions, sites, users } from '../../db/schema';
import { choicesOf, defaultReachOf, mySitesOf } from '../../lib/alert-recipients';
import { badRequest, HttpError } from '../../lib/http-error';
import { verifyUnsubscribe } from '../../lib/mail/unsubscribe-link';
import { retryTransaction } from '../../lib/retry';
import type { Role } from '../../../shared/permissions';
import {
  ALERT_KINDS,
  type AlertKind,
  type PutSubscriptionsParsed,
  type SubscriptionsDto,
  type UnsubscribeInput,
} from '../../../shared/schemas/alerts';

type Person = { id: string; role: Role };

export async function getSubscriptions(db: DbOrTx, person: Person, now: Date): Promise<SubscriptionsDto> {
  const [siteRows, ticked, choices, mine] = await Promise.all([
    db.select({ id: sites.id, code: sites.code, name: sites.name }).from(sites).orderBy(asc(sites.name)),
    db
      .select({ siteId: alertSubscriptions.siteId, kind: alertSubscriptions.kind })
      .from(alertSubscriptions)
      .where(eq(alertSubscriptions.userId, person.id)),
    choicesOf(db, person.id),
    mySitesOf(db, [person.id], now),
  ]);
  const allIds = siteRows.map((s) => s.id);
  const mySiteIds = allIds.filter((id) => mine.get(person.id)?.has(id));
  const kinds = ALERT_KINDS.map((kind) => ({
    kind,
    scope: choices.get(kind) ?? ('default' as const),
    defaultReach: defaultReachOf(person.role, kind),
  }));
  const subscriptions = kinds.flatMap(({ kind, scope, defaultReach }) => {
    const reach = scope === 'default' ? defaultReach : scope;
    const siteIds =
      reach === 'all_sites'
        ? allIds
        : reach === 'my_sites'
          ? mySiteIds
          : reach === 'sites'
            ? ticked.filter((t) => t.kind === kind).map((t) => t.siteId)
            : [];
    return siteIds.map((siteId) => ({ siteId, kind }));
  });
  subscriptions.sort((a, b) => a.siteId - b.siteId || ALERT_KINDS.indexOf(a.kind) - ALERT_KINDS.indexOf(b.kind));
  return { sites: siteRows, subscriptions, kinds, role: person.role, mySiteIds };
}

/** Serialises every change of one person's alert settings: two saves at once each replace the whole set in turn. */
async function lockPerson(tx: DbOrTx, userId: string) {
  await tx.select({ id: users.id }).from(users).where(eq(users.id, userId)).for('update');
}

async function setChoices(tx: DbOrTx, userId: string, kinds: AlertKind[], allSites: boolean) {
  if (kinds.length === 0) return;
  await tx
    .insert(alertKindChoices)
    .values(kinds.map((kind) => ({ userId, kind, allSites })))
    .onDuplicateKeyUpdate({ set: { allSites, updatedAt: new Date() } });
}

/**
 * Replaces the person's whole set: kinds in `allSites` follow every site (also sites added later), kinds in
 * `useDefaults` follow the role's default again, every other kind exactly the sites listed for it.
 */
export async function putSubscriptions(
  db: Db,
  person: Person,
  input: PutSubscriptionsParsed,
  now: Date,
): Promise<SubscriptionsDto> {
  const userId = person.id;
  const bySites = ALERT_KINDS.filter((k) => !input.allSites.includes(k) && !input.useDefaults.includes(k));
  const indexed = input.subscriptions.map((s, i) => ({ ...s, i })).filter((s) => bySites.includes(s.kind));
  const wanted = [...new Map(indexed.map((s) => [`${s.siteId}:${s.kind}`, s])).values()];
  await retryTransaction(() =>
    db.transaction(async (tx) => {
      // Two saves at once (two tabs, a double click) would each delete the list, hold the gap that leaves in the
      // index and deadlock inserting into it; the person's row lock makes them take turns. A site removed meanwhile
      // can still deadlock; that retries.
      await lockPerson(tx, userId);
      const siteIds = [...new Set(wanted.map((s) => s.siteId))];
      if (siteIds.length) {
        const known = new Set(
          (await tx.select({ id: sites.id }).from(sites).where(inArray(sites.id, siteIds))).map((r) => r.id),
        );
        const unknown = wanted.find((s) => !known.has(s.siteId));
        if (unknown) {
          throw badRequest('One of the sites does not exist.', {
            [`subscriptions.${unknown.i}.siteId`]: 'No such site',
          });
        }
      }
      await tx.delete(alertSubscriptions).where(eq(alertSubscriptions.userId, userId));
      if (wanted.length) {
        await tx.insert(alertSubscriptions).values(wanted.map((s) => ({ userId, siteId: s.siteId, kind: s.kind })));
      }
      if (input.useDefaults.length) {
        await tx
          .delete(alertKindChoices)
          .where(and(eq(alertKindChoices.userId, userId), inArray(alertKindChoices.kind, input.useDefaults)));
      }
      await setChoices(tx, userId, [...new Set(input.allSites)], true);
      await setChoices(tx, userId, bySites, false);
    }),
  );
  return getSubscriptions(db, person, now);
}

/**
 * The signed link in a mail: stops one kind of alert at every site, without signing in — also a default or "all
 * sites", so the kind stays off (a choice of no sites) until the person ticks sites again. `removed` counts the sites
 * the kind reached.
 */
export async function unsubscribe(
  db: Db,
  input: UnsubscribeInput,
  now: Date,
): Promise<{ kind: AlertKind; removed: number }> {
  return retryTransaction(() =>
    db.transaction(async (tx) => {
      if (!(await verifyUnsubscribe(tx, input.user, input.kind, input.sig))) {
        throw new HttpError(
          404,
          'link_invalid',
          'This unsubscribe link is not valid. Check that you opened the whole link from the e-mail.',
        );
      }
      await lockPerson(tx, input.user);
      const [person] = await tx.select({ id: users.id, role: users.role }).from(users).where(eq(users.id, input.user));
      const before = person ? await getSubscriptions(tx, person, now) : null;
      await tx
        .delete(alertSubscriptions)
        .where(and(eq(alertSubscriptions.userId, input.user), eq(alertSubscriptions.kind, input.kind)));
      if (person) await setChoices(tx, person.id, [input.kind], false);
      const removed = before?.subscriptions.filter((s) => s.kind === input.kind).length ?? 0;
      return { kind: input.kind, removed };
    }),
  );
}
