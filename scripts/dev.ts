// `npm run dev`: the project database, the API with reload on port 3000 and Vite's dev server on 5173.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { createDb, migrateDb } from '../server/db/client';
import { isEmpty, seedDemo } from '../seed/index';
import { resolveDatabaseUrl } from './lib/database-url';
import { PROJECT_ROOT } from './lib/mariadb';
import { MAILBOX_PAGE, startDevMailbox } from './lib/dev-mailbox';

const databaseUrl = await resolveDatabaseUrl();
const { db, pool } = createDb(databaseUrl, { connectionLimit: 2 });
await migrateDb(db);
if (await isEmpty(db)) await seedDemo(db);
await pool.end();
// Outside the reloading API process, so mail survives reloads.
const mailbox = await startDevMailbox(databaseUrl);

const bin = (name: string) => path.join(PROJECT_ROOT, 'node_modules', '.bin', name);
const env = {
  ...process.env,
  DATABASE_URL: databaseUrl,
  PUBLIC_URL: process.env.PUBLIC_URL ?? 'http://localhost:5173',
};
const children = [
  spawn(bin('tsx'), ['watch', 'server/index.ts'], { cwd: PROJECT_ROOT, env, stdio: 'inherit' }),
  spawn(bin('vite'), [], { cwd: PROJECT_ROOT, env, stdio: 'inherit' }),
];
const stop = () => {
  children.forEach((c) => c.kill('SIGTERM'));
  void mailbox?.stop();
};
if (mailbox)
  console.log(
    `Mail goes to a local fake SMTP server (port ${mailbox.port}); read it at ${env.PUBLIC_URL}${MAILBOX_PAGE} as the administrator.`,
  );
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
