// A server for `npm run bench`, in its own process so the load generator does not share its event loop:
//   bench-server.ts app <port>       the Tightloop app (createApp) on 127.0.0.1:<port>
//   bench-server.ts baseline <port>  a bare Express route doing one primary-key select, the yardstick
// DATABASE_URL comes from the environment. Prints "ready" once listening.
import express from 'express';
import mysql from 'mysql2/promise';
import { createApp } from '../../server/app';
import { createDb } from '../../server/db/client';
import type { Mailer } from '../../server/lib/mailer';

const [mode, portText] = process.argv.slice(2);
const port = Number(portText);
const url = process.env.DATABASE_URL;
if (!url || !port || (mode !== 'app' && mode !== 'baseline')) {
  console.error('usage: DATABASE_URL=… bench-server.ts app|baseline <port>');
  process.exit(2);
}

/** Listens on loopback; the returned close ends the open connections, the server and the database pool. */
async function serve(app: express.Express, pool: { end(): Promise<void> }): Promise<() => Promise<void>> {
  const server = app.listen(port, '127.0.0.1');
  await new Promise<void>((resolve, reject) => server.once('listening', resolve).once('error', reject));
  return async () => {
    server.closeAllConnections();
    await new Promise((r) => server.close(r));
    await pool.end();
  };
}

let close: () => Promise<void>;
if (mode === 'app') {
  const { db, pool } = createDb(url);
  // Mail is queued in the outbox by the write transactions; nothing is sent during a benchmark.
  const mailer: Mailer = { send: async () => undefined };
  const { app } = createApp({ db, publicUrl: `http://127.0.0.1:${port}`, devTools: false, mailer });
  close = await serve(app, pool);
} else {
  // Same pool size and options as the app's own pool, so the comparison is about the work per request.
  const pool = mysql.createPool({ uri: url, connectionLimit: 20, timezone: 'Z', supportBigNumbers: true });
  const app = express();
  app.disable('x-powered-by');
  app.get('/units/:id', async (req, res, next) => {
    try {
      const [rows] = await pool.query('SELECT * FROM units WHERE id = ?', [Number(req.params.id)]);
      res.json((rows as unknown[])[0] ?? null);
    } catch (err) {
      next(err);
    }
  });
  close = await serve(app, pool);
}
process.once('SIGTERM', () => void close().then(() => process.exit(0)));
console.log('ready');
