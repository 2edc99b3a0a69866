// The fleet's forecast case base (DOMAIN.md §7b) as an app holds it for every unit's forecast: loaded from the newest
// forecast_case_bases row on first use, and before each use the newest row's id is read (the primary key's last
// entry), so a case base built by any API process is used by all of them from their next write on. The forecast
// feature builds and stores it.
import { gunzipSync } from 'node:zlib';
import { desc, eq, sql } from 'drizzle-orm';
import type { Db, DbOrTx } from '../../db/client';
import { forecastCaseBases } from '../../db/schema';
import { decodeCaseBase, type ForecastAccuracy, type ForecastCaseBase } from '../../../shared/domain';

export type CaseBaseCache = {
  /** The case base every forecast uses (null until the first is built); a newer one is loaded when it appears. */
  get(db: Db): Promise<ForecastCaseBase | null>;
  /** The one this process just stored (what another process would read back). */
  set(id: number, caseBase: ForecastCaseBase): void;
  /** Forgets what is held, so the next use reads the table again (tests, after the table is cleared). */
  invalidate(): void;
};

export function createCaseBaseCache(): CaseBaseCache {
  let held: { id: number; caseBase: ForecastCaseBase } | null = null;
  // One load at a time; writes that arrive meanwhile wait for it rather than decode the same rows again.
  let loading: Promise<void> | null = null;

  async function load(db: Db, id: number): Promise<void> {
    const [row] = await db
      .select({ id: forecastCaseBases.id, data: forecastCaseBases.data })
      .from(forecastCaseBases)
      .where(eq(forecastCaseBases.id, id));
    // Pruned meanwhile: the next use finds the newer one.
    if (row && (!held || held.id < row.id)) {
      held = { id: row.id, caseBase: decodeCaseBase(new Uint8Array(gunzipSync(row.data))) };
    }
  }

  return {
    async get(db) {
      const [top] = await db
        .select({ id: forecastCaseBases.id })
        .from(forecastCaseBases)
        .orderBy(desc(forecastCaseBases.id))
        .limit(1);
      if (!top) {
        held = null;
        return null;
      }
      if (held?.id !== top.id) {
        // A failed load leaves the one held (or the rhythm) in use: it must not fail a write; the next use tries again.
        loading ??= load(db, top.id)
          .catch(() => undefined)
          .finally(() => (loading = null));
        await loading;
      }
      return held?.caseBase ?? null;
    },
    set(id, caseBase) {
      held = { id, caseBase };
    },
    invalidate() {
      held = null;
    },
  };
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
