// `npm run bench`: the app against the benchmark fleet (run `npm run seed:bench -- --units 100000` first), driven over
// loopback with autocannon, beside a bare Express + one primary-key select measured in the same run; then the
// forecast backtest on the simulated fleet. Writes bench/results.json, bench/results.md and the README section.
// `npm run bench -- --help` lists the options. Its parts live in scripts/bench/: the dataset it asks for, the servers,
// the scenarios and how one load is measured, then the later parts (fleetTableEach, backtest) and the results.
// Each scenario is measured twice: saturated (every connection sends its next request as soon as the last is
// answered, so latency is mostly queueing and req/s is the capacity) and at a steady load (requests arrive at random,
// `--rate` a second on average, and each is timed from when it was due, so a slow answer cannot hide the ones queued
// behind it). Each target says which of the two it is read from.
import { createRng } from '../seed/simulator/prng';
import { backtest } from './bench/backtest';
import type { BenchContext, LaterPart } from './bench/context';
import { readDataset } from './bench/dataset';
import { fleetTableEach } from './bench/fleet-each';
import { LATER_PARTS, readBenchOptions, runsPart } from './bench/options';
import { buildResults, readNotes, renderMarkdown, writeResults } from './bench/results';
import { runScenarios } from './bench/run-scenarios';
import { buildScenarios } from './bench/scenarios';
import { startServers } from './bench/servers';
import { BENCH_DATABASE } from './lib/bench-paths';
import { ensureProjectDatabase } from './lib/mariadb';

/** The parts after the scenarios, in the order they run and are reported; a new part goes here and in LATER_PARTS. */
const PARTS: LaterPart<unknown>[] = [fleetTableEach, backtest];

const options = readBenchOptions();
if (options.cluster) {
  await (await import('./bench/cluster')).runClusterBench(options);
  process.exit(0);
}
const databaseUrl = process.env.DATABASE_URL ?? (await ensureProjectDatabase(BENCH_DATABASE));
const rng = createRng(20_260_601);
const dataset = await readDataset(databaseUrl, rng);
console.log(
  `Benchmark database: ${dataset.unitTotal.toLocaleString('en')} units, ${dataset.eventTotal.toLocaleString('en')} events; ` +
    `busiest unit ${dataset.busy.unitId} with ${dataset.busy.events} events.`,
);
const servers = await startServers(databaseUrl);
const ctx: BenchContext = { options, databaseUrl, dataset, servers, rng };
const scenarios = buildScenarios(dataset, rng);
const unknownIds = (options.only ?? []).filter(
  (id) => !scenarios.some((s) => s.id === id) && !LATER_PARTS.includes(id),
);
if (unknownIds.length) {
  console.error(
    `Unknown --only ${unknownIds.join(', ')}; known: ${[...scenarios.map((s) => s.id), ...LATER_PARTS].join(', ')}.`,
  );
  servers.stopAll();
  process.exit(2);
}
const selected = scenarios.filter((s) => runsPart(options, s.id));
const scenarioRuns = await runScenarios(ctx, selected);
const partValues: Record<string, unknown> = {};
for (const part of PARTS.filter((p) => p.needsServers)) partValues[part.id] = await part.run(ctx);
servers.stopAll();
for (const part of PARTS.filter((p) => !p.needsServers)) partValues[part.id] = await part.run(ctx);

const results = buildResults(
  ctx,
  selected,
  scenarioRuns,
  Object.fromEntries(PARTS.map((p) => [p.id, partValues[p.id]])),
);
const markdown = renderMarkdown(results, {
  peakHourVisits: dataset.peakHourVisits,
  parts: PARTS,
  notes: options.only ? undefined : readNotes(),
});
writeResults(results, markdown, options.out);
process.exit(0);
