// The fleet's forecast case base (DOMAIN.md §7b) as an app holds it for every unit's forecast: loaded from the newest
// forecast_case_bases row on first use, looked for again at most once a minute (another process may have built a
// newer one), and swapped at once when this process builds one. The forecast feature builds and stores it.
import { gunzipSync } from 'node:zlib';
import { desc, eq, sql } from 'drizzle-orm';
import type { Db, DbOrTx } from '../../db/client';
import { forecastCaseBases } from '../../db/schema';
import { decodeCaseBase, type ForecastAccuracy, type ForecastCaseBase } from '../../../shared/domain';

const RECHECK_MS = 60_000;

export type CaseBaseCache = {
  /**
   * The case base every forecast uses (null until the first is built). The first call waits for the load; later
   * checks for a newer one run in the background, so a write never waits on them.
   */
  get(db: Db): Promise<ForecastCaseBase | null>;
  /** The one this process just stored (what another process would read back). */
  set(id: number, caseBase: ForecastCaseBase): void;
  /** Forgets what is held, so the next use reads the table again (tests, after the table is cleared). */
  invalidate(): void;
};

export function createCaseBaseCache(recheckMs = RECHECK_MS): CaseBaseCache {
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

  return {
    async get(db) {
      const now = Date.now();
      if (now - checkedAt >= recheckMs) {
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
    },
    set(id, caseBase) {
      held = { id, caseBase };
      checkedAt = Date.now();
    },
    invalidate() {
      held = null;
      checkedAt = 0;
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
