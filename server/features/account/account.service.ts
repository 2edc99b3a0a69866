// The signed-in person's own account: confirming their password, changing it, ending their other sessions.
import { eq } from 'drizzle-orm';
import type { Request } from 'express';
import { users } from '../../db/schema';
import type { AppContext } from '../../lib/app-context';
import { badRequest, notFound } from '../../lib/http-error';
import { hashPassword, verifyPassword } from '../../lib/password';
import { assertAcceptablePassword } from '../../lib/password-policy';
import type { SessionUser } from '../../lib/session';
import { clientAddress } from '../../lib/client-address';
import { expireOpenLinks } from './account-links.service';
import { queuePasswordChangedNotice } from './password-notice';

/** Checks the person's password again, under the same throttle as sign-in; a wrong one is a 400 on `field`. */
export async function confirmPassword(
  ctx: AppContext,
  req: Request,
  user: SessionUser,
  password: string,
  field: string,
) {
  const [row] = await ctx.db.select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, user.id));
  const attempt = await ctx.signInGuard.begin(req, user.email, user.id);
  const ok = row?.passwordHash ? await verifyPassword(row.passwordHash, password) : false;
  await attempt.settle(ok);
  if (!ok) throw badRequest('That is not your current password.', { [field]: 'That is not your current password.' });
}

/**
 * Sets a new password and ends every other session of the person (ASVS 4.0 3.3.3), and any password-reset link
 * still open. The session making the request stays.
 */
export async function changePassword(
  ctx: AppContext,
  req: Request,
  user: SessionUser,
  currentPassword: string,
  newPassword: string,
) {
  await confirmPassword(ctx, req, user, currentPassword, 'currentPassword');
  assertAcceptablePassword(newPassword, user, 'newPassword');
  if (newPassword === currentPassword)
    throw badRequest('Choose a different password.', {
      newPassword: 'The new password is the same as the current one.',
    });
  const passwordHash = await hashPassword(newPassword);
  return ctx.db.transaction(async (tx) => {
    const [row] = await tx.select({ id: users.id }).from(users).where(eq(users.id, user.id)).for('update');
    if (!row) throw notFound('No such user.');
    await tx.update(users).set({ passwordHash }).where(eq(users.id, user.id));
    await expireOpenLinks(tx, user.id, 'password_reset', ctx.clock.now());
    await queuePasswordChangedNotice(tx, ctx, user, 'changed', {
      address: clientAddress(req),
      browser: req.get('user-agent') ?? null,
    });
    return { endedSessions: await ctx.sessions.endOthers(user.id, req.sessionId!, tx) };
  });
}
