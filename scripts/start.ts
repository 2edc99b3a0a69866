// `npm start`: database, migrations, demo data on first run, client build, then the server on port 3000.
import { createDb, migrateDb } from '../server/db/client';
import { startServer } from '../server/index';
import { isEmpty, seedDemo } from '../seed/index';
import { DEMO_ACCOUNTS, DEMO_COMPANY, DEMO_PASSWORD } from '../seed/demo-accounts';
import { ROLE_LABELS } from '../shared/permissions';
import { resolveDatabaseUrl } from './lib/database-url';
import { buildClientIfStale } from './lib/build-client';
import { MAILBOX_PAGE, startDevMailbox } from './lib/dev-mailbox';

const t0 = Date.now();
const step = (s: string) => console.log(`[${((Date.now() - t0) / 1000).toFixed(1)} s] ${s}`);

step('Starting the database…');
const databaseUrl = await resolveDatabaseUrl();
const { db, pool } = createDb(databaseUrl, { connectionLimit: 4 });
step('Migrating…');
await migrateDb(db);
if (await isEmpty(db)) {
  step('Loading the demo fleet (first run)…');
  await seedDemo(db);
}
await pool.end();
buildClientIfStale(step);
const mailbox = await startDevMailbox(databaseUrl);
const { url } = await startServer({ databaseUrl });
step(`Tightloop is running at ${url}`);
if (mailbox)
  console.log(
    `Mail goes to a local fake SMTP server (port ${mailbox.port}); read it at ${url}${MAILBOX_PAGE} as the administrator.`,
  );
console.log(`\nDemo sign-ins (${DEMO_COMPANY}, invented), password "${DEMO_PASSWORD}":`);
for (const a of DEMO_ACCOUNTS) console.log(`  ${ROLE_LABELS[a.role].padEnd(16)} ${a.email}`);
console.log('\nStop the server with Ctrl+C; stop the database with `npm run db:stop`.');
