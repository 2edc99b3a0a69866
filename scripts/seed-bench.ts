// `npm run seed:bench -- --units 100000`: the benchmark fleet (about 50 events a unit, one unit with 5,000) in its own
// database — tightloop_bench on the project MariaDB, or DATABASE_URL — by bulk multi-row INSERTs over a few
// connections while the next batch is simulated, with statistics computed in memory by the server's functions.
import { mkdirSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { createDb, migrateDb } from '../server/db/client';
import { hashPassword } from '../server/lib/password';
import { getSettings } from '../server/lib/settings';
import { DEMO_PASSWORD } from '../seed/demo-accounts';
import { BUSY_UNIT_EVENTS, createFleet, DEFAULT_SEED, unitCount } from '../seed/simulator/fleet';
import { FleetWriter, fleetRows, writeSitesAndPeople, type Exec } from '../seed/simulator/writer';
import { ensureProjectDatabase } from './lib/mariadb';
import { BENCH_DATABASE, BENCH_SEED_INFO } from './lib/bench-paths';
import { parseCli } from './lib/cli';

const options = parseCli(
  `npm run seed:bench [-- options]: the benchmark fleet (about 50 events a unit, one unit with ${BUSY_UNIT_EVENTS.toLocaleString('en')}) in
its own database (${BENCH_DATABASE} on the project MariaDB, or DATABASE_URL), emptied first.`,
  {
    units: {
      type: 'number',
      default: 100_000,
      integer: true,
      min: 1,
      help: 'ordinary units (the busy unit comes on top)',
    },
    seed: { type: 'number', default: DEFAULT_SEED, integer: true, help: 'seed of the simulated fleet' },
    batch: { type: 'number', default: 1000, integer: true, min: 1, help: 'units simulated per batch' },
    connections: { type: 'number', default: 2, integer: true, min: 1, help: 'connections loading in parallel' },
    'keep-indexes': {
      type: 'boolean',
      help: 'keep the secondary indexes during the load instead of building them after',
    },
    reset: { type: 'boolean', help: 'empty the database even if its name has no "bench" in it' },
  },
);
const unitsWanted = options.units;
const seed = options.seed;
const batchUnits = options.batch;
const connectionCount = options.connections;
const deferIndexes = !options['keep-indexes'];

const url = process.env.DATABASE_URL ?? (await ensureProjectDatabase(BENCH_DATABASE));
const dbName = new URL(url).pathname.replace(/^\//, '');
if (!/bench/i.test(dbName) && !options.reset) {
  console.error(`Refusing to empty "${dbName}": its name has no "bench" in it. Pass --reset if you mean it.`);
  process.exit(1);
}

const t0 = performance.now();
const secs = () => (performance.now() - t0) / 1000;
const log = (s: string) => console.log(`[${secs().toFixed(1).padStart(6)} s] ${s}`);

// --- fresh schema ---------------------------------------------------------------------------------------------
const admin = await mysql.createConnection({ uri: url, timezone: 'Z' });
{
  const [tables] = (await admin.query(
    "SELECT table_name AS t FROM information_schema.tables WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE'",
  )) as unknown as [{ t: string }[]];
  await admin.query('SET foreign_key_checks = 0');
  for (const { t } of tables) await admin.query(`DROP TABLE \`${t}\``);
  await admin.query('SET foreign_key_checks = 1');
}
const settings = await (async () => {
  const { db, pool } = createDb(url, { connectionLimit: 2 });
  await migrateDb(db);
  const s = await getSettings(db);
  await pool.end();
  return s;
})();
log(`Emptied and migrated ${dbName}.`);

// Secondary indexes that no foreign key needs are built after the load, in one sorted pass each (faster than
// maintaining them row by row). Indexes a foreign key relies on stay.
type IndexDef = { table: string; name: string; columns: string[]; unique: boolean };
const deferred: IndexDef[] = [];
if (deferIndexes) {
  const [rows] = (await admin.query(
    `SELECT s.table_name AS t, s.index_name AS i, s.non_unique AS nu, GROUP_CONCAT(s.column_name ORDER BY s.seq_in_index) AS cols
       FROM information_schema.statistics s
      WHERE s.table_schema = DATABASE() AND s.index_name <> 'PRIMARY' AND s.table_name IN ('events', 'visits', 'unit_stats', 'units')
      GROUP BY s.table_name, s.index_name, s.non_unique`,
  )) as unknown as [{ t: string; i: string; nu: number; cols: string }[]];
  const [fks] = (await admin.query(
    `SELECT table_name AS t, column_name AS c FROM information_schema.key_column_usage
      WHERE table_schema = DATABASE() AND referenced_table_name IS NOT NULL`,
  )) as unknown as [{ t: string; c: string }[]];
  const fkFirst = new Set(fks.map((f) => `${f.t}.${f.c}`));
  for (const r of rows) {
    const columns = r.cols.split(',');
    if (Number(r.nu) === 0 || fkFirst.has(`${r.t}.${columns[0]}`)) continue;
    deferred.push({ table: r.t, name: r.i, columns, unique: false });
  }
  for (const d of deferred) await admin.query(`ALTER TABLE \`${d.table}\` DROP INDEX \`${d.name}\``);
  log(`Deferred ${deferred.length} secondary indexes until after the load: ${deferred.map((d) => d.name).join(', ')}.`);
}

// --- the load ------------------------------------------------------------------------------------------------
const conns = await Promise.all(
  Array.from({ length: connectionCount }, () =>
    mysql.createConnection({ uri: url, timezone: 'Z', multipleStatements: false }),
  ),
);
for (const c of conns) {
  // Our own freshly generated rows: keys are unique and references resolve by construction.
  await c.query('SET SESSION unique_checks = 0, foreign_key_checks = 0');
}
let next = 0;
const exec: Exec = async (q) => {
  const c = conns[next++ % conns.length];
  await c.query(q);
};

const now = new Date();
const fleet = createFleet({ seed, units: unitsWanted, now, busyUnitEvents: BUSY_UNIT_EVENTS });
const siteIds = await writeSitesAndPeople(exec, fleet, 1, await hashPassword(DEMO_PASSWORD));
const ids = { unit: 1, visit: 1, event: 1 };
const writer = new FleetWriter(exec);
const total = unitCount(fleet);
const loadStart = secs();
let lastPrint = 0;
const tty = process.stdout.isTTY;
const progress = (done: number, final = false) => {
  const el = secs() - loadStart;
  if (!final && el - lastPrint < (tty ? 0.5 : 5)) return;
  lastPrint = el;
  const rate = done / Math.max(el, 1e-3);
  const eta = (total - done) / Math.max(rate, 1e-9);
  const width = 30;
  const filled = Math.round((done / total) * width);
  const line =
    `[${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${done.toLocaleString('en')}/${total.toLocaleString('en')} units, ` +
    `${writer.counts.events.toLocaleString('en')} events, ${Math.round(rate).toLocaleString('en')} units/s, ` +
    `ETA ${final ? '0' : Math.round(eta)} s`;
  if (tty) process.stdout.write(`\r${line}${final ? '\n' : ''}`);
  else console.log(line);
};
let computeSeconds = 0;
for (let from = 0; from < total; from += batchUnits) {
  const to = Math.min(total, from + batchUnits);
  const c0 = performance.now();
  for (const { rows } of fleetRows(fleet, siteIds, ids, settings, from, to)) writer.add(rows);
  computeSeconds += (performance.now() - c0) / 1000;
  // At most a few statements outstanding per connection: the database stays busy, memory stays bounded.
  await writer.drain(connectionCount * 3);
  progress(to);
}
await writer.flush();
progress(total, true);
const loadSeconds = secs() - loadStart;
log(
  `Loaded ${writer.counts.units.toLocaleString('en')} units, ${writer.counts.visits.toLocaleString('en')} visits, ${writer.counts.events.toLocaleString('en')} events (simulation and statistics ${computeSeconds.toFixed(0)} s of it).`,
);
for (const c of conns) await c.end();

let indexSeconds = 0;
if (deferred.length) {
  const i0 = secs();
  const byTable = new Map<string, IndexDef[]>();
  for (const d of deferred) byTable.set(d.table, [...(byTable.get(d.table) ?? []), d]);
  for (const [table, list] of byTable) {
    await admin.query(
      `ALTER TABLE \`${table}\` ${list.map((d) => `ADD INDEX \`${d.name}\` (${d.columns.map((c) => `\`${c}\``).join(', ')})`).join(', ')}`,
    );
  }
  indexSeconds = secs() - i0;
  log(`Built the deferred indexes in ${indexSeconds.toFixed(0)} s.`);
}
await admin.query('ANALYZE TABLE units, visits, events, unit_stats, sites, users');
// InnoDB's sampled statistics (20 pages) are far off on events: voids_event_id is NULL on almost every row, so a
// lookup on it looks like thousands of rows, and recorded_by looks like 130 rows a person instead of about 46,000.
// The optimizer then starts a unit's history join from the users table and reads a person's whole history with a
// rowid filter: about 1 s per unit page for units with more than ~150 events. Engine-independent statistics
// (full counts, NULLs apart) put the join back on the unit's own index: 3–5 ms.
const a0 = secs();
await admin.query(
  'ANALYZE TABLE events PERSISTENT FOR COLUMNS (voids_event_id, cylinder, visit_id, recorded_by, unit_id, site_id, kind) ' +
    'INDEXES (events_voids_unique, events_cylinder_idx, events_visit_idx, events_recorded_by_users_id_fk, events_unit_time_idx, events_site_time_idx, events_kind_time_idx)',
);
await admin.query(
  'ANALYZE TABLE unit_stats PERSISTENT FOR COLUMNS (forecast_date, next_leak_check_due, pti_valid_until) INDEXES ()',
);
log(`Collected statistics in ${(secs() - a0).toFixed(0)} s.`);
await admin.end();

const info = {
  database: dbName,
  seed,
  units: writer.counts.units,
  visits: writer.counts.visits,
  events: writer.counts.events,
  busyUnitEvents: BUSY_UNIT_EVENTS,
  asOf: now.toISOString(),
  seconds: Math.round(secs()),
  loadSeconds: Math.round(loadSeconds),
  indexSeconds: Math.round(indexSeconds),
  machine: { cpu: os.cpus()[0]?.model ?? 'unknown', cores: os.cpus().length, node: process.version },
};
mkdirSync(path.dirname(BENCH_SEED_INFO), { recursive: true });
writeFileSync(BENCH_SEED_INFO, JSON.stringify(info, null, 2));
log(
  `Done: ${info.units.toLocaleString('en')} units, ${info.events.toLocaleString('en')} events in ${(info.seconds / 60).toFixed(1)} min ` +
    `(${Math.round(info.events / loadSeconds).toLocaleString('en')} events/s during the load).`,
);
process.exit(0);
