// What the benchmark asks for: the benchmark fleet's size, its busiest unit, random units, label tokens, the biggest
// site, container-number searches and the busiest hour of visits, read once before the servers start.
import { existsSync, readFileSync } from 'node:fs';
import mysql from 'mysql2/promise';
import type { Rng } from '../../seed/simulator/prng';
import { BENCH_SEED_INFO } from '../lib/bench-paths';

export type Dataset = {
  unitTotal: number;
  eventTotal: number;
  busy: { unitId: number; events: number };
  /** Random in-service units for the reads, and another draw for the writes. */
  unitIds: number[];
  writeIds: number[];
  tokens: string[];
  siteId: number;
  /** A container number for the searches, and the start that matches closest to 1 % of the fleet. */
  sampleNumber: string;
  onePercentPrefix: string | undefined;
  /** Visits in the simulated fleet's busiest hour of its last year (0 when it has none). */
  peakHourVisits: number;
  /** What `npm run seed:bench` wrote about the load, if it ran here. */
  seedInfo: Record<string, unknown> | null;
};

export function readSeedInfo(): Record<string, unknown> | null {
  return existsSync(BENCH_SEED_INFO)
    ? (JSON.parse(readFileSync(BENCH_SEED_INFO, 'utf8')) as Record<string, unknown>)
    : null;
}

/** Reads the dataset; exits with a hint when the benchmark database is empty. */
export async function readDataset(url: string, rng: Rng): Promise<Dataset> {
  const seedInfo = readSeedInfo();
  const sql = await mysql.createConnection({ uri: url, timezone: 'Z' });
  const one = async <T>(q: string, params: unknown[] = []): Promise<T[]> => (await sql.query(q, params))[0] as T[];
  const [{ n: unitTotal }] = await one<{ n: number }>('SELECT COUNT(*) AS n FROM units').catch(() => [{ n: 0 }]);
  if (!Number(unitTotal)) {
    console.error('The benchmark database is empty. Run `npm run seed:bench -- --units 100000` first.');
    process.exit(1);
  }
  const [{ n: eventTotal }] = await one<{ n: number }>('SELECT COUNT(*) AS n FROM events');
  const [busiest] = await one<{ unitId: number }>(
    'SELECT unit_id AS unitId FROM unit_stats ORDER BY event_count DESC LIMIT 1',
  );
  const [{ n: busyEvents }] = await one<{ n: number }>('SELECT COUNT(*) AS n FROM events WHERE unit_id = ?', [
    busiest.unitId,
  ]);
  const busy = { unitId: busiest.unitId, events: Number(busyEvents) };
  const inService = (
    await one<{ id: number }>("SELECT id FROM units WHERE status = 'in_service' AND id <> ?", [busy.unitId])
  ).map((r) => r.id);
  const sample = (list: number[], k: number) =>
    Array.from({ length: k }, () => list[Math.floor(rng.next() * list.length)]);
  const unitIds = sample(inService, 5000);
  const writeIds = sample(inService, 5000);
  const tokens = (
    await one<{ t: string }>('SELECT qr_token AS t FROM units WHERE id IN (?)', [sample(inService, 2000)])
  ).map((r) => r.t);
  const [site] = await one<{ id: number }>(
    'SELECT site_id AS id FROM units GROUP BY site_id ORDER BY COUNT(*) DESC LIMIT 1',
  );
  // Container-number searches: the owner code with two, three and four digits (in the simulated fleet about 3 %,
  // 0.3 % and 0.03 % of it), and the start that keeps closest to 1 % — near the share where the table stops walking
  // the sort index and reads the matching units instead, so the slower of the two ways shows.
  const [{ n: sampleNumber }] = await one<{ n: string }>('SELECT container_number AS n FROM units WHERE id = ?', [
    unitIds[0],
  ]);
  const [onePercent] = await one<{ p: string }>(
    'SELECT p FROM (SELECT LEFT(container_number, 5) AS p, COUNT(*) AS n FROM units GROUP BY p UNION ALL SELECT LEFT(container_number, 6), COUNT(*) FROM units GROUP BY 1) AS starts ORDER BY ABS(n - ? * 0.01) LIMIT 1',
    [Number(unitTotal)],
  );
  // What the steady rate stands for: the simulated fleet's busiest hour of visits in the year before it was seeded.
  const seededAt = new Date(String(seedInfo?.asOf ?? new Date().toISOString()));
  const [peakHour] = await one<{ c: number }>(
    "SELECT COUNT(*) AS c FROM visits WHERE occurred_at >= ? - INTERVAL 365 DAY AND occurred_at < ? GROUP BY DATE_FORMAT(occurred_at, '%Y-%m-%d %H') ORDER BY c DESC LIMIT 1",
    [seededAt, seededAt],
  );
  await sql.end();
  return {
    unitTotal: Number(unitTotal),
    eventTotal: Number(eventTotal),
    busy,
    unitIds,
    writeIds,
    tokens,
    siteId: site.id,
    sampleNumber,
    onePercentPrefix: onePercent?.p,
    peakHourVisits: Number(peakHour?.c ?? 0),
    seedInfo,
  };
}
