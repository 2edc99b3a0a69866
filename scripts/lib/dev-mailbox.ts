// The fake SMTP server for `npm start` and `npm run dev`: what Tightloop mails lands in the admin mailbox page.
import { createDb } from '../../server/db/client';
import { mailGoesToFakeSmtp, readEnv } from '../../server/env';
import { startFakeSmtp } from '../../server/lib/fake-smtp';
import { storeReceivedMail } from '../../server/features/mail/mailbox.service';
import { MAIL_PAGE_PATHS } from '../../shared/schemas/mail';

export const MAILBOX_PAGE = MAIL_PAGE_PATHS.mailbox;

/** Starts it unless a real SMTP server is configured (not on loopback, or with a login) or NODE_ENV=production. */
export async function startDevMailbox(databaseUrl: string): Promise<{ port: number; stop(): Promise<void> } | null> {
  const env = readEnv();
  if (!mailGoesToFakeSmtp(env)) return null;
  const { db, pool } = createDb(databaseUrl, { connectionLimit: 2 });
  try {
    const smtp = await startFakeSmtp({
      port: env.SMTP_PORT,
      host: '127.0.0.1',
      onMessage: (m) => storeReceivedMail(db, m),
    });
    return {
      port: smtp.port,
      async stop() {
        await smtp.stop();
        await pool.end();
      },
    };
  } catch (err) {
    await pool.end();
    if ((err as NodeJS.ErrnoException).code !== 'EADDRINUSE') throw err;
    console.warn(`Port ${env.SMTP_PORT} is taken (another Tightloop?); mail goes to whatever listens there.`);
    return null;
  }
}
