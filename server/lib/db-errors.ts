/** The MariaDB error codes along drizzle's wrapping chain (it puts the driver's error in `cause`). */
function codesOf(err: unknown): string[] {
  const codes: string[] = [];
  for (let e = err as { code?: unknown; cause?: unknown } | undefined, depth = 0; e && depth < 4; depth++) {
    if (typeof e.code === 'string') codes.push(e.code);
    e = e.cause as typeof e;
  }
  return codes;
}

/** True when MariaDB refused a row because it repeats a unique key. */
export function isDuplicateKeyError(err: unknown): boolean {
  return codesOf(err).includes('ER_DUP_ENTRY');
}

/** True when a row names a parent (a site, a unit) that a concurrent write removed before this one committed. */
export function isMissingParentError(err: unknown): boolean {
  return codesOf(err).includes('ER_NO_REFERENCED_ROW_2');
}

// A deadlock or lock-wait timeout rolls back the whole transaction; running it again is safe when the write is
// idempotent (every history write is, by its submission key). On a Galera cluster a write that fails certification
// comes back as ER_LOCK_DEADLOCK too, so the same rule covers it (decision record 012).
const RETRYABLE = new Set(['ER_LOCK_DEADLOCK', 'ER_LOCK_WAIT_TIMEOUT']);

export function isRetryableTransactionError(err: unknown): boolean {
  return codesOf(err).some((c) => RETRYABLE.has(c));
}
