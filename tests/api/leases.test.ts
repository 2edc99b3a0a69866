// Leases: one API process at a time runs each scheduled task; a holder that stops renewing (its process died) loses
// the lease when it expires, and the next process to ask takes it over.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { acquireLease, leaseHolder, releaseLease, runUnderLease } from '../../server/lib/leases';
import { scheduleMaintenance, SCHEDULE_LEASES } from '../../server/scheduler';
import { openTestDb, resetDb } from '../support/db';

const { db, pool } = openTestDb();
let now = new Date('2026-06-01T12:00:00Z');
const clock = { now: () => now };
const as = (holder: string) => ({ db, clock, holder });
const later = (ms: number) => (now = new Date(now.getTime() + ms));

beforeAll(() => resetDb(db));
afterAll(() => pool.end());

describe('a lease', () => {
  it('goes to the first to ask, stays with it while it renews, and is refused to others meanwhile', async () => {
    expect(await acquireLease(as('a'), 'test-1', 10_000)).toBe(true);
    expect(await acquireLease(as('b'), 'test-1', 10_000)).toBe(false);
    later(8_000);
    expect(await acquireLease(as('a'), 'test-1', 10_000)).toBe(true);
    later(8_000);
    // Renewed 8 s ago for 10 s: still a's.
    expect(await acquireLease(as('b'), 'test-1', 10_000)).toBe(false);
    expect((await leaseHolder(db, 'test-1'))?.holder).toBe('a');
  });

  it('is taken over once its holder stops renewing and it expires; the old holder then cannot renew', async () => {
    expect(await acquireLease(as('a'), 'test-2', 10_000)).toBe(true);
    later(10_001);
    expect(await acquireLease(as('b'), 'test-2', 10_000)).toBe(true);
    expect(await acquireLease(as('a'), 'test-2', 10_000)).toBe(false);
    expect((await leaseHolder(db, 'test-2'))?.holder).toBe('b');
  });

  it('is free at once when its holder hands it back, and only the holder can', async () => {
    expect(await acquireLease(as('a'), 'test-3', 60_000)).toBe(true);
    await releaseLease(as('b'), 'test-3');
    expect(await acquireLease(as('b'), 'test-3', 60_000)).toBe(false);
    await releaseLease(as('a'), 'test-3');
    expect(await acquireLease(as('b'), 'test-3', 60_000)).toBe(true);
  });

  it('goes to exactly one of many asking at the same moment', async () => {
    const asks = await Promise.all(Array.from({ length: 12 }, (_, i) => acquireLease(as(`p${i}`), 'test-4', 10_000)));
    expect(asks.filter(Boolean)).toHaveLength(1);
  });

  it('runs a task only where it is held', async () => {
    let runs = 0;
    const task = async () => void runs++;
    expect(await runUnderLease(as('a'), 'test-5', 10_000, task)).toBe(true);
    expect(await runUnderLease(as('b'), 'test-5', 10_000, task)).toBe(false);
    expect(await runUnderLease(as('a'), 'test-5', 10_000, task)).toBe(true);
    expect(runs).toBe(2);
  });
});

describe('the scheduled maintenance on two API processes', () => {
  it('runs in one process only, and in the other once the first has died and its lease expired', async () => {
    const one = createApp({ db, clock });
    const two = createApp({ db, clock });
    const first = scheduleMaintenance(one.ctx, { holder: 'process-1' });
    const second = scheduleMaintenance(two.ctx, { holder: 'process-2' });
    try {
      // Start-up: whichever asked first holds the lease; ask again so both have had their turn.
      const holder = async () => (await leaseHolder(db, 'maintenance'))?.holder;
      await expect.poll(holder).toBeTruthy();
      const owner = (await holder()) === 'process-1' ? first : second;
      const other = owner === first ? second : first;
      expect(await owner.tick()).toBe(true);
      expect(await other.tick()).toBe(false);
      // The owner's process dies: nothing renews its lease. Before it expires the other still waits…
      later(SCHEDULE_LEASES.maintenance - 1_000);
      expect(await other.tick()).toBe(false);
      // …and takes over at its next tick after that.
      later(2_000);
      expect(await other.tick()).toBe(true);
      expect(await holder()).toBe(other === first ? 'process-1' : 'process-2');
    } finally {
      first.stop();
      second.stop();
      await Promise.all([one.ctx.jobs.waitForAll(), two.ctx.jobs.waitForAll()]);
    }
  });
});
