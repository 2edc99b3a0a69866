// Process entry: listen and shut down gracefully. Everything else is in createApp.
import path from 'node:path';
import { createApp } from './app';
import { createDb } from './db/client';
import { publicUrl, readEnv } from './env';
import { createLogger } from './lib/logger';
import { createOutboxWorker } from './features/mail/outbox-worker';
import { createLocalStorage } from './lib/storage';
import { createHttpServer } from './lib/http-server';

export async function startServer(opts: { databaseUrl: string; port?: number }) {
  const env = readEnv();
  const logger = createLogger(env.LOG_LEVEL);
  const { db, pool } = createDb(opts.databaseUrl);
  const port = opts.port ?? env.PORT;
  const { app, ctx } = createApp({
    db,
    logger,
    publicUrl: env.PUBLIC_URL ?? `http://localhost:${port}`,
    storage: createLocalStorage(path.resolve(env.STORAGE_DIR)),
    clientDir: path.resolve(path.dirname(new URL(import.meta.url).pathname), '../dist'),
  });
  const mailWorker = createOutboxWorker(ctx);
  mailWorker.start();
  const server = createHttpServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('listening', resolve);
    server.once('error', reject);
    server.listen(port);
  });

  let closing = false;
  const shutdown = async (signal: string) => {
    if (closing) return;
    closing = true;
    logger.info({ signal }, 'shutting down');
    server.close();
    server.closeIdleConnections();
    const force = setTimeout(() => server.closeAllConnections(), 5000);
    force.unref();
    await new Promise((r) => server.once('close', r));
    await mailWorker.stop();
    await pool.end();
    process.exit(0);
  };
  process.once('SIGINT', () => void shutdown('SIGINT'));
  process.once('SIGTERM', () => void shutdown('SIGTERM'));
  return { server, url: `${publicUrl({ ...env, PORT: port })}` };
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(new URL(import.meta.url).pathname)) {
  const env = readEnv();
  if (!env.DATABASE_URL) {
    console.error('DATABASE_URL is not set. Use `npm start`, which starts a local MariaDB and sets it.');
    process.exit(1);
  }
  await startServer({ databaseUrl: env.DATABASE_URL });
}
