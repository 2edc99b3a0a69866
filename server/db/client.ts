import { drizzle } from 'drizzle-orm/mysql2';
import { migrate } from 'drizzle-orm/mysql2/migrator';
import mysql from 'mysql2/promise';
import path from 'node:path';
import * as schema from './schema';

export function createDb(url: string, opts: { connectionLimit?: number } = {}) {
  const pool = mysql.createPool({
    uri: url,
    connectionLimit: opts.connectionLimit ?? 20,
    // Dates are UTC end to end.
    timezone: 'Z',
    dateStrings: false,
    supportBigNumbers: true,
    multipleStatements: false,
  });
  const db = drizzle(pool, { schema, mode: 'default', casing: 'snake_case' });
  return { db, pool };
}

export type Db = ReturnType<typeof createDb>['db'];
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
export type DbOrTx = Db | Tx;

export const MIGRATIONS_FOLDER = path.resolve(path.dirname(new URL(import.meta.url).pathname), '../../drizzle');

export async function migrateDb(db: Db): Promise<void> {
  await migrate(db, { migrationsFolder: MIGRATIONS_FOLDER });
}
