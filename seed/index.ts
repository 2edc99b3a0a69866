import { sql } from 'drizzle-orm';
import type { Db } from '../server/db/client';
import { users } from '../server/db/schema';
import { hashPassword } from '../server/lib/password';
import { newId } from '../server/lib/ids';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from './demo-accounts';

export async function isEmpty(db: Db): Promise<boolean> {
  const [row] = await db.select({ n: sql<number>`count(*)` }).from(users);
  return Number(row.n) === 0;
}

export async function seedDemoAccounts(db: Db): Promise<void> {
  const hash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (tx) => {
    for (const a of DEMO_ACCOUNTS) {
      await tx.insert(users).values({ id: newId(), ...a, passwordHash: hash });
    }
  });
}

/** Loads the whole demo (accounts now; the fleet simulator adds sites, units and histories). */
export async function seedDemo(db: Db): Promise<void> {
  await seedDemoAccounts(db);
}
