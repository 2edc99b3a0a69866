// Measuring one load: saturated (autocannon, every connection sends its next request as soon as the last is answered)
// or steady (arrivals at random at a given rate, each timed from when it was due), with every answer counted by status
// and, for scenarios that say so, by kind of request.
import http from 'node:http';
import autocannon from 'autocannon';
import { createRng } from '../../seed/simulator/prng';

/** Answers other than 2xx by status code. */
export type Statuses = Record<string, number>;
export type KindRun = {
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
export type Run = {
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
/** What a scenario's setupRequest may note about the request it built (its kind, for the per-kind figures). */
export type RequestContext = { kind?: string };

/** The kind of the request autocannon has just had answered; its 'response' event follows `onResponse` synchronously. */
let answeredKind: string | undefined;
export const noteAnsweredKind = (kind: string | undefined) => {
  answeredKind = kind;
};

export function percentile(sorted: Float64Array, p: number): number {
  if (!sorted.length) return NaN;
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[i];
}

/** Counts answers: all of them, and per kind of request for scenarios that say which kind each request was. */
function tally() {
  const times: number[] = [];
  const all = { non2xx: 0, s5xx: 0, statuses: {} as Statuses };
  const byKind = new Map<string, { times: number[]; non2xx: number; s5xx: number; statuses: Statuses }>();
  const count = (k: { non2xx: number; s5xx: number; statuses: Statuses }, status: number) => {
    if (status < 200 || status >= 300) {
      k.non2xx++;
      k.statuses[status] = (k.statuses[status] ?? 0) + 1;
    }
    if (status >= 500) k.s5xx++;
  };
  return {
    add(kind: string | undefined, status: number, ms: number) {
      times.push(ms);
      count(all, status);
      if (!kind) return;
      let k = byKind.get(kind);
      if (!k) byKind.set(kind, (k = { times: [], non2xx: 0, s5xx: 0, statuses: {} }));
      k.times.push(ms);
      count(k, status);
    },
    run(seconds: number, errors: number): Run {
      const sorted = Float64Array.from(times).sort();
      return {
        rps: times.length / seconds,
        okRps: (times.length - all.non2xx) / seconds,
        p50: percentile(sorted, 50),
        p95: percentile(sorted, 95),
        p99: percentile(sorted, 99),
        requests: times.length,
        errors,
        non2xx: all.non2xx,
        s5xx: all.s5xx,
        statuses: all.statuses,
        byKind: byKind.size
          ? Object.fromEntries(
              [...byKind].map(([kind, k]) => {
                const s = Float64Array.from(k.times).sort();
                const okRps = (k.times.length - k.non2xx) / seconds;
                const { non2xx, s5xx, statuses } = k;
                const p = { p50: percentile(s, 50), p95: percentile(s, 95), p99: percentile(s, 99) };
                return [kind, { okRps, requests: k.times.length, non2xx, s5xx, statuses, ...p }];
              }),
            )
          : undefined,
      };
    },
  };
}

/** Saturated: `connections` connections, each sending its next request as soon as the last is answered. */
export async function measure(
  base: string,
  requests: autocannon.Request[],
  seconds: number,
  headers: Record<string, string>,
  connections: number,
): Promise<Run> {
  const answers = tally();
  answeredKind = undefined;
  const instance = autocannon({ url: base, connections, duration: seconds, headers, requests });
  instance.on('response', (_client: unknown, status: number, _bytes: number, ms: number) => {
    answers.add(answeredKind, status, ms);
    answeredKind = undefined;
  });
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    instance.once('done', resolve);
    instance.once('error', reject);
  });
  return answers.run(result.duration, result.errors + result.timeouts);
}

const pacing = createRng(20_261_202);
/**
 * Requests at a steady rate: arrivals at random (exponential gaps, `rate` a second on average) over at most
 * `connections` keep-alive sockets; each is timed from when it was due, so time spent waiting for a socket counts.
 */
export async function measureSteady(
  base: string,
  requests: autocannon.Request[],
  seconds: number,
  rate: number,
  headers: Record<string, string>,
  connections: number,
): Promise<Run> {
  const agent = new http.Agent({ keepAlive: true, maxSockets: connections });
  const target = new URL(base);
  const template = requests[0];
  const answers = tally();
  let errors = 0;
  const send = (due: number) =>
    new Promise<void>((resolve) => {
      const context: RequestContext = {};
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
            template.onResponse?.(status, Buffer.concat(chunks).toString(), context, {});
            answers.add(context.kind, status, ms);
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
  return answers.run((performance.now() - start) / 1000, errors);
}

/** Waits until the app has worked off what the last scenario left in flight (its health check answers quickly). */
export async function settle(base: string) {
  const t = Date.now();
  let quick = 0;
  while (quick < 3 && Date.now() - t < 120_000) {
    const t0 = performance.now();
    await fetch(`${base}/api/health`).then((r) => r.arrayBuffer());
    quick = performance.now() - t0 < 20 ? quick + 1 : 0;
    await new Promise((r) => setTimeout(r, 100));
  }
}

export function fmtRun(x: Run) {
  return `p50 ${x.p50.toFixed(1)} ms  p95 ${x.p95.toFixed(1)} ms  p99 ${x.p99.toFixed(1)} ms  ${Math.round(x.rps)} req/s${x.non2xx ? `  (${x.non2xx} non-2xx, ${x.s5xx} × 5xx)` : ''}${x.errors ? `  (${x.errors} errors)` : ''}`;
}
