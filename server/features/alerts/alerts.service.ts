// A person's alert subscriptions, and the signed unsubscribe link from a mail.
import { and, asc, eq, inArray } from 'drizzle-orm';
import type { Db, DbOrTx } from '../../db/client';
import { alertSubscriptions, sites, users } from '../../db/schema';
import { badRequest, HttpError } from '../../lib/http-error';
import { verifyUnsubscribe } from '../../lib/mail/unsubscribe-link';
import { retryTransaction } from '../../lib/retry';
import type {
  AlertKind,
  PutSubscriptionsInput,
  SubscriptionsDto,
  UnsubscribeInput,
} from '../../../shared/schemas/alerts';

export async function getSubscriptions(db: DbOrTx, userId: string): Promise<SubscriptionsDto> {
  const [siteRows, subs] = await Promise.all([
    db.select({ id: sites.id, code: sites.code, name: sites.name }).from(sites).orderBy(asc(sites.name)),
    db
      .select({ siteId: alertSubscriptions.siteId, kind: alertSubscriptions.kind })
      .from(alertSubscriptions)
      .where(eq(alertSubscriptions.userId, userId))
      .orderBy(asc(alertSubscriptions.siteId), asc(alertSubscriptions.kind)),
  ]);
  return { sites: siteRows, subscriptions: subs };
}

/** Replaces the person's whole set of subscriptions with the given one. */
export async function putSubscriptions(
  db: Db,
  userId: string,
  input: PutSubscriptionsInput,
): Promise<SubscriptionsDto> {
  const wanted = [...new Map(input.subscriptions.map((s) => [`${s.siteId}:${s.kind}`, s])).values()];
  await retryTransaction(() =>
    db.transaction(async (tx) => {
      // One save of a person's list at a time: two at once (a double click) each delete the list, hold the gap that
      // leaves in the index, and deadlock inserting into it. A site removed meanwhile can still deadlock; that retries.
      await tx.select({ id: users.id }).from(users).where(eq(users.id, userId)).for('update');
      const siteIds = [...new Set(wanted.map((s) => s.siteId))];
      if (siteIds.length) {
        const known = new Set(
          (await tx.select({ id: sites.id }).from(sites).where(inArray(sites.id, siteIds))).map((r) => r.id),
        );
        const unknown = wanted.findIndex((s) => !known.has(s.siteId));
        if (unknown >= 0) {
          throw badRequest('One of the sites does not exist.', { [`subscriptions.${unknown}.siteId`]: 'No such site' });
        }
      }
      await tx.delete(alertSubscriptions).where(eq(alertSubscriptions.userId, userId));
      if (wanted.length) await tx.insert(alertSubscriptions).values(wanted.map((s) => ({ userId, ...s })));
    }),
  );
  return getSubscriptions(db, userId);
}

/** The signed link in a mail: stops one kind of alert at every site, without signing in. */
export async function unsubscribe(db: Db, input: UnsubscribeInput): Promise<{ kind: AlertKind; removed: number }> {
  return db.transaction(async (tx) => {
    if (!(await verifyUnsubscribe(tx, input.user, input.kind, input.sig))) {
      throw new HttpError(
        404,
        'link_invalid',
        'This unsubscribe link is not valid. Check that you opened the whole link from the e-mail.',
      );
    }
    // After the person's own saves, like every change of their list (see putSubscriptions).
    await tx.select({ id: users.id }).from(users).where(eq(users.id, input.user)).for('update');
    const [result] = await tx
      .delete(alertSubscriptions)
      .where(and(eq(alertSubscriptions.userId, input.user), eq(alertSubscriptions.kind, input.kind)));
    return { kind: input.kind, removed: result.affectedRows };
  });
}
