// Writes a simulated fleet as bulk multi-row INSERTs, parents before children, in statements of a few MB.
import { sites, units, unitStats, users, visits, events } from '../../server/db/schema';
import type { Settings } from '../../shared/schemas/settings';
import { simulateFleetUnit, unitCount, type Fleet } from './fleet';
import { rowsForUnit, siteRows, userRows, type IdCursor, type UnitRows } from './rows';
import { InsertBuffer } from './sql';
import type { UnitSim } from './unit-sim';

/** Runs one SQL statement; may queue it (the writer waits on the returned promise only when told to). */
export type Exec = (sql: string) => Promise<void>;

/** A promise awaited later: mark it handled now so that an early failure is not an unhandled rejection. */
function quiet<T>(p: Promise<T>): Promise<T> {
  p.catch(() => undefined);
  return p;
}

export const STATEMENT_BYTES = 4 * 1024 * 1024;

export type WriteCounts = { units: number; visits: number; events: number; stats: number };

export class FleetWriter {
  private readonly buffers: InsertBuffer[];
  private pending: Promise<void>[] = [];
  readonly counts: WriteCounts = { units: 0, visits: 0, events: 0, stats: 0 };

  constructor(
    private readonly exec: Exec,
    private readonly maxBytes = STATEMENT_BYTES,
  ) {
    const push = (sql: string) => {
      this.pending.push(quiet(this.exec(sql)));
    };
    // Dependency order: a buffer flushes the ones before it first, so foreign keys hold statement by statement.
    this.buffers = [units, visits, events, unitStats].map((t) => new InsertBuffer(t, push));
  }

  add(rows: UnitRows): void {
    this.put(0, rows.unit);
    for (const v of rows.visits) this.put(1, v);
    for (const e of rows.events) this.put(2, e);
    this.put(3, rows.stats as unknown as Record<string, unknown>);
    this.counts.units++;
    this.counts.visits += rows.visits.length;
    this.counts.events += rows.events.length;
    this.counts.stats++;
  }

  private put(k: number, row: Record<string, unknown>) {
    if (this.buffers[k].size >= this.maxBytes) for (let i = 0; i <= k; i++) this.buffers[i].end();
    this.buffers[k].add(row);
  }

  /** Emits everything buffered and waits for every statement handed out so far. */
  async flush(): Promise<void> {
    for (const b of this.buffers) b.end();
    await this.settle();
  }

  /** Waits for the statements handed out so far. */
  async settle(): Promise<void> {
    const list = this.pending;
    this.pending = [];
    await Promise.all(list);
  }

  get inFlight(): number {
    return this.pending.length;
  }
}

export async function writeSitesAndPeople(exec: Exec, fleet: Fleet, firstSiteId: number, demoPasswordHash: string | null) {
  const siteBuf = new InsertBuffer(sites, (sql) => void pendingList.push(quiet(exec(sql))));
  const userBuf = new InsertBuffer(users, (sql) => void pendingList.push(quiet(exec(sql))));
  const pendingList: Promise<void>[] = [];
  const rows = siteRows(fleet, firstSiteId);
  for (const r of rows) siteBuf.add(r);
  siteBuf.end();
  for (const u of userRows(fleet, demoPasswordHash)) userBuf.add(u);
  userBuf.end();
  await Promise.all(pendingList);
  return rows.map((r) => r.id!);
}

/**
 * Simulates units [from, to) and hands each one's rows to `onUnit`; the simulation and the statistics are pure, so
 * this is also what the determinism test runs.
 */
export function* fleetRows(fleet: Fleet, siteIds: readonly number[], ids: IdCursor, settings: Settings, from = 0, to = unitCount(fleet)) {
  for (let i = from; i < to; i++) {
    const sim: UnitSim = simulateFleetUnit(fleet, i);
    yield { sim, rows: rowsForUnit(fleet, sim, siteIds, ids, settings) };
  }
}
