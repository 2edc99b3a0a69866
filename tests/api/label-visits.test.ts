// Issue 19: a scanned label's figures in the same round trip as its unit, a visit recorded offline at a label the
// phone had never opened (sent by the label's token, once), and a depot's units for a phone to keep offline.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { count, eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { sites, visits } from '../../server/db/schema';
import { OVERVIEWS_PAGE_SIZE } from '../../shared/schemas/history';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';

const { db, pool } = openTestDb();
const now = new Date('2026-06-01T12:00:00Z');
const { app } = createApp({ db, clock: { now: () => now }, rateLimits: { signInPerIp: 1000 } });

beforeAll(() => resetDb(db));
afterAll(() => pool.end());

const visitsOf = async (unitId: number) =>
  Number((await db.select({ n: count() }).from(visits).where(eq(visits.unitId, unitId)))[0].n);
const topUp = (kg: number) => ({
  occurredAt: '2026-06-01T09:30:00Z',
  events: [{ kind: 'top_up', kg, cylinder: 'CYL-LBL-1' }],
});

describe("a label's figures by its token", () => {
  it("answers the same figures and first history page as the unit's own overview", async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const unit = await createTestUnit(db);
    await agent
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({ idempotencyKey: randomUUID(), unitId: unit.id, ...topUp(0.4) })
      .expect(201);
    const byToken = await agent.get(`/api/units/by-token/${unit.qrToken}/overview`);
    expect(byToken.status).toBe(200);
    const byId = await agent.get(`/api/units/${unit.id}/overview`);
    expect(byToken.body).toEqual(byId.body);
    expect(byToken.body.history.events).toHaveLength(1);
  });

  it('returns 404 for a label that is not linked to any unit, 400 for text that is no label code', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const unknown = await agent.get(`/api/units/by-token/${'A'.repeat(43)}/overview`);
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toMatch(/not linked to any unit/);
    const malformed = await agent.get('/api/units/by-token/not*a*token/overview');
    expect(malformed.status).toBe(400);
  });

  it('returns 401 without a session', async () => {
    const unit = await createTestUnit(db);
    expect((await request(app).get(`/api/units/by-token/${unit.qrToken}/overview`)).status).toBe(401);
  });
});

describe('a visit sent by the label it was recorded at', () => {
  it("lands on the label's unit through the write path, and once however often it is sent", async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const unit = await createTestUnit(db, { nominalChargeKg: 4 });
    const other = await createTestUnit(db);
    const body = { idempotencyKey: randomUUID(), qrToken: unit.qrToken, ...topUp(0.6) };
    const first = await agent.post('/api/visits').set('Origin', TEST_ORIGIN).send(body);
    expect(first.status).toBe(201);
    expect(first.body.events[0]).toMatchObject({ unitId: unit.id, kind: 'top_up', kg: 0.6 });
    expect(first.body.stats.detail.totalMadeUpKg365).toBeCloseTo(0.6, 6);
    // The phone lost the answer and sends the same visit again.
    const again = await agent.post('/api/visits').set('Origin', TEST_ORIGIN).send(body);
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ replayed: true, visitId: first.body.visitId });
    expect(await visitsOf(unit.id)).toBe(1);
    expect(await visitsOf(other.id)).toBe(0);
  });

  it("applies the unit's plausibility rules once the label's unit is known (400 with the field)", async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const unit = await createTestUnit(db, { nominalChargeKg: 2 });
    const res = await agent
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({ idempotencyKey: randomUUID(), qrToken: unit.qrToken, ...topUp(9) });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['events.0.kg']).toMatch(/more than twice/);
    expect(await visitsOf(unit.id)).toBe(0);
  });

  it('returns 404 for a label that is not linked to any unit and records nothing', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const res = await agent
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({ idempotencyKey: randomUUID(), qrToken: 'B'.repeat(43), ...topUp(0.5) });
    expect(res.status).toBe(404);
    expect(res.body.error.message).toMatch(/not linked to any unit/);
  });

  it('returns 400 naming qrToken for text that is no label code', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const res = await agent
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({ idempotencyKey: randomUUID(), qrToken: 'short', ...topUp(0.5) });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('qrToken');
  });

  it('returns 403 when a role that cannot record visits sends one by label', async () => {
    const { agent } = await signInAs(app, db, 'owner');
    const unit = await createTestUnit(db);
    const res = await agent
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({ idempotencyKey: randomUUID(), qrToken: unit.qrToken, ...topUp(0.5) });
    expect(res.status).toBe(403);
  });
});

describe("a depot's units for a phone to keep", () => {
  it('pages through the units of one site with their label tokens and first reads, and no other site', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const [{ id: siteId }] = await db
      .insert(sites)
      .values({ code: 'DPT1', name: 'Keep Depot', kind: 'depot' })
      .$returningId();
    const [{ id: elsewhere }] = await db
      .insert(sites)
      .values({ code: 'DPT2', name: 'Other Depot', kind: 'depot' })
      .$returningId();
    const mine = [];
    for (let i = 0; i < OVERVIEWS_PAGE_SIZE + 3; i++) mine.push(await createTestUnit(db, { siteId }));
    await createTestUnit(db, { siteId: elsewhere });
    const first = await agent.get(`/api/overviews?siteId=${siteId}`);
    expect(first.status).toBe(200);
    expect(first.body.units).toHaveLength(OVERVIEWS_PAGE_SIZE);
    expect(first.body.units[0]).toMatchObject({
      unitId: mine[0].id,
      qrToken: mine[0].qrToken,
      overview: { stats: null, history: { events: [] } },
    });
    const second = await agent.get(`/api/overviews?siteId=${siteId}&after=${first.body.nextAfter}`);
    expect(second.body.units.map((u: { unitId: number }) => u.unitId)).toEqual(mine.slice(-3).map((u) => u.id));
    expect(second.body.nextAfter).toBeNull();
  });

  it('returns 400 naming siteId when no site is given', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const res = await agent.get('/api/overviews');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('siteId');
  });
});
