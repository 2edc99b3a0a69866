import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { mailOutbox } from '../../server/db/schema';
import { startFakeSmtp } from '../../server/lib/fake-smtp';
import { createSmtpMailer } from '../../server/lib/mailer';
import { enqueueMail, type OutboxMessage } from '../../server/lib/mail/outbox';
import { backoffMs, createOutboxWorker } from '../../server/lib/mail/sender';
import { storeReceivedMail } from '../../server/features/mail/mailbox.service';
import { renderMail } from '../../server/lib/mail/layout';
import { openTestDb, resetDb } from '../support/db';
import { signInAs } from '../support/factories';
import { linkIn, startTestSmtp, TEST_MAIL_FROM, testClock } from '../support/mail';

const { db, pool } = openTestDb();
const { smtp, mailer } = await startTestSmtp();
const clock = testClock();
const { app, ctx } = createApp({ db, mailer, clock, rateLimits: { signInPerIp: 1000 } });
const worker = createOutboxWorker(ctx, { baseBackoffMs: 30_000 });

let n = 0;
function message(overrides: Partial<OutboxMessage> = {}): OutboxMessage {
  n += 1;
  return {
    dedupeKey: `test:${n}:${Date.now()}`,
    kind: 'alert',
    to: `reader${n}@halyard.example`,
    subject: `Test message ${n}`,
    ...renderMail({
      heading: `Test message ${n}`,
      paragraphs: ['Ünïcode, “quotes” & <angle brackets>.'],
      action: { label: 'Open', url: 'http://localhost:3000/units/7' },
    }),
    ...overrides,
  };
}

beforeAll(() => resetDb(db));
beforeEach(async () => {
  await worker.drain();
  smtp.clear();
});
afterAll(async () => {
  await smtp.stop();
  await pool.end();
});

describe('outbox', () => {
  it('sends a queued message once through SMTP, with text and HTML parts', async () => {
    const m = message();
    expect(await db.transaction((tx) => enqueueMail(tx, m))).toBe(true);
    expect(await worker.drain()).toEqual({ sent: 1, failed: 0 });
    expect(await worker.drain()).toEqual({ sent: 0, failed: 0 });
    expect(smtp.messages).toHaveLength(1);
    const got = smtp.messages[0];
    expect(got.envelopeTo).toEqual([m.to]);
    expect(got.from).toBe(TEST_MAIL_FROM);
    expect(got.subject).toBe(m.subject);
    expect(got.text).toContain('Ünïcode, “quotes” & <angle brackets>.');
    expect(got.html).toContain('Ünïcode, “quotes” &amp; &lt;angle brackets&gt;.');
    expect(linkIn(got.text, 'http://localhost:3000/units/')).toBe('http://localhost:3000/units/7');
    expect(got.messageId).toMatch(/^<outbox-\d+@localhost>$/);
    const [row] = await db.select().from(mailOutbox).where(eq(mailOutbox.dedupeKey, m.dedupeKey));
    expect(row).toMatchObject({ attempts: 1, lockedUntil: null, lastError: null });
    expect(row.sentAt).not.toBeNull();
  });

  it('queues a message with the same dedupe key only once', async () => {
    const m = message();
    expect(await enqueueMail(db, m)).toBe(true);
    expect(await enqueueMail(db, { ...m, subject: 'again' })).toBe(false);
    await worker.drain();
    expect(smtp.messages.map((x) => x.subject)).toEqual([m.subject]);
  });

  it('drops the message with the transaction that caused it', async () => {
    const m = message();
    await expect(
      db.transaction(async (tx) => {
        await enqueueMail(tx, m);
        throw new Error('the event failed');
      }),
    ).rejects.toThrow('the event failed');
    expect(await db.select().from(mailOutbox).where(eq(mailOutbox.dedupeKey, m.dedupeKey))).toHaveLength(0);
  });

  it('keeps a message while SMTP is down and sends it once SMTP is back', async () => {
    const down = await startFakeSmtp({ port: 0 });
    const port = down.port;
    await down.stop();
    const w = createOutboxWorker({
      ...ctx,
      mailer: createSmtpMailer({ host: '127.0.0.1', port, from: TEST_MAIL_FROM }),
    });
    const m = message();
    await enqueueMail(db, m, clock.now());

    expect(await w.drain()).toEqual({ sent: 0, failed: 1 });
    const [failed] = await db.select().from(mailOutbox).where(eq(mailOutbox.dedupeKey, m.dedupeKey));
    expect(failed).toMatchObject({ sentAt: null, attempts: 1, lockedUntil: null });
    expect(failed.lastError).toMatch(/ECONNREFUSED|connect/i);
    expect(failed.nextAttemptAt.getTime() - clock.now().getTime()).toBeGreaterThan(25_000);
    // Waiting out the backoff: not retried before it is due.
    expect(await w.drain()).toEqual({ sent: 0, failed: 0 });

    clock.advance(31_000);
    expect(await w.drain()).toEqual({ sent: 0, failed: 1 });
    const [twice] = await db.select().from(mailOutbox).where(eq(mailOutbox.dedupeKey, m.dedupeKey));
    expect(twice.nextAttemptAt.getTime() - clock.now().getTime()).toBeGreaterThan(55_000);

    const back = await startFakeSmtp({ port });
    try {
      clock.advance(61_000);
      expect(await w.drain()).toEqual({ sent: 1, failed: 0 });
      expect(await w.drain()).toEqual({ sent: 0, failed: 0 });
      expect(back.messages.map((x) => x.subject)).toEqual([m.subject]);
      const [sent] = await db.select().from(mailOutbox).where(eq(mailOutbox.dedupeKey, m.dedupeKey));
      expect(sent).toMatchObject({ attempts: 3, lastError: null });
    } finally {
      await back.stop();
    }
  });

  it('leaves a row another worker holds alone until its lease runs out', async () => {
    const m = message();
    await enqueueMail(db, m, clock.now());
    await db
      .update(mailOutbox)
      .set({ lockedUntil: new Date(clock.now().getTime() + 60_000) })
      .where(eq(mailOutbox.dedupeKey, m.dedupeKey));
    expect(await worker.drain()).toEqual({ sent: 0, failed: 0 });
    clock.advance(61_000);
    expect(await worker.drain()).toEqual({ sent: 1, failed: 0 });
    expect(smtp.messages).toHaveLength(1);
  });

  it('sends each message once when two workers drain at the same time', async () => {
    const batch = Array.from({ length: 12 }, () => message());
    await db.transaction(async (tx) => {
      for (const m of batch) await enqueueMail(tx, m, clock.now());
    });
    const other = createOutboxWorker(ctx);
    const [a, b] = await Promise.all([worker.drain(), other.drain()]);
    expect(a.sent + b.sent).toBe(12);
    expect(smtp.messages).toHaveLength(12);
    expect(new Set(smtp.messages.map((x) => x.subject)).size).toBe(12);
  });

  it('doubles the wait after each failure, up to a cap', () => {
    expect([1, 2, 3, 4].map((a) => backoffMs(a, 30_000, 100_000))).toEqual([30_000, 60_000, 100_000, 100_000]);
  });
});

describe('development mailbox', () => {
  it('lists what the fake SMTP server received, newest first, to an administrator', async () => {
    const recorder = await startFakeSmtp({ port: 0, onMessage: (m) => storeReceivedMail(db, m) });
    try {
      const w = createOutboxWorker({
        ...ctx,
        mailer: createSmtpMailer({ host: '127.0.0.1', port: recorder.port, from: TEST_MAIL_FROM }),
      });
      const first = message();
      const second = message();
      await enqueueMail(db, first, clock.now());
      await w.drain();
      await enqueueMail(db, second, clock.now());
      await w.drain();
    } finally {
      await recorder.stop();
    }
    const { agent } = await signInAs(app, db, 'admin');
    const res = await agent.get('/api/dev/mailbox?limit=2');
    expect(res.status).toBe(200);
    expect(res.body.messages).toHaveLength(2);
    expect(res.body.messages[0]).toMatchObject({
      subject: `Test message ${n}`,
      to: `reader${n}@halyard.example`,
      from: TEST_MAIL_FROM,
    });
    expect(res.body.messages[0].text).toContain('Ünïcode');
    expect(res.body.messages[0].html).toContain('<!doctype html>');
    expect((await agent.get('/api/dev/mailbox?limit=0')).status).toBe(400);
  });

  it('refuses other roles with 403 and signed-out visitors with 401', async () => {
    const { agent } = await signInAs(app, db, 'engineer');
    expect((await agent.get('/api/dev/mailbox')).status).toBe(403);
    expect((await request(app).get('/api/dev/mailbox')).status).toBe(401);
  });

  it('does not exist in production', async () => {
    const prod = createApp({ db, mailer, devTools: false, rateLimits: { signInPerIp: 1000 } }).app;
    const { agent } = await signInAs(prod, db, 'admin');
    const res = await agent.get('/api/dev/mailbox');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});

describe('request guards for mail routes', () => {
  it('refuses a password-reset request from a foreign origin', async () => {
    const res = await request(app)
      .post('/api/password-reset')
      .set('Origin', 'https://elsewhere.example')
      .send({ email: 'x@halyard.example' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad_origin');
  });
});
