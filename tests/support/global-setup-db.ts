// One throwaway MariaDB for the whole run (temporary data folder, free port), shared by the api and e2e projects.
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import {
  createDatabaseAndUser,
  freePort,
  newPassword,
  startMariaDb,
  type LocalMariaDb,
} from '../../scripts/lib/mariadb';
import { createDb, migrateDb } from '../../server/db/client';

type Shared = { server: LocalMariaDb; dir: string; urls: Record<string, string>; users: number };
const g = globalThis as typeof globalThis & { __tightloopTestDb?: Promise<Shared> };

async function start(): Promise<Shared> {
  if (process.env.DATABASE_URL) {
    throw new Error('npm test uses its own throwaway MariaDB; unset DATABASE_URL.');
  }
  const dir = mkdtempSync(path.join(os.tmpdir(), 'tightloop-testdb-'));
  const server = await startMariaDb({
    dataDir: dir,
    port: await freePort(),
    detached: false,
    durable: false,
    bufferPool: '256M',
  });
  const password = newPassword();
  const urls: Record<string, string> = {};
  for (const name of ['api', 'e2e']) {
    urls[name] = createDatabaseAndUser(server, `tightloop_${name}`, 'tightloop_test', password);
    const { db, pool } = createDb(urls[name], { connectionLimit: 2 });
    await migrateDb(db);
    await pool.end();
  }
  return { server, dir, urls, users: 0 };
}

export async function sharedTestDb(): Promise<Shared> {
  g.__tightloopTestDb ??= start();
  return g.__tightloopTestDb;
}

export default async function setup(project: TestProject) {
  const shared = await sharedTestDb();
  shared.users += 1;
  project.provide('apiDatabaseUrl', shared.urls.api);
  project.provide('e2eDatabaseUrl', shared.urls.e2e);
  return async () => {
    shared.users -= 1;
    if (shared.users > 0) return;
    g.__tightloopTestDb = undefined;
    try {
      process.kill(shared.server.pid, 'SIGTERM');
    } catch {
      /* already gone */
    }
    await new Promise((r) => setTimeout(r, 500));
    rmSync(shared.dir, { recursive: true, force: true });
  };
}
