import type { DbOrTx } from '../../db/client';
import { mailOutbox, MAIL_KINDS } from '../../db/schema';
import { isDuplicateKeyError } from '../db-errors';

export type OutboxMessage = {
  /** One per logical message (an alert for one unit, one person and one crossing): a repeat is dropped. */
  dedupeKey: string;
  kind: (typeof MAIL_KINDS)[number];
  to: string;
  subject: string;
  text: string;
  html: string;
  headers?: Record<string, string>;
};

/**
 * Queues a mail in the caller's transaction, so it exists exactly when the change that caused it is committed.
 * Returns false when a message with the same dedupe key was queued before.
 */
export async function enqueueMail(tx: DbOrTx, message: OutboxMessage, now: Date = new Date()): Promise<boolean> {
  try {
    await tx.insert(mailOutbox).values({
      dedupeKey: message.dedupeKey,
      kind: message.kind,
      toAddress: message.to,
      subject: message.subject.slice(0, 300),
      textBody: message.text,
      htmlBody: message.html,
      headers: message.headers ?? null,
      nextAttemptAt: now,
    });
    return true;
  } catch (err) {
    // InnoDB undoes only the refused statement, so the caller's transaction goes on.
    if (isDuplicateKeyError(err)) return false;
    throw err;
  }
}
