// Counters in MariaDB under concurrent requests: every add counts exactly once, none fails.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { counterStore } from '../../server/lib/rate-limit-store';
import { openTestDb, resetDb } from '../support/db';

const { db, pool } = openTestDb();
beforeAll(() => resetDb(db));
afterAll(() => pool.end());

describe('rate-limit counters', () => {
  it('count every one of many adds sent at once to neighbouring and shared keys, without an error', async () => {
    const counters = counterStore(db);
    const perAddress = counters('probe_addr', 900);
    const perAccount = counters('probe_email', 900);
    const rounds = 60;
    const results = await Promise.allSettled(
      Array.from({ length: rounds }, (_, i) =>
        // Like a sign-in: the address and the account counted side by side.
        Promise.all([
          perAddress.add(`10.0.0.${i % 4}`),
          perAccount.add(`person${i}@example.test`),
          perAccount.add('shared@example.test'),
        ]),
      ),
    );
    expect(
      results.filter((r) => r.status === 'rejected').map((r) => String((r as PromiseRejectedResult).reason)),
    ).toEqual([]);
    const shared = await perAccount.add('shared@example.test');
    expect(shared.count).toBe(rounds + 1);
  });
});
