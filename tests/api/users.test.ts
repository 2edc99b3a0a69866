import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app';
import { openTestDb, resetDb } from '../support/db';
import { signInAs, TEST_ORIGIN } from '../support/factories';

const { db, pool } = openTestDb();
const { app } = createApp({ db, rateLimits: { signInPerIp: 1000 } });

beforeAll(() => resetDb(db));
afterAll(() => pool.end());

describe('people (admin)', () => {
  it('lists, creates and updates users', async () => {
    const { agent } = await signInAs(app, db, 'admin');
    const created = await agent.post('/api/users').set('Origin', TEST_ORIGIN).send({
      email: 'New.Tech@Test.example',
      name: 'New Tech',
      role: 'technician',
      certificateNumber: 'C-1',
      password: 'a-long-password',
    });
    expect(created.status).toBe(201);
    expect(created.body.user).toMatchObject({
      email: 'new.tech@test.example',
      role: 'technician',
      certificateNumber: 'C-1',
      active: true,
    });
    const list = await agent.get('/api/users');
    expect(list.status).toBe(200);
    expect(list.body.users.map((u: { email: string }) => u.email)).toContain('new.tech@test.example');
    const id = created.body.user.id;
    const promoted = await agent.patch(`/api/users/${id}`).set('Origin', TEST_ORIGIN).send({ role: 'engineer' });
    expect(promoted.status).toBe(200);
    expect(promoted.body.user.role).toBe('engineer');
  });

  it('answers 409 for an e-mail already in use', async () => {
    const { agent, user } = await signInAs(app, db, 'admin');
    const res = await agent
      .post('/api/users')
      .set('Origin', TEST_ORIGIN)
      .send({ email: user.email, name: 'Dup', role: 'owner' });
    expect(res.status).toBe(409);
    expect(res.body.error.fields.email).toBeTruthy();
  });

  it('returns one 201 and 409 for the rest when the same person is added several times at once', async () => {
    const admins = await Promise.all([signInAs(app, db, 'admin'), signInAs(app, db, 'admin')]);
    for (const [round, password] of [undefined, 'a-long-password', undefined].entries()) {
      const email = `twice.${round}@test.example`;
      const results = await Promise.all(
        Array.from({ length: 6 }, (_, i) =>
          admins[i % 2].agent
            .post('/api/users')
            .set('Origin', TEST_ORIGIN)
            .send({ email, name: `Twice ${round}`, role: 'technician', ...(password && { password }) }),
        ),
      );
      const statuses = results.map((r) => r.status).sort();
      expect(statuses, JSON.stringify(results.map((r) => r.body))).toEqual([201, 409, 409, 409, 409, 409]);
      for (const r of results.filter((x) => x.status === 409)) expect(r.body.error.fields.email).toBe('Already in use');
    }
  });

  it('answers 400 with fields for an unknown role or a short password', async () => {
    const { agent } = await signInAs(app, db, 'admin');
    const res = await agent
      .post('/api/users')
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'x@test.example', name: 'X', role: 'captain', password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toMatchObject({ role: expect.any(String), password: expect.any(String) });
  });

  it('answers 404 for an unknown user and 400 for an empty change', async () => {
    const { agent, user } = await signInAs(app, db, 'admin');
    expect((await agent.patch('/api/users/nope').set('Origin', TEST_ORIGIN).send({ active: false })).status).toBe(404);
    expect((await agent.patch(`/api/users/${user.id}`).set('Origin', TEST_ORIGIN).send({})).status).toBe(400);
  });

  it('will not let an admin deactivate or demote themself', async () => {
    const { agent, user } = await signInAs(app, db, 'admin');
    const off = await agent.patch(`/api/users/${user.id}`).set('Origin', TEST_ORIGIN).send({ active: false });
    expect(off.status).toBe(409);
    const demote = await agent.patch(`/api/users/${user.id}`).set('Origin', TEST_ORIGIN).send({ role: 'owner' });
    expect(demote.status).toBe(409);
  });

  it('revokes the sessions of a deactivated user at once', async () => {
    const { agent: admin } = await signInAs(app, db, 'admin');
    const { agent: tech, user } = await signInAs(app, db, 'technician');
    expect((await tech.get('/api/auth/me')).status).toBe(200);
    const res = await admin.patch(`/api/users/${user.id}`).set('Origin', TEST_ORIGIN).send({ active: false });
    expect(res.status).toBe(200);
    expect((await tech.get('/api/auth/me')).status).toBe(401);
    const again = await request(app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send({ email: user.email, password: 'correct-horse-battery' });
    // The right password of a deactivated account is told what happened instead of a wrong-password 401.
    expect(again.status).toBe(403);
    expect(again.body.error.code).toBe('account_deactivated');
  });
});
