import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { randomUUID } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { events } from '../../server/db/schema';
import { compareRepairOptions } from '../../shared/domain';
import type { RetirementCandidatesDto, UnitDecisionDto } from '../../shared/schemas/decisions';
import { DEFAULT_SETTINGS } from '../../shared/schemas/settings';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { halyardNumber } from '../support/units';
import { chronicLeaker, recordVisits, tightUnit } from '../support/visits';

const { db, pool } = openTestDb();
const now = new Date('2026-06-01T12:00:00Z');
const { app, ctx } = createApp({ db, clock: { now: () => now }, rateLimits: { signInPerIp: 1000 } });

type Agent = Awaited<ReturnType<typeof signInAs>>['agent'];
let owner: Agent;
let leaker = 0;
let tight = 0;

beforeAll(async () => {
  await resetDb(db);
  const tech = await signInAs(app, db, 'technician');
  owner = (await signInAs(app, db, 'owner')).agent;
  leaker = (
    await createTestUnit(db, {
      containerNumber: halyardNumber(610001),
      nominalChargeKg: 5,
      commissionedOn: '2014-06-01',
    })
  ).id;
  tight = (
    await createTestUnit(db, {
      containerNumber: halyardNumber(610002),
      nominalChargeKg: 5,
      commissionedOn: '2023-06-01',
    })
  ).id;
  await recordVisits(tech.agent, leaker, chronicLeaker());
  await recordVisits(tech.agent, tight, tightUnit());
});
afterAll(async () => {
  await ctx.jobs.waitForAll();
  await pool.end();
});

describe('GET /api/decisions/units/:id', () => {
  it('prices the four options from the unit history, with the assumptions and the cheapest marked', async () => {
    const res = await owner.get(`/api/decisions/units/${leaker}`);
    expect(res.status).toBe(200);
    const d = res.body as UnitDecisionDto;
    expect(d.unit).toMatchObject({ id: leaker, refrigerant: 'R-134a', nominalChargeKg: 5 });
    expect(d.result.options.map((o) => o.id)).toEqual([
      'keep_topping_up',
      'repair',
      'new_machinery',
      'retire_and_sell',
    ]);
    expect(d.result.options.filter((o) => o.cheapest)).toHaveLength(1);
    expect(d.engineInput).toMatchObject({
      leakLocation: 'service_valve',
      topUpIntervalDays: expect.any(Number),
      madeUpKgPerVisit: expect.any(Number),
    });
    // The leak found on 2026-03-01 was not repaired: it is the open one.
    expect(d.sources).toEqual({ leakLocation: 'open_leak', interval: 'forecast' });
    expect(d.economics).toEqual(JSON.parse(JSON.stringify(DEFAULT_SETTINGS.economics)));
    // The browser recomputes with the same engine: the same input gives the same figures.
    expect(compareRepairOptions(d.engineInput, DEFAULT_SETTINGS)).toEqual(d.result);
    expect(d.result.assumptions.recurrenceSource).toBe('default');
  });

  it('says there is no leak evidence for a tight unit: keeping it costs nothing a year', async () => {
    const d = (await owner.get(`/api/decisions/units/${tight}`)).body as UnitDecisionDto;
    expect(d.sources.interval).toBe('no_leak_evidence');
    expect(d.result.cheapestId).toBe('keep_topping_up');
    expect(d.result.options[0].yearlyCost).toBe(0);
  });

  it('answers 404 for an unknown unit, 400 for a bad id, 403 for engineers and technicians, 401 for visitors', async () => {
    expect((await owner.get('/api/decisions/units/99999999')).status).toBe(404);
    expect((await owner.get('/api/decisions/units/abc')).status).toBe(400);
    for (const role of ['engineer', 'technician'] as const) {
      const { agent } = await signInAs(app, db, role);
      expect((await agent.get(`/api/decisions/units/${leaker}`)).status).toBe(403);
    }
    expect((await request(app).get(`/api/decisions/units/${leaker}`)).status).toBe(401);
  });
});

describe('POST /api/decisions/units/:id', () => {
  it('records the decision as a unit event with the figures and the edited assumptions, once per key', async () => {
    const d = (await owner.get(`/api/decisions/units/${leaker}`)).body as UnitDecisionDto;
    const economics = {
      ...d.economics,
      refrigerantPricePerKg: { ...d.economics.refrigerantPricePerKg, 'R-134a': 250 },
    };
    const body = {
      choice: 'repair',
      economics,
      inputs: { topUpIntervalDays: 60, madeUpKgPerVisit: 1.2, leakLocation: 'service_valve' },
      note: 'Repair before the peak season',
      idempotencyKey: randomUUID(),
    };
    const res = await owner.post(`/api/decisions/units/${leaker}`).set('Origin', TEST_ORIGIN).send(body);
    expect(res.status).toBe(201);
    expect(res.body.decision).toMatchObject({
      choice: 'repair',
      note: 'Repair before the peak season',
      by: { name: expect.any(String) },
    });
    const [ev] = await db
      .select()
      .from(events)
      .where(and(eq(events.unitId, leaker), eq(events.kind, 'decision')));
    const details = ev.details as {
      choice: string;
      options: { id: string; npv: number }[];
      assumptions: { refrigerantPricePerKg: number; visitsPerYear: number };
      inputs: { topUpIntervalDays: number };
    };
    expect(details.choice).toBe('repair');
    expect(details.assumptions.refrigerantPricePerKg).toBe(250);
    expect(details.inputs.topUpIntervalDays).toBe(60);
    // The stored figures are the engine's for exactly these assumptions.
    const expected = compareRepairOptions(
      { ...d.engineInput, ...body.inputs, leakLocation: 'service_valve' },
      { ...DEFAULT_SETTINGS, economics },
    );
    expect(details.options).toEqual(JSON.parse(JSON.stringify(expected.options)));

    const again = await owner.post(`/api/decisions/units/${leaker}`).set('Origin', TEST_ORIGIN).send(body);
    expect(again.status).toBe(200);
    expect(again.body.decision.eventId).toBe(res.body.decision.eventId);
    const listed = (await owner.get(`/api/decisions/units/${leaker}`)).body as UnitDecisionDto;
    expect(listed.decisions.map((x) => x.eventId)).toEqual([res.body.decision.eventId]);
  });

  it('answers 400 for a bad choice or assumptions, 404 for an unknown unit, 403 for an engineer', async () => {
    const d = (await owner.get(`/api/decisions/units/${leaker}`)).body as UnitDecisionDto;
    const good = {
      choice: 'retire',
      economics: d.economics,
      inputs: { topUpIntervalDays: null, madeUpKgPerVisit: null, leakLocation: 'other' },
      idempotencyKey: randomUUID(),
    };
    const post = (agent: Agent, id: number, b: object) =>
      agent.post(`/api/decisions/units/${id}`).set('Origin', TEST_ORIGIN).send(b);
    expect((await post(owner, leaker, { ...good, choice: 'sell' })).status).toBe(400);
    const negative = await post(owner, leaker, { ...good, economics: { ...d.economics, discountRatePct: -5 } });
    expect(negative.status).toBe(400);
    expect(negative.body.error.fields['economics.discountRatePct']).toBeTruthy();
    expect((await post(owner, leaker, { ...good, inputs: { ...good.inputs, leakLocation: 'roof' } })).status).toBe(400);
    expect((await post(owner, 99999999, good)).status).toBe(404);
    const { agent } = await signInAs(app, db, 'engineer');
    expect((await post(agent, leaker, good)).status).toBe(403);
    expect((await post(owner, leaker, good)).status).toBe(201);
  });

  it('returns 409 when the submission key was used for a visit, another decision or another unit, and replays a voided one', async () => {
    const d = (await owner.get(`/api/decisions/units/${leaker}`)).body as UnitDecisionDto;
    const post = (id: number, b: object) => owner.post(`/api/decisions/units/${id}`).set('Origin', TEST_ORIGIN).send(b);
    const tech = (await signInAs(app, db, 'technician')).agent;
    const visitKey = randomUUID();
    const visit = await tech
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({
        idempotencyKey: visitKey,
        unitId: leaker,
        occurredAt: '2026-05-20T10:00:00Z',
        events: [{ kind: 'pti', passed: false }],
      });
    expect(visit.status).toBe(201);
    const body = {
      choice: 'keep',
      economics: d.economics,
      inputs: { topUpIntervalDays: 90, madeUpKgPerVisit: 0.8, leakLocation: 'service_valve' },
      idempotencyKey: visitKey,
    };
    const onVisitKey = await post(leaker, body);
    expect(onVisitKey.status).toBe(409);
    expect(onVisitKey.body.error.fields.idempotencyKey).toBeTruthy();

    const decision = { ...body, idempotencyKey: randomUUID() };
    const first = await post(leaker, decision);
    expect(first.status).toBe(201);
    expect((await post(leaker, { ...decision, choice: 'retire' })).status).toBe(409);
    expect((await post(tight, decision)).status).toBe(409);

    const voided = await owner
      .post(`/api/events/${first.body.decision.eventId}/void`)
      .set('Origin', TEST_ORIGIN)
      .send({ reason: 'Decided twice' });
    expect(voided.status).toBe(201);
    const replayed = await post(leaker, decision);
    expect(replayed.status).toBe(200);
    expect(replayed.body).toMatchObject({
      replayed: true,
      decision: { eventId: first.body.decision.eventId, choice: 'keep' },
    });
  });
});

describe('GET /api/decisions/candidates', () => {
  it('ranks units by the yearly saving of the cheapest option over keeping on topping up', async () => {
    const res = await owner.get('/api/decisions/candidates');
    expect(res.status).toBe(200);
    const c = res.body as RetirementCandidatesDto;
    expect(c.currency).toBe('USD');
    expect(c.considered).toBeGreaterThanOrEqual(1);
    expect(c.candidates.map((x) => x.unitId)).toContain(leaker);
    expect(c.candidates.map((x) => x.unitId)).not.toContain(tight);
    for (const x of c.candidates) expect(x.yearlySaving).toBeCloseTo(x.keepEac - x.cheapestEac, 1);
    const sorted = [...c.candidates].sort((a, b) => b.yearlySaving - a.yearlySaving);
    expect(c.candidates).toEqual(sorted);
  });

  it('answers 400 for a bad limit and 403 for an engineer', async () => {
    expect((await owner.get('/api/decisions/candidates?limit=0')).status).toBe(400);
    const { agent } = await signInAs(app, db, 'engineer');
    expect((await agent.get('/api/decisions/candidates')).status).toBe(403);
  });
});
