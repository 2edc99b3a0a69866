// The HTTP server and how long it waits for a client. Node's defaults let a client that sends its request slowly
// hold a connection for 5 minutes (requestTimeout 300 s), so a few dozen slow clients could tie the API up.
import http from 'node:http';
import type { RequestListener } from 'node:http';

export type ServerTimeouts = {
  /** The request line and headers must arrive within this. */
  headersMs: number;
  /** The whole request, body included, must arrive within this: the slowest upload we still accept (25 MB at ~2 Mbit/s). */
  requestMs: number;
  /** An idle keep-alive connection is closed after this. */
  keepAliveMs: number;
  /** How often Node looks for connections past the limits above; a cut comes at most this late. */
  checkIntervalMs: number;
};

export const SERVER_TIMEOUTS: ServerTimeouts = {
  headersMs: 10_000,
  requestMs: 120_000,
  keepAliveMs: 5_000,
  checkIntervalMs: 1_000,
};

/** A server whose slow clients are answered 408 and disconnected; JSON bodies have a shorter limit (body-deadline). */
export function createHttpServer(handler: RequestListener | undefined, timeouts: Partial<ServerTimeouts> = {}) {
  const t = { ...SERVER_TIMEOUTS, ...timeouts };
  return http.createServer(
    {
      headersTimeout: t.headersMs,
      requestTimeout: t.requestMs,
      keepAliveTimeout: t.keepAliveMs,
      connectionsCheckingInterval: t.checkIntervalMs,
    },
    handler,
  );
}
