import { sql } from 'drizzle-orm';
import { inject } from 'vitest';
import { createDb, type Db } from '../../server/db/client';

export function openTestDb() {
  return createDb(inject('apiDatabaseUrl'), { connectionLimit: 10 });
}

/** Empties every table (not the migration journal) so each test file starts from a clean database. */
export async function resetDb(db: Db): Promise<void> {
  const [rows] = (await db.execute(
    sql`SELECT table_name AS t FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name <> '__drizzle_migrations'`,
  )) as unknown as [{ t: string }[]];
  await db.transaction(async (tx) => {
    await tx.execute(sql`SET FOREIGN_KEY_CHECKS = 0`);
    for (const { t } of rows) await tx.execute(sql.raw(`DELETE FROM \`${t}\``));
    await tx.execute(sql`SET FOREIGN_KEY_CHECKS = 1`);
  });
}
