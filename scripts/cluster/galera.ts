// One MariaDB Galera node on loopback (Debian's mariadb-server + galera-4): its data folder, start (bootstrap or
// join), readiness, a hard kill for the failure tests, a clean stop.
import { execFileSync, spawn } from 'node:child_process';
import { chownSync, existsSync, mkdirSync, openSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { findMariadbd, portOpen } from '../lib/mariadb';
import {
  alive,
  CLUSTER_DIR,
  logFile,
  mysqlUid,
  NODE_ROOT,
  NODES,
  nodeDir,
  nodeSocket,
  PORTS,
  waitUntilGone,
} from './layout';

export const GALERA_PROVIDER = '/usr/lib/galera/libgalera_smm.so';
const isRoot = () => process.getuid?.() === 0;

/** As root the nodes run as `mysql` (rsync SST refuses to work as root); otherwise as the caller. */
function runAs(): { uid: number; gid: number } | null {
  if (!isRoot()) return null;
  const uid = mysqlUid();
  if (uid === null) throw new Error('The mysql system user is missing (it comes with mariadb-server).');
  const line = readFileSync('/etc/passwd', 'utf8')
    .split('\n')
    .find((l) => l.startsWith('mysql:'))!;
  return { uid, gid: Number(line.split(':')[3]) };
}

function chownTree(dir: string, owner: { uid: number; gid: number }) {
  execFileSync('chown', ['-R', `${owner.uid}:${owner.gid}`, dir]);
}

export function initNode(i: number): void {
  const dir = nodeDir(i);
  if (NODE_ROOT !== CLUSTER_DIR) {
    // The data lives where the mysql user can reach it; .data/cluster/nodeN points there.
    const link = path.join(CLUSTER_DIR, `node${i}`);
    mkdirSync(dir, { recursive: true });
    if (!existsSync(link)) symlinkSync(dir, link);
  }
  if (existsSync(path.join(dir, 'mysql'))) return;
  mkdirSync(dir, { recursive: true });
  const owner = runAs();
  if (owner) chownSync(dir, owner.uid, owner.gid);
  const args = [
    '--no-defaults',
    `--datadir=${dir}`,
    '--auth-root-authentication-method=socket',
    '--skip-test-db',
    '--skip-name-resolve',
  ];
  args.push(`--user=${owner ? 'mysql' : os.userInfo().username}`);
  execFileSync('mariadb-install-db', args, { stdio: ['ignore', 'ignore', 'pipe'] });
  if (owner) chownTree(dir, owner);
}

/** Whether this node may start a new cluster: it left last, cleanly (Galera writes safe_to_bootstrap: 1 then). */
export function safeToBootstrap(i: number): boolean {
  const file = path.join(nodeDir(i), 'grastate.dat');
  return existsSync(file) && /safe_to_bootstrap:\s*1/.test(readFileSync(file, 'utf8'));
}

/** The node to bootstrap from: the one that left last, or node 1 for a new cluster or after all were killed. */
export function bootstrapNode(): number {
  const safe = NODES.find(safeToBootstrap);
  if (safe) return safe;
  const file = path.join(nodeDir(1), 'grastate.dat');
  if (existsSync(file)) {
    // Every node went down hard: node 1 starts the cluster again; the others take what they lack from it.
    writeFileSync(file, readFileSync(file, 'utf8').replace(/safe_to_bootstrap:\s*0/, 'safe_to_bootstrap: 1'));
  }
  return 1;
}

function nodeArgs(i: number, bootstrap: boolean): string[] {
  const dir = nodeDir(i);
  const peers = NODES.map((n) => `127.0.0.1:${PORTS.galera(n)}`).join(',');
  const provider = [
    `gmcast.listen_addr=tcp://127.0.0.1:${PORTS.galera(i)}`,
    `ist.recv_addr=127.0.0.1:${PORTS.ist(i)}`,
    // Enough write sets for a node that was away for minutes to catch up by IST instead of a full copy.
    'gcache.size=256M',
  ].join(';');
  const args = [
    '--no-defaults',
    `--datadir=${dir}`,
    `--socket=${nodeSocket(i)}`,
    `--pid-file=${path.join(dir, 'mariadb.pid')}`,
    `--port=${PORTS.node(i)}`,
    '--bind-address=127.0.0.1',
    '--skip-name-resolve',
    `--log-error=${path.join(dir, 'error.log')}`,
    '--character-set-server=utf8mb4',
    '--collation-server=utf8mb4_unicode_ci',
    // Three nodes share two cores with the API processes: small caches, few threads.
    '--innodb-buffer-pool-size=128M',
    '--innodb-log-file-size=64M',
    '--max-connections=200',
    '--performance-schema=OFF',
    '--thread-handling=one-thread-per-connection',
    // What Galera needs: row-based replication, InnoDB, interleaved auto-increment locks.
    '--binlog-format=ROW',
    '--default-storage-engine=InnoDB',
    '--enforce-storage-engine=InnoDB',
    '--innodb-autoinc-lock-mode=2',
    // A commit is durable once the cluster has certified it (it is on three nodes); the log is flushed each second.
    '--innodb-flush-log-at-trx-commit=2',
    // Refuse what Galera cannot replicate faithfully instead of letting the nodes drift apart: a table without a
    // primary key, writes to a non-InnoDB table.
    '--wsrep-mode=REQUIRED_PRIMARY_KEY,STRICT_REPLICATION',
    '--wsrep-on=ON',
    `--wsrep-provider=${GALERA_PROVIDER}`,
    '--wsrep-cluster-name=tightloop',
    `--wsrep-cluster-address=gcomm://${peers}`,
    `--wsrep-node-name=node${i}`,
    `--wsrep-node-address=127.0.0.1:${PORTS.galera(i)}`,
    `--wsrep-node-incoming-address=127.0.0.1:${PORTS.node(i)}`,
    `--wsrep-provider-options=${provider}`,
    '--wsrep-sst-method=rsync',
    `--wsrep-sst-receive-address=127.0.0.1:${PORTS.sst(i)}`,
    '--wsrep-slave-threads=2',
    // Each node hands out its own auto-increment values (offset = its index, step = cluster size): no two nodes
    // ever pick the same id, whichever node a write lands on.
    '--wsrep-auto-increment-control=ON',
    // Reads wait until the node has applied every write set certified before them: a read sees every write
    // acknowledged before it, on whichever node it lands (decision record 012).
    '--wsrep-sync-wait=1',
  ];
  if (bootstrap) args.push('--wsrep-new-cluster');
  if (runAs()) args.push('--user=mysql');
  return args;
}

/** Runs SQL on one node as its superuser over the unix socket. */
export function nodeSql(i: number, sql: string): string {
  return execFileSync(
    'mariadb',
    ['--no-defaults', `--socket=${nodeSocket(i)}`, '-u', isRoot() ? 'root' : os.userInfo().username, '-N', '-e', sql],
    { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] },
  );
}

export function wsrepStatus(i: number): Record<string, string> {
  const out = nodeSql(
    i,
    "SHOW GLOBAL STATUS WHERE Variable_name IN ('wsrep_local_state_comment', 'wsrep_ready', 'wsrep_cluster_size', 'wsrep_cluster_status', 'wsrep_last_committed')",
  );
  return Object.fromEntries(
    out
      .trim()
      .split('\n')
      .map((l) => l.split('\t') as [string, string]),
  );
}

export function nodeSynced(i: number): boolean {
  try {
    const s = wsrepStatus(i);
    return s.wsrep_local_state_comment === 'Synced' && s.wsrep_ready === 'ON' && s.wsrep_cluster_status === 'Primary';
  } catch {
    return false;
  }
}

export function nodePid(i: number): number | null {
  try {
    const pid = Number(readFileSync(path.join(nodeDir(i), 'mariadb.pid'), 'utf8').trim());
    return alive(pid) ? pid : null;
  } catch {
    return null;
  }
}

/** Starts a node (detached: it outlives the caller) and waits until it is synced with the cluster. */
export async function startNode(i: number, opts: { bootstrap: boolean; timeoutMs?: number }): Promise<number> {
  initNode(i);
  const out = openSync(logFile(`node${i}`), 'a');
  const child = spawn(findMariadbd(), nodeArgs(i, opts.bootstrap), { detached: true, stdio: ['ignore', out, out] });
  let exited = false;
  child.once('exit', () => (exited = true));
  child.unref();
  const deadline = Date.now() + (opts.timeoutMs ?? 180_000);
  while (!(await portOpen(PORTS.node(i))) || !nodeSynced(i)) {
    if (exited) throw new Error(`node${i} exited during start-up; see ${path.join(nodeDir(i), 'error.log')}`);
    if (Date.now() > deadline) throw new Error(`node${i} did not join the cluster in time; see its error.log`);
    await new Promise((r) => setTimeout(r, 250));
  }
  return child.pid ?? 0;
}

/** kill -9: the failure the tests inject. */
export function killNode(i: number): boolean {
  const pid = nodePid(i);
  if (!pid) return false;
  process.kill(pid, 'SIGKILL');
  return true;
}

/** A clean shutdown; the last node to leave is marked safe to bootstrap the next start from. */
export async function stopNode(i: number, timeoutMs = 120_000): Promise<void> {
  const pid = nodePid(i);
  if (!pid) return;
  process.kill(pid, 'SIGTERM');
  if (!(await waitUntilGone(pid, timeoutMs))) throw new Error(`node${i} did not stop in time`);
}
