// Unsubscribe links are signed (HMAC-SHA256) so they work without signing in and cannot be forged for someone else.
import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { mailKeys } from '../../db/schema';
import type { AlertKind } from '../../../shared/schemas/alerts';
import { MAIL_PAGE_PATHS } from '../../../shared/schemas/mail';

const KEY_ID = 'unsubscribe';

/** The signing key lives in the database, made on first use, so every server shares it without configuration. */
async function signingKey(db: DbOrTx): Promise<string> {
  const [found] = await db.select().from(mailKeys).where(eq(mailKeys.id, KEY_ID));
  if (found) return found.secret;
  await db
    .insert(mailKeys)
    .values({ id: KEY_ID, secret: randomBytes(32).toString('hex') })
    .onDuplicateKeyUpdate({ set: { id: sql`id` } });
  const [made] = await db.select().from(mailKeys).where(eq(mailKeys.id, KEY_ID));
  return made.secret;
}

const sign = (key: string, userId: string, kind: AlertKind) =>
  createHmac('sha256', key).update(`unsubscribe:${userId}:${kind}`).digest('base64url');

export async function unsubscribeUrl(db: DbOrTx, publicUrl: string, userId: string, kind: AlertKind): Promise<string> {
  const sig = sign(await signingKey(db), userId, kind);
  const q = new URLSearchParams({ user: userId, kind, sig });
  return `${publicUrl}${MAIL_PAGE_PATHS.unsubscribe}?${q.toString()}`;
}

export async function verifyUnsubscribe(db: DbOrTx, userId: string, kind: AlertKind, sig: string): Promise<boolean> {
  const expected = Buffer.from(sign(await signingKey(db), userId, kind));
  const given = Buffer.from(sig);
  return given.length === expected.length && timingSafeEqual(given, expected);
}
