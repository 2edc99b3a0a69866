// The benchmark's options. A new section adds its option here and its name to LATER_PARTS if `--only` may pick it.
import { parseCli, type CliOption } from '../lib/cli';

const SUMMARY = `
npm run bench [-- options]: the app against the benchmark fleet (run \`npm run seed:bench -- --units 100000\` first),
driven over loopback with autocannon beside a bare Express + one primary-key select, then the forecast backtest.
Writes bench/results.json, bench/results.md and the README's Performance section; a partial run (--only) writes
its table to --out instead and leaves those alone.`;

export const BENCH_OPTIONS = {
  duration: { type: 'number', default: 10, min: 0.1, placeholder: 's', help: 'seconds per scenario and load' },
  repeat: { type: 'number', default: 3, integer: true, min: 1, help: 'runs of each scenario, medians quoted' },
  connections: { type: 'number', default: 16, integer: true, min: 1, help: 'concurrent connections' },
  rate: { type: 'number', default: 50, min: 0.1, help: 'requests/s of the steady-load runs' },
  'backtest-units': { type: 'number', default: 4000, integer: true, min: 1, help: 'units in the forecast backtest' },
  // The forecast learns from a simulated fleet of another seed than the one it is tested on (DOMAIN.md §7b).
  'backtest-train-seed': { type: 'number', default: 7, integer: true, help: 'seed of the backtest training fleet' },
  only: {
    type: 'string',
    placeholder: 'ids',
    help: 'only these scenarios, comma-separated (e.g. visitWrite,visitTopUp,mixedWrite; fleetTableEach and backtest name the later parts)',
  },
  out: {
    type: 'string',
    placeholder: 'file.md',
    help: 'where a partial run writes its table, a .json beside it (default .data/bench-partial.md)',
  },
  cluster: {
    type: 'boolean',
    help: 'instead: unit page and visit write through the local cluster (npm run cluster) with 1, 2, 3 API processes, beside one plain MariaDB',
  },
} satisfies Record<string, CliOption>;

/** The parts after the scenarios, by the names `--only` knows them by (and their keys in results.json). */
export const LATER_PARTS = ['fleetTableEach', 'backtest'];

export type BenchOptions = {
  durationS: number;
  repeat: number;
  connections: number;
  steadyRate: number;
  backtestUnits: number;
  backtestTrainSeed: number;
  /** The scenarios and parts to run; undefined for all (a full run). */
  only: string[] | undefined;
  out: string | undefined;
  /** The cluster benchmark (scripts/bench/cluster.ts) instead of the scenarios. */
  cluster: boolean;
};

export function readBenchOptions(argv?: string[]): BenchOptions {
  const o = parseCli(SUMMARY, BENCH_OPTIONS, argv);
  return {
    durationS: o.duration,
    repeat: o.repeat,
    connections: o.connections,
    steadyRate: o.rate,
    backtestUnits: o['backtest-units'],
    backtestTrainSeed: o['backtest-train-seed'],
    only: o.only
      ?.split(',')
      .map((s) => s.trim())
      .filter(Boolean),
    out: o.out,
    cluster: o.cluster,
  };
}

/** Whether a scenario or later part runs: every one in a full run, the named ones in a partial run. */
export const runsPart = (options: BenchOptions, id: string) => !options.only || options.only.includes(id);
