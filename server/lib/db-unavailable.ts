// Errors that mean "the database cannot be reached" rather than "this query is wrong": the server answers them with
// 503 and Retry-After (ASVS 4.0 7.4.1), so clients wait and try again instead of reading a bug report.

// Connection-level codes of mysql2 and Node, MariaDB's "too many connections" / "shutting down", and Galera's
// "node not ready" (ER_UNKNOWN_COM_ERROR while the node is not part of the primary component).
const UNAVAILABLE = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EHOSTUNREACH',
  'ENETUNREACH',
  'ENOTFOUND',
  'EAI_AGAIN',
  'EPIPE',
  'PROTOCOL_CONNECTION_LOST',
  'PROTOCOL_SEQUENCE_TIMEOUT',
  'ER_CON_COUNT_ERROR',
  'ER_SERVER_SHUTDOWN',
  'ER_UNKNOWN_COM_ERROR',
  'ER_ACCESS_DENIED_ERROR',
]);

/** Seconds a client is told to wait. */
export const DATABASE_RETRY_AFTER_SECONDS = 10;

export function isDatabaseUnavailable(err: unknown): boolean {
  for (
    let e = err as { code?: unknown; fatal?: unknown; message?: unknown; cause?: unknown } | undefined, depth = 0;
    e && depth < 5;
    depth++
  ) {
    if (typeof e.code === 'string' && UNAVAILABLE.has(e.code)) return true;
    // mysql2 marks errors that broke the connection itself as fatal; a closed pool says so in its message.
    if (e.fatal === true) return true;
    if (typeof e.message === 'string' && /^Pool is closed|connection is in closed state/i.test(e.message)) return true;
    e = e.cause as typeof e;
  }
  return false;
}
