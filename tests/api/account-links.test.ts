import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createHash } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { accountLinks, mailOutbox, rateLimits, users } from '../../server/db/schema';
import { createOutboxWorker } from '../../server/lib/mail/sender';
import { openTestDb, resetDb } from '../support/db';
import { createTestUser, signInAs, TEST_ORIGIN, TEST_PASSWORD } from '../support/factories';
import { linkIn, startTestSmtp, testClock } from '../support/mail';

const { db, pool } = openTestDb();
const { smtp, mailer } = await startTestSmtp();
const clock = testClock();
const PUBLIC_URL = 'http://localhost:3000';
const { app, ctx } = createApp({ db, mailer, clock, publicUrl: PUBLIC_URL, rateLimits: { signInPerIp: 1000 } });
const worker = createOutboxWorker(ctx);

beforeAll(() => resetDb(db));
// Whatever an earlier test queued goes out first, so each test reads only its own mail.
beforeEach(async () => {
  await worker.drain();
  smtp.clear();
});
afterAll(async () => {
  await smtp.stop();
  await pool.end();
});

const tokenOf = (url: string) => url.split('/').pop()!;
const NEW_PASSWORD = 'a-brand-new-passphrase';

async function invite(email: string) {
  const { agent } = await signInAs(app, db, 'admin');
  const res = await agent
    .post('/api/users')
    .set('Origin', TEST_ORIGIN)
    .send({ email, name: 'Mara Quell', role: 'technician' });
  expect(res.status).toBe(201);
  await worker.drain();
  const mail = smtp.messages.find((m) => m.envelopeTo.includes(email));
  if (!mail) throw new Error('no invitation arrived');
  return { admin: agent, user: res.body.user as { id: string }, mail, url: linkIn(mail.text, `${PUBLIC_URL}/invite/`) };
}

describe('invitations', () => {
  it('mails an invitation whose link sets a password and signs the person in', async () => {
    const { mail, url } = await invite('mara.quell@halyard.example');
    expect(mail.subject).toBe('You are invited to Tightloop');
    expect(mail.html).toContain(url);
    const token = tokenOf(url);

    const shown = await request(app).get(`/api/invitations/${token}`);
    expect(shown.status).toBe(200);
    expect(shown.body.link).toMatchObject({ email: 'mara.quell@halyard.example', name: 'Mara Quell' });
    const hours = (new Date(shown.body.link.expiresAt).getTime() - clock.now().getTime()) / 3600_000;
    expect(hours).toBeGreaterThan(71.9);
    expect(hours).toBeLessThanOrEqual(72);

    const agent = request.agent(app);
    const accepted = await agent
      .post(`/api/invitations/${token}`)
      .set('Origin', TEST_ORIGIN)
      .send({ password: NEW_PASSWORD });
    expect(accepted.status).toBe(200);
    expect(accepted.body.user.email).toBe('mara.quell@halyard.example');
    expect((await agent.get('/api/auth/me')).status).toBe(200);

    const signIn = await request(app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'mara.quell@halyard.example', password: NEW_PASSWORD });
    expect(signIn.status).toBe(200);

    const again = await request(app)
      .post(`/api/invitations/${token}`)
      .set('Origin', TEST_ORIGIN)
      .send({ password: 'another-passphrase' });
    expect(again.status).toBe(410);
    expect(again.body.error).toMatchObject({ code: 'link_used', message: expect.stringMatching(/already been used/) });
  });

  it('stores only the SHA-256 of the token', async () => {
    const { user, url } = await invite('hash.check@halyard.example');
    const token = tokenOf(url);
    const [link] = await db.select().from(accountLinks).where(eq(accountLinks.userId, user.id));
    expect(link.tokenHash).toBe(createHash('sha256').update(token).digest('hex'));
    const [queued] = await db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, 'hash.check@halyard.example'));
    expect(JSON.stringify(link)).not.toContain(token);
    expect(queued.sentAt).not.toBeNull();
  });

  it('sends no invitation when the admin sets the password', async () => {
    const { agent } = await signInAs(app, db, 'admin');
    const res = await agent.post('/api/users').set('Origin', TEST_ORIGIN).send({
      email: 'has.password@halyard.example',
      name: 'Has Password',
      role: 'owner',
      password: 'set-by-the-admin',
    });
    expect(res.status).toBe(201);
    expect(
      await db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, 'has.password@halyard.example')),
    ).toHaveLength(0);
  });

  it('fails an expired invitation with a clear message', async () => {
    const { user, url } = await invite('late.comer@halyard.example');
    await db
      .update(accountLinks)
      .set({ expiresAt: new Date(clock.now().getTime() - 1000) })
      .where(eq(accountLinks.userId, user.id));
    const shown = await request(app).get(`/api/invitations/${tokenOf(url)}`);
    expect(shown.status).toBe(410);
    expect(shown.body.error).toEqual({
      code: 'link_expired',
      message: 'This invitation has expired. Ask an administrator to send you a new one.',
    });
    const accept = await request(app)
      .post(`/api/invitations/${tokenOf(url)}`)
      .set('Origin', TEST_ORIGIN)
      .send({ password: NEW_PASSWORD });
    expect(accept.status).toBe(410);
    const [row] = await db.select().from(users).where(eq(users.id, user.id));
    expect(row.passwordHash).toBeNull();
  });

  it('re-sends an invitation: the new link works and the old one no longer does', async () => {
    const { admin, user, url: first } = await invite('twice.asked@halyard.example');
    smtp.clear();
    const resent = await admin.post(`/api/users/${user.id}/invitation`).set('Origin', TEST_ORIGIN).send({});
    expect(resent.status).toBe(202);
    await worker.drain();
    expect(smtp.messages).toHaveLength(1);
    const second = linkIn(smtp.messages[0].text, `${PUBLIC_URL}/invite/`);
    expect(second).not.toBe(first);
    expect((await request(app).get(`/api/invitations/${tokenOf(first)}`)).body.error.code).toBe('link_expired');
    const ok = await request(app)
      .post(`/api/invitations/${tokenOf(second)}`)
      .set('Origin', TEST_ORIGIN)
      .send({ password: NEW_PASSWORD });
    expect(ok.status).toBe(200);
  });

  it('answers re-send with 404 for an unknown user, 409 once a password is set, 403 for non-admins, 401 signed out', async () => {
    const { agent: admin } = await signInAs(app, db, 'admin');
    expect((await admin.post('/api/users/no-such-user/invitation').set('Origin', TEST_ORIGIN).send({})).status).toBe(
      404,
    );
    const withPassword = await createTestUser(db);
    const conflict = await admin.post(`/api/users/${withPassword.id}/invitation`).set('Origin', TEST_ORIGIN).send({});
    expect(conflict.status).toBe(409);
    const { agent: engineer } = await signInAs(app, db, 'engineer');
    expect(
      (await engineer.post(`/api/users/${withPassword.id}/invitation`).set('Origin', TEST_ORIGIN).send({})).status,
    ).toBe(403);
    expect(
      (await request(app).post(`/api/users/${withPassword.id}/invitation`).set('Origin', TEST_ORIGIN).send({})).status,
    ).toBe(401);
  });

  it('answers 404 for an unknown link and 400 for a short password', async () => {
    const unknown = await request(app).get('/api/invitations/not-a-real-token');
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('link_invalid');
    const { url } = await invite('short.pw@halyard.example');
    const short = await request(app)
      .post(`/api/invitations/${tokenOf(url)}`)
      .set('Origin', TEST_ORIGIN)
      .send({ password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.fields.password).toBeTruthy();
  });
});

describe('password reset', () => {
  async function requestReset(email: string) {
    return request(app).post('/api/password-reset').set('Origin', TEST_ORIGIN).send({ email });
  }

  it('gives the same answer for a known and an unknown address, and mails only the known one', async () => {
    const user = await createTestUser(db);
    const known = await requestReset(user.email);
    const unknown = await requestReset('nobody.here@halyard.example');
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(known.body).toEqual(unknown.body);
    await worker.drain();
    expect(smtp.messages.map((m) => m.envelopeTo[0])).toEqual([user.email]);
  });

  it('resets once through the link, signs out other sessions, and refuses the link a second time', async () => {
    const { agent: elsewhere, user } = await signInAs(app, db, 'engineer');
    expect((await elsewhere.get('/api/auth/me')).status).toBe(200);
    await requestReset(user.email.toUpperCase());
    await worker.drain();
    const url = linkIn(smtp.messages[0].text, `${PUBLIC_URL}/reset/`);
    const token = tokenOf(url);

    expect((await request(app).get(`/api/password-reset/${token}`)).body.link.email).toBe(user.email);
    const here = request.agent(app);
    const done = await here
      .post(`/api/password-reset/${token}`)
      .set('Origin', TEST_ORIGIN)
      .send({ password: NEW_PASSWORD });
    expect(done.status).toBe(200);
    expect((await here.get('/api/auth/me')).status).toBe(200);
    expect((await elsewhere.get('/api/auth/me')).status).toBe(401);

    const oldPw = await request(app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send({ email: user.email, password: TEST_PASSWORD });
    expect(oldPw.status).toBe(401);
    const newPw = await request(app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send({ email: user.email, password: NEW_PASSWORD });
    expect(newPw.status).toBe(200);

    const twice = await request(app)
      .post(`/api/password-reset/${token}`)
      .set('Origin', TEST_ORIGIN)
      .send({ password: 'yet-another-passphrase' });
    expect(twice.status).toBe(410);
    expect(twice.body.error.code).toBe('link_used');
  });

  it('expires the link after an hour', async () => {
    const user = await createTestUser(db);
    await requestReset(user.email);
    await worker.drain();
    const token = tokenOf(linkIn(smtp.messages[0].text, `${PUBLIC_URL}/reset/`));
    clock.advance(61 * 60_000);
    try {
      const res = await request(app)
        .post(`/api/password-reset/${token}`)
        .set('Origin', TEST_ORIGIN)
        .send({ password: NEW_PASSWORD });
      expect(res.status).toBe(410);
      expect(res.body.error).toEqual({
        code: 'link_expired',
        message: 'This password-reset link has expired. Ask for a new one on the sign-in page.',
      });
    } finally {
      clock.advance(-61 * 60_000);
    }
  });

  it('sends no link to a deactivated account', async () => {
    const user = await createTestUser(db, { active: false });
    expect((await requestReset(user.email)).status).toBe(202);
    await worker.drain();
    expect(smtp.messages).toHaveLength(0);
  });

  it('answers 400 for a malformed address and 404 for an unknown link', async () => {
    const bad = await requestReset('not-an-address');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.email).toBeTruthy();
    const unknown = await request(app)
      .post('/api/password-reset/nope')
      .set('Origin', TEST_ORIGIN)
      .send({ password: NEW_PASSWORD });
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('link_invalid');
  });

  it('rate-limits requests per e-mail address and per IP address', async () => {
    // The counters live in MariaDB and every app on this database shares them: start from none.
    await db.delete(rateLimits);
    const limited = createApp({ db, mailer, clock, rateLimits: { resetPerEmail: 2, resetPerIp: 4 } }).app;
    const send = (email: string) =>
      request(limited).post('/api/password-reset').set('Origin', TEST_ORIGIN).send({ email });
    const sameAddress = [
      await send('same@halyard.example'),
      await send('SAME@halyard.example'),
      await send('same@halyard.example'),
    ];
    expect(sameAddress.map((r) => r.status)).toEqual([202, 202, 429]);
    expect(sameAddress[2].body.error.code).toBe('rate_limited');
    const others = [await send('a@halyard.example'), await send('b@halyard.example')];
    expect(others.map((r) => r.status)).toEqual([202, 429]);
    expect(Number(others[1].headers['retry-after'])).toBeGreaterThan(0);
  });
});
