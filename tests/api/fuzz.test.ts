// Property-based fuzz over the route table: thousands of random requests to every API route, as every role and signed
// out, with valid, near-valid and junk input. Bad input must get a 4xx; no request may get a 5xx.
// `npm test` runs 3,000 requests with a fixed seed; `npm run fuzz` runs 25,000 with a random one and prints it.
// Replay a run: FUZZ_SEED=<seed> FUZZ_RUNS=<n> npx vitest run --project api tests/api/fuzz.test.ts
import { randomInt } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { and, eq, inArray, isNull, notInArray } from 'drizzle-orm';
import fc from 'fast-check';
import pino from 'pino';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { accountLinks, units, users } from '../../server/db/schema';
import { hashToken } from '../../server/features/account/account-links.service';
import { unsubscribeUrl } from '../../server/lib/mail/unsubscribe-link';
import { newToken } from '../../server/lib/ids';
import { hashPassword } from '../../server/lib/password';
import { createLocalStorage } from '../../server/lib/storage';
import { can, ROLES, type Role } from '../../shared/permissions';
import { ALERT_KINDS } from '../../shared/schemas/alerts';
import { openTestDb, resetDb } from '../support/db';
import { createTestUser, TEST_ORIGIN, TEST_PASSWORD } from '../support/factories';
import {
  ACTORS,
  PoolRef,
  POOLS,
  requestArbitrary,
  type Actor,
  type FuzzRequest,
  type Pools,
  type RouteInfo,
  type Shape,
} from '../support/fuzz-requests';
import { startTestSmtp } from '../support/mail';
import { chronicLeaker, tightUnit } from '../support/visits';

const RUNS = Number(process.env.FUZZ_RUNS ?? 3000);
const SEED = process.env.FUZZ_SEED === 'random' ? randomInt(2 ** 31 - 1) : Number(process.env.FUZZ_SEED ?? 17_2026);
const REQUEST_TIMEOUT_MS = 15_000;

/**
 * 5xx answers whose cause another part of issue 17 is fixing; each entry is removed when its fix lands. A match needs
 * the route and the server's error message (or stack) to match.
 */
const KNOWN_5XX: { route: string; error: RegExp; reason: string }[] = [];

// ---- the app under test --------------------------------------------------------------------------------------

type LogEntry = {
  level: number;
  msg: string;
  requestId?: string;
  err?: { type?: string; message?: string; stack?: string };
  jobId?: number;
};
const logged: LogEntry[] = [];
// The error handler logs every 5xx with its stack and request id; collected here to explain each failure.
const logger = pino(
  { level: 'warn', base: undefined, redact: ['req.headers.cookie', 'password'] },
  { write: (line: string) => void logged.push(JSON.parse(line) as LogEntry) },
);

const now = new Date('2026-06-15T12:00:00Z');
const uploads = mkdtempSync(path.join(os.tmpdir(), 'tightloop-fuzz-uploads-'));
const { db, pool } = openTestDb();
const { smtp, mailer } = await startTestSmtp();
const { app, ctx, routes } = createApp({
  db,
  mailer,
  logger,
  clock: { now: () => now },
  storage: createLocalStorage(uploads),
  // Sign-in and reset limits out of the way: the fuzz signs in thousands of times from one address.
  rateLimits: {
    signInPerIp: 1_000_000,
    signInPerAccount: 1_000_000,
    signInFreeTries: 1_000_000,
    resetPerIp: 1_000_000,
    resetPerEmail: 1_000_000,
  },
});
const server = http.createServer(app);

const allowedActors = (access: string): Actor[] =>
  access === 'public'
    ? [...ACTORS]
    : access === 'signed-in'
      ? [...ROLES]
      : ROLES.filter((role) => can({ role }, access as never));
const routeInfos: RouteInfo[] = routes.map((r) => ({
  method: r.method,
  path: r.path,
  access: r.access,
  allowed: allowedActors(r.access),
}));
const infoOf = new Map(routeInfos.map((r) => [`${r.method} ${r.path}`, r]));

// ---- pools of real rows, and the sessions of one user per role ---------------------------------------------------

const pools = Object.fromEntries(POOLS.map((p) => [p, [] as unknown[]])) as Pools;
const MAX_POOL = 400;
const add = (name: keyof Pools, ...values: unknown[]) => {
  for (const v of values)
    if (v != null && pools[name].length < MAX_POOL && !pools[name].includes(v)) pools[name].push(v);
};

const actors = {} as Record<Role, { email: string; cookie: string }>;
const actorIds: string[] = [];

async function signIn(email: string): Promise<string> {
  const res = await request(server)
    .post('/api/auth/sign-in')
    .set('Origin', TEST_ORIGIN)
    .send({ email, password: TEST_PASSWORD });
  const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => /^tl_session=[^;]+/.test(c));
  if (res.status !== 200 || !cookie)
    throw new Error(`sign-in of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return cookie.split(';')[0];
}

/** A seeding call as a role; throws unless the answer is the expected status. */
async function call(role: Role, method: 'get' | 'post' | 'put', url: string, body?: object, status = [200, 201, 202]) {
  const agent = request(server);
  const res = await agent[method](url).set('Origin', TEST_ORIGIN).set('Cookie', actors[role].cookie).send(body);
  return seeded(res, `${method} ${url}`, status);
}

function seeded(res: request.Response, what: string, status = [200, 201, 202]) {
  if (!status.includes(res.status)) {
    const err = logged.findLast((l) => l.level >= 50)?.err;
    throw new Error(
      `seeding, ${what}: ${res.status} ${JSON.stringify(res.body)}${res.status >= 500 ? `\n${err?.stack ?? ''}` : ''}`,
    );
  }
  return res.body as Record<string, never>;
}

async function seed() {
  for (const role of ROLES) {
    const user = await createTestUser(db, { role, name: `Fuzz ${role}` });
    actorIds.push(user.id);
    actors[role] = { email: user.email, cookie: await signIn(user.email) };
    add('userEmail', user.email);
    for (const kind of ALERT_KINDS) {
      const q = new URL(await unsubscribeUrl(db, TEST_ORIGIN, user.id, kind)).searchParams;
      add('unsubscribe', { user: q.get('user'), kind: q.get('kind'), sig: q.get('sig') });
    }
  }
  // Users the fuzz may edit, invite, reset and sign in as (never the ones whose sessions it uses).
  const active = await createTestUser(db, { role: 'technician' });
  const inactive = await createTestUser(db, { role: 'engineer', active: false });
  const invited = await createTestUser(db, { role: 'owner', passwordHash: null });
  const admin = await createTestUser(db, { role: 'admin' });
  for (const u of [active, inactive, invited, admin]) {
    add('userId', u.id);
    add('userEmail', u.email);
  }
  await issueLinks();

  // FZD stays empty, so deleting it can succeed.
  for (const code of ['FZA', 'FZB', 'FZC', 'FZD']) {
    const { site } = await call('admin', 'post', '/api/sites', {
      code,
      name: `Fuzz depot ${code}`,
      kind: 'depot',
      country: 'NL',
    });
    add('siteId', (site as { id: number }).id);
  }
  const unitBodies = [
    {
      containerNumber: 'HRLU1000016',
      refrigerant: 'R-134a',
      nominalChargeKg: 4.5,
      commissionedOn: '2019-04-10',
      siteId: pools.siteId[0],
    },
    {
      containerNumber: 'HRLU1000021',
      refrigerant: 'R-404A',
      nominalChargeKg: 5.2,
      commissionedOn: '2021-03-15',
      siteId: pools.siteId[1],
    },
    { containerNumber: 'HRLU1000037', refrigerant: 'R-513A', nominalChargeKg: 4, siteId: pools.siteId[0] },
    { containerNumber: 'HRLU1000042', refrigerant: 'R-744', nominalChargeKg: 3.5, commissionedOn: '2024-01-02' },
  ];
  for (const body of unitBodies) {
    const { unit } = await call('engineer', 'post', '/api/units', body);
    add('unitId', (unit as { id: number }).id);
    add('containerNumber', body.containerNumber);
  }
  await refreshQrTokens();

  const scripts = [chronicLeaker(2026), tightUnit(2026), chronicLeaker(2025)];
  for (const [i, script] of scripts.entries()) {
    for (const v of script) {
      const idempotencyKey = `seed-${i}-${v.at.replace(/\W/g, '')}`;
      const body = {
        idempotencyKey,
        unitId: pools.unitId[i],
        siteId: pools.siteId[i],
        occurredAt: v.at,
        events: v.events,
      };
      const res = await call('technician', 'post', '/api/visits', body);
      add('eventId', ...(res.events as { id: number }[]).map((e) => e.id));
      add('idempotencyKey', idempotencyKey);
    }
  }
  const png = Buffer.from(
    'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==',
    'base64',
  );
  const uploaded = await request(server)
    .post(`/api/events/${pools.eventId[0] as number}/attachments`)
    .set('Origin', TEST_ORIGIN)
    .set('Cookie', actors.technician.cookie)
    .attach('files', png, { filename: 'valve.png', contentType: 'image/png' });
  add('attachmentId', ...(seeded(uploaded, 'an attachment').attachments as { id: number }[]).map((a) => a.id));

  const importKey = newToken();
  const imported = await request(server)
    .post('/api/unit-imports')
    .set('Origin', TEST_ORIGIN)
    .set('Cookie', actors.engineer.cookie)
    .field('importKey', importKey)
    .attach(
      'file',
      Buffer.from('container_number,refrigerant,nominal_charge_kg,site_code\nHRLU1000058,R-134a,4.5,FZB\n'),
      'fleet.csv',
    );
  seeded(imported, 'an import');
  add('importKey', importKey);

  add('settingsVersion', (await call('admin', 'get', '/api/settings')).version);
  add('jobId', ((await call('engineer', 'post', '/api/fleet/repair-effectiveness/refresh')).job as { id: number }).id);
  await ctx.jobs.waitForAll();
}

/**
 * Fresh invitation and password-reset links: the fuzz uses them up, and re-sending an invitation expires the old
 * ones. Only the latest few stay in the pools.
 */
async function issueLinks() {
  const [invited] = await db
    .select({ id: users.id })
    .from(users)
    .where(and(isNull(users.passwordHash), eq(users.active, true)))
    .limit(1);
  const [active] = await db
    .select({ id: users.id })
    .from(users)
    .where(and(eq(users.role, 'technician'), eq(users.active, true), notInArray(users.id, actorIds)))
    .limit(1);
  const expiresAt = new Date(now.getTime() + 3600_000);
  for (const [purpose, user, poolName] of [
    ['invitation', invited, 'invitationToken'],
    ['password_reset', active, 'resetToken'],
  ] as const) {
    if (!user) continue;
    const token = newToken();
    await db.insert(accountLinks).values({ userId: user.id, purpose, tokenHash: hashToken(token), expiresAt });
    pools[poolName] = [token, ...pools[poolName].slice(0, 4)];
  }
}

async function refreshQrTokens() {
  const ids = pools.unitId.filter((id): id is number => typeof id === 'number');
  if (!ids.length) return;
  const rows = await db.select({ token: units.qrToken }).from(units).where(inArray(units.id, ids));
  pools.qrToken = rows.map((r) => r.token);
}

// ---- sending one fuzz request --------------------------------------------------------------------------------

function pick(r: PoolRef): unknown {
  const rows = pools[r.pool];
  // An empty pool (every site deleted, say) still sends something of the right type.
  if (!rows.length) return r.pool.endsWith('Id') || r.pool === 'settingsVersion' ? 999_999 : 'nothing-seeded';
  const v = rows[r.index % rows.length];
  return r.field ? (v as Record<string, unknown>)[r.field] : v;
}

function resolve(shape: Shape): unknown {
  if (shape instanceof PoolRef) return pick(shape);
  if (Array.isArray(shape)) return shape.map(resolve);
  if (shape && typeof shape === 'object')
    return Object.fromEntries(Object.entries(shape).map(([k, v]) => [k, resolve(v)]));
  return shape;
}

/** Percent-encodes as a careless client would: a lone surrogate goes out as its three (invalid) UTF-8 bytes. */
function encode(s: string): string {
  let out = '';
  for (const ch of s) {
    const c = ch.codePointAt(0)!;
    out +=
      c >= 0xd800 && c <= 0xdfff
        ? [0xe0 | (c >> 12), 0x80 | ((c >> 6) & 63), 0x80 | (c & 63)]
            .map((b) => `%${b.toString(16).toUpperCase()}`)
            .join('')
        : encodeURIComponent(ch);
  }
  return out;
}

const text = (v: PoolRef | string | { raw: string } | { text: string }): string =>
  v instanceof PoolRef
    ? encode(String(pick(v)))
    : typeof v === 'string'
      ? encode(v)
      : 'raw' in v
        ? v.raw
        : encode(v.text);

type Sent = { method: string; url: string; actor: Actor; copies: number; body: string };
type Failure = {
  route: string;
  sent: Sent;
  status: number | 'no answer';
  answer: string;
  error: string;
  stack: string;
};

function describeBody(req: FuzzRequest): string {
  const b = req.body;
  if (b.kind === 'none') return '(none)';
  if (b.kind === 'raw') return `${b.contentType}: ${b.text}`;
  if (b.kind === 'json') return JSON.stringify(resolve(b.value));
  const files = b.files.map(
    (f) =>
      `${f.field}=${JSON.stringify(f.name)} (${f.contentType}, ${f.content.length} B: ${JSON.stringify(f.content.subarray(0, 200).toString())})`,
  );
  return `multipart: ${[...b.fields.map(([k, v]) => `${k}=${JSON.stringify(v instanceof PoolRef ? pick(v) : v)}`), ...files].join('; ')}`;
}

const clip = (s: string, n = 400) => (s.length > n ? `${s.slice(0, n)}… (${s.length} chars)` : s);

let counter = 0;
const failures: Failure[] = [];
const statusCounts = new Map<string, Map<number | 'no answer', number>>();
const sentPairs = new Set<string>();

async function send(req: FuzzRequest): Promise<void> {
  if (counter > 0 && counter % 200 === 0) await issueLinks();
  const info = infoOf.get(req.route)!;
  const url =
    info.path.replace(/:(\w+)/g, (_m, name: string) => text(req.params[name])) +
    (req.query.length ? `?${req.query.map(([k, v]) => `${encode(k)}=${text(v)}`).join('&')}` : '');
  const sent: Sent = {
    method: info.method.toUpperCase(),
    url,
    actor: req.actor,
    copies: req.copies,
    body: clip(describeBody(req), 2000),
  };
  sentPairs.add(`${req.route} ${req.actor}`);
  // A double click or a retry on a bad connection: the same request twice or three times at once.
  await Promise.all(Array.from({ length: req.copies }, () => sendOnce(req, info, url, sent)));
}

async function sendOnce(req: FuzzRequest, info: RouteInfo, url: string, sent: Sent) {
  const requestId = `fuzz-${SEED}-${++counter}`;
  let r = request(server)[info.method as 'get'](url).set('X-Request-Id', requestId).timeout(REQUEST_TIMEOUT_MS);
  if (req.withOrigin) r = r.set('Origin', TEST_ORIGIN);
  if (req.actor !== 'signed-out') r = r.set('Cookie', actors[req.actor].cookie);
  const b = req.body;
  if (b.kind === 'json') r = r.set('Content-Type', 'application/json').send(JSON.stringify(resolve(b.value)));
  else if (b.kind === 'raw') r = r.set('Content-Type', b.contentType).send(b.text);
  else if (b.kind === 'multipart') {
    for (const [k, v] of b.fields) r = r.field(k, String(v instanceof PoolRef ? pick(v) : v));
    for (const f of b.files) r = r.attach(f.field, f.content, { filename: f.name, contentType: f.contentType });
  }

  let res: request.Response;
  try {
    res = await r;
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    failures.push({
      route: req.route,
      sent,
      status: 'no answer',
      answer: '',
      error: message,
      stack: (err as Error)?.stack ?? '',
    });
    count(req.route, 'no answer');
    return;
  }
  count(req.route, res.status);
  if (res.status >= 500) {
    const log = logged.find((l) => l.requestId === requestId && l.level >= 50);
    failures.push({
      route: req.route,
      sent,
      status: res.status,
      answer: clip(JSON.stringify(res.body) ?? res.text ?? ''),
      error: log?.err?.message ?? log?.msg ?? '(nothing logged)',
      stack: log?.err?.stack ?? '',
    });
  }
  await afterAnswer(req, res, info, url);
}

function count(route: string, status: number | 'no answer') {
  const m = statusCounts.get(route) ?? new Map<number | 'no answer', number>();
  m.set(status, (m.get(status) ?? 0) + 1);
  statusCounts.set(route, m);
}

/** Grows the pools from what the API created, and keeps every role signed in. */
async function afterAnswer(req: FuzzRequest, res: request.Response, info: RouteInfo, url: string) {
  const body = (res.body ?? {}) as Record<string, never>;
  const ok = res.status >= 200 && res.status < 300;
  if (ok) {
    switch (req.route) {
      case 'post /api/visits':
        add('eventId', ...((body.events ?? []) as { id: number }[]).map((e) => e.id));
        if (req.body.kind === 'json')
          add('idempotencyKey', (resolve(req.body.value) as { idempotencyKey?: unknown })?.idempotencyKey);
        break;
      case 'post /api/units':
        add('unitId', (body.unit as { id?: number })?.id);
        add('containerNumber', (body.unit as { containerNumber?: string })?.containerNumber);
        await refreshQrTokens();
        break;
      case 'post /api/units/:id/qr-token':
        await refreshQrTokens();
        break;
      case 'post /api/sites':
        add('siteId', (body.site as { id?: number })?.id);
        break;
      case 'delete /api/sites/:id': {
        const id = Number(url.split('?')[0].split('/').pop());
        pools.siteId = pools.siteId.filter((s) => s !== id);
        break;
      }
      case 'post /api/users':
        add('userId', (body.user as { id?: string })?.id);
        add('userEmail', (body.user as { email?: string })?.email);
        break;
      case 'post /api/events/:id/attachments':
        add('attachmentId', ...((body.attachments ?? []) as { id: number }[]).map((a) => a.id));
        break;
      case 'post /api/unit-imports':
        add('importKey', (body.import as { key?: string })?.key);
        break;
      case 'post /api/decisions/units/:id':
        add('eventId', (body.decision as { eventId?: number })?.eventId);
        break;
      case 'post /api/traceability/mark-for-inspection':
        add('eventId', ...((body.eventIds ?? []) as number[]));
        break;
      case 'get /api/settings':
      case 'put /api/settings':
        pools.settingsVersion = [body.version];
        add('jobId', (body.recompute as { id?: number } | null)?.id);
        break;
      case 'get /api/account/sessions':
        add('sessionId', ...((body.sessions ?? []) as { id: string }[]).map((x) => x.id));
        break;
      case 'get /api/users/:id/sessions': {
        const user = decodeURIComponent(url.split('/')[3]);
        add('userSession', ...((body.sessions ?? []) as { id: string }[]).map((x) => ({ user, id: x.id })));
        break;
      }
      case 'post /api/fleet/repair-effectiveness/refresh':
        add('jobId', (body.job as { id?: number })?.id);
        break;
    }
  }
  // Signing out (or anything else that ends the session) must not leave the role signed out for the rest of the run.
  if (
    req.actor !== 'signed-out' &&
    (req.route === 'post /api/auth/sign-out' || (res.status === 401 && info.access !== 'public'))
  ) {
    await resumeActor(req.actor);
  }
}

/** Signs the role's user in again; if the fuzz changed their password (a valid change request), it is put back first. */
async function resumeActor(role: Role) {
  try {
    actors[role].cookie = await signIn(actors[role].email);
  } catch {
    await db
      .update(users)
      .set({ passwordHash: await hashPassword(TEST_PASSWORD), active: true })
      .where(eq(users.email, actors[role].email));
    actors[role].cookie = await signIn(actors[role].email);
  }
}

// ---- the run ------------------------------------------------------------------------------------------------------

const isKnown = (f: Failure) =>
  KNOWN_5XX.some((k) => k.route === f.route && (k.error.test(f.error) || k.error.test(f.stack)));

/** A query error without its parameters: the statement and what the database said ("Duplicate entry … for key …"). */
const errorKind = (error: string) => {
  const [statement, rest] = error.split('\nparams: ');
  return rest === undefined ? error : `${statement} → ${rest.slice(rest.lastIndexOf(': ') + 2)}`;
};

/** One entry per distinct failure (route, status and error, with ids, numbers and quoted values blanked). */
function distinct(list: Failure[]) {
  const groups = new Map<string, { first: Failure; n: number }>();
  for (const f of list) {
    const key = `${f.route} ${f.status} ${errorKind(f.error)
      .replace(/'[^']*'/g, "'…'")
      .replace(/\d+/g, 'N')}`;
    const g = groups.get(key);
    if (g) g.n += 1;
    else groups.set(key, { first: f, n: 1 });
  }
  return [...groups.values()];
}

function report(list: Failure[]): string {
  return distinct(list)
    .map(({ first: f, n }, i) =>
      [
        `${i + 1}. ${f.route} → ${f.status} (${n}×): ${errorKind(f.error)}`,
        `   request: ${f.sent.method} ${clip(f.sent.url, 300)} as ${f.sent.actor}${f.sent.copies > 1 ? `, ${f.sent.copies} at once` : ''}`,
        `   body: ${f.sent.body}`,
        `   answer: ${f.answer}`,
        f.stack
          ? `   at: ${f.stack
              .split('\n')
              .filter((l) => /^\s+at /.test(l))
              .slice(0, 6)
              .map((l) => l.trim().slice(3))
              .join('\n       ')}`
          : '',
      ]
        .filter(Boolean)
        .join('\n'),
    )
    .join('\n\n');
}

beforeAll(async () => {
  await resetDb(db);
  await new Promise<void>((ok) => server.listen(0, '127.0.0.1', ok));
  await seed();
}, 120_000);

afterAll(async () => {
  await ctx.jobs.waitForAll();
  await new Promise((ok) => server.close(ok));
  await smtp.stop();
  await pool.end();
  rmSync(uploads, { recursive: true, force: true });
});

describe('fuzzing the route table', () => {
  it(
    `answers ${RUNS} random requests to every route, as every role and signed out, without a 5xx`,
    async () => {
      console.log(`fuzz: seed ${SEED}, ${RUNS} requests (replay: FUZZ_SEED=${SEED} FUZZ_RUNS=${RUNS})`);
      const started = Date.now();
      // First every route once per role and signed out (so even a rarely drawn route meets every role), then at random.
      const sweep = routeInfos.flatMap((r, i) =>
        ACTORS.map((actor, j) => ({
          ...fc.sample(requestArbitrary([r]), { seed: SEED + i * ACTORS.length + j, numRuns: 1 })[0],
          actor,
        })),
      );
      for (const req of sweep) await send(req);
      await fc.assert(
        fc.asyncProperty(requestArbitrary(routeInfos), async (req) => {
          await send(req);
        }),
        { seed: SEED, numRuns: Math.max(0, RUNS - sweep.length), endOnFailure: true },
      );
      await ctx.jobs.waitForAll();
      const seconds = ((Date.now() - started) / 1000).toFixed(1);
      const background = logged.filter((l) => l.level >= 50 && !l.requestId?.startsWith('fuzz-'));
      const unknown = failures.filter((f) => !isKnown(f));
      console.log(
        `fuzz: ${counter} requests in ${seconds} s; ${failures.length} answered 5xx or not at all (${failures.length - unknown.length} known)` +
          (background.length ? `; ${background.length} errors logged outside requests` : ''),
      );
      if (failures.length - unknown.length)
        console.log(`fuzz: known 5xx, still open:\n${report(failures.filter(isKnown))}`);
      const never2xx = routeInfos
        .map((r) => `${r.method} ${r.path}`)
        .filter((k) => ![...(statusCounts.get(k)?.keys() ?? [])].some((s) => typeof s === 'number' && s < 300));
      if (never2xx.length)
        console.log(
          `fuzz: routes that never answered 2xx in this run: ${never2xx.map((k) => `${k} ${JSON.stringify([...statusCounts.get(k)!])}`).join(', ')}`,
        );
      for (const l of background)
        console.log(`fuzz: logged outside a request: ${l.msg} ${l.err?.message ?? ''}\n${l.err?.stack ?? ''}`);

      const missing = routeInfos.flatMap((r) =>
        ACTORS.filter((a) => !sentPairs.has(`${r.method} ${r.path} ${a}`)).map((a) => `${r.method} ${r.path} as ${a}`),
      );
      expect(missing).toEqual([]);
      expect(counter).toBeGreaterThanOrEqual(RUNS);
      if (unknown.length) {
        throw new Error(`${unknown.length} requests answered 5xx or not at all (seed ${SEED}):\n\n${report(unknown)}`);
      }
    },
    // About 20 ms a request on a quiet machine; the margin is for a busy one.
    60_000 + RUNS * 60,
  );
});
