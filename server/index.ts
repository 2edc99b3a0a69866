// Process entry: listen and shut down gracefully. Everything else is in createApp.
import path from 'node:path';
import { createApp } from './app';
import { createDb } from './db/client';
import { publicUrl, readEnv } from './env';
import { createLogger } from './lib/logger';
import { createOutboxWorker } from './lib/mail/sender';
import { startSchedules } from './scheduler';
import { createStorage } from './lib/storage-config';
import { createHttpServer } from './lib/http-server';

const HOUR_MS = 3600_000;

export async function startServer(opts: { databaseUrl: string; port?: number; host?: string; exitOnSignal?: boolean }) {
  const env = readEnv();
  const logger = createLogger(env.LOG_LEVEL);
  const { db, pool } = createDb(opts.databaseUrl);
  const port = opts.port ?? env.PORT;
  const host = opts.host ?? env.HOST;
  const { app, ctx } = createApp({
    db,
    logger,
    publicUrl: env.PUBLIC_URL ?? `http://localhost:${port}`,
    trustProxy: env.TRUST_PROXY,
    mailboxFromAnyAddress: env.MAILBOX_FROM_ANY_ADDRESS,
    sessionLifetimes: {
      absoluteMs: env.SESSION_ABSOLUTE_DAYS * 24 * HOUR_MS,
      idleMs: env.SESSION_IDLE_HOURS * HOUR_MS,
      idleTechnicianMs: env.SESSION_IDLE_HOURS_TECHNICIAN * HOUR_MS,
    },
    storage: await createStorage(env),
    clientDir: path.resolve(path.dirname(new URL(import.meta.url).pathname), '../dist'),
  });
  const mailWorker = createOutboxWorker(ctx);
  mailWorker.start();
  // Background work on timers: the forecast's nightly case base, the daily mails, stale jobs and old derived tables.
  const schedules = startSchedules(ctx);
  // Ended sessions and expired known devices leave their rows; sweep them hourly.
  const sweep = setInterval(
    () =>
      void ctx.sessions
        .deleteExpired()
        .then(ctx.signInGuard.forgetExpired)
        .catch((err: unknown) => logger.warn({ err }, 'session sweep failed')),
    3600_000,
  );
  sweep.unref();
  const server = createHttpServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('listening', resolve);
    server.once('error', reject);
    // Loopback unless HOST says otherwise: `npm start` on a laptop is not reachable from its network.
    server.listen(port, host);
  });
  if (env.NODE_ENV === 'production' && !/^https:/.test(env.PUBLIC_URL ?? '')) {
    logger.warn('PUBLIC_URL is not https: session cookies are sent without Secure and without the __Host- prefix.');
  }

  let closing: Promise<void> | null = null;
  const stop = () =>
    (closing ??= (async () => {
      clearInterval(sweep);
      server.close();
      server.closeIdleConnections();
      const force = setTimeout(() => server.closeAllConnections(), 5000);
      force.unref();
      await new Promise((r) => server.once('close', r));
      await schedules.stop();
      await mailWorker.stop();
      await pool.end();
    })());
  const shutdown = async (signal: string) => {
    if (closing) return;
    logger.info({ signal }, 'shutting down');
    await stop();
    process.exit(0);
  };
  if (opts.exitOnSignal !== false) {
    process.once('SIGINT', () => void shutdown('SIGINT'));
    process.once('SIGTERM', () => void shutdown('SIGTERM'));
  }
  return { server, url: `${publicUrl({ ...env, PORT: port })}`, stop };
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(new URL(import.meta.url).pathname)) {
  const env = readEnv();
  if (!env.DATABASE_URL) {
    console.error('DATABASE_URL is not set. Use `npm start`, which starts a local MariaDB and sets it.');
    process.exit(1);
  }
  await startServer({ databaseUrl: env.DATABASE_URL });
}
