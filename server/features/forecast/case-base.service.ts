// Building the fleet's forecast case base (DOMAIN.md §7b): every unit's cut-offs read from the database, the case base
// learned from them, stored, and handed to the app's case-base cache (server/lib/record/case-base.ts).
import { gzipSync } from 'node:zlib';
import { and, asc, desc, gt, inArray, lt, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
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
  type ForecastCaseBase,
} from '../../../shared/domain';
import type { Settings } from '../../../shared/schemas/settings';
import { engineUnit, ENGINE_EVENT_COLUMNS, toEngineEvent } from '../../lib/record/stats';
import type { CaseBaseCache } from '../../lib/record/case-base';

/** Rows kept: the newest and one before it (a process may still be loading it). */
const KEEP_ROWS = 2;
/** Days between the cut-offs of one unit's record (each unit starts at its own phase). */
export const CASE_STEP_DAYS = 30;
const CHUNK_UNITS = 500;
const DAY_MS = 86_400_000;

/** Stores a newly learned case base, makes it this process's at once, and prunes older rows. */
export async function storeCaseBase(
  db: Db,
  cache: CaseBaseCache,
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
  cache.set(id, decodeCaseBase(bytes));
  const old = await db
    .select({ id: forecastCaseBases.id })
    .from(forecastCaseBases)
    .orderBy(desc(forecastCaseBases.id))
    .limit(1)
    .offset(KEEP_ROWS - 1);
  if (old.length) await db.delete(forecastCaseBases).where(lt(forecastCaseBases.id, old[0].id));
  return id;
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
