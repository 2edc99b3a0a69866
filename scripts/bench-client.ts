// `npm run bench:client`: a technician's phone opening unit pages by their label address (/u/<token>), in Debian's
// Chromium emulating a mid-range phone on Slow 4G (1.6 Mbps down, 750 kbps up, 150 ms round trip, CPU slowed 4×).
// Against a running app (BASE_URL, default http://localhost:3000, i.e. `npm start`) and its database (the demo fleet).
//   cold     fresh profile, signed in, empty caches, from the start of the navigation until the unit's figures show
//   warm     the same phone, another unit's label
//   offline  the same phone with no network at all, the first unit again (must show its figures and history)
// Each run is a fresh profile; medians of --runs (5). Writes bench/client-results.json and prints a table.
//   --runs <n>   --label <text> (kept in the JSON, e.g. "before")   --timeout <ms> per page (20000)
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { chromium, type BrowserContext, type CDPSession, type Page } from 'playwright-core';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../seed/demo-accounts';
import { resolveDatabaseUrl } from './lib/database-url';
import { PROJECT_ROOT } from './lib/mariadb';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from './lib/chromium';
import { parseCli } from './lib/cli';

const options = parseCli(
  `BASE_URL=http://localhost:3000 npm run bench:client [-- options]: a technician's phone opening unit pages by their
label address, cold, warm and offline, in Chromium emulating a mid-range phone on Slow 4G.`,
  {
    runs: { type: 'number', default: 5, integer: true, min: 1, help: 'fresh profiles, medians quoted' },
    label: { type: 'string', default: 'current', help: 'kept in the JSON, e.g. "before"' },
    timeout: { type: 'number', default: 20_000, min: 1, placeholder: 'ms', help: 'per page' },
  },
);
const RUNS = options.runs;
const TIMEOUT_MS = options.timeout;
const LABEL = options.label;
const BASE_URL = (process.env.BASE_URL ?? 'http://localhost:3000').replace(/\/$/, '');

// Chrome DevTools' "Slow 4G" preset and its 4× CPU slowdown for a mid-range phone.
export const SLOW_4G = {
  offline: false,
  latency: 150,
  downloadThroughput: (1.6 * 1024 * 1024) / 8,
  uploadThroughput: (750 * 1024) / 8,
};
export const CPU_SLOWDOWN = 4;

type Visit = { ms: number | null; bytes: number };
type Run = { cold: Visit; warm: Visit; offline: Visit };

async function pickUnits(): Promise<{ id: number; token: string }[]> {
  const conn = await mysql.createConnection(await resolveDatabaseUrl());
  try {
    // Units with a history, so the figures and the timeline have something to draw.
    const [rows] = await conn.query(
      `SELECT u.id, u.qr_token AS token FROM units u
       WHERE EXISTS (SELECT 1 FROM visits v WHERE v.unit_id = u.id) ORDER BY u.id LIMIT ${2 * RUNS}`,
    );
    return (rows as { id: number; token: string }[]).map((r) => ({ id: Number(r.id), token: r.token }));
  } finally {
    await conn.end();
  }
}

/** Bytes on the wire for every response the page's network stack finished (SW/cache hits count what they cost). */
function countBytes(cdp: CDPSession) {
  let bytes = 0;
  cdp.on('Network.loadingFinished', (e) => (bytes += e.encodedDataLength));
  return {
    take: () => {
      const b = bytes;
      bytes = 0;
      return b;
    },
  };
}

// Marks, inside the page, the moment the unit's figures are first in the document (performance.now() counts from the
// start of the navigation); polling from outside would add up to half a second of its own.
const MARK_FIGURES = `new MutationObserver((_, o) => {
  if (document.querySelector('[data-testid="unit-figures"]')) { window.__figuresAt = performance.now(); o.disconnect(); }
}).observe(document, { subtree: true, childList: true });`;

async function openLabel(page: Page, token: string, counter: { take: () => number }): Promise<Visit> {
  counter.take();
  try {
    await page.goto(`${BASE_URL}/u/${token}`, { timeout: TIMEOUT_MS, waitUntil: 'commit' });
    const at = await page.waitForFunction(() => (window as unknown as { __figuresAt?: number }).__figuresAt, null, {
      timeout: TIMEOUT_MS,
      polling: 100,
    });
    const ms = Math.round(Number(await at.jsonValue()));
    // Let the rest of the page (history, charts) arrive, so the bytes are the page's, not half of them.
    await page.waitForLoadState('networkidle', { timeout: TIMEOUT_MS }).catch(() => undefined);
    return { ms, bytes: counter.take() };
  } catch {
    return { ms: null, bytes: counter.take() };
  }
}

async function oneRun(units: { token: string }[], i: number): Promise<Run> {
  const tmp = path.join(os.tmpdir(), 'tightloop-bench');
  mkdirSync(tmp, { recursive: true });
  const profile = mkdtempSync(path.join(tmp, 'profile-'));
  let context: BrowserContext | undefined;
  try {
    context = await chromium.launchPersistentContext(profile, {
      executablePath: CHROMIUM_PATH,
      args: CHROMIUM_ARGS,
      viewport: { width: 390, height: 844 },
      deviceScaleFactor: 3,
      isMobile: true,
      hasTouch: true,
    });
    await context.addInitScript(MARK_FIGURES);
    const page = context.pages()[0] ?? (await context.newPage());
    const tech = DEMO_ACCOUNTS.find((a) => a.role === 'technician')!;
    // Signed in earlier (the session cookie is there), nothing else cached.
    const res = await page.request.post(`${BASE_URL}/api/auth/sign-in`, {
      data: { email: tech.email, password: DEMO_PASSWORD },
      headers: { origin: BASE_URL },
    });
    if (!res.ok()) throw new Error(`sign-in answered ${res.status()}: ${await res.text()}`);
    const cdp = await context.newCDPSession(page);
    await cdp.send('Network.enable');
    await cdp.send('Network.emulateNetworkConditions', SLOW_4G);
    await cdp.send('Emulation.setCPUThrottlingRate', { rate: CPU_SLOWDOWN });
    const counter = countBytes(cdp);
    const [first, second] = [units[(2 * i) % units.length], units[(2 * i + 1) % units.length]];

    const cold = await openLabel(page, first.token, counter);
    // Let the page settle (service worker install, cache persistence) as a phone does between two units.
    await page.waitForTimeout(3000);
    const warm = await openLabel(page, second.token, counter);
    await page.waitForTimeout(1500);
    await context.setOffline(true);
    await cdp.send('Network.emulateNetworkConditions', { ...SLOW_4G, offline: true });
    const offline = await openLabel(page, first.token, counter);
    return { cold, warm, offline };
  } finally {
    await context?.close();
    rmSync(profile, { recursive: true, force: true });
  }
}

const median = (xs: number[]) => {
  if (!xs.length) return null;
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

function summarize(runs: Run[], key: keyof Run) {
  const ok = runs.map((r) => r[key].ms).filter((m): m is number => m !== null);
  return {
    medianMs: ok.length === runs.length ? median(ok) : null,
    opened: `${ok.length}/${runs.length}`,
    medianKB: Math.round(median(runs.map((r) => r[key].bytes))! / 1024),
    samplesMs: runs.map((r) => r[key].ms),
  };
}

async function entryScript() {
  // The entry script as the server sends it to a browser that accepts brotli/gzip.
  const html = await (await fetch(`${BASE_URL}/`)).text();
  const src = /<script[^>]+type="module"[^>]+src="([^"]+)"/.exec(html)?.[1];
  if (!src) return null;
  const r = await fetch(`${BASE_URL}${src}`, { headers: { 'accept-encoding': 'br, gzip' } });
  const body = Buffer.from(await r.arrayBuffer());
  return {
    path: src,
    encoding: r.headers.get('content-encoding') ?? 'identity',
    cacheControl: r.headers.get('cache-control'),
    // fetch decodes the body; the wire size is the Content-Length when compressed.
    wireKB: Math.round(Number(r.headers.get('content-length') ?? body.length) / 1024),
    decodedKB: Math.round(body.length / 1024),
    development: body.includes('jsxDEV'),
  };
}

const units = await pickUnits();
if (units.length < 2) throw new Error('The database has fewer than two units with visits; run `npm start` once first.');
const runs: Run[] = [];
for (let i = 0; i < RUNS; i++) {
  const r = await oneRun(units, i);
  console.log(
    `run ${i + 1}/${RUNS}: cold ${r.cold.ms ?? '—'} ms (${Math.round(r.cold.bytes / 1024)} KB), warm ${r.warm.ms ?? '—'} ms, offline ${r.offline.ms ?? 'did not open'} ms`,
  );
  runs.push(r);
}
const result = {
  label: LABEL,
  at: new Date().toISOString(),
  baseUrl: BASE_URL,
  conditions: { ...SLOW_4G, cpuSlowdown: CPU_SLOWDOWN, viewport: '390×844 @3x', runs: RUNS },
  cold: summarize(runs, 'cold'),
  warm: summarize(runs, 'warm'),
  offline: summarize(runs, 'offline'),
  entry: await entryScript(),
};
const fmt = (s: ReturnType<typeof summarize>) =>
  s.medianMs === null ? `does not open (${s.opened})` : `${(s.medianMs / 1000).toFixed(2)} s`;
console.log(
  `\n${LABEL}: cold ${fmt(result.cold)} (${result.cold.medianKB} KB), warm ${fmt(result.warm)} (${result.warm.medianKB} KB), offline ${fmt(result.offline)}`,
);
console.log(`entry script: ${JSON.stringify(result.entry)}`);
const out = path.join(PROJECT_ROOT, 'bench', 'client-results.json');
const all = existsSync(out) ? (JSON.parse(readFileSync(out, 'utf8')) as Record<string, unknown>) : {};
all[LABEL] = result;
mkdirSync(path.dirname(out), { recursive: true });
writeFileSync(out, JSON.stringify(all, null, 2) + '\n');
console.log(`written to ${path.relative(PROJECT_ROOT, out)}`);
