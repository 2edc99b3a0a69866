// Sends what the outbox holds. Rows are claimed with a lease, so several servers can run a worker each and a
// message goes out once; a failed send waits with exponential backoff and is tried again, never dropped.
import { and, asc, eq, isNull, lt, lte, or, sql } from 'drizzle-orm';
import { mailOutbox } from '../../db/schema';
import type { AppContext } from '../app-context';

export type WorkerContext = Pick<AppContext, 'db' | 'mailer' | 'clock' | 'logger' | 'publicUrl'>;

export type OutboxWorkerOptions = {
  batchSize?: number;
  /** How long a claimed row stays ours; longer than any SMTP conversation. */
  leaseMs?: number;
  pollMs?: number;
  baseBackoffMs?: number;
  maxBackoffMs?: number;
};

const DEFAULTS: Required<OutboxWorkerOptions> = {
  batchSize: 25,
  leaseMs: 2 * 60_000,
  pollMs: 5_000,
  baseBackoffMs: 30_000,
  maxBackoffMs: 6 * 3600_000,
};

export function backoffMs(attempts: number, base: number, max: number): number {
  return Math.min(max, base * 2 ** Math.max(0, attempts - 1));
}

export function createOutboxWorker(ctx: WorkerContext, options: OutboxWorkerOptions = {}) {
  const o = { ...DEFAULTS, ...options };
  const { db, mailer, clock, logger } = ctx;
  const host = new URL(ctx.publicUrl).hostname;
  let running: Promise<{ sent: number; failed: number }> | null = null;

  async function claim(id: number, now: Date): Promise<boolean> {
    const [result] = await db
      .update(mailOutbox)
      .set({ lockedUntil: new Date(now.getTime() + o.leaseMs), attempts: sql`${mailOutbox.attempts} + 1` })
      .where(
        and(
          eq(mailOutbox.id, id),
          isNull(mailOutbox.sentAt),
          or(isNull(mailOutbox.lockedUntil), lt(mailOutbox.lockedUntil, now)),
        ),
      );
    return result.affectedRows === 1;
  }

  async function sendOne(id: number): Promise<'sent' | 'failed' | 'skipped'> {
    const now = clock.now();
    if (!(await claim(id, now))) return 'skipped';
    const [row] = await db.select().from(mailOutbox).where(eq(mailOutbox.id, id));
    try {
      await mailer.send({
        to: row.toAddress,
        subject: row.subject,
        text: row.textBody,
        html: row.htmlBody,
        messageId: `<outbox-${row.id}@${host}>`,
        headers: row.headers ?? undefined,
      });
    } catch (err) {
      const wait = backoffMs(row.attempts, o.baseBackoffMs, o.maxBackoffMs);
      const message = err instanceof Error ? err.message : String(err);
      await db
        .update(mailOutbox)
        .set({
          lockedUntil: null,
          nextAttemptAt: new Date(clock.now().getTime() + wait),
          lastError: message.slice(0, 1000),
        })
        .where(eq(mailOutbox.id, id));
      logger.warn(
        { outboxId: id, attempts: row.attempts, retryInMs: wait, err: message },
        'mail send failed; will retry',
      );
      return 'failed';
    }
    await db
      .update(mailOutbox)
      .set({ sentAt: clock.now(), lockedUntil: null, lastError: null })
      .where(eq(mailOutbox.id, id));
    return 'sent';
  }

  async function drainOnce() {
    let sent = 0;
    let failed = 0;
    const tried = new Set<number>();
    for (;;) {
      const now = clock.now();
      const due = await db
        .select({ id: mailOutbox.id })
        .from(mailOutbox)
        .where(
          and(
            isNull(mailOutbox.sentAt),
            lte(mailOutbox.nextAttemptAt, now),
            or(isNull(mailOutbox.lockedUntil), lt(mailOutbox.lockedUntil, now)),
          ),
        )
        .orderBy(asc(mailOutbox.nextAttemptAt), asc(mailOutbox.id))
        .limit(o.batchSize);
      const fresh = due.filter((r) => !tried.has(r.id));
      if (fresh.length === 0) break;
      for (const { id } of fresh) {
        tried.add(id);
        const outcome = await sendOne(id);
        if (outcome === 'sent') sent++;
        if (outcome === 'failed') failed++;
      }
    }
    return { sent, failed };
  }

  /** Sends everything that is due now; concurrent calls share one run. */
  function drain() {
    running ??= drainOnce().finally(() => (running = null));
    return running;
  }

  const timers: NodeJS.Timeout[] = [];
  const report = (what: string) => (err: unknown) => logger.error({ err }, `${what} failed`);

  return {
    drain,
    start() {
      timers.push(setInterval(() => void drain().catch(report('mail outbox')), o.pollMs));
      void drain().catch(report('mail outbox'));
    },
    async stop() {
      timers.splice(0).forEach(clearInterval);
      await running;
    },
  };
}

export type OutboxWorker = ReturnType<typeof createOutboxWorker>;
