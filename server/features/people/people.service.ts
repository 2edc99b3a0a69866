import { asc, eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { sessions, users } from '../../db/schema';
import { isDuplicateKeyError } from '../../lib/db-errors';
import { conflict, notFound } from '../../lib/http-error';
import { hashPassword } from '../../lib/password';
import { assertAcceptablePassword } from '../../lib/password-policy';
import { newId } from '../../lib/ids';
import type { CreateUserInput, UpdateUserInput } from '../../../shared/schemas/people';
import { toUserDto } from '../../lib/user-dto';
import type { AppContext } from '../../lib/app-context';

export async function listUsers(db: Db) {
  const rows = await db.select().from(users).orderBy(asc(users.name));
  return rows.map(toUserDto);
}

export async function createUser(db: Db, input: CreateUserInput, ctx: Pick<AppContext, 'queueInvitation'>) {
  if (input.password) assertAcceptablePassword(input.password, input);
  const passwordHash = input.password ? await hashPassword(input.password) : null;
  const id = newId();
  const emailTaken = () => conflict('A user with this e-mail already exists.', { email: 'Already in use' });
  try {
    return await db.transaction(async (tx) => {
      const [taken] = await tx.select({ id: users.id }).from(users).where(eq(users.email, input.email)).limit(1);
      if (taken) throw emailTaken();
      await tx.insert(users).values({
        id,
        email: input.email,
        name: input.name,
        role: input.role,
        certificateNumber: input.certificateNumber ?? null,
        certificateExpiresOn: input.certificateExpiresOn ?? null,
        passwordHash,
      });
      const [row] = await tx.select().from(users).where(eq(users.id, id));
      if (!passwordHash) await ctx.queueInvitation(tx, row);
      return toUserDto(row);
    });
  } catch (err) {
    // Two administrators adding the same person at once: both checks pass, the unique e-mail key decides.
    if (isDuplicateKeyError(err)) throw emailTaken();
    throw err;
  }
}

export async function updateUser(db: Db, actorId: string, id: string, input: UpdateUserInput) {
  return db.transaction(async (tx) => {
    const [current] = await tx.select().from(users).where(eq(users.id, id)).for('update');
    if (!current) throw notFound('No such user.');
    if (id === actorId && input.active === false) throw conflict('You cannot deactivate your own account.');
    if (id === actorId && input.role && input.role !== current.role) {
      throw conflict('You cannot change your own role; ask another administrator.');
    }
    await tx
      .update(users)
      .set({
        ...(input.name !== undefined && { name: input.name }),
        ...(input.role !== undefined && { role: input.role }),
        ...(input.certificateNumber !== undefined && { certificateNumber: input.certificateNumber }),
        ...(input.certificateExpiresOn !== undefined && { certificateExpiresOn: input.certificateExpiresOn }),
        ...(input.active !== undefined && { active: input.active }),
      })
      .where(eq(users.id, id));
    // Deactivation and role changes take effect at once: the person signs in again.
    if (input.active === false || (input.role && input.role !== current.role)) {
      await tx.delete(sessions).where(eq(sessions.userId, id));
    }
    const [row] = await tx.select().from(users).where(eq(users.id, id));
    return toUserDto(row);
  });
}
