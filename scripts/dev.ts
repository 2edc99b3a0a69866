// `npm run dev`: the project database, the API with reload on port 3000 and Vite's dev server on 5173.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { createDb, migrateDb } from '../server/db/client';
import { isEmpty, seedDemo } from '../seed/index';
import { resolveDatabaseUrl } from './lib/database-url';
import { PROJECT_ROOT } from './lib/mariadb';

const databaseUrl = await resolveDatabaseUrl();
const { db, pool } = createDb(databaseUrl, { connectionLimit: 2 });
await migrateDb(db);
if (await isEmpty(db)) await seedDemo(db);
await pool.end();

const bin = (name: string) => path.join(PROJECT_ROOT, 'node_modules', '.bin', name);
const env = { ...process.env, DATABASE_URL: databaseUrl, PUBLIC_URL: process.env.PUBLIC_URL ?? 'http://localhost:5173' };
const children = [
  spawn(bin('tsx'), ['watch', 'server/index.ts'], { cwd: PROJECT_ROOT, env, stdio: 'inherit' }),
  spawn(bin('vite'), [], { cwd: PROJECT_ROOT, env, stdio: 'inherit' }),
];
const stop = () => children.forEach((c) => c.kill('SIGTERM'));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
