import { desc } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { devMailbox } from '../../db/schema';
import type { ReceivedMail } from '../../lib/fake-smtp';
import type { MailboxDto } from '../../../shared/schemas/mail';

/** Keeps what the fake SMTP server received where the admin mailbox page (any process) can read it. */
export async function storeReceivedMail(db: Db, m: ReceivedMail): Promise<void> {
  await db.insert(devMailbox).values({
    receivedAt: m.receivedAt,
    fromHeader: m.from.slice(0, 400),
    toHeader: (m.to || m.envelopeTo.join(', ')).slice(0, 1000),
    subject: m.subject.slice(0, 400),
    textBody: m.text,
    htmlBody: m.html,
  });
}

export async function listMailbox(db: Db, limit: number): Promise<MailboxDto> {
  const rows = await db
    .select()
    .from(devMailbox)
    .orderBy(desc(devMailbox.receivedAt), desc(devMailbox.id))
    .limit(limit);
  return {
    messages: rows.map((r) => ({
      id: r.id,
      receivedAt: r.receivedAt.toISOString(),
      from: r.fromHeader,
      to: r.toHeader,
      subject: r.subject,
      text: r.textBody,
      html: r.htmlBody,
    })),
  };
}
