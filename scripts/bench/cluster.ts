// `npm run bench -- --cluster`: the unit page and the visit write through the load balancer of the local cluster
// (3 Galera nodes, HAProxy) with 1, 2 and 3 API processes, and the same two on one plain MariaDB with one API process,
// in the same rounds on the same machine. Ratios are to one API process on the cluster. Writes
// bench/cluster-results.json and the cluster part of README's Performance section.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import mysql, { type RowDataPacket } from 'mysql2/promise';
import { createRng } from '../../seed/simulator/prng';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import {
  apiPid,
  haproxyCommand,
  runningParts,
  startApi,
  startCluster,
  stopApi,
  stopCluster,
} from '../cluster/cluster';
import { clusterUrl, databaseUrl, MAX_API, readState } from '../cluster/layout';
import { createDatabaseAndUser, freePort, newPassword, PROJECT_ROOT, startMariaDb } from '../lib/mariadb';
import { measure, settle, fmtRun, type Run } from './measure';
import type { BenchOptions } from './options';
import { get } from './scenarios';
import { med, summary, type RunSummary } from './summary';
import { createWrites } from './writes';

type Setup = { id: string; title: string; apis: number; url: string };
type Row = {
  setup: string;
  title: string;
  apis: number;
  unitPage: RunSummary;
  visitWrite: RunSummary;
  /** req/s over one API process on the cluster, medians of the rounds' ratios. */
  unitPageRatio: number;
  visitWriteRatio: number;
};
export type ClusterBenchResult = {
  date: string;
  machine: { cpu: string; cores: number; memoryGiB: number; node: string };
  fleet: { units: number; events: number };
  settings: { durationS: number; repeat: number; connections: number };
  rows: Row[];
};

/** Both setups' API processes are configured as the cluster's public address, the origin writes must come from. */
const ORIGIN = `http://localhost:${new URL(clusterUrl()).port}`;

async function signIn(url: string): Promise<Record<string, string>> {
  const res = await fetch(`${url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: ORIGIN },
    body: JSON.stringify({ email: DEMO_ACCOUNTS.find((a) => a.role === 'technician')!.email, password: DEMO_PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`Signing in failed: ${res.status} ${await res.text()}`);
  const cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  return { cookie, origin: ORIGIN, 'content-type': 'application/json', accept: 'application/json' };
}

async function fleetOf(url: string) {
  const conn = await mysql.createConnection({ uri: url });
  try {
    const [units] = await conn.query<RowDataPacket[]>("SELECT id FROM units WHERE status = 'in_service'");
    const [[{ n }]] = await conn.query<RowDataPacket[]>('SELECT COUNT(*) AS n FROM events');
    return { unitIds: units.map((u) => Number(u.id)), events: Number(n) };
  } finally {
    await conn.end();
  }
}

/** Sends the balancer's traffic to API processes 1..n only (the others stay running, idle). */
async function useApis(n: number) {
  for (let i = 1; i <= MAX_API; i++) {
    if (i <= n && !apiPid(i)) await startApi(i);
    await haproxyCommand(`${i <= n ? 'enable' : 'disable'} server api/api${i}`);
  }
  // Until the balancer has seen each enabled process pass its health check.
  const deadline = Date.now() + 15_000;
  for (;;) {
    const stat = await haproxyCommand('show stat');
    const up = stat.split('\n').filter((l) => /^api,api\d,/.test(l) && l.split(',')[17] === 'UP').length;
    if (up === n || Date.now() > deadline) break;
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** One plain MariaDB (no Galera, the durable single-node defaults of `npm start`) with the demo fleet and one API. */
async function startSingleNode(): Promise<{ url: string; dbUrl: string; stop: () => void }> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'tightloop-single-'));
  const server = await startMariaDb({
    dataDir: dir,
    port: await freePort(),
    detached: false,
    durable: true,
    bufferPool: '128M',
  });
  const dbUrl = createDatabaseAndUser(server, 'tightloop', 'tightloop', newPassword());
  const { createDb, migrateDb } = await import('../../server/db/client');
  const { seedDemo } = await import('../../seed/index');
  const { db, pool } = createDb(dbUrl, { connectionLimit: 4 });
  await migrateDb(db);
  await seedDemo(db, { log: () => {} });
  await pool.end();
  const port = await freePort();
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: PROJECT_ROOT,
    stdio: 'ignore',
    env: {
      ...process.env,
      NODE_ENV: 'production',
      PORT: String(port),
      HOST: '127.0.0.1',
      DATABASE_URL: dbUrl,
      PUBLIC_URL: ORIGIN,
      LOG_LEVEL: 'silent',
      STORAGE_DIR: path.join(dir, 'uploads'),
    },
  });
  const url = `http://127.0.0.1:${port}`;
  for (let t = 0; ; t++) {
    const ok = await fetch(`${url}/api/health`)
      .then((r) => r.ok)
      .catch(() => false);
    if (ok) break;
    if (t > 300) throw new Error('the single-node API process did not start');
    await new Promise((r) => setTimeout(r, 200));
  }
  return {
    url,
    dbUrl,
    stop() {
      child.kill('SIGTERM');
      process.kill(server.pid, 'SIGTERM');
      setTimeout(() => rmSync(dir, { recursive: true, force: true }), 2000).unref();
    },
  };
}

export async function runClusterBench(options: BenchOptions): Promise<ClusterBenchResult> {
  const startedHere = runningParts().length === 0;
  const log = (s: string) => console.log(s);
  await startCluster({ apis: MAX_API, log });
  const state = readState()!;
  const cluster = await fleetOf(databaseUrl(state));
  log(`Cluster: ${cluster.unitIds.length} units in service, ${cluster.events.toLocaleString('en')} events.`);
  log('Single node: a plain MariaDB with the demo fleet and one API process…');
  const single = await startSingleNode();
  const cleanUp = async () => {
    single.stop();
    if (startedHere) {
      await stopCluster(log);
    } else {
      await useApis(state.apis);
      for (let i = state.apis + 1; i <= MAX_API; i++) await stopApi(i);
    }
  };
  try {
    return await measureAll(options, cluster.unitIds, single, cleanUp, log, cluster.events);
  } catch (err) {
    await cleanUp().catch(() => undefined);
    throw err;
  }
}

async function measureAll(
  options: BenchOptions,
  clusterUnitIds: number[],
  single: { url: string; dbUrl: string },
  cleanUp: () => Promise<void>,
  log: (s: string) => void,
  clusterEvents: number,
): Promise<ClusterBenchResult> {
  const { durationS, repeat, connections } = options;
  const singleFleet = await fleetOf(single.dbUrl);

  const rng = createRng(20_261_205);
  const setups: Setup[] = [
    { id: 'single', title: 'One MariaDB, one API process (no balancer)', apis: 1, url: single.url },
    ...[1, 2, 3].map((n) => ({
      id: `cluster${n}`,
      title: `3-node Galera cluster, HAProxy, ${n} API process${n > 1 ? 'es' : ''}`,
      apis: n,
      url: clusterUrl(),
    })),
  ];
  const headers = { single: await signIn(single.url), cluster: await signIn(clusterUrl()) };
  const runs: Record<string, { unitPage: Run[]; visitWrite: Run[] }> = {};
  for (const s of setups) runs[s.id] = { unitPage: [], visitWrite: [] };
  const ratio: Record<string, { unitPage: number[]; visitWrite: number[] }> = {};

  try {
    for (let r = 0; r <= repeat; r++) {
      const warm = r === 0;
      const seconds = warm ? Math.min(3, durationS) : durationS;
      const round: Record<string, { unitPage: Run; visitWrite: Run }> = {};
      for (const s of setups) {
        if (s.id !== 'single') await useApis(s.apis);
        const h = s.id === 'single' ? headers.single : headers.cluster;
        const ids = s.id === 'single' ? singleFleet.unitIds : clusterUnitIds;
        const writes = createWrites(rng, ids);
        await settle(s.url);
        const unitPage = await measure(
          s.url,
          get(() => `/api/units/${ids[Math.floor(rng.next() * ids.length)]}/overview`),
          seconds,
          h,
          connections,
        );
        await settle(s.url);
        const visitWrite = await measure(
          s.url,
          [{ method: 'POST', setupRequest: (req) => ({ ...req, ...writes.topUpVisit() }) }],
          seconds,
          h,
          connections,
        );
        if (warm) continue;
        round[s.id] = { unitPage, visitWrite };
        runs[s.id].unitPage.push(unitPage);
        runs[s.id].visitWrite.push(visitWrite);
        log(`round ${r}/${repeat}  ${s.id.padEnd(9)} unit page   ${fmtRun(unitPage)}`);
        log(`round ${r}/${repeat}  ${s.id.padEnd(9)} visit write ${fmtRun(visitWrite)}`);
      }
      if (warm) continue;
      for (const s of setups) {
        const base = round.cluster1;
        const q = (ratio[s.id] ??= { unitPage: [], visitWrite: [] });
        q.unitPage.push(round[s.id].unitPage.rps / base.unitPage.rps);
        q.visitWrite.push(round[s.id].visitWrite.rps / base.visitWrite.rps);
      }
    }
  } finally {
    await cleanUp();
  }

  const cpu = /model name\s*:\s*(.+)/.exec(readFileSync('/proc/cpuinfo', 'utf8'))?.[1]?.trim() ?? os.cpus()[0]?.model;
  const result: ClusterBenchResult = {
    date: new Date().toISOString(),
    machine: {
      cpu: cpu ?? 'unknown',
      cores: os.cpus().length,
      memoryGiB: Math.round(os.totalmem() / 2 ** 30),
      node: process.version,
    },
    fleet: { units: clusterUnitIds.length, events: clusterEvents },
    settings: { durationS, repeat, connections },
    rows: setups.map((s) => ({
      setup: s.id,
      title: s.title,
      apis: s.apis,
      unitPage: summary(runs[s.id].unitPage)!,
      visitWrite: summary(runs[s.id].visitWrite)!,
      unitPageRatio: +med(ratio[s.id].unitPage).toFixed(2),
      visitWriteRatio: +med(ratio[s.id].visitWrite).toFixed(2),
    })),
  };
  await writeClusterResults(result);
  return result;
}

export function renderClusterMarkdown(r: ClusterBenchResult): string {
  const m = r.machine;
  const cell = (x: RunSummary) => `${x.p50Ms} / ${x.p95Ms} / ${x.p99Ms}`;
  const lines = [
    `Measured ${r.date.slice(0, 10)} on ${m.cpu}, ${m.cores} cores, ${m.memoryGiB} GiB, ` +
      `Node ${m.node}: the demo fleet (${r.fleet.units} units in service, ${r.fleet.events.toLocaleString('en')} events), ` +
      `${r.settings.connections} connections saturated, ${r.settings.durationS} s per load, medians of ${r.settings.repeat} rounds; ` +
      'every process of every setup (3 nodes, HAProxy, the API processes, the load generator) shares the same 2 cores. ' +
      'Ratios are req/s over one API process on the cluster in the same round.',
    '',
    '| setup | unit page p50 / p95 / p99 ms | req/s | × | visit write p50 / p95 / p99 ms | req/s | × |',
    '| --- | ---: | ---: | ---: | ---: | ---: | ---: |',
    ...r.rows.map(
      (x) =>
        `| ${x.title} | ${cell(x.unitPage)} | ${x.unitPage.rps} | ${x.unitPageRatio.toFixed(2)} | ${cell(x.visitWrite)} | ${x.visitWrite.rps} | ${x.visitWriteRatio.toFixed(2)} |`,
    ),
    '',
  ];
  return lines.join('\n');
}

async function writeClusterResults(r: ClusterBenchResult) {
  const outDir = path.join(PROJECT_ROOT, 'bench');
  mkdirSync(outDir, { recursive: true });
  writeFileSync(path.join(outDir, 'cluster-results.json'), JSON.stringify(r, null, 2) + '\n');
  // Formatted as the project formats markdown, so the README passes the Prettier check after a run.
  const prettier = await import('prettier');
  const file = path.join(PROJECT_ROOT, 'README.md');
  const config = (await prettier.resolveConfig(file)) ?? {};
  const md = await prettier.format(renderClusterMarkdown(r), { ...config, parser: 'markdown' });
  const start = '<!-- bench:cluster:start -->';
  const end = '<!-- bench:cluster:end -->';
  const readme = readFileSync(file, 'utf8');
  const i = readme.indexOf(start);
  const j = readme.indexOf(end);
  if (i >= 0 && j > i) writeFileSync(file, readme.slice(0, i) + `${start}\n\n${md}\n${end}` + readme.slice(j + end.length));
  console.log(`\n${md}`);
  console.log(`Wrote bench/cluster-results.json${i >= 0 && j > i ? ' and the cluster part of README.md' : ''}.`);
}
