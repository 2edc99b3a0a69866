// Two apps on one database stand for two API processes behind the load balancer: each keeps its own caches in
// memory. A change made through one must be what the other answers at once, and limits count over both.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { randomUUID } from 'node:crypto';
import type { Express } from 'express';
import { createApp } from '../../server/app';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, createTestUser, signInAs, TEST_ORIGIN, TEST_PASSWORD } from '../support/factories';
import { halyardNumber } from '../support/units';

const { db, pool } = openTestDb();
const NOW = new Date('2026-06-01T12:00:00Z');
const clock = { now: () => NOW };
const a = createApp({ db, clock });
const b = createApp({ db, clock });

beforeAll(() => resetDb(db));
afterAll(async () => {
  await Promise.all([a.ctx.jobs.waitForAll(), b.ctx.jobs.waitForAll()]);
  await pool.end();
});

/** A signed-in session (its cookie) that works on both apps: sessions live in the database. */
async function session(role: Parameters<typeof signInAs>[2]) {
  const user = await createTestUser(db, { role });
  const res = await request(a.app)
    .post('/api/auth/sign-in')
    .set('Origin', TEST_ORIGIN)
    .send({ email: user.email, password: TEST_PASSWORD });
  expect(res.status).toBe(200);
  const cookie = (res.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
  return {
    get: (app: Express, path: string) => request(app).get(path).set('Cookie', cookie),
    send: (app: Express, method: 'post' | 'put', path: string, body: object) =>
      request(app)[method](path).set('Cookie', cookie).set('Origin', TEST_ORIGIN).send(body),
  };
}

describe('two API processes on one database', () => {
  it('counts wrong passwords sent to either process against the same limit', async () => {
    const user = await createTestUser(db, { role: 'technician' });
    const answers: number[] = [];
    for (let n = 0; n < 8; n++) {
      const res = await request(n % 2 ? b.app : a.app)
        .post('/api/auth/sign-in')
        .set('Origin', TEST_ORIGIN)
        .send({ email: user.email, password: 'not the password at all' });
      answers.push(res.status);
    }
    // Five free tries in all, not five per process; then each try has to wait.
    expect(answers.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    expect(answers.slice(5)).toContain(429);
  });

  it('uses settings saved through one process in the other at once', async () => {
    const admin = await session('admin');
    const engineer = await session('engineer');
    const before = await engineer.get(b.app, '/api/fleet/overview');
    expect(before.status).toBe(200);
    const threshold = before.body.leakRate.thresholdPct as number;
    const current = (await admin.get(a.app, '/api/settings')).body;
    const saved = await admin.send(a.app, 'put', '/api/settings', {
      settings: { ...current.settings, leakRateThresholdPct: threshold + 5 },
      baseVersion: current.version ?? null,
    });
    expect(saved.status).toBe(200);
    const after = await engineer.get(b.app, '/api/fleet/overview');
    expect(after.body.leakRate.thresholdPct).toBe(threshold + 5);
  });

  it('shows a top-up recorded through one process in the other’s monthly totals at once', async () => {
    const technician = await session('technician');
    const engineer = await session('engineer');
    const unit = await createTestUnit(db, { refrigerant: 'R-134a' });
    const month = (body: {
      emissions: { byRefrigerant: { month: string; refrigerant: string; madeUpKg: number }[] };
    }) =>
      body.emissions.byRefrigerant
        .filter((r) => r.month === '2026-05' && r.refrigerant === 'R-134a')
        .reduce((s, r) => s + r.madeUpKg, 0);
    // Process B reads (and keeps) the totals first.
    const before = month((await engineer.get(b.app, '/api/fleet/overview?months=12')).body);
    const visit = await technician.send(a.app, 'post', '/api/visits', {
      idempotencyKey: randomUUID(),
      unitId: unit.id,
      occurredAt: '2026-05-20T10:00:00Z',
      events: [{ kind: 'top_up', kg: 1.25, cylinder: 'CYL-S1' }],
    });
    expect(visit.status).toBe(201);
    const after = month((await engineer.get(b.app, '/api/fleet/overview?months=12')).body);
    expect(after - before).toBeCloseTo(1.25, 6);
  });

  it('counts a unit registered through one process in the other’s fleet size at once', async () => {
    const engineer = await session('engineer');
    const total = async () => (await engineer.get(b.app, '/api/fleet?count=1')).body.count.total as number;
    const before = await total();
    const res = await engineer.send(a.app, 'post', '/api/units', {
      containerNumber: halyardNumber(700_123),
      refrigerant: 'R-134a',
      nominalChargeKg: 4,
    });
    expect(res.status).toBe(201);
    expect(await total()).toBe(before + 1);
  });
});
