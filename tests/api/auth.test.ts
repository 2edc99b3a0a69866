import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { eq, sql } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { rateLimits, sessions } from '../../server/db/schema';
import { openTestDb, resetDb } from '../support/db';
import { createTestUser, signInAs, TEST_ORIGIN, TEST_PASSWORD } from '../support/factories';

const { db, pool } = openTestDb();
const { app } = createApp({ db });

beforeAll(() => resetDb(db));
afterAll(() => pool.end());

describe('sign-in', () => {
  it('signs in with the right password and sets an HttpOnly, SameSite=Lax session cookie', async () => {
    const user = await createTestUser(db, { role: 'engineer' });
    const res = await request(app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send({ email: user.email.toUpperCase(), password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: user.email, role: 'engineer', active: true });
    expect(res.body.user.passwordHash).toBeUndefined();
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/tl_session=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i);
  });

  it('marks the cookie Secure with the __Host- prefix when PUBLIC_URL is https', async () => {
    const secure = createApp({ db, publicUrl: 'https://tightloop.example' }).app;
    const user = await createTestUser(db);
    const res = await request(secure)
      .post('/api/auth/sign-in')
      .set('Origin', 'https://tightloop.example')
      .send({ email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/__Host-tl_session=[^;]+;.*Path=\/;.*Secure/);
    expect(cookie).not.toMatch(/Domain=/i);
  });

  it('gives the same answer for an unknown e-mail and a wrong password', async () => {
    const user = await createTestUser(db);
    const wrong = await request(app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send({ email: user.email, password: 'nope-nope-nope' });
    const unknown = await request(app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'nobody@test.example', password: 'nope-nope-nope' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe('invalid_credentials');
  });

  it('tells a deactivated person with the right password that the account was deactivated (403), and signs nobody in', async () => {
    const user = await createTestUser(db, { active: false });
    const res = await request(app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send({ email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('account_deactivated');
    expect(res.body.error.message).toMatch(/administrator deactivated this account/);
    expect(res.headers['set-cookie'] ?? []).not.toEqual(
      expect.arrayContaining([expect.stringMatching(/tl_session=[^;]/)]),
    );
  });

  it('answers a wrong password for a deactivated account like any wrong password', async () => {
    const user = await createTestUser(db, { active: false });
    const res = await request(app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send({ email: user.email, password: 'nope-nope-nope' });
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('invalid_credentials');
  });

  it('answers 400 with field errors for wrong types, and never a 500', async () => {
    const res = await request(app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send({ email: 42, password: ['x'] });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    expect(Object.keys(res.body.error.fields)).toEqual(expect.arrayContaining(['email', 'password']));
  });

  it('answers 400 invalid_json for a body that is not JSON, without a stack trace', async () => {
    const res = await request(app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .set('Content-Type', 'application/json')
      .send('{"email": "a@b.c", ');
    expect(res.status).toBe(400);
    expect(res.body).toEqual({ error: { code: 'invalid_json', message: expect.any(String) } });
    expect(res.text).not.toMatch(/at .*\.ts:\d+/);
  });

  it('rate-limits failed sign-ins per address across accounts', async () => {
    await db.delete(rateLimits);
    const limited = createApp({ db, rateLimits: { signInPerIp: 3 } }).app;
    const codes: number[] = [];
    for (let i = 0; i < 4; i++) {
      const res = await request(limited)
        .post('/api/auth/sign-in')
        .set('Origin', TEST_ORIGIN)
        .send({ email: `x${i}@test.example`, password: 'whatever-x' });
      codes.push(res.status);
    }
    expect(codes).toEqual([401, 401, 401, 429]);
    await db.delete(rateLimits);
  });

  it('does not count successful sign-ins against the address', async () => {
    await db.delete(rateLimits);
    const limited = createApp({ db, rateLimits: { signInPerIp: 2 } }).app;
    for (let i = 0; i < 4; i++) {
      const user = await createTestUser(db);
      const res = await request(limited)
        .post('/api/auth/sign-in')
        .set('Origin', TEST_ORIGIN)
        .send({ email: user.email, password: TEST_PASSWORD });
      expect(res.status).toBe(200);
    }
  });
});

describe('sessions', () => {
  it('returns the signed-in user from /api/auth/me and 401 without a session', async () => {
    const { agent, user } = await signInAs(app, db, 'owner');
    const me = await agent.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.id).toBe(user.id);
    const anon = await request(app).get('/api/auth/me');
    expect(anon.status).toBe(401);
    expect(anon.body.error.code).toBe('unauthenticated');
  });

  it('ends the session on sign-out', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const out = await agent.post('/api/auth/sign-out').set('Origin', TEST_ORIGIN);
    expect(out.status).toBe(204);
    expect((await agent.get('/api/auth/me')).status).toBe(401);
  });

  it('refuses an expired session', async () => {
    const { agent, user } = await signInAs(app, db, 'technician');
    await db
      .update(sessions)
      .set({ expiresAt: new Date(Date.now() - 60_000) })
      .where(eq(sessions.userId, user.id));
    const res = await agent.get('/api/auth/me');
    expect(res.status).toBe(401);
  });

  it('moves the idle deadline on when the session is used', async () => {
    const { agent, user } = await signInAs(app, db, 'engineer');
    const hourAgo = new Date(Date.now() - 3600_000);
    await db
      .update(sessions)
      .set({ lastSeenAt: hourAgo, expiresAt: new Date(hourAgo.getTime() + 12 * 3600_000) })
      .where(eq(sessions.userId, user.id));
    expect((await agent.get('/api/auth/me')).status).toBe(200);
    const [row] = await db.select().from(sessions).where(eq(sessions.userId, user.id));
    expect(row.lastSeenAt.getTime()).toBeGreaterThan(hourAgo.getTime() + 30 * 60_000);
    expect(row.expiresAt.getTime()).toBeGreaterThan(Date.now() + 11.9 * 3600_000);
  });

  it('answers 401 for a user deactivated while signed in', async () => {
    const { agent, user } = await signInAs(app, db, 'engineer');
    await db.execute(sql`UPDATE users SET active = false WHERE id = ${user.id}`);
    expect((await agent.get('/api/auth/me')).status).toBe(401);
    const [left] = await db
      .select({ n: sql<number>`count(*)` })
      .from(sessions)
      .where(eq(sessions.userId, user.id));
    expect(Number(left.n)).toBe(0);
  });
});

describe('request guards', () => {
  it('refuses a write without an Origin header with 403', async () => {
    const { agent } = await signInAs(app, db, 'admin');
    const res = await agent.post('/api/users').send({ email: 'a@test.example', name: 'A', role: 'owner' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad_origin');
  });

  it('refuses a write from a foreign Origin with 403', async () => {
    const { agent } = await signInAs(app, db, 'admin');
    const res = await agent
      .post('/api/users')
      .set('Origin', 'https://evil.example')
      .send({ email: 'a@test.example', name: 'A', role: 'owner' });
    expect(res.status).toBe(403);
  });

  it('answers unknown API routes with a JSON 404', async () => {
    const res = await request(app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('sends security headers with a same-origin content security policy', async () => {
    const res = await request(app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.headers['content-security-policy']).toMatch(/default-src 'self'/);
    expect(res.headers['x-powered-by']).toBeUndefined();
    expect(res.headers['x-request-id']).toBeTruthy();
  });

  it('refuses an oversized body with 413', async () => {
    const res = await request(app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'a@test.example', password: 'x'.repeat(400_000) });
    expect(res.status).toBe(413);
  });
});
