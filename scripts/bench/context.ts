// What every part of the benchmark gets, and the shape of a part that runs after the scenarios.
import type { Rng } from '../../seed/simulator/prng';
import type { BenchResults } from './results';
import type { Dataset } from './dataset';
import type { BenchOptions } from './options';
import type { BenchServers } from './servers';

export type BenchContext = {
  options: BenchOptions;
  /** The benchmark database (DATABASE_URL, or tightloop_bench on the project MariaDB). */
  databaseUrl: string;
  dataset: Dataset;
  servers: BenchServers;
  /** The one random stream of the run: samples, paths and write bodies draw from it in turn. */
  rng: Rng;
};

/**
 * A part after the scenarios (`--only` knows it by `id`, results.json keeps what `run` returns under `id`, and the
 * markdown adds its lines after the scenario tables). Parts that need the app run before the servers stop.
 */
export type LaterPart<R> = {
  id: string;
  needsServers: boolean;
  /** Runs the part, or returns what results.json shows for it when `--only` leaves it out. */
  run(ctx: BenchContext): Promise<R>;
  /** Its lines in the markdown (none when it did not run). */
  markdown(value: R, results: BenchResults): string[];
};
