// The built app, served on a random port against the e2e database, for the browser journeys.
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { createApp } from '../../server/app';
import { createDb } from '../../server/db/client';
import { seedDemo } from '../../seed/index';
import { buildClientIfStale } from '../../scripts/lib/build-client';
import { PROJECT_ROOT } from '../../scripts/lib/mariadb';
import { sharedTestDb } from './global-setup-db';

export default async function setup(project: TestProject) {
  buildClientIfStale();
  const shared = await sharedTestDb();
  const { db, pool } = createDb(shared.urls.e2e, { connectionLimit: 10 });
  await seedDemo(db);
  // Bind first so the origin check knows the port.
  const http = await import('node:http');
  const server = http.createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const port = (server.address() as AddressInfo).port;
  const baseUrl = `http://127.0.0.1:${port}`;
  const { app } = createApp({ db, publicUrl: baseUrl, clientDir: path.join(PROJECT_ROOT, 'dist') });
  server.on('request', app);
  project.provide('baseUrl', baseUrl);
  return async () => {
    server.closeAllConnections();
    await new Promise((r) => server.close(r));
    await pool.end();
  };
}
