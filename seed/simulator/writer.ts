// Writes a simulated fleet as bulk multi-row INSERTs, parents before children, in statements of a few MB.
import { sites, units, unitStats, unitStatsDetail, users, visitMadeUp, visits, events } from '../../server/db/schema';
import type { Settings } from '../../shared/schemas/settings';
import { simulateFleetUnit, unitCount, type Fleet } from './fleet';
import { rowsForUnit, siteRows, userRows, type IdCursor, type UnitRows } from './rows';
import { InsertBuffer, quote } from './sql';
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

const EVENT_COMMON = [
  'id',
  'unitId',
  'visitId',
  'siteId',
  'recordedBy',
  'kind',
  'occurredAt',
  'enteredAt',
  'details',
  'note',
  'createdAt',
];
/** Event rows go in by kind, each with only its own columns: the rest are NULL anyway, and the statements shrink. */
const EVENT_GROUPS: Record<string, string[]> = {
  pressure: [
    ...EVENT_COMMON,
    'suctionKPaG',
    'dischargeKPaG',
    'ambientC',
    'setPointC',
    'supplyAirC',
    'returnAirC',
    'sightGlass',
  ],
  movement: [...EVENT_COMMON, 'kg', 'cylinder', 'reusedRecovered', 'excludedFromLeakRate'],
  check: [...EVENT_COMMON, 'method', 'leakFound', 'location', 'action', 'verified', 'passed'],
  plain: EVENT_COMMON,
  void: [...EVENT_COMMON, 'voidsEventId'],
};
const GROUP_OF: Record<string, string> = {
  pressure: 'pressure',
  top_up: 'movement',
  recovery: 'movement',
  recharge: 'movement',
  leak_check: 'check',
  repair: 'check',
  pti: 'check',
  void: 'void',
};

export class FleetWriter {
  /** Buffers with their dependency level: a buffer flushes every buffer of a lower level first. */
  private readonly buffers: { level: number; buf: InsertBuffer }[];
  private readonly eventBuffers = new Map<string, number>();
  /** fleet_monthly, summed in memory over the whole load (a few thousand cells). */
  private readonly monthly = new Map<
    string,
    { month: string; siteId: number; refrigerant: string; kg: number; visits: number }
  >();
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
    this.buffers = [
      { level: 0, buf: new InsertBuffer(units, push) },
      { level: 1, buf: new InsertBuffer(visits, push) },
      { level: 3, buf: new InsertBuffer(unitStats, push) },
      { level: 3, buf: new InsertBuffer(visitMadeUp, push) },
      { level: 3, buf: new InsertBuffer(unitStatsDetail, push) },
    ];
    for (const [group, keys] of Object.entries(EVENT_GROUPS)) {
      this.eventBuffers.set(group, this.buffers.length);
      this.buffers.push({ level: 2, buf: new InsertBuffer(events, push, keys) });
    }
  }

  add(rows: UnitRows): void {
    this.put(0, rows.unit);
    for (const v of rows.visits) this.put(1, v);
    for (const e of rows.events) this.put(this.eventBuffers.get(GROUP_OF[e.kind] ?? 'plain')!, e);
    this.put(2, rows.stats as unknown as Record<string, unknown>);
    this.put(4, rows.statsDetail as unknown as Record<string, unknown>);
    for (const m of rows.madeUp) {
      this.put(3, m);
      const key = `${m.month}|${m.siteId}|${m.refrigerant}`;
      const cell = this.monthly.get(key);
      if (cell) {
        cell.kg += m.madeUpKg;
        cell.visits++;
      } else
        this.monthly.set(key, {
          month: m.month,
          siteId: m.siteId,
          refrigerant: m.refrigerant,
          kg: m.madeUpKg,
          visits: 1,
        });
    }
    this.counts.units++;
    this.counts.visits += rows.visits.length;
    this.counts.events += rows.events.length;
    this.counts.stats++;
  }

  private put(k: number, row: Record<string, unknown>) {
    const { level, buf } = this.buffers[k];
    if (buf.size >= this.maxBytes) {
      for (const b of this.buffers) if (b.level < level) b.buf.end();
      buf.end();
    }
    buf.add(row);
  }

  /** Emits everything buffered and waits for every statement handed out so far. */
  async flush(): Promise<void> {
    for (const level of [0, 1, 2, 3]) for (const b of this.buffers) if (b.level === level) b.buf.end();
    await this.settle();
    // Added onto what is there, the same way applyToFleetMonthly keeps the table.
    const cells = [...this.monthly.values()];
    this.monthly.clear();
    for (let i = 0; i < cells.length; i += 2000) {
      const values = cells
        .slice(i, i + 2000)
        .map((c) => `(${quote(c.month)},${c.siteId},${quote(c.refrigerant)},${c.kg},${c.visits})`)
        .join(',');
      await this.exec(
        `INSERT INTO fleet_monthly (month, site_id, refrigerant, made_up_kg, visits) VALUES ${values} ` +
          'ON DUPLICATE KEY UPDATE made_up_kg = made_up_kg + VALUES(made_up_kg), visits = visits + VALUES(visits)',
      );
    }
  }

  /** Waits for the statements handed out so far. */
  async settle(): Promise<void> {
    const list = this.pending;
    this.pending = [];
    await Promise.all(list);
  }

  /** Waits for the oldest statements until at most `max` are outstanding (keeps memory bounded, the pipe full). */
  async drain(max: number): Promise<void> {
    while (this.pending.length > max) await this.pending.shift();
  }

  get inFlight(): number {
    return this.pending.length;
  }
}

export async function writeSitesAndPeople(
  exec: Exec,
  fleet: Fleet,
  firstSiteId: number,
  demoPasswordHash: string | null,
) {
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
export function* fleetRows(
  fleet: Fleet,
  siteIds: readonly number[],
  ids: IdCursor,
  settings: Settings,
  from = 0,
  to = unitCount(fleet),
) {
  for (let i = from; i < to; i++) {
    const sim: UnitSim = simulateFleetUnit(fleet, i);
    yield { sim, rows: rowsForUnit(fleet, sim, siteIds, ids, settings) };
  }
}
