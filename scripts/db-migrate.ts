import { createDb, migrateDb } from '../server/db/client';
import { resolveDatabaseUrl } from './lib/database-url';

const { db, pool } = createDb(await resolveDatabaseUrl(), { connectionLimit: 2 });
await migrateDb(db);
await pool.end();
console.log('Migrations applied.');
