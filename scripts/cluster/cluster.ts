// The local cluster as a whole: three Galera nodes, the readiness agent, HAProxy, the fake S3/SMTP services and the
// API processes (the production server), all detached so they outlive `npm run cluster`; their ids go to
// .data/cluster/state.json for `cluster:stop`, the cluster tests and the cluster benchmark. The server's and the
// seed's modules are loaded only by startCluster, so stopping works whatever state the app's code is in.
import { spawn } from 'node:child_process';
import { mkdirSync, openSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import mysql, { type RowDataPacket } from 'mysql2/promise';
import { newPassword, portOpen, PROJECT_ROOT } from '../lib/mariadb';
import { fakeS3Env } from './fake-s3';
import { bootstrapNode, killNode, nodePid, nodeSql, startNode, stopNode } from './galera';
import { startHaproxy } from './haproxy';
import {
  alive,
  BUCKET,
  CHECK_USER,
  CLUSTER_DIR,
  clusterUrl,
  DATABASE,
  databaseUrl,
  HTTP_PORT,
  logFile,
  MAX_API,
  NODES,
  PORTS,
  readState,
  waitUntilGone,
  writeState,
  type ClusterState,
} from './layout';

type Log = (line: string) => void;

const TSX_IMPORT = ['--import', 'tsx'];

function spawnDetached(name: string, args: string[], env: NodeJS.ProcessEnv = {}): number {
  const out = openSync(logFile(name), 'a');
  const child = spawn(process.execPath, [...TSX_IMPORT, ...args], {
    cwd: PROJECT_ROOT,
    detached: true,
    stdio: ['ignore', out, out],
    env: { ...process.env, ...env },
  });
  child.unref();
  return child.pid ?? 0;
}

async function waitFor(what: string, check: () => Promise<boolean>, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error(`${what} did not come up in time (logs in ${CLUSTER_DIR}/logs)`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

async function healthy(url: string): Promise<boolean> {
  try {
    const res = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(2000) });
    return res.ok;
  } catch {
    return false;
  }
}

/** The environment of API process `i`: the production server behind the balancer, uploads in the fake S3. */
function apiEnv(i: number, state: ClusterState): NodeJS.ProcessEnv {
  return {
    NODE_ENV: 'production',
    PORT: String(PORTS.api(i)),
    HOST: '127.0.0.1',
    DATABASE_URL: databaseUrl(state),
    PUBLIC_URL: `http://localhost:${HTTP_PORT}`,
    TRUST_PROXY: 'loopback',
    LOG_LEVEL: 'warn',
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(PORTS.smtp),
    // Uploads arrive here before they go to S3.
    STORAGE_DIR: path.join(CLUSTER_DIR, `api${i}`),
    ...fakeS3Env(`http://127.0.0.1:${PORTS.s3}`, BUCKET),
  };
}

export function apiPid(i: number): number | null {
  const pid = readState()?.pids[`api${i}`];
  return pid && alive(pid) ? pid : null;
}

/** Starts API process `i` and waits until it answers its health check. */
export async function startApi(i: number): Promise<number> {
  const state = readState();
  if (!state) throw new Error('The cluster is not running.');
  const pid = spawnDetached(`api${i}`, ['server/index.ts'], apiEnv(i, state));
  writeState({ ...state, pids: { ...state.pids, [`api${i}`]: pid } });
  await waitFor(`API process ${i}`, () => healthy(`http://127.0.0.1:${PORTS.api(i)}`));
  return pid;
}

export async function stopApi(i: number, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  const pid = apiPid(i);
  if (!pid) return;
  process.kill(pid, signal);
  await waitUntilGone(pid, 15_000);
}

/** Sends a command to HAProxy's admin socket (enable/disable an API process at run time). */
export function haproxyCommand(command: string): Promise<string> {
  return new Promise((resolve, reject) => {
    let out = '';
    const sock = net.connect(path.join(CLUSTER_DIR, 'haproxy.sock'));
    sock.on('data', (d) => (out += d.toString()));
    sock.on('end', () => resolve(out));
    sock.on('error', reject);
    sock.end(`${command}\n`);
  });
}

/** The node HAProxy sends MariaDB connections to now. */
export async function activeNode(): Promise<number | null> {
  const state = readState();
  if (!state) return null;
  let conn: mysql.Connection | null = null;
  try {
    conn = await mysql.createConnection({ uri: databaseUrl(state), connectTimeout: 2000 });
    const [rows] = await conn.query<RowDataPacket[]>('SELECT @@wsrep_node_name AS n');
    return Number(String(rows[0].n).replace('node', ''));
  } catch {
    return null;
  } finally {
    conn?.destroy();
  }
}

function createUsers(node: number, state: ClusterState) {
  const q = (s: string) => s.replace(/'/g, "''");
  // Users and grants replicate: made once on one node, they exist on all three.
  nodeSql(
    node,
    [
      `CREATE DATABASE IF NOT EXISTS \`${DATABASE}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`,
      `CREATE USER IF NOT EXISTS '${state.user}'@'127.0.0.1' IDENTIFIED BY '${q(state.password)}';`,
      `ALTER USER '${state.user}'@'127.0.0.1' IDENTIFIED BY '${q(state.password)}';`,
      `GRANT ALL PRIVILEGES ON \`${DATABASE}\`.* TO '${state.user}'@'127.0.0.1';`,
      // The cluster tests' scratch databases.
      `GRANT ALL PRIVILEGES ON \`${DATABASE}\\_%\`.* TO '${state.user}'@'127.0.0.1';`,
      `CREATE USER IF NOT EXISTS '${CHECK_USER}'@'127.0.0.1' IDENTIFIED BY '${q(state.checkPassword)}';`,
      `ALTER USER '${CHECK_USER}'@'127.0.0.1' IDENTIFIED BY '${q(state.checkPassword)}';`,
    ].join(' '),
  );
}

/** Every part of the cluster that is running. */
export function runningParts(): string[] {
  const state = readState();
  const parts = NODES.filter((i) => nodePid(i)).map((i) => `node${i}`);
  for (const [name, pid] of Object.entries(state?.pids ?? {}))
    if (!name.startsWith('node') && alive(pid)) parts.push(name);
  return parts;
}

export type StartOptions = {
  apis?: number;
  /** Build the client for the API processes to serve (npm run cluster); the tests need only the API. */
  buildClient?: boolean;
  log?: Log;
};

/** Starts whatever part of the cluster is not running yet; the demo fleet is loaded on the first start only. */
export async function startCluster(opts: StartOptions = {}): Promise<ClusterState> {
  const log = opts.log ?? (() => {});
  const apis = Math.min(Math.max(opts.apis ?? 2, 1), MAX_API);
  mkdirSync(path.join(CLUSTER_DIR, 'logs'), { recursive: true });
  const previous = readState();
  let state: ClusterState = {
    user: 'tightloop',
    password: previous?.password ?? newPassword(),
    checkPassword: previous?.checkPassword ?? newPassword(),
    pids: Object.fromEntries(Object.entries(previous?.pids ?? {}).filter(([, pid]) => alive(pid))),
    apis,
    startedAt: new Date().toISOString(),
  };
  writeState(state);

  const running = NODES.filter((i) => nodePid(i));
  const first = running[0] ?? bootstrapNode();
  if (!running.length) {
    log(`Starting node${first} (bootstrapping the cluster)…`);
    await startNode(first, { bootstrap: true });
  }
  for (const i of NODES) {
    if (nodePid(i)) continue;
    log(`Starting node${i} (joining)…`);
    await startNode(i, { bootstrap: false });
  }
  createUsers(first, state);

  if (!alive(state.pids.agent)) state.pids.agent = spawnDetached('galera-agent', ['scripts/cluster/galera-agent.ts']);
  if (!alive(state.pids.haproxy)) state.pids.haproxy = startHaproxy(apis);
  writeState(state);
  await waitFor('HAProxy', () => portOpen(PORTS.db));
  await waitFor('a ready node behind HAProxy', async () => (await activeNode()) !== null);

  const { createDb, migrateDb } = await import('../../server/db/client');
  const { isEmpty, seedDemo } = await import('../../seed/index');
  const { db, pool } = createDb(databaseUrl(state), { connectionLimit: 4 });
  try {
    log('Migrating…');
    await migrateDb(db);
    if (await isEmpty(db)) {
      log('Loading the demo fleet (first start)…');
      await seedDemo(db, { log });
    }
  } finally {
    await pool.end();
  }

  if (!alive(state.pids.services)) {
    state.pids.services = spawnDetached('services', ['scripts/cluster/services.ts']);
    writeState(state);
  }
  await waitFor('the fake S3 and SMTP servers', async () => (await portOpen(PORTS.s3)) && portOpen(PORTS.smtp));
  if (opts.buildClient) (await import('../lib/build-client')).buildClientIfStale(log);
  for (let i = 1; i <= apis; i++) {
    if (apiPid(i)) continue;
    log(`Starting API process ${i} on port ${PORTS.api(i)}…`);
    await startApi(i);
  }
  state = readState()!;
  await waitFor('the load balancer', () => healthy(clusterUrl()));
  return state;
}

/** Stops everything: API processes and helpers first, then the nodes one by one (the last is safe to bootstrap). */
export async function stopCluster(log: Log = () => {}): Promise<void> {
  const state = readState();
  for (const [name, pid] of Object.entries(state?.pids ?? {})) {
    if (name.startsWith('node') || !alive(pid)) continue;
    log(`Stopping ${name}…`);
    process.kill(pid, 'SIGTERM');
  }
  for (const pid of Object.values(state?.pids ?? {})) await waitUntilGone(pid, 15_000);
  for (const i of [...NODES].reverse()) {
    if (!nodePid(i)) continue;
    log(`Stopping node${i}…`);
    await stopNode(i);
  }
}

export { killNode, nodePid, startNode };
