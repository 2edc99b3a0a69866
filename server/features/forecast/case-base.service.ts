// The fleet's forecast case base (DOMAIN.md §7b) as this process holds it: loaded from the newest forecast_case_bases
// row on first use, looked for again at most once a minute (another process may have built a newer one), and
// swapped at once when this process builds one. Also the build itself: every unit's cut-offs read from the database.
import { gunzipSync, gzipSync } from 'node:zlib';
import { and, asc, desc, eq, gt, inArray, lt, sql } from 'drizzle-orm';
import type { Db, DbOrTx } from '../../db/client';
import { events, forecastCaseBases, units } from '../../db/schema';
import {
  appendCases,
  createCaseTable,
  decodeCaseBase,
  encodeCaseBase,
  forecastCases,
  learnCaseBaseInSteps,
  unitForecastTimeline,
  type CaseTable,
  type ForecastAccuracy,
  type ForecastCaseBase,
} from '../../../shared/domain';
import type { Settings } from '../../../shared/schemas/settings';
import { engineUnit, ENGINE_EVENT_COLUMNS, toEngineEvent } from '../history/stats.service';

const RECHECK_MS = 60_000;
/** Rows kept: the newest and one before it (a process may still be loading it). */
const KEEP_ROWS = 2;
/** Days between the cut-offs of one unit's record (each unit starts at its own phase). */
export const CASE_STEP_DAYS = 30;
const CHUNK_UNITS = 500;
const DAY_MS = 86_400_000;

let held: { id: number; caseBase: ForecastCaseBase } | null = null;
let checkedAt = 0;
let checking: Promise<void> | null = null;

async function loadNewest(db: Db): Promise<void> {
  const [top] = await db
    .select({ id: forecastCaseBases.id })
    .from(forecastCaseBases)
    .orderBy(desc(forecastCaseBases.id))
    .limit(1);
  if (!top) {
    held = null;
    return;
  }
  if (held?.id === top.id) return;
  const [row] = await db
    .select({ id: forecastCaseBases.id, data: forecastCaseBases.data })
    .from(forecastCaseBases)
    .where(eq(forecastCaseBases.id, top.id));
  if (!row) return;
  held = { id: row.id, caseBase: decodeCaseBase(new Uint8Array(gunzipSync(row.data))) };
}

/**
 * The case base every forecast of this process uses (null until the first is built). The first call waits for the
 * load; later checks for a newer one run in the background, so a write never waits on them.
 */
export async function currentCaseBase(db: Db): Promise<ForecastCaseBase | null> {
  const now = Date.now();
  if (now - checkedAt >= RECHECK_MS) {
    const first = checkedAt === 0;
    checkedAt = now;
    checking ??= loadNewest(db)
      .catch(() => {
        // The forecast falls back to the rhythm until the next check; a failed read must not fail a write.
        checkedAt = 0;
      })
      .finally(() => {
        checking = null;
      });
    if (first) await checking;
  }
  return held?.caseBase ?? null;
}

/** Forgets what this process holds, so the next use reads the table again (tests, after the table is cleared). */
export function forgetCaseBase(): void {
  held = null;
  checkedAt = 0;
}

/** Stores a newly learned case base, makes it this process's at once, and prunes older rows. */
export async function storeCaseBase(
  db: Db,
  caseBase: ForecastCaseBase,
  meta: { cases: number; units: number; buildMs: number },
): Promise<number> {
  const bytes = encodeCaseBase(caseBase);
  const [{ id }] = await db
    .insert(forecastCaseBases)
    .values({
      builtAt: new Date(caseBase.builtAt),
      cases: meta.cases,
      units: meta.units,
      buildMs: meta.buildMs,
      accuracy: caseBase.accuracy as unknown as Record<string, unknown>,
      data: gzipSync(bytes),
    })
    .$returningId();
  // What this process serves is what another process would read back (the stored form rounds the features).
  held = { id, caseBase: decodeCaseBase(bytes) };
  checkedAt = Date.now();
  const old = await db
    .select({ id: forecastCaseBases.id })
    .from(forecastCaseBases)
    .orderBy(desc(forecastCaseBases.id))
    .limit(1)
    .offset(KEEP_ROWS - 1);
  if (old.length) await db.delete(forecastCaseBases).where(lt(forecastCaseBases.id, old[0].id));
  return id;
}

export type ForecastAccuracyInfo = {
  builtAt: string;
  cases: number;
  units: number;
  buildMs: number;
  accuracy: ForecastAccuracy | null;
};

/** The newest case base's measured accuracy (without its data), for the overview. */
export async function latestForecastAccuracy(db: Db): Promise<ForecastAccuracyInfo | null> {
  const [row] = await db
    .select({
      builtAt: forecastCaseBases.builtAt,
      cases: forecastCaseBases.cases,
      units: forecastCaseBases.units,
      buildMs: forecastCaseBases.buildMs,
      accuracy: forecastCaseBases.accuracy,
    })
    .from(forecastCaseBases)
    .orderBy(desc(forecastCaseBases.id))
    .limit(1);
  if (!row) return null;
  return {
    builtAt: row.builtAt.toISOString(),
    cases: row.cases,
    units: row.units,
    buildMs: row.buildMs,
    accuracy: (row.accuracy as unknown as ForecastAccuracy) ?? null,
  };
}

/** When the newest case base was built (null: never). */
export async function latestCaseBaseAt(db: DbOrTx): Promise<Date | null> {
  const [row] = await db.select({ at: sql<Date | null>`MAX(${forecastCaseBases.builtAt})` }).from(forecastCaseBases);
  return row?.at ? new Date(row.at) : null;
}

const counted = sql`NOT EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = ${events.id})`;
const ENGINE_KINDS = ['top_up', 'recovery', 'recharge', 'leak_check', 'repair', 'pti', 'pressure'] as const;

/**
 * Every unit's cut-offs as of `asOf`, read chunk by chunk in unit-id order (`progress` after each chunk; false
 * stops). A unit whose record the engine refuses is left out.
 */
export async function collectFleetCases(
  db: Db,
  asOf: Date,
  settings: Settings,
  progress: (done: number, table: CaseTable) => Promise<boolean>,
): Promise<{ table: CaseTable; units: number; skipped: number } | null> {
  const table = createCaseTable(1 << 16);
  const asOfIso = asOf.toISOString();
  const todayDay = Math.floor(asOf.getTime() / DAY_MS);
  let cursor = 0;
  let done = 0;
  let skipped = 0;
  for (;;) {
    const chunk = await db
      .select({
        id: units.id,
        refrigerant: units.refrigerant,
        nominalChargeKg: units.nominalChargeKg,
        commissionedOn: units.commissionedOn,
        createdAt: units.createdAt,
      })
      .from(units)
      .where(gt(units.id, cursor))
      .orderBy(asc(units.id))
      .limit(CHUNK_UNITS);
    if (!chunk.length) break;
    cursor = chunk[chunk.length - 1].id;
    const rows = await db
      .select({ unitId: events.unitId, ...ENGINE_EVENT_COLUMNS })
      .from(events)
      .where(
        and(
          inArray(
            events.unitId,
            chunk.map((u) => u.id),
          ),
          inArray(events.kind, [...ENGINE_KINDS]),
          counted,
        ),
      )
      .orderBy(asc(events.unitId), asc(events.occurredAt), asc(events.id));
    let r = 0;
    for (const u of chunk) {
      const history = [];
      while (r < rows.length && rows[r].unitId < u.id) r++;
      for (; r < rows.length && rows[r].unitId === u.id; r++) {
        const e = toEngineEvent(rows[r]);
        if (e) history.push(e);
      }
      if (!history.some((e) => (e.kind === 'top_up' || e.kind === 'recharge') && e.kg > 0)) continue;
      try {
        const timeline = unitForecastTimeline(engineUnit(u), history, asOfIso, settings);
        const first = timeline.visits[0]?.day;
        if (first === undefined) continue;
        const phase = (u.id * 7919) % CASE_STEP_DAYS;
        appendCases(
          table,
          forecastCases(timeline, { fromDay: first + phase, toDay: todayDay, stepDays: CASE_STEP_DAYS, unitKey: u.id }),
        );
      } catch {
        skipped++;
      }
    }
    done += chunk.length;
    if (!(await progress(done, table))) return null;
  }
  return { table, units: done, skipped };
}

const BEAT_MS = 5_000;

/**
 * Learns the case base from collected cut-offs and measures it (DOMAIN.md §7b), letting requests through between
 * steps of the work; `beat` every few seconds (false stops, and the result is null).
 */
export async function learnFromTable(
  table: CaseTable,
  builtAt: Date,
  settings: Settings,
  beat: () => Promise<boolean>,
): Promise<{ caseBase: ForecastCaseBase; cases: number } | null> {
  const steps = learnCaseBaseInSteps(table, { builtAt: builtAt.toISOString(), k: settings.forecast.neighbours });
  let last = Date.now();
  for (;;) {
    const r = steps.next();
    if (r.done) {
      let cases = 0;
      for (let i = 0; i < table.n; i++) if (!Number.isNaN(table.days[i])) cases++;
      return { caseBase: r.value, cases };
    }
    await new Promise<void>((resolve) => setImmediate(resolve));
    if (Date.now() - last > BEAT_MS) {
      last = Date.now();
      if (!(await beat())) return null;
    }
  }
}
