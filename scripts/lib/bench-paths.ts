import path from 'node:path';
import { PROJECT_ROOT } from './mariadb';

/** The benchmark fleet's database on the project MariaDB (DATABASE_URL overrides it). */
export const BENCH_DATABASE = 'tightloop_bench';
/** What `npm run seed:bench` loaded and how long it took; read by `npm run bench` for its results. */
export const BENCH_SEED_INFO = path.join(PROJECT_ROOT, '.data', 'bench-seed.json');
