// The fleet table, each sort (both ways) and each filter by itself, saturated and at the steady rate: the fleet-views
// issue asks for each one within its target, not only for the mix.
import type { LaterPart } from './context';
import { fmtRun, measure, measureSteady, settle, type Run } from './measure';
import { runsPart } from './options';
import { fleetEachQueries, get, TARGETS } from './scenarios';
import { med } from './summary';

export type FleetEachRow = {
  query: string;
  saturatedP95Ms: number;
  saturatedRps: number;
  steadyP95Ms: number;
  non2xx: number;
};

/** Seconds of each load per query and round. */
const eachSeconds = (durationS: number) => Math.min(3, durationS);

export const fleetTableEach: LaterPart<FleetEachRow[]> = {
  id: 'fleetTableEach',
  needsServers: true,
  async run({ options, dataset, servers }) {
    if (!runsPart(options, 'fleetTableEach')) return [];
    const { repeat, steadyRate, connections } = options;
    const { appUrl, appHeaders } = servers;
    const seconds = eachSeconds(options.durationS);
    console.log(
      `Fleet table, each sort and filter by itself (${seconds} s saturated, ${seconds} s steady, ${repeat} rounds)…`,
    );
    // Round by round over all cases, so a slow spell of a shared machine lands on different cases, not on every run of one.
    const cases = fleetEachQueries(dataset).map((query) => ({ query, saturated: [] as Run[], steady: [] as Run[] }));
    for (let r = 1; r <= repeat; r++) {
      for (const f of cases) {
        const requests = get(() => `/api/fleet?${f.query}`);
        await settle(appUrl);
        const saturated = await measure(appUrl, requests, seconds, appHeaders, connections);
        await settle(appUrl);
        const steady = await measureSteady(appUrl, requests, seconds, steadyRate, appHeaders, connections);
        f.saturated.push(saturated);
        f.steady.push(steady);
        console.log(
          `  ${r}/${repeat} ${f.query.padEnd(44)} ${fmtRun(saturated)}  |  @${steadyRate}/s p95 ${steady.p95.toFixed(1)} ms`,
        );
      }
    }
    return cases.map((f) => ({
      query: f.query,
      saturatedP95Ms: +med(f.saturated.map((x) => x.p95)).toFixed(2),
      saturatedRps: Math.round(med(f.saturated.map((x) => x.rps))),
      steadyP95Ms: +med(f.steady.map((x) => x.p95)).toFixed(2),
      non2xx: [...f.saturated, ...f.steady].reduce((n, x) => n + x.non2xx, 0),
    }));
  },
  markdown(rows, { settings }) {
    if (!rows.length) return [];
    const fleetLimit = TARGETS.fleetTable[0].p95Ms;
    const over = rows.filter((f) => f.saturatedP95Ms > fleetLimit);
    const seconds = eachSeconds(settings.durationS);
    return [
      `Fleet table, each sort (both ways) and each filter by itself, ${seconds} s saturated and ${seconds} s steady, medians of ${settings.repeat} rounds: ` +
        (over.length
          ? `${over.length} of ${rows.length} above p95 ${fleetLimit} ms saturated.`
          : `all ${rows.length} within p95 ${fleetLimit} ms saturated.`),
      '',
      `| \`GET /api/fleet?…\` | saturated p95 ms | req/s | steady ${settings.steadyRate}/s p95 ms | ≤ ${fleetLimit} ms saturated |`,
      '|---|---:|---:|---:|---|',
      ...rows.map(
        (f) =>
          `| \`${f.query}\`${f.non2xx ? ` (${f.non2xx} non-2xx)` : ''} | ${f.saturatedP95Ms} | ${f.saturatedRps} | ${f.steadyP95Ms} | ${f.saturatedP95Ms <= fleetLimit ? '✓' : '✗'} |`,
      ),
      '',
    ];
  },
};
