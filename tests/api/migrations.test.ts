// Migrations that move data: a database at the version before, with rows in it, migrated to the current schema.
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { migrate } from 'drizzle-orm/mysql2/migrator';
import { createDb, MIGRATIONS_FOLDER } from '../../server/db/client';
import { unitStatsDetail } from '../../server/db/schema';
import { openTestDb } from '../support/db';

const admin = openTestDb();
const url = new URL(inject('apiDatabaseUrl'));
url.pathname = `${url.pathname}_migration`;
const dbName = url.pathname.slice(1);
const tmp = mkdtempSync(path.join(os.tmpdir(), 'tightloop-migrations-'));

/** The migrations folder as it stood up to and including `lastTag`. */
function migrationsUpTo(lastTag: string): string {
  const dir = path.join(tmp, lastTag);
  cpSync(MIGRATIONS_FOLDER, dir, { recursive: true });
  const journalPath = path.join(dir, 'meta', '_journal.json');
  const journal = JSON.parse(readFileSync(journalPath, 'utf8')) as { entries: { tag: string }[] };
  const last = journal.entries.findIndex((e) => e.tag === lastTag);
  expect(last).toBeGreaterThanOrEqual(0);
  journal.entries = journal.entries.slice(0, last + 1);
  writeFileSync(journalPath, JSON.stringify(journal));
  return dir;
}

afterAll(async () => {
  await admin.db.execute(sql.raw(`DROP DATABASE IF EXISTS \`${dbName}\``));
  await admin.pool.end();
  rmSync(tmp, { recursive: true, force: true });
});

describe('0005: the wide statistics columns move to unit_stats_detail', () => {
  it('keeps every unit’s summary and factors and leaves unit_stats without them', async () => {
    await admin.db.execute(sql.raw(`DROP DATABASE IF EXISTS \`${dbName}\``));
    await admin.db.execute(sql.raw(`CREATE DATABASE \`${dbName}\``));
    const { db, pool } = createDb(url.toString(), { connectionLimit: 1 });
    try {
      await migrate(db, { migrationsFolder: migrationsUpTo('0004_fleet_indexes') });
      await db.execute(
        sql`INSERT INTO units (id, container_number, refrigerant, nominal_charge_kg, qr_token) VALUES (1, 'HRLU1000010', 'R-134a', 5, 'token-one'), (2, 'HRLU1000021', 'R-404A', 4, 'token-two')`,
      );
      await db.execute(
        sql`INSERT INTO unit_stats (unit_id, computed_at, score, score_factors, detail) VALUES
          (1, '2026-06-01 10:00:00', 72, '{"interval":{"points":30}}', '{"totalMadeUpKg365":3.1,"forecast":{"intervalDays":60}}'),
          (2, '2026-06-01 10:00:00', 0, NULL, NULL)`,
      );

      await migrate(db, { migrationsFolder: MIGRATIONS_FOLDER });

      const moved = await db.select().from(unitStatsDetail).orderBy(unitStatsDetail.unitId);
      expect(moved).toEqual([
        {
          unitId: 1,
          scoreFactors: { interval: { points: 30 } },
          detail: { totalMadeUpKg365: 3.1, forecast: { intervalDays: 60 } },
        },
        { unitId: 2, scoreFactors: null, detail: null },
      ]);
      const [columns] = (await db.execute(
        sql`SELECT column_name AS c FROM information_schema.columns WHERE table_schema = DATABASE() AND table_name = 'unit_stats' AND column_name IN ('detail', 'score_factors')`,
      )) as unknown as [{ c: string }[]];
      expect(columns).toEqual([]);
      const [[kept]] = (await db.execute(sql`SELECT score FROM unit_stats WHERE unit_id = 1`)) as unknown as [
        { score: number }[],
      ];
      expect(kept.score).toBe(72);
    } finally {
      await pool.end();
    }
  });
});
