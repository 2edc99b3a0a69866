import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { alertSubscriptions, units, unitStats } from '../../server/db/schema';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, createTestUser, signInAs, TEST_ORIGIN } from '../support/factories';
import { createTestSite } from '../support/units';
import { recordVisits } from '../support/visits';

const { db, pool } = openTestDb();
const { app } = createApp({ db, rateLimits: { signInPerIp: 1000 } });
let engineer: TestAgent;
let technician: TestAgent;

beforeAll(async () => {
  await resetDb(db);
  engineer = (await signInAs(app, db, 'engineer')).agent;
  technician = (await signInAs(app, db, 'technician')).agent;
});
afterAll(() => pool.end());

const send = (agent: TestAgent, method: 'post' | 'patch' | 'delete', path: string, body: object = {}) =>
  agent[method](path).set('Origin', TEST_ORIGIN).send(body);

describe('sites', () => {
  it('creates a site with its code in upper case and lists it with its unit count for everyone', async () => {
    const res = await send(engineer, 'post', '/api/sites', {
      code: 'rtm-d1',
      name: 'Rotterdam east depot',
      kind: 'depot',
      country: 'nl',
    });
    expect(res.status).toBe(201);
    expect(res.body.site).toMatchObject({
      code: 'RTM-D1',
      name: 'Rotterdam east depot',
      kind: 'depot',
      country: 'NL',
      unitCount: 0,
    });
    await createTestUnit(db, { siteId: res.body.site.id });
    const list = await technician.get('/api/sites');
    expect(list.status).toBe(200);
    expect(list.body.sites.find((s: { code: string }) => s.code === 'RTM-D1')).toMatchObject({ unitCount: 1 });
    const one = await technician.get(`/api/sites/${res.body.site.id}`);
    expect(one.body.site).toMatchObject({ code: 'RTM-D1', unitCount: 1 });
  });

  it('accepts a vessel without a country', async () => {
    const res = await send(engineer, 'post', '/api/sites', {
      code: 'MV-HALYARD-STAR',
      name: 'MV Halyard Star',
      kind: 'vessel',
      country: '',
    });
    expect(res.status).toBe(201);
    expect(res.body.site.country).toBeNull();
  });

  it('answers 400 with fields for a bad kind, code or country', async () => {
    const res = await send(engineer, 'post', '/api/sites', {
      code: 'a b',
      name: '',
      kind: 'warehouse',
      country: 'Netherlands',
    });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['code', 'country', 'kind', 'name']);
  });

  it('answers 409 for a code already in use, on create and on edit', async () => {
    const a = await createTestSite(db, { code: 'DUP-A' });
    await createTestSite(db, { code: 'DUP-B' });
    expect((await send(engineer, 'post', '/api/sites', { code: 'dup-a', name: 'X', kind: 'terminal' })).status).toBe(
      409,
    );
    const edit = await send(engineer, 'patch', `/api/sites/${a.id}`, { code: 'DUP-B' });
    expect(edit.status).toBe(409);
    expect(edit.body.error.fields.code).toBeTruthy();
  });

  it('edits a site; 404 for an unknown one and 400 for an empty edit', async () => {
    const site = await createTestSite(db);
    const res = await send(engineer, 'patch', `/api/sites/${site.id}`, { name: 'Workshop north', kind: 'workshop' });
    expect(res.status).toBe(200);
    expect(res.body.site).toMatchObject({ name: 'Workshop north', kind: 'workshop', code: site.code });
    expect((await send(engineer, 'patch', '/api/sites/999999', { name: 'X' })).status).toBe(404);
    expect((await send(engineer, 'patch', `/api/sites/${site.id}`, {})).status).toBe(400);
    expect((await technician.get('/api/sites/999999')).status).toBe(404);
  });

  it('removes an empty site, but not one that still has units (409)', async () => {
    const empty = await createTestSite(db);
    const busy = await createTestSite(db);
    await createTestUnit(db, { siteId: busy.id });
    expect((await send(engineer, 'delete', `/api/sites/${empty.id}`)).status).toBe(204);
    expect((await technician.get(`/api/sites/${empty.id}`)).status).toBe(404);
    const refused = await send(engineer, 'delete', `/api/sites/${busy.id}`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toContain('1 unit is at this site');
    expect((await send(engineer, 'delete', '/api/sites/999999')).status).toBe(404);
  });

  it('returns 409 saying why when a site with history is removed, even after its units moved away', async () => {
    const depot = await createTestSite(db);
    const elsewhere = await createTestSite(db);
    const unit = await createTestUnit(db, { siteId: depot.id });
    const visit = await technician
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({
        idempotencyKey: randomUUID(),
        unitId: unit.id,
        siteId: depot.id,
        occurredAt: new Date(Date.now() - 3600_000).toISOString(),
        events: [{ kind: 'pti', passed: true }],
      });
    expect(visit.status).toBe(201);
    const withUnit = await send(engineer, 'delete', `/api/sites/${depot.id}`);
    expect(withUnit.status).toBe(409);
    expect(withUnit.body.error).toMatchObject({ code: 'conflict' });
    expect(withUnit.body.error.message).toContain('move them to another site');

    await db.update(units).set({ siteId: elsewhere.id }).where(eq(units.id, unit.id));
    const withHistory = await send(engineer, 'delete', `/api/sites/${depot.id}`);
    expect(withHistory.status).toBe(409);
    expect(withHistory.body.error.message).toContain('service history');
    expect((await technician.get(`/api/sites/${depot.id}`)).status).toBe(200);
  });

  it('removes a site that only has alert subscriptions, and the subscriptions with it', async () => {
    const site = await createTestSite(db);
    const user = await createTestUser(db, { role: 'engineer' });
    await db.insert(alertSubscriptions).values({ userId: user.id, siteId: site.id, kind: 'chronic' });
    expect((await send(engineer, 'delete', `/api/sites/${site.id}`)).status).toBe(204);
    expect(await db.select().from(alertSubscriptions).where(eq(alertSubscriptions.siteId, site.id))).toEqual([]);
  });

  it('lets a technician read sites but not change them; a visitor gets 401', async () => {
    const site = await createTestSite(db);
    expect((await send(technician, 'post', '/api/sites', { code: 'TECH', name: 'X', kind: 'depot' })).status).toBe(403);
    expect((await send(technician, 'patch', `/api/sites/${site.id}`, { name: 'X' })).status).toBe(403);
    expect((await send(technician, 'delete', `/api/sites/${site.id}`)).status).toBe(403);
    expect((await request(app).get('/api/sites')).status).toBe(401);
  });
});

describe('rules by site', () => {
  const intervalOf = async (unitId: number) =>
    (await db.select().from(unitStats).where(eq(unitStats.unitId, unitId)))[0]?.leakCheckIntervalMonths ?? null;

  it('gives two leak-check intervals for the same unit data at sites under different jurisdictions', async () => {
    const eu = await send(engineer, 'post', '/api/sites', {
      code: 'RULE-EU',
      name: 'Rule depot EU',
      kind: 'depot',
      jurisdiction: 'EU',
      timeZone: 'Europe/Amsterdam',
    });
    const us = await send(engineer, 'post', '/api/sites', {
      code: 'RULE-US',
      name: 'Rule depot US',
      kind: 'depot',
      jurisdiction: 'US',
      timeZone: 'America/New_York',
    });
    expect(eu.status).toBe(201);
    expect(us.body.site).toMatchObject({ jurisdiction: 'US', timeZone: 'America/New_York' });
    // 5 kg of R-134a: 7.15 t CO2e (EU: a check every 12 months), under the US 15 lb threshold (no federal duty).
    const atEu = (await createTestUnit(db, { siteId: eu.body.site.id })).id;
    const atUs = (await createTestUnit(db, { siteId: us.body.site.id })).id;
    for (const [unitId, siteId] of [
      [atEu, eu.body.site.id],
      [atUs, us.body.site.id],
    ])
      await recordVisits(technician, unitId, [
        {
          at: '2026-03-01T09:00:00Z',
          siteId,
          events: [{ kind: 'leak_check', method: 'electronic_detector', leakFound: false }],
        },
      ]);
    expect(await intervalOf(atEu)).toBe(12);
    expect(await intervalOf(atUs)).toBeNull();
    // The unit page's entries carry the site's zone, in which their times are shown.
    const history = await technician.get(`/api/units/${atUs}/history`);
    expect(JSON.stringify(history.body)).toContain('"timeZone":"America/New_York"');

    // The US site switches to the EU rule: its unit's stored figures follow at once.
    const changed = await send(engineer, 'patch', `/api/sites/${us.body.site.id}`, { jurisdiction: 'EU' });
    expect(changed.status).toBe(200);
    expect(await intervalOf(atUs)).toBe(12);
  });

  it('returns 400 with the field for a time zone Intl does not know and clears the rule with a blank', async () => {
    const site = await createTestSite(db, { name: 'Zone test' });
    const bad = await send(engineer, 'patch', `/api/sites/${site.id}`, { timeZone: 'Mars/Olympus' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.timeZone).toMatch(/time zone/);
    const cleared = await send(engineer, 'patch', `/api/sites/${site.id}`, { jurisdiction: '', timeZone: '' });
    expect(cleared.status).toBe(200);
    expect(cleared.body.site).toMatchObject({ jurisdiction: null, timeZone: null });
  });
});
