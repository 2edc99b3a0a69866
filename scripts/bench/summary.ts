// Runs to the figures results.json quotes: medians of the runs' percentiles and rates, sums of their counts.
import type { KindRun, Run, Statuses } from './measure';
import { WRITE_KIND_ORDER } from './writes';

export const med = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

export type KindSummary = {
  okRps: number;
  p50Ms: number;
  p95Ms: number;
  p99Ms: number;
  requests: number;
  non2xx: number;
  s5xx: number;
  statuses: Statuses;
};
export type RunSummary = KindSummary & {
  rps: number;
  errors: number;
  byKind?: Record<string, KindSummary>;
};

export function summary(list: Run[]): RunSummary | null {
  return list.length
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
}

function addStatuses(list: { statuses: Statuses }[]): Statuses {
  const sum: Statuses = {};
  for (const x of list) for (const [code, n] of Object.entries(x.statuses)) sum[code] = (sum[code] ?? 0) + n;
  return sum;
}

/** Per kind of request: answers and failures summed over the runs, latency percentiles as medians of the runs. */
function kindSummary(list: Run[]): Record<string, KindSummary> {
  const seen = new Set(list.flatMap((x) => Object.keys(x.byKind ?? {})));
  const kinds = WRITE_KIND_ORDER.filter((kind) => seen.has(kind));
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
