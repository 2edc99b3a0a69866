/** True when MariaDB refused a row because it repeats a unique key (drizzle wraps the driver's error in `cause`). */
export function isDuplicateKeyError(err: unknown): boolean {
  for (let e = err as { code?: unknown; cause?: unknown } | undefined, depth = 0; e && depth < 4; depth++) {
    if (e.code === 'ER_DUP_ENTRY') return true;
    e = e.cause as typeof e;
  }
  return false;
}
