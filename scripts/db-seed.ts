import { createDb, migrateDb } from '../server/db/client';
import { isEmpty, seedDemo } from '../seed/index';
import { resolveDatabaseUrl } from './lib/database-url';

const { db, pool } = createDb(await resolveDatabaseUrl(), { connectionLimit: 2 });
await migrateDb(db);
if (await isEmpty(db)) {
  await seedDemo(db);
  console.log('Demo data loaded.');
} else {
  console.log('The database already has data; nothing loaded.');
}
await pool.end();
