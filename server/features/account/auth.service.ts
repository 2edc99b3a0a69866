import { eq } from 'drizzle-orm';
import type { Request } from 'express';
import type { Db } from '../../db/client';
import { users } from '../../db/schema';
import { burnPasswordCheck, verifyPassword } from '../../lib/password';
import { HttpError } from '../../lib/http-error';
import type { SignInInput } from '../../../shared/schemas/account';
import type { SignInGuard } from '../../lib/sign-in-guard';

// One answer for an unknown e-mail, a wrong password and an account without a password. Only the right password of
// a deactivated account learns that it was deactivated: that tells nothing to someone guessing.
const invalidCredentials = () =>
  new HttpError(401, 'invalid_credentials', 'That e-mail and password do not match an active account.');
const deactivated = () =>
  new HttpError(
    403,
    'account_deactivated',
    'An administrator deactivated this account. Ask your administrator if you still need access.',
  );

/** Checks e-mail and password under the sign-in throttle; returns the user or throws 401/429. */
export async function checkCredentials(db: Db, guard: SignInGuard, req: Request, input: SignInInput) {
  const [user] = await db.select().from(users).where(eq(users.email, input.email)).limit(1);
  const attempt = await guard.begin(req, input.email, user?.id ?? null);
  let passwordRight = false;
  if (!user || !user.passwordHash) await burnPasswordCheck(input.password);
  else passwordRight = await verifyPassword(user.passwordHash, input.password);
  const ok = passwordRight && Boolean(user?.active);
  await attempt.settle(ok);
  if (passwordRight && !user?.active) throw deactivated();
  if (!ok || !user) throw invalidCredentials();
  return user;
}
