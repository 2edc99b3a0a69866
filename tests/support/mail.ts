import { startFakeSmtp, type FakeSmtp } from '../../server/lib/fake-smtp';
import { createSmtpMailer } from '../../server/lib/mailer';

export const TEST_MAIL_FROM = 'Tightloop <no-reply@tightloop.example>';

/** A fake SMTP server on a free loopback port and a real SMTP mailer pointed at it. */
export async function startTestSmtp(): Promise<{ smtp: FakeSmtp; mailer: ReturnType<typeof createSmtpMailer> }> {
  const smtp = await startFakeSmtp({ port: 0 });
  return { smtp, mailer: createSmtpMailer({ host: '127.0.0.1', port: smtp.port, from: TEST_MAIL_FROM }) };
}

/** The first link in a mail's text part that starts with the given prefix. */
export function linkIn(text: string, prefix: string): string {
  const escaped = prefix.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  const m = new RegExp(`${escaped}[^\\s)]+`).exec(text);
  if (!m) throw new Error(`No link starting with ${prefix} in:\n${text}`);
  return m[0];
}

/** A clock the test can move forward. */
export function testClock(start = new Date()) {
  let offsetMs = start.getTime() - Date.now();
  return {
    now: () => new Date(Date.now() + offsetMs),
    advance(ms: number) {
      offsetMs += ms;
    },
  };
}
