import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import net from 'node:net';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { createApp } from '../../server/app';
import { createHttpServer } from '../../server/lib/http-server';
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

describe('slow clients', () => {
  // Short limits so the test is quick; production uses SERVER_TIMEOUTS and a 15 s body deadline.
  const limits = { bodyMs: 500, headersMs: 600, requestMs: 1500, checkIntervalMs: 100 };
  const slowApp = createApp({ db, bodyDeadlineMs: limits.bodyMs }).app;
  const server = createHttpServer(slowApp, limits);
  let port: number;
  beforeAll(
    () =>
      new Promise<void>((r) =>
        server.listen(0, '127.0.0.1', () => {
          port = (server.address() as AddressInfo).port;
          r();
        }),
      ),
  );
  afterAll(
    () =>
      new Promise<void>((r) => {
        server.closeAllConnections();
        server.close(() => r());
      }),
  );

  /** Sends `head` at once, then `drip` one byte every 100 ms; resolves when the server closes the connection. */
  const slowRequest = (head: string, drip: string) =>
    new Promise<{ ms: number; response: string }>((resolve, reject) => {
      const started = performance.now();
      const socket = net.connect(port, '127.0.0.1');
      let response = '';
      let i = 0;
      const timer = setInterval(() => {
        if (i < drip.length && !socket.destroyed) socket.write(drip[i++]);
      }, 100);
      socket.on('connect', () => socket.write(head));
      socket.on('data', (d) => (response += d.toString()));
      socket.on('error', () => {}); // a reset after the cut is expected
      socket.on('close', () => {
        clearInterval(timer);
        resolve({ ms: performance.now() - started, response });
      });
      setTimeout(() => {
        socket.destroy();
        reject(new Error(`still connected after 5 s; got ${response}`));
      }, 5000).unref();
    });

  it('answers 408 and disconnects a client that sends a JSON body too slowly', async () => {
    const body = '{"email":"slow@test.example","password":"x"}';
    const { ms, response } = await slowRequest(
      `POST /api/auth/sign-in HTTP/1.1\r\nHost: 127.0.0.1\r\nOrigin: ${TEST_ORIGIN}\r\nContent-Type: application/json\r\nContent-Length: ${body.length}\r\n\r\n`,
      body,
    );
    expect(response).toMatch(/^HTTP\/1\.1 408/);
    expect(response).toContain('request_timeout');
    expect(ms).toBeGreaterThanOrEqual(limits.bodyMs - 50);
    expect(ms).toBeLessThan(limits.bodyMs + 700);
  });

  it('disconnects an upload that is still arriving at the request timeout', async () => {
    const body = `--b\r\nContent-Disposition: form-data; name="file"; filename="f.csv"\r\n\r\n${'x'.repeat(200)}\r\n--b--\r\n`;
    const { ms, response } = await slowRequest(
      `POST /api/unit-imports/preview HTTP/1.1\r\nHost: 127.0.0.1\r\nOrigin: ${TEST_ORIGIN}\r\nContent-Type: multipart/form-data; boundary=b\r\nContent-Length: ${body.length}\r\n\r\n`,
      body,
    );
    expect(ms).toBeLessThan(limits.requestMs + limits.checkIntervalMs + 700);
    expect(response).not.toMatch(/^HTTP\/1\.1 [25]/);
  });

  it('disconnects a client that sends its headers too slowly', async () => {
    const { ms, response } = await slowRequest('GET /api/health HTTP/1.1\r\n', 'X-Slow: ' + 'a'.repeat(100));
    expect(response).toMatch(/^HTTP\/1\.1 408/);
    expect(ms).toBeLessThan(limits.headersMs + limits.checkIntervalMs + 700);
  });

  it('still serves a client that sends at ordinary speed', async () => {
    const res = await request(server)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send({ email: 'nobody@test.example', password: 'x' });
    expect(res.status).toBe(401);
  });
});
