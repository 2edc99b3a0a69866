// Every API route × every role, generated from the route table and shared/permissions.ts: a new route cannot skip it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { createApp } from '../../server/app';
import { can, ROLES, type Role } from '../../shared/permissions';
import { openTestDb, resetDb } from '../support/db';
import { signInAs, TEST_ORIGIN } from '../support/factories';

const { db, pool } = openTestDb();
const { app, routes } = createApp({ db, rateLimits: { signInPerIp: 1000 } });
const agents = {} as Record<Role, TestAgent>;

beforeAll(async () => {
  await resetDb(db);
  for (const role of ROLES) agents[role] = (await signInAs(app, db, role)).agent;
});
afterAll(() => pool.end());

const concrete = (path: string) =>
  path.replace(/:(\w+)/g, (_m, name: string) => (/id$/i.test(name) ? '999999' : 'zz-unknown'));

function send(agent: TestAgent | ReturnType<typeof request>, method: string, path: string) {
  const m = method as 'get' | 'post' | 'patch' | 'put' | 'delete';
  const req = agent[m](path);
  return method === 'get' ? req : req.set('Origin', TEST_ORIGIN).send({});
}

import type { Access } from '../../server/lib/route';

const guarded = routes.filter((r): r is typeof r & { access: Exclude<Access, 'public'> } => r.access !== 'public');

describe('role × route matrix', () => {
  it('has protected routes to check', () => {
    expect(guarded.length).toBeGreaterThan(3);
  });

  for (const r of guarded) {
    it(`${r.method.toUpperCase()} ${r.path} answers 401 without a session`, async () => {
      const res = await send(request(app), r.method, concrete(r.path));
      expect(res.status).toBe(401);
    });
    for (const role of ROLES) {
      const allowed = r.access === 'signed-in' || can({ role }, r.access);
      it(`${r.method.toUpperCase()} ${r.path} is ${allowed ? 'allowed' : 'refused with 403'} for ${role}`, async () => {
        const res = await send(agents[role], r.method, concrete(r.path));
        if (allowed) {
          expect(res.status).not.toBe(403);
          expect(res.status).not.toBe(401);
          expect(res.status).toBeLessThan(500);
        } else {
          expect(res.status).toBe(403);
          expect(res.body.error.code).toBe('forbidden');
        }
      });
    }
  }
});
