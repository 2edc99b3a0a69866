// What the depot must do about a unit or must not do with it, read from its history: the re-checks after top-ups and
// repairs (shared/domain/rechecks.ts) and quarantine (shared/domain/quarantine.ts). Part of the unit write path's
// effects, so the unit_depot_state row always matches the events it came from; reads of one unit recompute the
// whole list (re-check answers, quarantine details) from the same history.
import { and, asc, count, eq, getTableColumns, inArray, isNull, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { events, unitDepotState, units } from '../../db/schema';
import { rechecksFromHistory, type DepotEvent, type RecheckSummary } from '../../../shared/domain/rechecks';
import { quarantineFromHistory, type QuarantineNote, type QuarantineState } from '../../../shared/domain/quarantine';
import type { SightGlassState } from '../../../shared/domain';
import { ptiBlockers } from '../../../shared/domain/pti';
import { HttpError } from '../http-error';
import type { Settings } from '../../../shared/schemas/settings';

const DEPOT_KINDS = ['top_up', 'recharge', 'repair', 'leak_check', 'pressure', 'note'] as const;
const notVoided = sql`NOT EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = \`events\`.\`id\`)`;

type DepotUnit = { id: number; refrigerant: string; commissionedOn: string | null; createdAt: Date };
export type DepotHistory = { events: DepotEvent[]; notes: QuarantineNote[] };
export type DepotState = { rechecks: RecheckSummary; quarantine: QuarantineState | null };

const COLUMNS = {
  id: events.id,
  unitId: events.unitId,
  kind: events.kind,
  occurredAt: events.occurredAt,
  visitId: events.visitId,
  leakFound: events.leakFound,
  excluded: events.excludedFromLeakRate,
  verified: events.verified,
  dischargeKPaG: events.dischargeKPaG,
  suctionKPaG: events.suctionKPaG,
  ambientC: events.ambientC,
  sightGlass: events.sightGlass,
  details: events.details,
};
type Row = { [K in keyof typeof COLUMNS]: (typeof COLUMNS)[K]['_']['data'] | null } & { unitId: number };

function historyOf(rows: readonly Row[]): DepotHistory {
  const out: DepotHistory = { events: [], notes: [] };
  for (const r of rows) {
    const at = (r.occurredAt as Date).toISOString();
    if (r.kind === 'note') {
      const d = r.details as Record<string, unknown> | null;
      if (d && (d.quarantine || d.quarantineLifted)) out.notes.push({ id: r.id as number, at, details: d });
      continue;
    }
    out.events.push({
      id: r.id as number,
      kind: r.kind as string,
      at,
      visitId: r.visitId == null ? null : String(r.visitId),
      leakFound: r.leakFound as boolean | null,
      excluded: r.excluded as boolean | null,
      verified: r.verified as boolean | null,
      dischargeKPaG: r.dischargeKPaG as number | null,
      suctionKPaG: r.suctionKPaG as number | null,
      ambientC: r.ambientC as number | null,
      sightGlass: r.sightGlass as SightGlassState | null,
    });
  }
  return out;
}

async function loadRows(db: DbOrTx, unitIds: readonly number[]): Promise<Row[]> {
  return (await db
    .select(COLUMNS)
    .from(events)
    .where(and(inArray(events.unitId, [...unitIds]), inArray(events.kind, [...DEPOT_KINDS]), notVoided))
    .orderBy(asc(events.unitId), asc(events.occurredAt), asc(events.id))) as Row[];
}

export async function loadDepotHistory(db: DbOrTx, unitId: number): Promise<DepotHistory> {
  return historyOf(await loadRows(db, [unitId]));
}

const commissioned = (u: DepotUnit) => u.commissionedOn ?? u.createdAt.toISOString().slice(0, 10);

export function depotStateOf(unit: DepotUnit, history: DepotHistory, now: Date, settings: Settings): DepotState {
  return {
    rechecks: rechecksFromHistory(
      { refrigerant: unit.refrigerant, commissionedOn: commissioned(unit) },
      history.events,
      now.toISOString(),
      settings,
    ),
    quarantine: quarantineFromHistory(history.notes),
  };
}

function rowOf(unitId: number, s: DepotState, now: Date): typeof unitDepotState.$inferInsert {
  const open = s.rechecks.open;
  return {
    unitId,
    computedAt: now,
    recheckDue: open?.dueOn ?? null,
    recheckReason: open?.reason ?? null,
    recheckSourceEventId: open?.sourceEventId ?? null,
    missedRechecks365: s.rechecks.missed365,
    quarantinedSince: s.quarantine ? new Date(s.quarantine.since) : null,
    quarantineReason: s.quarantine?.reason.slice(0, 300) ?? null,
    quarantineEventId: s.quarantine?.eventId ?? null,
  };
}

const UPSERT_SET = Object.fromEntries(
  Object.entries(getTableColumns(unitDepotState))
    .filter(([key]) => key !== 'unitId')
    .map(([key, column]) => [key, sql`values(${column})`]),
);

/** Step of writeEffects for a unit the caller has locked: its depot state from its history, upserted by unit. */
export async function applyDepotState(tx: DbOrTx, unit: DepotUnit, now: Date, settings: Settings): Promise<DepotState> {
  const state = depotStateOf(unit, await loadDepotHistory(tx, unit.id), now, settings);
  await tx
    .insert(unitDepotState)
    .values(rowOf(unit.id, state, now))
    .onDuplicateKeyUpdate({ set: UPSERT_SET });
  return state;
}

/** Rows per statement when rebuilding every unit's depot state (the seed, a settings change). */
const REBUILD_CHUNK = 500;

/**
 * Every unit's depot state from its history, in chunks (the demo seed loads history in bulk, outside the write path;
 * a changed re-check interval). Each chunk is one short transaction; a unit written meanwhile is written again by its
 * own writer with the same rule, so the last word is always a full recompute.
 */
export async function rebuildDepotStates(
  db: DbOrTx,
  now: Date,
  settings: Settings,
  opts: { onlyMissing?: boolean } = {},
): Promise<number> {
  let after = 0;
  let done = 0;
  for (;;) {
    const chunk = await db
      .select({
        id: units.id,
        refrigerant: units.refrigerant,
        commissionedOn: units.commissionedOn,
        createdAt: units.createdAt,
      })
      .from(units)
      .leftJoin(unitDepotState, eq(unitDepotState.unitId, units.id))
      .where(and(sql`${units.id} > ${after}`, opts.onlyMissing ? isNull(unitDepotState.unitId) : undefined))
      .orderBy(asc(units.id))
      .limit(REBUILD_CHUNK);
    if (!chunk.length) return done;
    const rows = await loadRows(
      db,
      chunk.map((u) => u.id),
    );
    const byUnit = new Map<number, Row[]>();
    for (const r of rows) (byUnit.get(r.unitId) ?? byUnit.set(r.unitId, []).get(r.unitId)!).push(r);
    const values = chunk.map((u) =>
      rowOf(u.id, depotStateOf(u, historyOf(byUnit.get(u.id) ?? []), now, settings), now),
    );
    await db.insert(unitDepotState).values(values).onDuplicateKeyUpdate({ set: UPSERT_SET });
    done += chunk.length;
    after = chunk[chunk.length - 1].id;
  }
}

/**
 * A database from before unit_depot_state (or units loaded past the API) has units without a row until their next
 * write; this fills in only those. Two index counts tell at once when none is missing, so it is cheap to repeat.
 */
export async function fillMissingDepotStates(db: DbOrTx, now: Date, settings: Settings): Promise<number> {
  const [[a], [b]] = await Promise.all([
    db.select({ n: count() }).from(units),
    db.select({ n: count() }).from(unitDepotState),
  ]);
  if (Number(a.n) === Number(b.n)) return 0;
  return rebuildDepotStates(db, now, settings, { onlyMissing: true });
}

/** One unit's depot state as stored (null before its first write since the table came). */
export async function storedDepotState(db: DbOrTx, unitId: number) {
  const [row = null] = await db.select().from(unitDepotState).where(eq(unitDepotState.unitId, unitId));
  return row;
}

/**
 * For a visit that records a PTI as passed (the visit form's bare passed/failed): refused with 409 when the unit has
 * an open leak, a possible low charge at its latest reading, or is in quarantine. Call it inside writeUnit's change,
 * after the lock, before inserting the visit. The structured PTI (POST /api/units/:id/pti) has the override.
 */
export async function assertPtiMayPass(
  tx: DbOrTx,
  locked: {
    unit: DepotUnit;
    stats: { openLeakFoundAt: Date | null; pressureFlag: 'ok' | 'possible_low_charge' | 'unknown' } | null;
  },
  entries: readonly { kind: string; passed?: boolean }[],
): Promise<void> {
  if (!entries.some((e) => e.kind === 'pti' && e.passed)) return;
  const { unit, stats } = locked;
  const quarantine = quarantineFromHistory((await loadDepotHistory(tx, unit.id)).notes);
  // What the same visit does about it counts: a repair answers the open leak, refrigerant added or a new reading the
  // low-charge flag of the reading before.
  const has = (...kinds: string[]) => entries.some((e) => kinds.includes(e.kind));
  const blockers = ptiBlockers({
    openLeakFoundAt: stats?.openLeakFoundAt && !has('repair') ? stats.openLeakFoundAt.toISOString() : null,
    pressureFlag: has('top_up', 'recharge', 'pressure') ? 'unknown' : (stats?.pressureFlag ?? 'unknown'),
    quarantined: quarantine != null,
  });
  if (blockers.length)
    throw new HttpError(
      409,
      'pti_blocked',
      `This PTI cannot be recorded as passed: ${blockers.map((b) => b.words).join(' ')} Record it as failed, or an engineer can override on the PTI checklist.`,
      { events: blockers.map((b) => b.words).join(' ') },
    );
}
