// Counters for rate limits live in MariaDB (table rate_limits, through rate-limiter-flexible's MySQL store), so a
// restart does not forget them and every API process behind the load balancer counts against the same limit.
import { RateLimiterMySQL, type RateLimiterRes } from 'rate-limiter-flexible';
import type { Db } from '../db/client';
import { retryTransaction } from './retry';

export type Counter = {
  /** Adds one (a new window of `seconds` when none is open) and answers the count and time left in the window. */
  add(key: string, seconds?: number): Promise<{ count: number; msLeft: number }>;
  /** Takes one back (an attempt that did not count after all). */
  takeBack(key: string): Promise<void>;
  reset(key: string): Promise<void>;
};

export function counterStore(db: Db) {
  // The store speaks the callback API of mysql2; drizzle's promise pool carries it as `.pool`.
  const pool = db.$client.pool;
  const dbName = (pool as unknown as { config: { connectionConfig: { database: string } } }).config.connectionConfig
    .database;
  let cleanupOwner = true;

  return function counter(name: string, windowSeconds: number): Counter {
    const limiter = new RateLimiterMySQL({
      storeClient: pool,
      storeType: 'pool',
      dbName,
      tableName: 'rate_limits',
      tableCreated: true,
      keyPrefix: name,
      // Counted by us, never refused by the library: points is only what "remaining" is measured against.
      points: Number.MAX_SAFE_INTEGER,
      duration: windowSeconds,
      // One periodic sweep of expired rows per store is enough for the whole table.
      clearExpiredByTimeout: cleanupOwner,
    });
    cleanupOwner = false;
    const read = (r: RateLimiterRes) => ({ count: r.consumedPoints, msLeft: Math.max(0, r.msBeforeNext) });
    // The store upserts in a transaction of its own; two counters of one request (per address, per account) insert
    // into neighbouring gaps of the same index and may deadlock. InnoDB rolls the loser back, so it counts again.
    return {
      add: async (key, seconds) =>
        read(await retryTransaction(() => limiter.penalty(key, 1, seconds ? { customDuration: seconds } : {}))),
      takeBack: async (key) => void (await retryTransaction(() => limiter.reward(key, 1))),
      reset: async (key) => void (await retryTransaction(() => limiter.delete(key))),
    };
  };
}

export type CounterStore = ReturnType<typeof counterStore>;
