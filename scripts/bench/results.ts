// results.json and the markdown table: what was measured, on what, against which targets. A full run writes
// bench/results.* and the README's Performance section; a partial run (--only) writes to --out and leaves them alone.
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { PROJECT_ROOT } from '../lib/mariadb';
import type { BenchContext, LaterPart } from './context';
import type { ScenarioRuns } from './run-scenarios';
import { TARGETS, type Regime, type Scenario, type Target } from './scenarios';
import { med, summary, type KindSummary, type RunSummary } from './summary';
import { KIND_NAMES, WRITE_NAMES, type WriteKind } from './writes';

type ScenarioResult = Partial<RunSummary> & {
  id: string;
  title: string;
  available: boolean;
  probeStatus: number;
  baselineRatio: number | null;
  steady: RunSummary | null;
  targets: (Target & { measuredP95Ms: number | null; met: boolean | null })[];
};
export type BenchResults = {
  date: string;
  machine: { cpu: string; cores: number; memoryGiB: number; node: string; os: string };
  settings: { durationS: number; repeat: number; connections: number; steadyRate: number; only: string[] | null };
  dataset: { units: number; events: number; busyUnitEvents: number; seed: Record<string, unknown> | null };
  baseline: RunSummary & { title: string; steady: RunSummary | null };
  scenarios: ScenarioResult[];
  targets: typeof TARGETS;
  /** What each later part returned, under its id. */
  [part: string]: unknown;
};

function machine(): BenchResults['machine'] {
  const cpu = (() => {
    try {
      return /model name\s*:\s*(.+)/.exec(readFileSync('/proc/cpuinfo', 'utf8'))?.[1]?.trim() ?? os.cpus()[0]?.model;
    } catch {
      return os.cpus()[0]?.model ?? 'unknown';
    }
  })();
  return {
    cpu,
    cores: os.cpus().length,
    memoryGiB: Math.round(os.totalmem() / 2 ** 30),
    node: process.version,
    os: `${os.type()} ${os.release()}`,
  };
}

export function buildResults(
  { options, dataset }: BenchContext,
  selected: Scenario[],
  { runs, steadyRuns, ratios, available }: ScenarioRuns,
  parts: Record<string, unknown>,
): BenchResults {
  return {
    date: new Date().toISOString(),
    machine: machine(),
    settings: {
      durationS: options.durationS,
      repeat: options.repeat,
      connections: options.connections,
      steadyRate: options.steadyRate,
      only: options.only ?? null,
    },
    dataset: {
      units: dataset.unitTotal,
      events: dataset.eventTotal,
      busyUnitEvents: dataset.busy.events,
      seed: dataset.seedInfo,
    },
    baseline: {
      title: 'Bare Express + one mysql2 primary-key select (`SELECT * FROM units WHERE id = ?`)',
      ...summary(runs.baseline)!,
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
    ...parts,
  };
}

/** The header and the scenario table. */
function scenarioTable(results: BenchResults, peakHourVisits: number): string[] {
  const { machine: m, settings, dataset, baseline } = results;
  const { durationS, repeat, connections, steadyRate } = settings;
  const visitLoad = peakHourVisits
    ? ` The simulated fleet's busiest hour in its last year had ${peakHourVisits} visits (${(peakHourVisits / 3600).toFixed(3)} a second): ` +
      `the steady load is ${Math.round((steadyRate * 3600) / peakHourVisits).toLocaleString('en')} times that.`
    : '';
  const steadyCell = (x: RunSummary | null) => (x ? `${x.p50Ms} / ${x.p95Ms} / ${x.p99Ms}` : '');
  const md = [
    `Measured ${results.date.slice(0, 10)} on ${m.cpu}, ${m.cores} cores, ${m.memoryGiB} GiB, Node ${m.node}; `,
    `${dataset.units.toLocaleString('en')} units, ${dataset.events.toLocaleString('en')} events; over loopback, ` +
      `${durationS} s per scenario and load, medians of ${repeat} runs; server, load generator and MariaDB share the machine. ` +
      `*Saturated*: ${connections} connections, each sending its next request as soon as the last is answered (req/s is the capacity; ` +
      `latency is mostly waiting in line). *Steady*: requests arriving at random, ${steadyRate} a second on average, over up to ` +
      `${connections} connections, each timed from when it was due.${visitLoad}\n`,
    `| scenario | saturated p50 / p95 / p99 ms | req/s | vs baseline req/s | steady ${steadyRate}/s p50 / p95 / p99 ms | target |`,
    '|---|---:|---:|---:|---:|---|',
    `| ${baseline.title} | ${baseline.p50Ms} / ${baseline.p95Ms} / ${baseline.p99Ms} | ${baseline.rps} | 1.00 | ${steadyCell(baseline.steady)} | |`,
  ];
  const unitRatio = results.scenarios.find((s) => s.id === 'unitPage')?.baselineRatio;
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
  return md;
}

/** Every answer of the write scenarios, by load and by kind of request. */
function writeTable(results: BenchResults): string[] {
  const { repeat, steadyRate } = results.settings;
  const writeRows = results.scenarios.filter((s) => s.available && s.id in WRITE_NAMES);
  if (!writeRows.length) return [];
  const md = [
    `Write scenarios, every answer counted (summed over the ${repeat} runs of each load; 2xx/s and latency as medians of the runs). ` +
      'Concurrent writers must never get a 5xx (the integrity issue); a 4xx here is a refused write the load did not mean to send.',
    '',
    '| write scenario | load | requests | 2xx/s | non-2xx | 5xx | p50 / p95 / p99 ms | no 5xx |',
    '|---|---|---:|---:|---:|---:|---:|---|',
  ];
  const share = (n: number, of: number) =>
    `${n.toLocaleString('en')} (${of ? ((100 * n) / of).toFixed(n && n < of / 100 ? 2 : 1) : '0'} %)`;
  const byStatus = (x: KindSummary['statuses']) =>
    Object.entries(x)
      .map(([code, n]) => `${code} × ${n.toLocaleString('en')}`)
      .join(', ');
  const row = (name: string, load: string, x: KindSummary) =>
    md.push(
      `| ${name} | ${load} | ${x.requests.toLocaleString('en')} | ${x.okRps} | ${share(x.non2xx, x.requests)}${x.non2xx ? `: ${byStatus(x.statuses)}` : ''} | ` +
        `${share(x.s5xx, x.requests)} | ${x.p50Ms} / ${x.p95Ms} / ${x.p99Ms} | ${x.s5xx ? '✗' : '✓'} |`,
    );
  for (const s of writeRows) {
    const name = WRITE_NAMES[s.id as keyof typeof WRITE_NAMES];
    const saturated = s.requests === undefined ? null : (s as RunSummary);
    for (const [load, x] of [
      ['saturated', saturated],
      [`steady ${steadyRate}/s`, s.steady],
    ] as const) {
      if (!x) continue;
      row(name, load, x);
      for (const [kind, k] of Object.entries(x.byKind ?? {}))
        row(`↳ ${KIND_NAMES[kind as WriteKind] ?? kind}`, load, k);
    }
  }
  md.push('');
  return md;
}


/** The markdown quoted in bench/results.md and the README: tables, the later parts' lines, how to reproduce. */
export function renderMarkdown(
  results: BenchResults,
  opts: { peakHourVisits: number; parts: Pick<LaterPart<unknown>, 'id' | 'markdown'>[]; notes?: string },
): string {
  const { settings } = results;
  const seedInfo = results.dataset.seed;
  const md = [...scenarioTable(results, opts.peakHourVisits), ...writeTable(results)];
  for (const part of opts.parts) md.push(...part.markdown(results[part.id], results));
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
  if (settings.only) md.push('', `Partial run: \`--only ${settings.only.join(',')}\`.`);
  else if (opts.notes) md.push('', opts.notes.trim());
  // Parts left out of a partial run would leave blank lines doubled.
  return md.join('\n').replace(/\n{3,}/g, '\n\n') + '\n';
}

/** Hand-written findings (what misses its target and why) live beside the results and are quoted with them. */
export function readNotes(): string | undefined {
  const notesFile = path.join(PROJECT_ROOT, 'bench', 'notes.md');
  return existsSync(notesFile) ? readFileSync(notesFile, 'utf8') : undefined;
}

export function writeResults(results: BenchResults, mdText: string, out: string | undefined) {
  if (results.settings.only) {
    // A partial run would leave the published table with scenarios missing: it goes to a file of its own.
    const file = path.resolve(out ?? path.join(PROJECT_ROOT, '.data', 'bench-partial.md'));
    const json = file.replace(/(\.md)?$/, '.json');
    mkdirSync(path.dirname(file), { recursive: true });
    writeFileSync(file, `# Benchmark results (partial run)\n\n${mdText}`);
    writeFileSync(json, JSON.stringify(results, null, 2) + '\n');
    console.log(`\n${mdText}`);
    console.log(`Wrote ${file} and ${json}; bench/results.* and README.md are unchanged.`);
    return;
  }
  const outDir = path.join(PROJECT_ROOT, 'bench');
  mkdirSync(outDir, { recursive: true });
  writeFileSync(path.join(outDir, 'results.json'), JSON.stringify(results, null, 2) + '\n');
  writeFileSync(path.join(outDir, 'results.md'), `# Benchmark results\n\n${mdText}`);
  updateReadme(mdText);
  console.log(`\n${mdText}`);
  console.log('Wrote bench/results.json, bench/results.md and the Performance section of README.md.');
}

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
