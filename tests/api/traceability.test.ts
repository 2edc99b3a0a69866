import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { randomUUID } from 'node:crypto';
import { parse } from 'csv-parse/sync';
import { and, eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { events } from '../../server/db/schema';
import type { TraceResultDto } from '../../shared/schemas/trace';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { createTestSite, halyardNumber } from '../support/units';
import { recordVisits } from '../support/visits';

const { db, pool } = openTestDb();
const now = new Date('2026-06-01T12:00:00Z');
const { app } = createApp({ db, clock: { now: () => now }, rateLimits: { signInPerIp: 1000 } });

type Agent = Awaited<ReturnType<typeof signInAs>>['agent'];
let engineer: Agent;
let site: { id: number };
const unitIds: number[] = [];
let voided = 0;

beforeAll(async () => {
  await resetDb(db);
  const tech = await signInAs(app, db, 'technician');
  engineer = (await signInAs(app, db, 'engineer')).agent;
  site = await createTestSite(db, { name: 'East depot' });
  const other = await createTestSite(db, { name: 'West depot' });
  for (let i = 0; i < 4; i++)
    unitIds.push(
      (
        await createTestUnit(db, {
          containerNumber: halyardNumber(510001 + i),
          siteId: i < 3 ? site.id : other.id,
          nominalChargeKg: 5,
        })
      ).id,
    );
  await recordVisits(tech.agent, unitIds[0], [
    { at: '2026-03-01T08:00:00Z', siteId: site.id, events: [{ kind: 'top_up', kg: 0.6, cylinder: 'LOT77-0001' }] },
  ]);
  await recordVisits(tech.agent, unitIds[1], [
    {
      at: '2026-03-02T08:00:00Z',
      siteId: site.id,
      events: [
        { kind: 'recovery', kg: 2, cylinder: 'REC-1' },
        { kind: 'recharge', kg: 5, cylinder: 'LOT77-0002' },
      ],
    },
  ]);
  await recordVisits(tech.agent, unitIds[2], [
    { at: '2026-04-15T08:00:00Z', siteId: site.id, events: [{ kind: 'top_up', kg: 0.4, cylinder: 'CYL-9' }] },
  ]);
  const [[wrong]] = await recordVisits(tech.agent, unitIds[3], [
    { at: '2026-03-03T08:00:00Z', siteId: other.id, events: [{ kind: 'top_up', kg: 0.2, cylinder: 'LOT77-0003' }] },
  ]);
  voided = wrong;
  expect(
    (
      await engineer
        .post(`/api/events/${wrong}/void`)
        .set('Origin', TEST_ORIGIN)
        .send({ reason: 'Wrong cylinder number' })
    ).status,
  ).toBe(201);
});
afterAll(() => pool.end());

const trace = async (query: string) => {
  const res = await engineer.get(`/api/traceability?${query}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as TraceResultDto;
};

describe('GET /api/traceability', () => {
  it('finds every unit charged from a cylinder or lot (top-ups and recharges), not the recovery, not voided charges', async () => {
    const t = await trace('cylinder=lot77');
    expect(t.units.map((u) => u.unitId).sort()).toEqual([unitIds[0], unitIds[1]].sort());
    expect(t.charges.map((c) => c.kind).sort()).toEqual(['recharge', 'top_up']);
    expect(t.totalKg).toBeCloseTo(5.6, 6);
    expect(t.totalCharges).toBe(2);
    expect(t.voidedExcluded).toBe(1);
    expect(t.charges.map((c) => c.eventId)).not.toContain(voided);
    expect(t.charges[0]).toMatchObject({
      containerNumber: expect.any(String),
      technician: { name: expect.any(String) },
      site: { id: site.id },
    });
  });

  it('finds the units charged at a site in a date range', async () => {
    const t = await trace(`siteId=${site.id}&from=2026-03-01&to=2026-03-31`);
    expect(t.units.map((u) => u.unitId).sort()).toEqual([unitIds[0], unitIds[1]].sort());
    expect((await trace(`siteId=${site.id}&from=2026-04-01&to=2026-04-30`)).units.map((u) => u.unitId)).toEqual([
      unitIds[2],
    ]);
  });

  it('answers 400 for a search without cylinder or site, a site without dates, or a reversed range', async () => {
    for (const q of [
      '',
      'cylinder=x',
      `siteId=${site.id}`,
      `siteId=${site.id}&from=2026-03-01&to=2026-01-01`,
      'cylinder=LOT&from=bad',
    ]) {
      expect((await engineer.get(`/api/traceability?${q}`)).status, q).toBe(400);
    }
  });

  it('is refused to technicians and visitors', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    expect((await agent.get('/api/traceability?cylinder=LOT77')).status).toBe(403);
    expect((await request(app).get('/api/traceability?cylinder=LOT77')).status).toBe(401);
  });
});

describe('GET /api/traceability/export.csv', () => {
  it('exports the charges of the search', async () => {
    const res = await engineer.get('/api/traceability/export.csv?cylinder=LOT77').buffer(true);
    expect(res.status).toBe(200);
    const rows = parse(res.text.replace(/^\uFEFF/, ''), { columns: true }) as Record<string, string>[];
    expect(rows.map((r) => r['Cylinder or lot']).sort()).toEqual(['LOT77-0001', 'LOT77-0002']);
    expect(rows.every((r) => r['Recorded by'])).toBe(true);
    expect(rows.every((r) => ['Top-up', 'Recharge'].includes(r.Entry))).toBe(true);
  });
});

describe('POST /api/traceability/mark-for-inspection', () => {
  const body = (key = randomUUID()) => ({
    query: { cylinder: 'LOT77' },
    reason: 'Supplier recalled lot 77',
    idempotencyKey: key,
  });

  it('records a note on every unit found, in one go, and a retry marks nothing twice', async () => {
    const key = randomUUID();
    const res = await engineer.post('/api/traceability/mark-for-inspection').set('Origin', TEST_ORIGIN).send(body(key));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ marked: 2, replayed: false });
    const notes = await db
      .select()
      .from(events)
      .where(and(eq(events.kind, 'note'), eq(events.unitId, unitIds[0])));
    expect(notes).toHaveLength(1);
    expect(notes[0].note).toMatch(
      /Marked for inspection: charged from cylinder or lot LOT77 .*Supplier recalled lot 77/,
    );
    // The note is read on the unit's history: its days are written the app's way (4 Mar 2026), never 2026-03-04.
    expect(notes[0].note).toMatch(/last on \d{1,2} [A-Z][a-z]{2} \d{4}\)/);
    expect(notes[0].note).not.toMatch(/\d{4}-\d{2}-\d{2}/);
    expect(notes[0].details).toMatchObject({ inspection: { cylinder: 'LOT77' } });
    expect(notes[0].visitId).toEqual(expect.any(Number));

    const again = await engineer
      .post('/api/traceability/mark-for-inspection')
      .set('Origin', TEST_ORIGIN)
      .send(body(key));
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ marked: 2, replayed: true, eventIds: res.body.eventIds });
    // The search now shows when each unit was marked; the unit's history shows the note.
    const t = await trace('cylinder=LOT77');
    expect(t.units.every((u) => u.markedAt === now.toISOString())).toBe(true);
    const history = await engineer.get(`/api/units/${unitIds[0]}/history`);
    expect(
      history.body.events.some(
        (e: { kind: string; note: string }) => e.kind === 'note' && /Marked for inspection/.test(e.note),
      ),
    ).toBe(true);
  });

  it('answers 400 without a reason, for a search that finds nothing, or a bad search', async () => {
    const post = (b: object) =>
      engineer.post('/api/traceability/mark-for-inspection').set('Origin', TEST_ORIGIN).send(b);
    expect((await post({ ...body(), reason: '' })).status).toBe(400);
    expect((await post({ ...body(), query: { cylinder: 'NO-SUCH-LOT' } })).status).toBe(400);
    expect((await post({ ...body(), query: {} })).status).toBe(400);
    expect((await post({})).status).toBe(400);
  });

  it('is for engineers and administrators: owners and technicians get 403', async () => {
    for (const role of ['owner', 'technician'] as const) {
      const { agent } = await signInAs(app, db, role);
      expect(
        (await agent.post('/api/traceability/mark-for-inspection').set('Origin', TEST_ORIGIN).send(body())).status,
      ).toBe(403);
    }
    expect(
      (await request(app).post('/api/traceability/mark-for-inspection').set('Origin', TEST_ORIGIN).send(body())).status,
    ).toBe(401);
  });
});
