// What the cluster tests share: a signed-in HTTP client through the load balancer (or straight to one API process),
// and connections to each Galera node.
import mysql, { type Connection, type RowDataPacket } from 'mysql2/promise';
import { DEMO_PASSWORD } from '../../seed/demo-accounts';
import { clusterUrl, databaseUrl, NODES, readState } from '../../scripts/cluster/layout';
import { wsrepStatus } from '../../scripts/cluster/galera';

export const ORIGIN = `http://localhost:${new URL(clusterUrl()).port}`;

export type Answer = { status: number; body: Record<string, unknown> | null; error?: string };

/** A browser-like client: one session cookie, JSON in and out, every request bounded in time. */
export class Client {
  private cookie = '';
  constructor(
    private readonly base = clusterUrl(),
    private readonly headers: Record<string, string> = {},
  ) {}

  async request(method: string, path: string, body?: unknown, timeoutMs = 20_000): Promise<Answer> {
    try {
      const res = await fetch(`${this.base}${path}`, {
        method,
        headers: {
          ...this.headers,
          Origin: ORIGIN,
          ...(body === undefined ? {} : { 'Content-Type': 'application/json' }),
          ...(this.cookie ? { Cookie: this.cookie } : {}),
        },
        body: body === undefined ? undefined : JSON.stringify(body),
        signal: AbortSignal.timeout(timeoutMs),
      });
      const set = res.headers.getSetCookie();
      if (set.length) this.cookie = set.map((c) => c.split(';')[0]).join('; ');
      const text = await res.text();
      let parsed: Record<string, unknown> | null = null;
      try {
        parsed = text ? (JSON.parse(text) as Record<string, unknown>) : null;
      } catch {
        parsed = null;
      }
      return { status: res.status, body: parsed };
    } catch (err) {
      // No answer at all (connection cut, timeout): the client's queue sends the same submission again.
      return { status: 0, body: null, error: (err as Error).message };
    }
  }

  /** A multipart upload of one file, as the browser sends it. */
  async upload(path: string, field: string, name: string, bytes: Buffer, type: string): Promise<Answer> {
    const form = new FormData();
    form.append(field, new Blob([new Uint8Array(bytes)], { type }), name);
    const res = await fetch(`${this.base}${path}`, {
      method: 'POST',
      headers: { Origin: ORIGIN, Cookie: this.cookie },
      body: form,
      signal: AbortSignal.timeout(30_000),
    });
    return { status: res.status, body: (await res.json()) as Record<string, unknown> };
  }

  /** The raw bytes of a download. */
  async download(path: string): Promise<{ status: number; bytes: Buffer }> {
    const res = await fetch(`${this.base}${path}`, { headers: { Cookie: this.cookie } });
    return { status: res.status, bytes: Buffer.from(await res.arrayBuffer()) };
  }

  /** The same session through another address (another API process): sessions live in the database. */
  via(base: string): Client {
    const other = new Client(base);
    other.cookie = this.cookie;
    return other;
  }

  async signIn(email: string, password = DEMO_PASSWORD): Promise<Answer> {
    return this.request('POST', '/api/auth/sign-in', { email, password });
  }
}

export function appState() {
  const state = readState();
  if (!state) throw new Error('The cluster is not running.');
  return state;
}

/** A connection as the application's user straight to node `i` (not through the balancer). */
export function connectNode(i: number): Promise<Connection> {
  return mysql.createConnection({
    uri: databaseUrl(appState(), i),
    timezone: 'Z',
    supportBigNumbers: true,
    connectTimeout: 5000,
  });
}

export async function rows<T = RowDataPacket>(conn: Connection, sql: string, params: unknown[] = []): Promise<T[]> {
  const [r] = await conn.query<RowDataPacket[]>(sql, params);
  return r as T[];
}

/** Waits until every node has applied the same last write set (so counts and checksums can be compared). */
export async function waitForNodesToAgree(timeoutMs = 60_000): Promise<string> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const seen = NODES.map((i) => {
      try {
        const s = wsrepStatus(i);
        return s.wsrep_local_state_comment === 'Synced' ? s.wsrep_last_committed : `not synced (${i})`;
      } catch {
        return `down (${i})`;
      }
    });
    if (new Set(seen).size === 1 && !seen[0].includes('(')) return seen[0];
    if (Date.now() > deadline) throw new Error(`nodes did not converge: ${seen.join(', ')}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
