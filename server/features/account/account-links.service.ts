// One-time links by e-mail: invitations (set a first password) and password resets. The link carries a random
// token; only its SHA-256 is stored, so a leaked database does not hand out working links.
import { createHash } from 'node:crypto';
import { and, eq, gt, isNull } from 'drizzle-orm';
import type { Db, DbOrTx } from '../../db/client';
import { accountLinks, sessions, users, ACCOUNT_LINK_PURPOSES } from '../../db/schema';
import type { AppContext } from '../../lib/app-context';
import { conflict, HttpError, notFound } from '../../lib/http-error';
import { newToken } from '../../lib/ids';
import { hashPassword } from '../../lib/password';
import { assertAcceptablePassword } from '../../lib/password-policy';
import { INVITATION_HOURS, PASSWORD_RESET_HOURS, type AccountLinkDto } from '../../../shared/schemas/account';
import { MAIL_PAGE_PATHS } from '../../../shared/schemas/mail';
import { enqueueMail } from '../../lib/mail/outbox';
import { renderMail } from '../../lib/mail/layout';
import { queuePasswordChangedNotice } from './password-notice';

type Purpose = (typeof ACCOUNT_LINK_PURPOSES)[number];
type LinkContext = Pick<AppContext, 'publicUrl' | 'clock'>;
type UserRow = typeof users.$inferSelect;

const HOUR_MS = 3600_000;

export const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

const LINK = {
  invitation: {
    hours: INVITATION_HOURS,
    path: MAIL_PAGE_PATHS.invitation,
    expired: 'This invitation has expired. Ask an administrator to send you a new one.',
    used: 'This invitation has already been used. Sign in with your e-mail address and password.',
  },
  password_reset: {
    hours: PASSWORD_RESET_HOURS,
    path: MAIL_PAGE_PATHS.passwordReset,
    expired: 'This password-reset link has expired. Ask for a new one on the sign-in page.',
    used: 'This password-reset link has already been used. Ask for a new one on the sign-in page if you still need it.',
  },
} satisfies Record<Purpose, { hours: number; path: string; expired: string; used: string }>;

const invalidLink = () =>
  new HttpError(404, 'link_invalid', 'This link is not valid. Check that you opened the whole link from the e-mail.');

/** Ends the user's unused links of one purpose now (a newer link replaces them, or the password they set changed). */
export async function expireOpenLinks(tx: DbOrTx, userId: string, purpose: Purpose, now: Date) {
  await tx
    .update(accountLinks)
    .set({ expiresAt: now })
    .where(
      and(
        eq(accountLinks.userId, userId),
        eq(accountLinks.purpose, purpose),
        isNull(accountLinks.usedAt),
        gt(accountLinks.expiresAt, now),
      ),
    );
}

/** Makes a link for the user, replacing any unused one of the same purpose; returns the token for the mail. */
async function issueLink(tx: DbOrTx, ctx: LinkContext, userId: string, purpose: Purpose) {
  const now = ctx.clock.now();
  await expireOpenLinks(tx, userId, purpose, now);
  const token = newToken();
  const expiresAt = new Date(now.getTime() + LINK[purpose].hours * HOUR_MS);
  const [result] = await tx.insert(accountLinks).values({ userId, purpose, tokenHash: hashToken(token), expiresAt });
  return { id: result.insertId, url: `${ctx.publicUrl}${LINK[purpose].path}/${token}`, expiresAt };
}

/** Queues an invitation mail in the caller's transaction (a new account without a password, or a re-send). */
export async function queueInvitation(tx: DbOrTx, ctx: LinkContext, user: Pick<UserRow, 'id' | 'email' | 'name'>) {
  const link = await issueLink(tx, ctx, user.id, 'invitation');
  const subject = 'You are invited to Tightloop';
  await enqueueMail(
    tx,
    {
      dedupeKey: `invitation:${link.id}`,
      kind: 'invitation',
      to: user.email,
      subject,
      ...renderMail({
        heading: `Welcome to Tightloop, ${user.name}`,
        paragraphs: [
          'An administrator has made you an account in Tightloop, the service history of our reefer units.',
          `Choose a password to start. The link works once and for ${INVITATION_HOURS} hours.`,
        ],
        action: { label: 'Choose a password', url: link.url },
        footer: [{ text: 'Not expecting this? Ignore the mail; nothing happens until the link is used.' }],
      }),
    },
    ctx.clock.now(),
  );
}

export async function resendInvitation(db: Db, ctx: LinkContext, userId: string) {
  await db.transaction(async (tx) => {
    const [user] = await tx.select().from(users).where(eq(users.id, userId)).for('update');
    if (!user) throw notFound('No such user.');
    if (user.passwordHash)
      throw conflict('This person has already set a password; they can reset it from the sign-in page.');
    if (!user.active) throw conflict('This account is deactivated. Activate it before sending an invitation.');
    await queueInvitation(tx, ctx, user);
  });
}

/** Same answer whether or not the address has an account; only an active account gets a mail. */
export async function requestPasswordReset(db: Db, ctx: LinkContext, email: string) {
  await db.transaction(async (tx) => {
    const [user] = await tx.select().from(users).where(eq(users.email, email)).for('update');
    if (!user || !user.active) return;
    const link = await issueLink(tx, ctx, user.id, 'password_reset');
    const subject = 'Reset your Tightloop password';
    await enqueueMail(
      tx,
      {
        dedupeKey: `password_reset:${link.id}`,
        kind: 'password_reset',
        to: user.email,
        subject,
        ...renderMail({
          heading: subject,
          paragraphs: [
            `Someone (probably you) asked to reset the password of ${user.email}.`,
            `The link works once and for ${PASSWORD_RESET_HOURS} hour. Setting a new password signs out every other device.`,
          ],
          action: { label: 'Choose a new password', url: link.url },
          footer: [{ text: 'Did not ask for this? Ignore the mail; your password stays as it is.' }],
        }),
      },
      ctx.clock.now(),
    );
  });
}

async function usableLink(tx: DbOrTx, ctx: LinkContext, purpose: Purpose, token: string, lock: boolean) {
  const q = tx
    .select({ link: accountLinks, user: users })
    .from(accountLinks)
    .innerJoin(users, eq(users.id, accountLinks.userId))
    .where(and(eq(accountLinks.tokenHash, hashToken(token)), eq(accountLinks.purpose, purpose)));
  const [row] = lock ? await q.for('update') : await q;
  if (!row) throw invalidLink();
  const { link, user } = row;
  const usedInvitation = purpose === 'invitation' && user.passwordHash != null;
  if (link.usedAt || usedInvitation) throw new HttpError(410, 'link_used', LINK[purpose].used);
  if (link.expiresAt.getTime() <= ctx.clock.now().getTime())
    throw new HttpError(410, 'link_expired', LINK[purpose].expired);
  if (!user.active) throw new HttpError(410, 'account_inactive', 'This account is deactivated. Ask an administrator.');
  return { link, user };
}

export async function describeLink(db: Db, ctx: LinkContext, purpose: Purpose, token: string): Promise<AccountLinkDto> {
  const { link, user } = await usableLink(db, ctx, purpose, token, false);
  return { email: user.email, name: user.name, expiresAt: link.expiresAt.toISOString() };
}

/**
 * Sets the password through a link, once: marks every open link of that purpose used and ends the user's
 * sessions (the caller starts a fresh one). Returns the user.
 */
export async function completeLink(
  db: Db,
  ctx: LinkContext,
  purpose: Purpose,
  token: string,
  password: string,
  from: { address: string; browser: string | null },
) {
  // Check before hashing (argon2 is slow and needs no row lock), and again under the lock.
  const { user: person } = await usableLink(db, ctx, purpose, token, false);
  assertAcceptablePassword(password, person);
  const passwordHash = await hashPassword(password);
  return db.transaction(async (tx) => {
    const { user } = await usableLink(tx, ctx, purpose, token, true);
    const now = ctx.clock.now();
    await tx.update(users).set({ passwordHash }).where(eq(users.id, user.id));
    await tx
      .update(accountLinks)
      .set({ usedAt: now })
      .where(and(eq(accountLinks.userId, user.id), eq(accountLinks.purpose, purpose), isNull(accountLinks.usedAt)));
    await tx.delete(sessions).where(eq(sessions.userId, user.id));
    if (purpose === 'password_reset') await queuePasswordChangedNotice(tx, ctx, user, 'reset', from);
    return { ...user, passwordHash };
  });
}
