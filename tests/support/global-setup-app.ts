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
import { startFakeSmtp } from '../../server/lib/fake-smtp';
import { createSmtpMailer } from '../../server/lib/mailer';
import { storeReceivedMail } from '../../server/features/mail/mailbox.service';
import { createOutboxWorker } from '../../server/lib/mail/sender';
import { createHttpServer } from '../../server/lib/http-server';

export default async function setup(project: TestProject) {
  buildClientIfStale();
  const shared = await sharedTestDb();
  const { db, pool } = createDb(shared.urls.e2e, { connectionLimit: 10 });
  // A small fleet keeps the browser tests' start-up short.
  await seedDemo(db, { units: 40 });
  // Bind first so the origin check knows the port.
  const server = createHttpServer(undefined);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const port = (server.address() as AddressInfo).port;
  const baseUrl = `http://127.0.0.1:${port}`;
  // Mail goes through SMTP to a fake server that files it in the e2e database's dev_mailbox, where tests read it.
  const smtp = await startFakeSmtp({ port: 0, onMessage: (m) => storeReceivedMail(db, m) });
  const mailer = createSmtpMailer({
    host: '127.0.0.1',
    port: smtp.port,
    from: 'Tightloop <no-reply@tightloop.example>',
  });
  const { app, ctx } = createApp({ db, mailer, publicUrl: baseUrl, clientDir: path.join(PROJECT_ROOT, 'dist') });
  const mailWorker = createOutboxWorker(ctx, { pollMs: 250 });
  mailWorker.start();
  server.on('request', app);
  project.provide('baseUrl', baseUrl);
  return async () => {
    server.closeAllConnections();
    await new Promise((r) => server.close(r));
    await mailWorker.stop();
    await smtp.stop();
    await pool.end();
  };
}
