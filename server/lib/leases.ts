// Leases in MariaDB (table leases): one API process at a time holds a named lease and runs that task; it renews while
// it works, and a process that died stops renewing, so its lease expires and the next process to ask takes it over.
import { randomBytes } from 'node:crypto';
import os from 'node:os';
import { and, eq, lt, or } from 'drizzle-orm';
import type { DbOrTx } from '../db/client';
import { leases } from '../db/schema';
import type { Clock } from './clock';
import { isDuplicateKeyError } from './db-errors';
import { retryTransaction } from './retry';

/** This process's name as a lease holder (host, pid and a random part: a restarted process is a new holder). */
export const PROCESS_HOLDER = `${os.hostname()}:${process.pid}:${randomBytes(4).toString('hex')}`;

export type LeaseDeps = { db: DbOrTx; clock: Clock; holder?: string };

/**
 * Takes the lease (or keeps it, pushing its end out by `ttlMs`) when it is free, expired or already ours; true when
 * this holder has it now.
 */
export async function acquireLease(deps: LeaseDeps, name: string, ttlMs: number): Promise<boolean> {
  const holder = deps.holder ?? PROCESS_HOLDER;
  return retryTransaction(async () => {
    const now = deps.clock.now();
    const expiresAt = new Date(now.getTime() + ttlMs);
    const [res] = (await deps.db
      .update(leases)
      .set({ holder, expiresAt })
      .where(and(eq(leases.name, name), or(eq(leases.holder, holder), lt(leases.expiresAt, now))))) as unknown as [
      { affectedRows: number },
    ];
    if (res.affectedRows === 1) {
      return true;
    }
    try {
      await deps.db.insert(leases).values({ name, holder, expiresAt, acquiredAt: now });
      return true;
    } catch (err) {
      // Someone holds it (the row exists and is neither ours nor expired).
      if (isDuplicateKeyError(err)) return false;
      throw err;
    }
  });
}

/** Gives the lease up at once (a clean shutdown), so another process need not wait for it to expire. */
export async function releaseLease(deps: LeaseDeps, name: string): Promise<void> {
  await deps.db.delete(leases).where(and(eq(leases.name, name), eq(leases.holder, deps.holder ?? PROCESS_HOLDER)));
}

export async function leaseHolder(db: DbOrTx, name: string): Promise<{ holder: string; expiresAt: Date } | null> {
  const [row] = await db
    .select({ holder: leases.holder, expiresAt: leases.expiresAt })
    .from(leases)
    .where(eq(leases.name, name));
  return row ?? null;
}

/**
 * Runs `task` only if this process holds (or can take) the lease; the lease is renewed every third of `ttlMs` while
 * the task runs. Answers whether the task ran here.
 */
export async function runUnderLease(
  deps: LeaseDeps,
  name: string,
  ttlMs: number,
  task: () => Promise<void>,
): Promise<boolean> {
  if (!(await acquireLease(deps, name, ttlMs))) return false;
  const renew = setInterval(() => void acquireLease(deps, name, ttlMs).catch(() => undefined), ttlMs / 3);
  renew.unref();
  try {
    await task();
  } finally {
    clearInterval(renew);
  }
  return true;
}
