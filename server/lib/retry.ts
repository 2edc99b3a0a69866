// The retry rule for write transactions: a bounded number of attempts with jittered, growing pauses, and only for
// failures that roll the whole transaction back (see isRetryableTransactionError).
import { isRetryableTransactionError } from './db-errors';

export const MAX_WRITE_ATTEMPTS = 6;
const BASE_PAUSE_MS = 8;

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Runs `attempt` again after a deadlock or lock-wait timeout, up to MAX_WRITE_ATTEMPTS times in all. */
export async function retryTransaction<T>(attempt: () => Promise<T>, maxAttempts = MAX_WRITE_ATTEMPTS): Promise<T> {
  for (let n = 1; ; n++) {
    try {
      return await attempt();
    } catch (err) {
      if (n >= maxAttempts || !isRetryableTransactionError(err)) throw err;
      // Full jitter: writers that collided once spread out instead of colliding again in step.
      await pause(Math.random() * BASE_PAUSE_MS * 2 ** n);
    }
  }
}
