import { eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { users } from '../../db/schema';
import { burnPasswordCheck, verifyPassword } from '../../lib/password';
import { HttpError } from '../../lib/http-error';
import type { SignInInput } from '../../../shared/schemas/auth';

// One answer for an unknown e-mail, a wrong password, an account without a password and a deactivated account.
const invalidCredentials = () =>
  new HttpError(401, 'invalid_credentials', 'That e-mail and password do not match an active account.');

export async function checkCredentials(db: Db, input: SignInInput) {
  const [user] = await db.select().from(users).where(eq(users.email, input.email)).limit(1);
  if (!user || !user.passwordHash) {
    await burnPasswordCheck(input.password);
    throw invalidCredentials();
  }
  const ok = await verifyPassword(user.passwordHash, input.password);
  if (!ok || !user.active) throw invalidCredentials();
  return user;
}
