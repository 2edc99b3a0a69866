import { eq } from 'drizzle-orm';
import type { Request } from 'express';
import type { Db } from '../../db/client';
import { users } from '../../db/schema';
import { burnPasswordCheck, verifyPassword } from '../../lib/password';
import { HttpError } from '../../lib/http-error';
import type { SignInInput } from '../../../shared/schemas/account';
import type { SignInGuard } from '../../lib/sign-in-guard';

// One answer for an unknown e-mail, a wrong password, an account without a password and a deactivated account.
const invalidCredentials = () =>
  new HttpError(401, 'invalid_credentials', 'That e-mail and password do not match an active account.');

/** Checks e-mail and password under the sign-in throttle; returns the user or throws 401/429. */
export async function checkCredentials(db: Db, guard: SignInGuard, req: Request, input: SignInInput) {
  const [user] = await db.select().from(users).where(eq(users.email, input.email)).limit(1);
  const attempt = await guard.begin(req, input.email, user?.id ?? null);
  let ok = false;
  if (!user || !user.passwordHash) await burnPasswordCheck(input.password);
  else ok = (await verifyPassword(user.passwordHash, input.password)) && Boolean(user.active);
  await attempt.settle(ok);
  if (!ok || !user) throw invalidCredentials();
  return user;
}
