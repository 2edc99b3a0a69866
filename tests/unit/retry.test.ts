import { describe, expect, it } from 'vitest';
import { MAX_WRITE_ATTEMPTS, retryTransaction } from '../../server/lib/retry';

// drizzle wraps the driver's error in `cause`; MariaDB names deadlocks and lock-wait timeouts by these codes.
const wrapped = (code: string) =>
  Object.assign(new Error('Failed query'), { cause: Object.assign(new Error(code), { code }) });

describe('retryTransaction', () => {
  it('runs a write again after a deadlock and a lock-wait timeout, then returns its result', async () => {
    const failures = [wrapped('ER_LOCK_DEADLOCK'), wrapped('ER_LOCK_WAIT_TIMEOUT')];
    let calls = 0;
    const result = await retryTransaction(async () => {
      calls++;
      const f = failures.shift();
      if (f) throw f;
      return 'written';
    });
    expect(result).toBe('written');
    expect(calls).toBe(3);
  });

  it('does not run a write again for any other failure', async () => {
    let calls = 0;
    await expect(
      retryTransaction(async () => {
        calls++;
        throw wrapped('ER_DUP_ENTRY');
      }),
    ).rejects.toThrow('Failed query');
    expect(calls).toBe(1);
  });

  it('gives up after a bounded number of attempts', async () => {
    let calls = 0;
    await expect(
      retryTransaction(async () => {
        calls++;
        throw wrapped('ER_LOCK_DEADLOCK');
      }, 3),
    ).rejects.toThrow('Failed query');
    expect(calls).toBe(3);
    expect(MAX_WRITE_ATTEMPTS).toBeGreaterThanOrEqual(3);
  });
});
