// `npm run bench`: the app against the benchmark fleet (run `npm run seed:bench -- --units 100000` first), driven over
// loopback with autocannon, beside a bare Express + one primary-key select measured in the same run; then the
// forecast backtest on the simulated fleet. Writes bench/results.json, bench/results.md and the README section.
//   --duration <s>   seconds per scenario (default 10)     --repeat <n>  runs of each scenario, medians quoted (3)
//   --connections    concurrent connections (16)           --backtest-units <n>  units in the backtest (4000)
//   --rate <n>       requests/s of the steady-load runs (50)
//   --only <ids>     only these scenarios, comma-separated (e.g. `visitWrite,visitTopUp,mixedWrite`; `fleetTableEach`
//                    and `backtest` name the two later parts). A partial run leaves bench/results.* and the README alone
//                    and writes its table to `--out` (default .data/bench-partial.md, with a .json beside it).
// Each scenario is measured twice: saturated (every connection sends its next request as soon as the last is
// answered, so latency is mostly queueing and req/s is the capacity) and at a steady load (requests arrive at random,
// `--rate` a second on average, and each is timed from when it was due, so a slow answer cannot hide the ones queued
// behind it). Each target says which of the two it is read from.
import { spawn, type ChildProcess } from 'node:child_process';
import http from 'node:http';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import mysql from 'mysql2/promise';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../seed/demo-accounts';
import { backtestForecast, type BacktestResult } from '../seed/simulator/backtest';
import { createFleet, DEFAULT_SEED } from '../seed/simulator/fleet';
import { createRng } from '../seed/simulator/prng';
import { FLEET_SORTS } from '../shared/schemas/fleet';
import { DEFAULT_SETTINGS } from '../shared/schemas/settings';
import { ensureProjectDatabase, freePort, PROJECT_ROOT } from './lib/mariadb';
import { BENCH_DATABASE, BENCH_SEED_INFO } from './lib/bench-paths';

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 && process.argv[i + 1] ? Number(process.argv[i + 1]) : fallback;
}
const DURATION_S = arg('duration', 10);
const REPEAT = arg('repeat', 3);
const CONNECTIONS = arg('connections', 16);
const BACKTEST_UNITS = arg('backtest-units', 4000);
// The forecast learns from a simulated fleet of another seed than the one it is tested on (DOMAIN.md §7b).
const BACKTEST_TRAIN_SEED = arg('backtest-train-seed', 7);
const STEADY_RATE = arg('rate', 50);
function textArg(name: string): string | undefined {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : undefined;
}
const ONLY = textArg('only')
  ?.split(',')
  .map((s) => s.trim())
  .filter(Boolean);
const PARTIAL = ONLY !== undefined;
type Regime = 'saturated' | 'steady';
type Target = { p95Ms: number; at: Regime };
// Unit page (at 16 connections), visit write (the same) and the baseline share: the benchmark issue; the busy unit
// page and the visit write, p95 ≤ 50 ms with no load named: the service-history issue, read at the steady load; the
// fleet table and overview: the fleet-views issue, read saturated (the harder of the two).
const TARGETS = {
  unitPage: [{ p95Ms: 30, at: 'saturated' }],
  unitPageBusy: [{ p95Ms: 50, at: 'steady' }],
  fleetTable: [{ p95Ms: 100, at: 'saturated' }],
  fleetOverview: [{ p95Ms: 300, at: 'saturated' }],
  visitWrite: [
    { p95Ms: 50, at: 'saturated' },
    { p95Ms: 50, at: 'steady' },
  ],
  unitPageBaselineShare: 0.4,
} satisfies Record<string, Target[] | number>;

const url = process.env.DATABASE_URL ?? (await ensureProjectDatabase(BENCH_DATABASE));
const seedInfo = existsSync(BENCH_SEED_INFO)
  ? (JSON.parse(readFileSync(BENCH_SEED_INFO, 'utf8')) as Record<string, unknown>)
  : null;

// --- what to ask for ---------------------------------------------------------------------------------------------
const sql = await mysql.createConnection({ uri: url, timezone: 'Z' });
const one = async <T>(q: string, params: unknown[] = []): Promise<T[]> => (await sql.query(q, params))[0] as T[];
const [{ n: unitTotal }] = await one<{ n: number }>('SELECT COUNT(*) AS n FROM units').catch(() => [{ n: 0 }]);
if (!Number(unitTotal)) {
  console.error('The benchmark database is empty. Run `npm run seed:bench -- --units 100000` first.');
  process.exit(1);
}
const [{ n: eventTotal }] = await one<{ n: number }>('SELECT COUNT(*) AS n FROM events');
const [busiest] = await one<{ unitId: number }>(
  'SELECT unit_id AS unitId FROM unit_stats ORDER BY event_count DESC LIMIT 1',
);
const [{ n: busyEvents }] = await one<{ n: number }>('SELECT COUNT(*) AS n FROM events WHERE unit_id = ?', [
  busiest.unitId,
]);
const busy = { unitId: busiest.unitId, events: Number(busyEvents) };
const rng = createRng(20_260_601);
const inService = (
  await one<{ id: number }>("SELECT id FROM units WHERE status = 'in_service' AND id <> ?", [busy.unitId])
).map((r) => r.id);
const sample = (list: number[], k: number) =>
  Array.from({ length: k }, () => list[Math.floor(rng.next() * list.length)]);
const unitIds = sample(inService, 5000);
const writeIds = sample(inService, 5000);
const tokens = (
  await one<{ t: string }>('SELECT qr_token AS t FROM units WHERE id IN (?)', [sample(inService, 2000)])
).map((r) => r.t);
const [site] = await one<{ id: number }>(
  'SELECT site_id AS id FROM units GROUP BY site_id ORDER BY COUNT(*) DESC LIMIT 1',
);
// Container-number searches: the owner code with two, three and four digits (in the simulated fleet about 3 %,
// 0.3 % and 0.03 % of it), and the start that keeps closest to 1 % — near the share where the table stops walking
// the sort index and reads the matching units instead, so the slower of the two ways shows.
const [{ n: sampleNumber }] = await one<{ n: string }>('SELECT container_number AS n FROM units WHERE id = ?', [
  unitIds[0],
]);
const [onePercent] = await one<{ p: string }>(
  'SELECT p FROM (SELECT LEFT(container_number, 5) AS p, COUNT(*) AS n FROM units GROUP BY p UNION ALL SELECT LEFT(container_number, 6), COUNT(*) FROM units GROUP BY 1) AS starts ORDER BY ABS(n - ? * 0.01) LIMIT 1',
  [Number(unitTotal)],
);
// What the steady rate stands for: the simulated fleet's busiest hour of visits in the year before it was seeded.
const seededAt = new Date(String(seedInfo?.asOf ?? new Date().toISOString()));
const [peakHour] = await one<{ c: number }>(
  "SELECT COUNT(*) AS c FROM visits WHERE occurred_at >= ? - INTERVAL 365 DAY AND occurred_at < ? GROUP BY DATE_FORMAT(occurred_at, '%Y-%m-%d %H') ORDER BY c DESC LIMIT 1",
  [seededAt, seededAt],
);
await sql.end();
const peakVisits = Number(peakHour?.c ?? 0);
const visitLoad = peakVisits
  ? ` The simulated fleet's busiest hour in its last year had ${peakVisits} visits (${(peakVisits / 3600).toFixed(3)} a second): ` +
    `the steady load is ${Math.round((STEADY_RATE * 3600) / peakVisits).toLocaleString('en')} times that.`
  : '';
console.log(
  `Benchmark database: ${Number(unitTotal).toLocaleString('en')} units, ${Number(eventTotal).toLocaleString('en')} events; ` +
    `busiest unit ${busy.unitId} with ${busy.events} events.`,
);

// --- servers -------------------------------------------------------------------------------------------------
const tsx = path.join(PROJECT_ROOT, 'node_modules', '.bin', 'tsx');
const children: ChildProcess[] = [];
async function startServer(mode: 'app' | 'baseline'): Promise<string> {
  const port = await freePort();
  const child = spawn(tsx, [path.join(PROJECT_ROOT, 'scripts/lib/bench-server.ts'), mode, String(port)], {
    env: { ...process.env, DATABASE_URL: url, NODE_ENV: 'production', LOG_LEVEL: 'silent' },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  children.push(child);
  await new Promise<void>((resolve, reject) => {
    child.once('exit', (code) => reject(new Error(`bench ${mode} server exited (${code})`)));
    child.stdout!.on('data', (b: Buffer) => {
      if (b.toString().includes('ready')) resolve();
    });
  });
  return `http://127.0.0.1:${port}`;
}
const stopAll = () => {
  for (const c of children) if (c.exitCode === null) c.kill('SIGTERM');
};
process.once('exit', stopAll);
process.once('SIGINT', () => {
  stopAll();
  process.exit(130);
});

const appUrl = await startServer('app');
const baselineUrl = await startServer('baseline');
const signIn = await fetch(`${appUrl}/api/auth/sign-in`, {
  method: 'POST',
  headers: { 'content-type': 'application/json', origin: appUrl },
  body: JSON.stringify({ email: DEMO_ACCOUNTS.find((a) => a.role === 'engineer')!.email, password: DEMO_PASSWORD }),
});
if (signIn.status !== 200)
  throw new Error(`Signing in as the demo engineer failed: ${signIn.status} ${await signIn.text()}`);
const cookie = signIn.headers
  .getSetCookie()
  .map((c) => c.split(';')[0])
  .join('; ');

// --- scenarios -----------------------------------------------------------------------------------------------
type Scenario = {
  id: string;
  title: string;
  targets?: Target[];
  probe: string;
  requests: () => autocannon.Request[];
  /** Fewer connections than the others, said in the title. */
  connections?: number;
};
let seq = 0;
const pick = <T>(xs: readonly T[]) => xs[Math.floor(rng.next() * xs.length)];
const fleetQueries = [
  'sort=score&dir=desc',
  'sort=rate&dir=desc',
  'sort=forecast&dir=asc',
  `sort=score&dir=desc&siteId=${site.id}`,
  'sort=score&dir=desc&band=chronic',
];
// Every sort both ways and every filter on its own, each measured by itself once (the fleet-views issue asks for each).
const fleetEachQueries = [
  ...FLEET_SORTS.flatMap((s) => [`sort=${s}&dir=desc`, `sort=${s}&dir=asc`]),
  ...[
    `siteId=${site.id}`,
    'refrigerant=R-404A',
    'status=out_of_service',
    'band=chronic',
    'band=watch',
    'rateAbove=20',
    'forecastDays=30',
    'forecastOverdue=1',
    'leakCheckOverdue=1',
    'ptiExpired=1',
    `q=${sampleNumber.slice(0, 6)}`,
    `q=${sampleNumber.slice(0, 7)}`,
    `q=${sampleNumber.slice(0, 8)}`,
    ...(onePercent ? [`q=${onePercent.p}`] : []),
    'page=40',
    'count=1',
    `count=1&siteId=${site.id}`,
    'count=1&band=watch',
  ].map((f) => `sort=score&dir=desc&${f}`),
];
const get = (p: () => string): autocannon.Request[] => [
  {
    method: 'GET',
    setupRequest: (req) => ({ ...req, path: p() }),
  },
];
const scenarios: Scenario[] = [
  {
    id: 'unitPage',
    title: 'Unit page `GET /api/units/:id/overview`, random units',
    targets: TARGETS.unitPage,
    probe: `/api/units/${unitIds[0]}/overview`,
    requests: () => get(() => `/api/units/${pick(unitIds)}/overview`),
  },
  {
    id: 'unitPageBusy',
    title: `Unit page, the unit with ${busy.events.toLocaleString('en')} events`,
    targets: TARGETS.unitPageBusy,
    probe: `/api/units/${busy.unitId}/overview`,
    requests: () => get(() => `/api/units/${busy.unitId}/overview`),
  },
  {
    id: 'fleetTable',
    title: 'Fleet table `GET /api/fleet` (3 sorts, site and band filters, pages 1–5)',
    targets: TARGETS.fleetTable,
    probe: `/api/fleet?${fleetQueries[0]}`,
    requests: () => get(() => `/api/fleet?${pick(fleetQueries)}&page=${1 + Math.floor(rng.next() * 5)}`),
  },
  {
    id: 'fleetOverview',
    title: 'Fleet overview `GET /api/fleet/overview`',
    targets: TARGETS.fleetOverview,
    probe: '/api/fleet/overview',
    requests: () => get(() => '/api/fleet/overview'),
  },
  {
    id: 'visitWrite',
    title: 'Visit write `POST /api/visits` (pressure reading + PTI, unique keys)',
    targets: TARGETS.visitWrite,
    probe: '',
    requests: () => [
      {
        method: 'POST',
        setupRequest: (req) => ({ ...req, path: '/api/visits', body: JSON.stringify(visitBody()) }),
      },
    ],
  },
  {
    id: 'visitTopUp',
    title: 'Visit with a top-up `POST /api/visits` (top-up + pressure reading, random units, unique keys)',
    probe: '',
    requests: () => [
      {
        method: 'POST',
        setupRequest: (req) => ({ ...req, path: '/api/visits', body: JSON.stringify(visitBody(topUpEntries())) }),
      },
    ],
  },
  {
    id: 'mixedWrite',
    title:
      'Mixed writes: visits with a top-up (35 %), a recovery (10 %) or a pressure reading (15 %), voids of recent entries ' +
      '`POST /api/events/:id/void` (20 %), charge edits `PATCH /api/units/:id` (20 %)',
    probe: '',
    requests: () => [
      {
        method: 'POST',
        setupRequest: (req, context) => ({ ...req, ...mixedWrite(context as WriteContext) }),
        onResponse: (status, body, context) => answered(status, body, context as WriteContext),
      },
    ],
  },
  {
    id: 'scanLookup',
    title: 'Scan lookup `GET /api/units/by-token/:token`',
    probe: `/api/units/by-token/${tokens[0]}`,
    requests: () => get(() => `/api/units/by-token/${pick(tokens)}`),
  },
];
const runTag = Date.now().toString(36);
const LATER_PARTS = ['fleetTableEach', 'backtest'];
const unknownIds = (ONLY ?? []).filter((id) => !scenarios.some((s) => s.id === id) && !LATER_PARTS.includes(id));
if (unknownIds.length) {
  console.error(
    `Unknown --only ${unknownIds.join(', ')}; known: ${[...scenarios.map((s) => s.id), ...LATER_PARTS].join(', ')}.`,
  );
  stopAll();
  process.exit(2);
}
const selected = scenarios.filter((s) => !ONLY || ONLY.includes(s.id));
const runsPart = (id: string) => !ONLY || ONLY.includes(id);
const pressureEntry = {
  kind: 'pressure',
  suctionKPaG: 95,
  dischargeKPaG: 880,
  ambientC: 21.5,
  setPointC: -18,
  sightGlass: 'full',
};
function visitBody(events: object[] = [pressureEntry, { kind: 'pti', passed: true }]) {
  seq++;
  return {
    idempotencyKey: `bench-${runTag}-${seq}`,
    unitId: pick(writeIds),
    occurredAt: new Date(Date.now() - 60_000).toISOString(),
    events,
  };
}
// Up to 1.5 kg, well under twice the smallest charge a unit is seeded with, so every body passes the plausibility rule.
const someKg = () => Math.round(20 + rng.next() * 130) / 100;
const cylinderId = () => `BENCH-CYL-${100 + Math.floor(rng.next() * 24)}`;
const topUpEntries = () => [{ kind: 'top_up', kg: someKg(), cylinder: cylinderId() }, pressureEntry];

// The mixed scenario: what each connection sends next is drawn by weight; voids take entries this process recorded
// moments ago (each at most once, so a 409 for an entry voided twice does not count as a failure of the write path).
type WriteKind = 'topUp' | 'recovery' | 'pressure' | 'void' | 'unitEdit';
type WriteContext = { kind?: WriteKind };
const MIX: [WriteKind, number][] = [
  ['topUp', 0.35],
  ['recovery', 0.1],
  ['pressure', 0.15],
  ['void', 0.2],
  ['unitEdit', 0.2],
];
const recentEvents: number[] = [];
const RECENT_EVENTS_KEPT = 5000;
function mixedWrite(context: WriteContext): { method: string; path: string; body: string } {
  let r = rng.next();
  let kind = MIX.find(([, w]) => (r -= w) < 0)?.[0] ?? 'topUp';
  if (kind === 'void' && !recentEvents.length) kind = 'topUp';
  context.kind = kind;
  switch (kind) {
    case 'void': {
      const i = Math.floor(rng.next() * recentEvents.length);
      const id = recentEvents[i];
      recentEvents[i] = recentEvents[recentEvents.length - 1];
      recentEvents.pop();
      return {
        method: 'POST',
        path: `/api/events/${id}/void`,
        body: JSON.stringify({ reason: 'Benchmark: entered on the wrong unit' }),
      };
    }
    case 'unitEdit':
      return {
        method: 'PATCH',
        path: `/api/units/${pick(writeIds)}`,
        body: JSON.stringify({ nominalChargeKg: Math.round(40 + rng.next() * 20) / 10 }),
      };
    case 'recovery':
      return {
        method: 'POST',
        path: '/api/visits',
        body: JSON.stringify(visitBody([{ kind: 'recovery', kg: someKg(), cylinder: cylinderId() }])),
      };
    case 'pressure':
      return { method: 'POST', path: '/api/visits', body: JSON.stringify(visitBody([pressureEntry])) };
    default:
      return { method: 'POST', path: '/api/visits', body: JSON.stringify(visitBody(topUpEntries())) };
  }
}
/** The kind of the request autocannon has just had answered; its 'response' event follows `onResponse` synchronously. */
let answeredKind: WriteKind | undefined;
const WRITE_NAMES = {
  visitWrite: 'Visit (pressure reading + PTI)',
  visitTopUp: 'Visit with a top-up',
  mixedWrite: 'Mixed writes',
};
const KIND_NAMES: Record<WriteKind, string> = {
  topUp: 'visit with a top-up',
  recovery: 'visit with a recovery',
  pressure: 'visit with a pressure reading',
  void: 'void of a recent entry',
  unitEdit: 'charge edit',
};
function answered(status: number, body: string, context: WriteContext) {
  answeredKind = context.kind;
  if (status !== 201 || context.kind === 'void' || context.kind === 'unitEdit') return;
  for (const e of (JSON.parse(body) as { events: { id: number }[] }).events) recentEvents.push(e.id);
  if (recentEvents.length > RECENT_EVENTS_KEPT) recentEvents.splice(0, recentEvents.length - RECENT_EVENTS_KEPT);
}

/** Answers other than 2xx by status code. */
type Statuses = Record<string, number>;
type KindRun = {
  /** 2xx answers a second: what a write scenario got done (a fast 500 adds to req/s, not to this). */
  okRps: number;
  requests: number;
  non2xx: number;
  s5xx: number;
  statuses: Statuses;
  p50: number;
  p95: number;
  p99: number;
};
type Run = {
  rps: number;
  okRps: number;
  p50: number;
  p95: number;
  p99: number;
  requests: number;
  errors: number;
  non2xx: number;
  s5xx: number;
  statuses: Statuses;
  /** The mixed write scenario's figures per kind of request. */
  byKind?: Record<string, KindRun>;
};

/** Tallies answers per kind of request, for scenarios that say which kind each request was. */
function kindTally() {
  const seen = new Map<string, { times: number[]; non2xx: number; s5xx: number; statuses: Statuses }>();
  return {
    add(kind: string | undefined, status: number, ms: number) {
      if (!kind) return;
      let k = seen.get(kind);
      if (!k) seen.set(kind, (k = { times: [], non2xx: 0, s5xx: 0, statuses: {} }));
      k.times.push(ms);
      if (status < 200 || status >= 300) {
        k.non2xx++;
        k.statuses[status] = (k.statuses[status] ?? 0) + 1;
      }
      if (status >= 500) k.s5xx++;
    },
    result(seconds: number): Record<string, KindRun> | undefined {
      if (!seen.size) return undefined;
      return Object.fromEntries(
        [...seen].map(([kind, k]) => {
          const sorted = Float64Array.from(k.times).sort();
          return [
            kind,
            {
              okRps: (k.times.length - k.non2xx) / seconds,
              requests: k.times.length,
              non2xx: k.non2xx,
              s5xx: k.s5xx,
              statuses: k.statuses,
              p50: percentile(sorted, 50),
              p95: percentile(sorted, 95),
              p99: percentile(sorted, 99),
            },
          ];
        }),
      );
    },
  };
}

function percentile(sorted: Float64Array, p: number): number {
  if (!sorted.length) return NaN;
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[i];
}

async function measure(
  base: string,
  requests: autocannon.Request[],
  seconds: number,
  headers: Record<string, string>,
  connections = CONNECTIONS,
): Promise<Run> {
  const times: number[] = [];
  let non2xx = 0;
  let s5xx = 0;
  const statuses: Statuses = {};
  const kinds = kindTally();
  answeredKind = undefined;
  const instance = autocannon({
    url: base,
    connections,
    duration: seconds,
    headers,
    requests,
  });
  instance.on('response', (_client: unknown, status: number, _bytes: number, ms: number) => {
    times.push(ms);
    if (status < 200 || status >= 300) {
      non2xx++;
      statuses[status] = (statuses[status] ?? 0) + 1;
    }
    if (status >= 500) s5xx++;
    kinds.add(answeredKind, status, ms);
    answeredKind = undefined;
  });
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    instance.once('done', resolve);
    instance.once('error', reject);
  });
  const sorted = Float64Array.from(times).sort();
  return {
    rps: times.length / result.duration,
    okRps: (times.length - non2xx) / result.duration,
    p50: percentile(sorted, 50),
    p95: percentile(sorted, 95),
    p99: percentile(sorted, 99),
    requests: times.length,
    errors: result.errors + result.timeouts,
    non2xx,
    s5xx,
    statuses,
    byKind: kinds.result(result.duration),
  };
}

const pacing = createRng(20_261_202);
/**
 * Requests at a steady rate: arrivals at random (exponential gaps, `rate` a second on average) over at most
 * CONNECTIONS keep-alive sockets; each is timed from when it was due, so time spent waiting for a socket counts.
 */
async function measureSteady(
  base: string,
  requests: autocannon.Request[],
  seconds: number,
  rate: number,
  headers: Record<string, string>,
): Promise<Run> {
  const agent = new http.Agent({ keepAlive: true, maxSockets: CONNECTIONS });
  const target = new URL(base);
  const template = requests[0];
  const times: number[] = [];
  let non2xx = 0;
  let s5xx = 0;
  const statuses: Statuses = {};
  let errors = 0;
  const kinds = kindTally();
  const send = (due: number) =>
    new Promise<void>((resolve) => {
      const context: WriteContext = {};
      const r = (template.setupRequest?.({ ...template, headers: {} } as autocannon.Request, context) ?? template) as {
        method?: string;
        path?: string;
        body?: string;
      };
      const req = http.request(
        { host: target.hostname, port: target.port, method: r.method ?? 'GET', path: r.path, agent, headers },
        (res) => {
          const chunks: Buffer[] = [];
          res.on('data', (b: Buffer) => {
            if (template.onResponse) chunks.push(b);
          });
          res.on('end', () => {
            const ms = performance.now() - due;
            const status = res.statusCode ?? 0;
            times.push(ms);
            if (status < 200 || status >= 300) {
              non2xx++;
              statuses[status] = (statuses[status] ?? 0) + 1;
            }
            if (status >= 500) s5xx++;
            template.onResponse?.(status, Buffer.concat(chunks).toString(), context, {});
            kinds.add(context.kind, status, ms);
            resolve();
          });
        },
      );
      req.on('error', () => {
        errors++;
        resolve();
      });
      req.end(r.body);
    });
  const start = performance.now();
  const end = start + seconds * 1000;
  const inFlight: Promise<void>[] = [];
  for (let due = start; due < end; due += (-Math.log(1 - pacing.next()) * 1000) / rate) {
    const wait = due - performance.now();
    if (wait > 0) await new Promise((r) => setTimeout(r, wait));
    inFlight.push(send(due));
  }
  await Promise.all(inFlight);
  agent.destroy();
  const sorted = Float64Array.from(times).sort();
  const elapsedS = (performance.now() - start) / 1000;
  return {
    rps: times.length / elapsedS,
    okRps: (times.length - non2xx) / elapsedS,
    p50: percentile(sorted, 50),
    p95: percentile(sorted, 95),
    p99: percentile(sorted, 99),
    requests: times.length,
    errors,
    non2xx,
    s5xx,
    statuses,
    byKind: kinds.result(elapsedS),
  };
}

const appHeaders = { cookie, origin: appUrl, 'content-type': 'application/json', accept: 'application/json' };
const available = new Map<string, number>();
for (const s of selected) {
  if (!s.probe) {
    available.set(s.id, 200);
    continue;
  }
  const res = await fetch(`${appUrl}${s.probe}`, { headers: appHeaders });
  await res.arrayBuffer();
  available.set(s.id, res.status);
}
const baselineRequests = get(() => `/units/${pick(unitIds)}`);

// The first overview read starts the repair-effectiveness rebuild in the app (a background job): let it finish.
{
  const jobs = await mysql.createConnection({ uri: url, timezone: 'Z' });
  const t = Date.now();
  for (;;) {
    const [rows] = (await jobs.query(
      "SELECT status FROM background_jobs WHERE kind = 'repair_effectiveness' ORDER BY id DESC LIMIT 1",
    )) as unknown as [{ status: string }[]];
    if (rows[0]?.status !== 'running') break;
    if (Date.now() - t > 600_000) throw new Error('The repair-effectiveness job did not finish in 10 minutes.');
    await new Promise((r) => setTimeout(r, 1000));
  }
  if (Date.now() - t > 1500)
    console.log(`Waited ${((Date.now() - t) / 1000).toFixed(0)} s for the app's repair-effectiveness job.`);
  await jobs.end();
}

/** Waits until the app has worked off what the last scenario left in flight (its health check answers quickly). */
async function settle(base: string) {
  const t = Date.now();
  let quick = 0;
  while (quick < 3 && Date.now() - t < 120_000) {
    const t0 = performance.now();
    await fetch(`${base}/api/health`).then((r) => r.arrayBuffer());
    quick = performance.now() - t0 < 20 ? quick + 1 : 0;
    await new Promise((r) => setTimeout(r, 100));
  }
}

// Every scenario once before measuring: JIT, pools, buffer pool, and first-request work (the fleet routes check
// for units without statistics on their first read in a process) stay out of the figures.
const WARM_S = Math.min(3, DURATION_S);
console.log(`Warming up (${WARM_S} s per scenario)…`);
await measure(baselineUrl, baselineRequests, WARM_S, {});
for (const s of selected) {
  if (available.get(s.id) === 404) continue;
  await settle(appUrl);
  await measure(appUrl, s.requests(), WARM_S, appHeaders, s.connections);
}

const runs: Record<string, Run[]> = { baseline: [] };
const steadyRuns: Record<string, Run[]> = { baseline: [] };
for (const s of selected) {
  runs[s.id] = [];
  steadyRuns[s.id] = [];
}
const ratios: Record<string, number[]> = {};
for (let r = 1; r <= REPEAT; r++) {
  await settle(appUrl);
  const base = await measure(baselineUrl, baselineRequests, DURATION_S, {});
  runs.baseline.push(base);
  console.log(`run ${r}/${REPEAT}  baseline                ${fmtRun(base)}`);
  await settle(appUrl);
  const steadyBase = await measureSteady(baselineUrl, baselineRequests, DURATION_S, STEADY_RATE, {});
  steadyRuns.baseline.push(steadyBase);
  console.log(`run ${r}/${REPEAT}  baseline   @${STEADY_RATE}/s     ${fmtRun(steadyBase)}`);
  for (const s of selected) {
    const status = available.get(s.id)!;
    if (status === 404) continue;
    await settle(appUrl);
    const run = await measure(appUrl, s.requests(), DURATION_S, appHeaders, s.connections);
    runs[s.id].push(run);
    (ratios[s.id] ??= []).push(run.rps / base.rps);
    console.log(`run ${r}/${REPEAT}  ${s.id.padEnd(22)}  ${fmtRun(run)}`);
    await settle(appUrl);
    const steady = await measureSteady(appUrl, s.requests(), DURATION_S, STEADY_RATE, appHeaders);
    steadyRuns[s.id].push(steady);
    console.log(`run ${r}/${REPEAT}  ${`${s.id} @${STEADY_RATE}/s`.padEnd(22)}  ${fmtRun(steady)}`);
  }
}

const EACH_S = Math.min(3, DURATION_S);
if (runsPart('fleetTableEach'))
  console.log(
    `Fleet table, each sort and filter by itself (${EACH_S} s saturated, ${EACH_S} s steady, ${REPEAT} rounds)…`,
  );
// Round by round over all cases, so a slow spell of a shared machine lands on different cases, not on every run of one.
const fleetEachRuns = (runsPart('fleetTableEach') ? fleetEachQueries : []).map((query) => ({
  query,
  saturated: [] as Run[],
  steady: [] as Run[],
}));
for (let r = 1; r <= REPEAT; r++) {
  for (const f of fleetEachRuns) {
    const requests = get(() => `/api/fleet?${f.query}`);
    await settle(appUrl);
    const saturated = await measure(appUrl, requests, EACH_S, appHeaders);
    await settle(appUrl);
    const steady = await measureSteady(appUrl, requests, EACH_S, STEADY_RATE, appHeaders);
    f.saturated.push(saturated);
    f.steady.push(steady);
    console.log(
      `  ${r}/${REPEAT} ${f.query.padEnd(44)} ${fmtRun(saturated)}  |  @${STEADY_RATE}/s p95 ${steady.p95.toFixed(1)} ms`,
    );
  }
}
stopAll();

function fmtRun(x: Run) {
  return `p50 ${x.p50.toFixed(1)} ms  p95 ${x.p95.toFixed(1)} ms  p99 ${x.p99.toFixed(1)} ms  ${Math.round(x.rps)} req/s${x.non2xx ? `  (${x.non2xx} non-2xx, ${x.s5xx} × 5xx)` : ''}${x.errors ? `  (${x.errors} errors)` : ''}`;
}
const med = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};
const summary = (list: Run[]) =>
  list.length
    ? {
        p50Ms: +med(list.map((x) => x.p50)).toFixed(2),
        p95Ms: +med(list.map((x) => x.p95)).toFixed(2),
        p99Ms: +med(list.map((x) => x.p99)).toFixed(2),
        rps: Math.round(med(list.map((x) => x.rps))),
        okRps: Math.round(med(list.map((x) => x.okRps))),
        requests: list.reduce((s, x) => s + x.requests, 0),
        non2xx: list.reduce((s, x) => s + x.non2xx, 0),
        s5xx: list.reduce((s, x) => s + x.s5xx, 0),
        statuses: addStatuses(list),
        errors: list.reduce((s, x) => s + x.errors, 0),
        ...(list.some((x) => x.byKind) ? { byKind: kindSummary(list) } : {}),
      }
    : null;
function addStatuses(list: { statuses: Statuses }[]): Statuses {
  const sum: Statuses = {};
  for (const x of list) for (const [code, n] of Object.entries(x.statuses)) sum[code] = (sum[code] ?? 0) + n;
  return sum;
}
/** Per kind of request: answers and failures summed over the runs, latency percentiles as medians of the runs. */
function kindSummary(list: Run[]) {
  const seen = new Set(list.flatMap((x) => Object.keys(x.byKind ?? {})));
  const kinds = MIX.map(([kind]) => kind as string).filter((kind) => seen.has(kind));
  return Object.fromEntries(
    kinds.map((kind) => {
      const ks = list.map((x) => x.byKind?.[kind]).filter((k): k is KindRun => !!k);
      return [
        kind,
        {
          okRps: Math.round(med(ks.map((k) => k.okRps))),
          p50Ms: +med(ks.map((k) => k.p50)).toFixed(2),
          p95Ms: +med(ks.map((k) => k.p95)).toFixed(2),
          p99Ms: +med(ks.map((k) => k.p99)).toFixed(2),
          requests: ks.reduce((s, k) => s + k.requests, 0),
          non2xx: ks.reduce((s, k) => s + k.non2xx, 0),
          s5xx: ks.reduce((s, k) => s + k.s5xx, 0),
          statuses: addStatuses(ks),
        },
      ];
    }),
  );
}

// --- forecast backtest -----------------------------------------------------------------------------------------
let backtest: BacktestResult | null = null;
if (runsPart('backtest')) {
  console.log(
    `Forecast backtest (\`npm run backtest\`): trained on ${BACKTEST_UNITS.toLocaleString('en')} units of seed ${BACKTEST_TRAIN_SEED}, tested on the benchmark fleet's first ${BACKTEST_UNITS.toLocaleString('en')}…`,
  );
  const now = new Date(String(seedInfo?.asOf ?? new Date().toISOString()));
  const test = createFleet({
    seed: Number(seedInfo?.seed ?? DEFAULT_SEED),
    units: Number(seedInfo?.units ?? unitTotal) - 1,
    now,
    busyUnitEvents: 0,
  });
  const units = Math.min(BACKTEST_UNITS, test.units);
  backtest = backtestForecast({
    train: createFleet({ seed: BACKTEST_TRAIN_SEED, units, now }),
    test,
    trainUnits: units,
    testUnits: units,
    settings: DEFAULT_SETTINGS,
  });
}

// --- results -----------------------------------------------------------------------------------------------------
const cpu = (() => {
  try {
    return /model name\s*:\s*(.+)/.exec(readFileSync('/proc/cpuinfo', 'utf8'))?.[1]?.trim() ?? os.cpus()[0]?.model;
  } catch {
    return os.cpus()[0]?.model ?? 'unknown';
  }
})();
const machine = {
  cpu,
  cores: os.cpus().length,
  memoryGiB: Math.round(os.totalmem() / 2 ** 30),
  node: process.version,
  os: `${os.type()} ${os.release()}`,
};
const baselineSummary = summary(runs.baseline)!;
const results = {
  date: new Date().toISOString(),
  machine,
  settings: {
    durationS: DURATION_S,
    repeat: REPEAT,
    connections: CONNECTIONS,
    steadyRate: STEADY_RATE,
    only: ONLY ?? null,
  },
  dataset: { units: Number(unitTotal), events: Number(eventTotal), busyUnitEvents: busy.events, seed: seedInfo },
  baseline: {
    title: 'Bare Express + one mysql2 primary-key select (`SELECT * FROM units WHERE id = ?`)',
    ...baselineSummary,
    steady: summary(steadyRuns.baseline),
  },
  scenarios: selected.map((s) => {
    const status = available.get(s.id)!;
    const sum = summary(runs[s.id]);
    const steady = summary(steadyRuns[s.id]);
    const p95At = (at: Regime) => (at === 'saturated' ? sum : steady)?.p95Ms;
    return {
      id: s.id,
      title: s.title,
      available: status !== 404,
      probeStatus: status,
      ...(sum ?? {}),
      baselineRatio: ratios[s.id] ? +med(ratios[s.id]).toFixed(3) : null,
      steady,
      targets: (s.targets ?? []).map((t) => {
        const p95 = p95At(t.at);
        return { ...t, measuredP95Ms: p95 ?? null, met: p95 === undefined ? null : p95 <= t.p95Ms };
      }),
    };
  }),
  targets: TARGETS,
  fleetTableEach: fleetEachRuns.map((f) => ({
    query: f.query,
    saturatedP95Ms: +med(f.saturated.map((x) => x.p95)).toFixed(2),
    saturatedRps: Math.round(med(f.saturated.map((x) => x.rps))),
    steadyP95Ms: +med(f.steady.map((x) => x.p95)).toFixed(2),
    non2xx: [...f.saturated, ...f.steady].reduce((n, x) => n + x.non2xx, 0),
  })),
  backtest,
};
const unitRatio = results.scenarios.find((s) => s.id === 'unitPage')?.baselineRatio;

const md: string[] = [];
md.push(
  `Measured ${results.date.slice(0, 10)} on ${machine.cpu}, ${machine.cores} cores, ${machine.memoryGiB} GiB, Node ${machine.node}; `,
);
md.push(
  `${results.dataset.units.toLocaleString('en')} units, ${results.dataset.events.toLocaleString('en')} events; over loopback, ` +
    `${DURATION_S} s per scenario and load, medians of ${REPEAT} runs; server, load generator and MariaDB share the machine. ` +
    `*Saturated*: ${CONNECTIONS} connections, each sending its next request as soon as the last is answered (req/s is the capacity; ` +
    `latency is mostly waiting in line). *Steady*: requests arriving at random, ${STEADY_RATE} a second on average, over up to ` +
    `${CONNECTIONS} connections, each timed from when it was due.${visitLoad}\n`,
);
const steadyCell = (x: ReturnType<typeof summary>) => (x ? `${x.p50Ms} / ${x.p95Ms} / ${x.p99Ms}` : '');
md.push(
  `| scenario | saturated p50 / p95 / p99 ms | req/s | vs baseline req/s | steady ${STEADY_RATE}/s p50 / p95 / p99 ms | target |`,
);
md.push('|---|---:|---:|---:|---:|---|');
md.push(
  `| ${results.baseline.title} | ${baselineSummary.p50Ms} / ${baselineSummary.p95Ms} / ${baselineSummary.p99Ms} | ${baselineSummary.rps} | 1.00 | ${steadyCell(results.baseline.steady)} | |`,
);
for (const s of results.scenarios) {
  if (!s.available) {
    md.push(`| ${s.title} | | | | | not yet available (404) |`);
    continue;
  }
  const targets = s.targets.map((t) => `p95 ≤ ${t.p95Ms} ms ${t.at} ${t.met ? '✓' : '✗'}`);
  if (s.id === 'unitPage') {
    const share = unitRatio !== null && unitRatio !== undefined && unitRatio >= TARGETS.unitPageBaselineShare;
    targets.push(`≥ ${TARGETS.unitPageBaselineShare * 100} % of baseline req/s ${share ? '✓' : '✗'}`);
  }
  const failed = (s.non2xx ?? 0) + (s.steady?.non2xx ?? 0);
  const serverErrors = (s.s5xx ?? 0) + (s.steady?.s5xx ?? 0);
  const flags = failed ? ` (${failed} non-2xx${serverErrors ? `, ${serverErrors} × 5xx` : ''})` : '';
  md.push(
    `| ${s.title}${flags} | ${s.p50Ms} / ${s.p95Ms} / ${s.p99Ms} | ${s.rps} | ${s.baselineRatio?.toFixed(2)} | ${steadyCell(s.steady)} | ${targets.join('; ')} |`,
  );
}
md.push('');
const writeRows = results.scenarios.filter((s) => s.available && s.id in WRITE_NAMES);
if (writeRows.length) {
  md.push(
    `Write scenarios, every answer counted (summed over the ${REPEAT} runs of each load; 2xx/s and latency as medians of the runs). ` +
      'Concurrent writers must never get a 5xx (the integrity issue); a 4xx here is a refused write the load did not mean to send.',
  );
  md.push('');
  md.push('| write scenario | load | requests | 2xx/s | non-2xx | 5xx | p50 / p95 / p99 ms | no 5xx |');
  md.push('|---|---|---:|---:|---:|---:|---:|---|');
  const share = (n: number, of: number) =>
    `${n.toLocaleString('en')} (${of ? ((100 * n) / of).toFixed(n && n < of / 100 ? 2 : 1) : '0'} %)`;
  const byStatus = (x: Statuses) =>
    Object.entries(x)
      .map(([code, n]) => `${code} × ${n.toLocaleString('en')}`)
      .join(', ');
  const row = (
    name: string,
    load: string,
    x: {
      requests: number;
      okRps: number;
      non2xx: number;
      s5xx: number;
      statuses: Statuses;
      p50Ms: number;
      p95Ms: number;
      p99Ms: number;
    },
  ) =>
    md.push(
      `| ${name} | ${load} | ${x.requests.toLocaleString('en')} | ${x.okRps} | ${share(x.non2xx, x.requests)}${x.non2xx ? `: ${byStatus(x.statuses)}` : ''} | ` +
        `${share(x.s5xx, x.requests)} | ${x.p50Ms} / ${x.p95Ms} / ${x.p99Ms} | ${x.s5xx ? '✗' : '✓'} |`,
    );
  for (const s of writeRows) {
    const name = WRITE_NAMES[s.id as keyof typeof WRITE_NAMES];
    for (const [load, x] of [
      ['saturated', summary(runs[s.id])],
      [`steady ${STEADY_RATE}/s`, summary(steadyRuns[s.id])],
    ] as const) {
      if (!x) continue;
      row(name, load, x);
      for (const [kind, k] of Object.entries(x.byKind ?? {}))
        row(`↳ ${KIND_NAMES[kind as WriteKind] ?? kind}`, load, k);
    }
  }
  md.push('');
}
if (results.fleetTableEach.length) {
  const fleetLimit = TARGETS.fleetTable[0].p95Ms;
  const over = results.fleetTableEach.filter((f) => f.saturatedP95Ms > fleetLimit);
  md.push(
    `Fleet table, each sort (both ways) and each filter by itself, ${EACH_S} s saturated and ${EACH_S} s steady, medians of ${REPEAT} rounds: ` +
      (over.length
        ? `${over.length} of ${results.fleetTableEach.length} above p95 ${fleetLimit} ms saturated.`
        : `all ${results.fleetTableEach.length} within p95 ${fleetLimit} ms saturated.`),
  );
  md.push('');
  md.push(
    `| \`GET /api/fleet?…\` | saturated p95 ms | req/s | steady ${STEADY_RATE}/s p95 ms | ≤ ${fleetLimit} ms saturated |`,
  );
  md.push('|---|---:|---:|---:|---|');
  for (const f of results.fleetTableEach) {
    md.push(
      `| \`${f.query}\`${f.non2xx ? ` (${f.non2xx} non-2xx)` : ''} | ${f.saturatedP95Ms} | ${f.saturatedRps} | ${f.steadyP95Ms} | ${f.saturatedP95Ms <= fleetLimit ? '✓' : '✗'} |`,
    );
  }
  md.push('');
}
if (backtest) {
  const a = backtest.all;
  md.push(
    `Next top-up forecast (DOMAIN.md §7b, \`npm run backtest -- --seed ${backtest.testSeed} --train-seed ${backtest.trainSeed} --units ${backtest.testUnits}\`): ` +
      `case base learned from ${backtest.caseBaseCases.toLocaleString('en')} cut-offs of a ${backtest.trainUnits.toLocaleString('en')}-unit fleet of seed ${backtest.trainSeed} ` +
      `(${(backtest.caseBaseMs / 1000).toFixed(1)} s), tested on ${backtest.cases.toLocaleString('en')} cut-offs of the benchmark fleet (seed ${backtest.testSeed}), ` +
      `K = ${backtest.k}: MAE **${a.forecastMaeDays} days** = ${(a.forecastMaeDays / (a.naiveMaeDays ?? Number.NaN)).toFixed(2)} × naive ` +
      `("the last interval repeats", ${a.naiveMaeDays} days; target ≤ 0.55), the rhythm alone ${a.rhythmMaeDays} days; the 80 % range held ` +
      `**${(a.coverage80 * 100).toFixed(1)} %** (target 75–85 %), pinball loss of its ends ${a.pinball1090Days} days; ${a.forecastBeforeCutoff} dates before the cut-off.`,
  );
  md.push('');
  md.push(
    '| situation at the cut-off | cases | forecast MAE (bias) d | rhythm MAE d | naive MAE d | 80 % range held | pinball 10/90 d |',
  );
  md.push('|---|---:|---:|---:|---:|---:|---:|');
  for (const b of [...backtest.bySituation, a])
    md.push(
      `| ${b.title} | ${b.cases.toLocaleString('en')} | ${b.forecastMaeDays} (${b.forecastBiasDays >= 0 ? '+' : ''}${b.forecastBiasDays}) | ${b.rhythmMaeDays} | ` +
        `${b.naiveMaeDays} | ${(b.coverage80 * 100).toFixed(1)} % | ${b.pinball1090Days} |`,
    );
}
if (seedInfo) {
  md.push('');
  md.push(
    `Benchmark fleet: \`npm run seed:bench -- --units ${Number(seedInfo.units) - 1}\` loaded ${Number(seedInfo.units).toLocaleString('en')} units and ` +
      `${Number(seedInfo.events).toLocaleString('en')} events in ${(Number(seedInfo.seconds) / 60).toFixed(1)} min.`,
  );
}
md.push('');
md.push(
  'Reproduce: `npm run seed:bench -- --units 100000`, then `npm run bench` (options: `--duration`, `--repeat`, `--connections`, `--rate`, ' +
    '`--only <scenarios>`).',
);
if (PARTIAL) {
  md.push('', `Partial run: \`--only ${ONLY.join(',')}\`.`);
} else {
  // Hand-written findings (what misses its target and why) live beside the results and are quoted with them.
  const notesFile = path.join(PROJECT_ROOT, 'bench', 'notes.md');
  if (existsSync(notesFile)) md.push('', readFileSync(notesFile, 'utf8').trim());
}
// Parts left out of a partial run would leave blank lines doubled.
const mdText = md.join('\n').replace(/\n{3,}/g, '\n\n') + '\n';

if (PARTIAL) {
  // A partial run would leave the published table with scenarios missing: it goes to a file of its own.
  const out = path.resolve(textArg('out') ?? path.join(PROJECT_ROOT, '.data', 'bench-partial.md'));
  const outJson = out.replace(/(\.md)?$/, '.json');
  mkdirSync(path.dirname(out), { recursive: true });
  writeFileSync(out, `# Benchmark results (partial run)\n\n${mdText}`);
  writeFileSync(outJson, JSON.stringify(results, null, 2) + '\n');
  console.log(`\n${mdText}`);
  console.log(`Wrote ${out} and ${outJson}; bench/results.* and README.md are unchanged.`);
  process.exit(0);
}
const outDir = path.join(PROJECT_ROOT, 'bench');
mkdirSync(outDir, { recursive: true });
writeFileSync(path.join(outDir, 'results.json'), JSON.stringify(results, null, 2) + '\n');
writeFileSync(path.join(outDir, 'results.md'), `# Benchmark results\n\n${mdText}`);
updateReadme(mdText);
console.log(`\n${mdText}`);
console.log('Wrote bench/results.json, bench/results.md and the Performance section of README.md.');
process.exit(0);

function updateReadme(text: string) {
  const file = path.join(PROJECT_ROOT, 'README.md');
  const start = '<!-- bench:start -->';
  const end = '<!-- bench:end -->';
  let readme = readFileSync(file, 'utf8');
  const block = `${start}\n${text}${end}`;
  const i = readme.indexOf(start);
  const j = readme.indexOf(end);
  if (i >= 0 && j > i) readme = readme.slice(0, i) + block + readme.slice(j + end.length);
  else readme = `${readme.replace(/\s*$/, '\n')}\n## Performance\n\n${block}\n`;
  writeFileSync(file, readme);
}
