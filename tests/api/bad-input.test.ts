import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { createApp } from '../../server/app';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';

const { db, pool } = openTestDb();
const { app } = createApp({ db, rateLimits: { signInPerIp: 1000 } });
let engineer: TestAgent;
let admin: TestAgent;

beforeAll(async () => {
  await resetDb(db);
  engineer = (await signInAs(app, db, 'engineer')).agent;
  admin = (await signInAs(app, db, 'admin')).agent;
});
afterAll(() => pool.end());

// JSON text as a client would send it: the escape stays an escape, JSON.parse on the server makes the lone half.
const LONE = '\\ud800';
const rawJson = (agent: TestAgent | ReturnType<typeof request>, method: 'post' | 'patch', path: string, json: string) =>
  (agent as TestAgent)[method](path).set('Origin', TEST_ORIGIN).set('Content-Type', 'application/json').send(json);

const expectRefused = (res: request.Response, field: string) => {
  expect(res.status, JSON.stringify(res.body)).toBe(400);
  expect(res.body.error.code).toBe('invalid_input');
  expect(res.body.error.message).toContain('not valid Unicode');
  expect(res.body.error.fields).toEqual({ [field]: expect.any(String) });
};

describe('malformed unicode', () => {
  it('returns 400 naming the field when a site name holds a lone surrogate', async () => {
    const res = await rawJson(
      engineer,
      'post',
      '/api/sites',
      `{"code":"LONE-1","name":"Depot ${LONE}","kind":"depot"}`,
    );
    expectRefused(res, 'name');
    expect((await engineer.get('/api/sites')).body.sites).toEqual([]);
  });

  it('returns 400 for a lone surrogate deep in a visit, in a user edit and in a sign-in', async () => {
    const unit = await createTestUnit(db);
    // JSON.stringify escapes the lone half as \ud800, as any client would send it. The free text of an "other"
    // location goes to a JSON column, whose check refused it with a 500 before.
    const visit = await engineer
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({
        idempotencyKey: 'lone-surrogate-visit',
        unitId: unit.id,
        occurredAt: new Date(Date.now() - 3600_000).toISOString(),
        events: [
          { kind: 'note', note: 'Valve photographed' },
          {
            kind: 'leak_check',
            method: 'electronic_detector',
            leakFound: true,
            location: 'other',
            locationOther: 'Behind \ud83d panel',
          },
        ],
      });
    expectRefused(visit, 'events.1.locationOther');
    const { user } = await signInAs(app, db, 'technician');
    expectRefused(await rawJson(admin, 'patch', `/api/users/${user.id}`, `{"name":"Tech \\udfff"}`), 'name');
    expectRefused(
      await rawJson(request(app), 'post', '/api/auth/sign-in', `{"email":"a${LONE}@b.example","password":"x"}`),
      'email',
    );
  });

  it('returns 400 for a lone surrogate in a key of the body', async () => {
    expectRefused(await rawJson(engineer, 'post', '/api/sites', `{"${LONE}":"x"}`), '\ufffd');
  });

  it('returns 400 for an encoded surrogate or other bytes that are not UTF-8 in the query or the path', async () => {
    expectRefused(await engineer.get('/api/fleet?q=%ED%A0%80'), 'q');
    expectRefused(await engineer.get('/api/fleet?sort=name&q=caf%E9'), 'q');
    expectRefused(await engineer.get('/api/sites/%ED%A0%80'), '_');
    expectRefused(await engineer.get('/api/fleet/export.csv?q=%FF%FE'), 'q');
    expectRefused(await engineer.get('/api/traceability?from=2026-01-01&cylinder=CYL-%ED%B0%80'), 'cylinder');
  });

  it('returns 400 for a JSON body whose bytes are not UTF-8', async () => {
    const body = Buffer.concat([
      Buffer.from('{"code":"BYTES","name":"Caf'),
      Buffer.from([0xe9]),
      Buffer.from('","kind":"depot"}'),
    ]);
    const res = await engineer
      .post('/api/sites')
      .set('Origin', TEST_ORIGIN)
      .set('Content-Type', 'application/json')
      // Sent as the bytes they are, not JSON-encoded as a Buffer object.
      .serialize(((b: Buffer) => b) as unknown as (body: unknown) => string)
      .send(body);
    expectRefused(res, '_');
  });

  it('keeps accepting well-formed text: emoji, accents and a percent sign in a search', async () => {
    const created = await engineer
      .post('/api/sites')
      .set('Origin', TEST_ORIGIN)
      .send({ code: 'EMOJI-1', name: 'Dépôt 🚢 Zürich', kind: 'depot' });
    expect(created.status).toBe(201);
    expect(created.body.site.name).toBe('Dépôt 🚢 Zürich');
    expect((await engineer.get(`/api/traceability?cylinder=${encodeURIComponent('Zü🚢')}`)).status).toBe(200);
    expect((await engineer.get('/api/traceability?cylinder=50%zz+%E2%82%AC')).status).toBe(200);
    expect((await engineer.get(`/api/sites/${created.body.site.id}`)).status).toBe(200);
  });

  it('answers a JSON body nested a hundred thousand deep quickly and without a 500', async () => {
    const deep = `${'['.repeat(100_000)}"${LONE}"${']'.repeat(100_000)}`;
    const started = performance.now();
    const res = await rawJson(
      engineer,
      'post',
      '/api/sites',
      `{"code":"DEEP","name":"x","kind":"depot","extra":${deep}}`,
    );
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ [`extra${'.0'.repeat(100_000)}`]: expect.any(String) });
    expect(performance.now() - started).toBeLessThan(1000);
  });
});
