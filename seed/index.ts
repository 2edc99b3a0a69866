import { sql } from 'drizzle-orm';
import type { Db } from '../server/db/client';
import { users } from '../server/db/schema';
import { hashPassword } from '../server/lib/password';
import { newId } from '../server/lib/ids';
import { getSettings } from '../server/lib/settings';
import { rebuildRepairEffectiveness } from '../server/jobs';
import { createLogger } from '../server/lib/logger';
import { publicUrl, readEnv } from '../server/env';
import { seedCylinders } from './cylinders';
import { DEMO_ACCOUNTS, DEMO_COMPANY, DEMO_PASSWORD } from './demo-accounts';
import { seedDepotDay } from './depot-day';
import { createFleet, STORY_UNITS, type Fleet } from './simulator/fleet';
import { containerNumberFor } from './simulator/unit-sim';
import { FleetWriter, fleetRows, writeSitesAndPeople, type Exec } from './simulator/writer';

export const DEMO_UNITS = 500;

export async function isEmpty(db: Db): Promise<boolean> {
  const [row] = await db.select({ n: sql<number>`count(*)` }).from(users);
  return Number(row.n) === 0;
}

export async function seedDemoAccounts(db: Db): Promise<void> {
  const hash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (tx) => {
    for (const a of DEMO_ACCOUNTS) {
      await tx.insert(users).values({ id: newId(), ...a, passwordHash: hash });
    }
  });
}

export type SeedDemoOptions = {
  /** Ordinary units (default 500); the story units are the first four of them. */
  units?: number;
  seed?: number;
  /** The moment the fleet is seen from (default: now). Histories end the day before. */
  now?: Date;
  historyYears?: number;
  /** Where the one-line summary goes (default console.log). */
  log?: (line: string) => void;
};

export type SeedSummary = {
  units: number;
  visits: number;
  events: number;
  seconds: number;
  stories: { containerNumber: string; title: string }[];
};

/** The demo's story units, with their container numbers for this seed. */
export function storyUnits(fleet: Pick<Fleet, 'ctx' | 'units'>) {
  return STORY_UNITS.filter((s) => s.index < fleet.units).map((s) => ({
    containerNumber: containerNumberFor(fleet.ctx.seed, s.index),
    title: s.title,
  }));
}

/**
 * Loads the whole demo: the four demo sign-ins, the invented fleet of Halyard Reefer Leasing (sites, staff, units
 * with years of simulated history), every unit's statistics row and the monthly made-up totals, in one
 * transaction; then the repair-effectiveness table.
 */
export async function seedDemo(db: Db, opts: SeedDemoOptions = {}): Promise<SeedSummary> {
  const t0 = performance.now();
  const now = opts.now ?? new Date();
  const fleet = createFleet({ seed: opts.seed, units: opts.units ?? DEMO_UNITS, now, historyYears: opts.historyYears });
  const settings = await getSettings(db);
  const hash = await hashPassword(DEMO_PASSWORD);
  const conn = await db.$client.getConnection();
  let writer: FleetWriter;
  try {
    await conn.query('START TRANSACTION');
    const [rows] = (await conn.query(
      'SELECT (SELECT COALESCE(MAX(id), 0) FROM sites) AS s, (SELECT COALESCE(MAX(id), 0) FROM units) AS u, ' +
        '(SELECT COALESCE(MAX(id), 0) FROM visits) AS v, (SELECT COALESCE(MAX(id), 0) FROM events) AS e',
    )) as unknown as [{ s: number; u: number; v: number; e: number }[]];
    const max = rows[0];
    // One connection runs its statements in order, so parents always land before children.
    const exec: Exec = async (q) => {
      await conn.query(q);
    };
    const siteIds = await writeSitesAndPeople(exec, fleet, Number(max.s) + 1, hash);
    const ids = { unit: Number(max.u) + 1, visit: Number(max.v) + 1, event: Number(max.e) + 1 };
    writer = new FleetWriter(exec);
    for (const { rows: unitRows } of fleetRows(fleet, siteIds, ids, settings)) {
      writer.add(unitRows);
      if (writer.inFlight > 4) await writer.settle();
    }
    await writer.flush();
    await conn.query('COMMIT');
  } catch (err) {
    await conn.query('ROLLBACK').catch(() => undefined);
    throw err;
  } finally {
    conn.release();
  }
  // The repair-effectiveness table is a cache the server rebuilds in the background; build it now with the same job.
  await rebuildRepairEffectiveness({
    db,
    clock: { now: () => now },
    logger: createLogger('silent'),
    publicUrl: publicUrl(readEnv()),
  });
  await seedCylinders(db, { now });
  await seedDepotDay(db, { seed: fleet.ctx.seed, now, settings, publicUrl: publicUrl(readEnv()) });
  const summary: SeedSummary = {
    units: writer.counts.units,
    visits: writer.counts.visits,
    events: writer.counts.events,
    seconds: (performance.now() - t0) / 1000,
    stories: storyUnits(fleet),
  };
  (opts.log ?? console.log)(
    `Demo fleet of ${DEMO_COMPANY} (invented): ${summary.units} units, ${summary.visits.toLocaleString('en')} visits, ` +
      `${summary.events.toLocaleString('en')} events in ${summary.seconds.toFixed(1)} s. Stories: ` +
      summary.stories.map((s) => `${s.containerNumber} ${s.title.split(':')[0]}`).join('; '),
  );
  return summary;
}
