// The depot's working day: re-checks after top-ups and repairs, quarantine, the structured PTI, release for loading
// and My day — each rule through the API against a real database.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type TestAgent from 'supertest/lib/agent';
import { eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { depotBackfill } from '../../server/scheduler';
import { events, unitDepotState } from '../../server/db/schema';
import { PTI_ITEMS } from '../../shared/domain/pti';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { createTestSite, halyardNumber } from '../support/units';
import { recordVisits } from '../support/visits';

const { db, pool } = openTestDb();
let now = new Date('2026-06-01T12:00:00Z');
const { app, ctx } = createApp({ db, clock: { now: () => now }, rateLimits: { signInPerIp: 1000 } });
let engineer: TestAgent;
let technician: TestAgent;
let owner: TestAgent;
let siteId: number;
let serial = 620001;

beforeAll(async () => {
  await resetDb(db);
  engineer = (await signInAs(app, db, 'engineer')).agent;
  technician = (await signInAs(app, db, 'technician')).agent;
  owner = (await signInAs(app, db, 'owner')).agent;
  siteId = (await createTestSite(db, { name: 'North quay' })).id;
});
afterAll(() => pool.end());

const newUnit = async () =>
  (
    await createTestUnit(db, {
      containerNumber: halyardNumber(serial++),
      siteId,
      nominalChargeKg: 5,
      commissionedOn: '2024-01-10',
    })
  ).id;
const post = (agent: TestAgent, url: string, body: object) =>
  agent
    .post(url)
    .set('Origin', TEST_ORIGIN)
    .send({ idempotencyKey: randomUUID(), ...body });
const allItems = (result: 'passed' | 'failed' | 'not_done' = 'passed') => PTI_ITEMS.map((i) => ({ id: i.id, result }));
const depot = async (unitId: number) => (await technician.get(`/api/units/${unitId}/depot`)).body;

describe('re-checks', () => {
  it('creates a re-check due the next day after a top-up and clears it with a reading that says the charge held', async () => {
    const unitId = await newUnit();
    await recordVisits(technician, unitId, [
      {
        at: '2026-05-01T09:00:00Z',
        siteId,
        events: [
          { kind: 'recharge', kg: 5, cylinder: 'CYL-1' },
          { kind: 'pressure', dischargeKPaG: 965, ambientC: 30, sightGlass: 'full' },
        ],
      },
      { at: '2026-05-31T09:00:00Z', siteId, events: [{ kind: 'top_up', kg: 0.4, cylinder: 'CYL-2' }] },
    ]);
    const before = await depot(unitId);
    expect(before.openRecheck).toMatchObject({ reason: 'top_up', dueOn: '2026-06-01', status: 'due' });
    const [row] = await db.select().from(unitDepotState).where(eq(unitDepotState.unitId, unitId));
    expect(row.recheckDue).toBe('2026-06-01');

    await recordVisits(technician, unitId, [
      {
        at: '2026-06-01T08:00:00Z',
        siteId,
        events: [{ kind: 'pressure', dischargeKPaG: 960, ambientC: 30, sightGlass: 'full' }],
      },
    ]);
    const after = await depot(unitId);
    expect(after.openRecheck).toBeNull();
    const done = after.rechecks.find((c: { reason: string }) => c.reason === 'top_up');
    expect(done).toMatchObject({ status: 'done', outcome: 'held' });
    expect(done.outcomeWords).toMatch(/^Charge held/);
    const [cleared] = await db.select().from(unitDepotState).where(eq(unitDepotState.unitId, unitId));
    expect(cleared.recheckDue).toBeNull();
  });

  it('creates a re-check within a month of a repair, answered by a leak check, and counts a missed one', async () => {
    const unitId = await newUnit();
    await recordVisits(technician, unitId, [
      {
        at: '2026-03-01T09:00:00Z',
        siteId,
        events: [
          { kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'service_valve' },
          { kind: 'repair', location: 'service_valve', action: 'valve_core_replaced', verified: true },
        ],
      },
    ]);
    const open = await depot(unitId);
    expect(open.openRecheck).toMatchObject({ reason: 'repair', dueOn: '2026-03-31', status: 'overdue', missed: true });
    expect(open.missedRechecks365).toBe(1);
    await recordVisits(technician, unitId, [
      {
        at: '2026-05-20T09:00:00Z',
        siteId,
        events: [{ kind: 'leak_check', method: 'bubble_solution', leakFound: false }],
      },
    ]);
    const done = await depot(unitId);
    expect(done.openRecheck).toBeNull();
    expect(done.rechecks[0]).toMatchObject({ outcome: 'held', missed: true });
  });

  it('returns 404 for the depot state of a unit that does not exist and 400 for a malformed id', async () => {
    expect((await technician.get('/api/units/999999/depot')).status).toBe(404);
    const bad = await technician.get('/api/units/abc/depot');
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('invalid_input');
  });
});

describe('structured PTI', () => {
  it('records a PTI whose every item passed as passed, and the unit may then be released', async () => {
    const unitId = await newUnit();
    const pti = await post(technician, `/api/units/${unitId}/pti`, { items: allItems() });
    expect(pti.status).toBe(201);
    expect(pti.body).toMatchObject({ overall: 'passed', passed: true, overridden: false });
    expect((await depot(unitId)).pti).toMatchObject({ valid: true, passed: true });
    const rel = await post(technician, `/api/units/${unitId}/release`, {});
    expect(rel.status).toBe(201);
    const [e] = await db.select().from(events).where(eq(events.id, rel.body.eventId));
    expect(e.kind).toBe('status_change');
    expect(e.note).toBe('Released for loading.');
  });

  it('records a PTI with a failed item as failed, and release is refused', async () => {
    const unitId = await newUnit();
    const items = allItems();
    items[3] = { id: items[3].id, result: 'failed' };
    const pti = await post(technician, `/api/units/${unitId}/pti`, { items });
    expect(pti.body).toMatchObject({ overall: 'failed', passed: false });
    const rel = await post(technician, `/api/units/${unitId}/release`, {});
    expect(rel.status).toBe(409);
    expect(rel.body.error.code).toBe('pti_invalid');
  });

  it('returns 409 when a PTI is recorded as passed on a unit with an open leak', async () => {
    const unitId = await newUnit();
    await recordVisits(technician, unitId, [
      {
        at: '2026-05-30T09:00:00Z',
        siteId,
        events: [{ kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'brazed_joint' }],
      },
    ]);
    const res = await post(technician, `/api/units/${unitId}/pti`, { items: allItems() });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('pti_blocked');
    expect(res.body.error.message).toContain('has not been repaired');
    const asFailed = await post(technician, `/api/units/${unitId}/pti`, { items: allItems(), recordAsNotPassed: true });
    expect(asFailed.status).toBe(201);
    expect(asFailed.body).toMatchObject({ passed: false, overall: 'passed' });
  });

  it('returns 409 when the visit form records a bare PTI as passed on a unit with an open leak, not when it repairs it', async () => {
    const unitId = await newUnit();
    await recordVisits(technician, unitId, [
      {
        at: '2026-05-30T09:00:00Z',
        siteId,
        events: [{ kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'brazed_joint' }],
      },
    ]);
    const res = await post(technician, '/api/visits', {
      unitId,
      occurredAt: '2026-05-31T09:00:00Z',
      events: [{ kind: 'pti', passed: true }],
    });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('pti_blocked');
    const repaired = await post(technician, '/api/visits', {
      unitId,
      occurredAt: '2026-05-31T10:00:00Z',
      events: [
        { kind: 'repair', location: 'brazed_joint', action: 'rebrazed', verified: true },
        { kind: 'pti', passed: true },
      ],
    });
    expect(repaired.status, JSON.stringify(repaired.body)).toBe(201);
  });

  it('keeps an engineer’s override and its reason in the history; a technician may not override', async () => {
    const unitId = await newUnit();
    await recordVisits(technician, unitId, [
      {
        at: '2026-05-30T09:00:00Z',
        siteId,
        events: [{ kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'brazed_joint' }],
      },
    ]);
    const reason = 'Leak is on the drain pan heater line, isolated; repair booked for the next call';
    const tech = await post(technician, `/api/units/${unitId}/pti`, { items: allItems(), override: { reason } });
    expect(tech.status).toBe(403);
    const res = await post(engineer, `/api/units/${unitId}/pti`, { items: allItems(), override: { reason } });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ passed: true, overridden: true });
    const [e] = await db.select().from(events).where(eq(events.id, res.body.eventId));
    expect(e.passed).toBe(true);
    expect((e.details as { pti: { override: { reason: string } } }).pti.override.reason).toBe(reason);
  });

  it('returns 400 with the fields for a checklist that is not one', async () => {
    const unitId = await newUnit();
    const res = await post(technician, `/api/units/${unitId}/pti`, { items: [{ id: 'sparkle', result: 'maybe' }] });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    expect(res.body.error.fields).toBeTruthy();
  });

  it('returns 403 when an owner records a PTI', async () => {
    const unitId = await newUnit();
    expect((await post(owner, `/api/units/${unitId}/pti`, { items: allItems() })).status).toBe(403);
  });
});

describe('quarantine', () => {
  it('blocks a passed PTI and release, and is lifted only by an engineer with a recorded result', async () => {
    const unitId = await newUnit();
    expect((await post(technician, `/api/units/${unitId}/pti`, { items: allItems() })).status).toBe(201);
    const q = await post(engineer, '/api/quarantine', {
      unitIds: [unitId],
      reason: 'Charged from suspect lot LOT-66',
      source: 'trace',
      search: 'cylinder or lot LOT-66',
    });
    expect(q.status).toBe(201);
    expect(q.body.quarantined).toEqual([unitId]);
    const state = await depot(unitId);
    expect(state.quarantine.reason).toBe('Charged from suspect lot LOT-66');
    const fleet = (await engineer.get('/api/fleet?quarantined=1')).body;
    expect(fleet.rows.map((r: { unitId: number }) => r.unitId)).toContain(unitId);
    expect(fleet.rows.every((r: { unitId: number }) => r.unitId !== unitId - 1)).toBe(true);
    expect(state.pti).toMatchObject({ valid: false });
    expect(state.pti.invalidBecause).toContain('quarantine');

    const rel = await post(technician, `/api/units/${unitId}/release`, {});
    expect(rel.status).toBe(409);
    expect(rel.body.error.code).toBe('quarantined');
    const pti = await post(technician, `/api/units/${unitId}/pti`, { items: allItems() });
    expect(pti.status).toBe(409);
    expect(pti.body.error.message).toContain('quarantine');

    const byTech = await post(technician, `/api/units/${unitId}/quarantine/lift`, {
      result: 'identified_pure',
      note: 'Identifier reading 99.8 % R-134a',
    });
    expect(byTech.status).toBe(403);
    const noResult = await post(engineer, `/api/units/${unitId}/quarantine/lift`, { note: 'fine' });
    expect(noResult.status).toBe(400);
    expect(noResult.body.error.fields.result).toBeTruthy();
    const lift = await post(engineer, `/api/units/${unitId}/quarantine/lift`, {
      result: 'identified_pure',
      note: 'Identifier reading 99.8 % R-134a',
    });
    expect(lift.status).toBe(201);
    const [e] = await db.select().from(events).where(eq(events.id, lift.body.eventId));
    expect(e.note).toContain('Refrigerant identified as pure');
    expect((await depot(unitId)).quarantine).toBeNull();
    expect((await post(technician, `/api/units/${unitId}/release`, {})).status).toBe(201);
    const lifted = (await engineer.get('/api/fleet?quarantined=1')).body;
    expect(lifted.rows.map((r: { unitId: number }) => r.unitId)).not.toContain(unitId);
    const again = await post(engineer, `/api/units/${unitId}/quarantine/lift`, {
      result: 'identified_pure',
      note: 'Again',
    });
    expect(again.status).toBe(409);
  });

  it('returns 403 when a technician quarantines and 400 for an unknown unit', async () => {
    const unitId = await newUnit();
    expect((await post(technician, '/api/quarantine', { unitIds: [unitId], reason: 'Suspect' })).status).toBe(403);
    const res = await post(engineer, '/api/quarantine', { unitIds: [unitId, 999999], reason: 'Suspect' });
    expect(res.status).toBe(400);
    expect((await depot(unitId)).quarantine).toBeNull();
  });

  it('keeps one quarantine per unit when two engineers quarantine the same units side by side', async () => {
    const ids = [await newUnit(), await newUnit(), await newUnit()];
    const results = await Promise.all(
      [0, 1, 2, 3].map((i) => post(engineer, '/api/quarantine', { unitIds: ids, reason: `Suspect cylinder ${i}` })),
    );
    expect(results.map((r) => r.status)).toEqual([201, 201, 201, 201]);
    for (const id of ids) {
      const s = await depot(id);
      expect(s.quarantine.marks).toBe(4);
      const [row] = await db.select().from(unitDepotState).where(eq(unitDepotState.unitId, id));
      expect(row.quarantineEventId).toBe(s.quarantine.eventId);
    }
  });

  it('ends with the figures of the last writer when top-ups, readings and quarantine marks race on one unit', async () => {
    const unitId = await newUnit();
    const writes = [
      ...[0, 1, 2].map((i) =>
        post(technician, '/api/visits', {
          unitId,
          occurredAt: `2026-05-2${i}T09:00:00Z`,
          events: [{ kind: 'top_up', kg: 0.2, cylinder: 'CYL-R' }],
        }),
      ),
      post(technician, '/api/visits', {
        unitId,
        occurredAt: '2026-05-31T09:00:00Z',
        events: [{ kind: 'pressure', dischargeKPaG: 900, ambientC: 25 }],
      }),
      post(engineer, '/api/quarantine', { unitIds: [unitId], reason: 'Suspect lot' }),
    ];
    const res = await Promise.all(writes);
    expect(res.map((r) => r.status)).toEqual([201, 201, 201, 201, 201]);
    const [row] = await db.select().from(unitDepotState).where(eq(unitDepotState.unitId, unitId));
    const s = await depot(unitId);
    expect(row.recheckDue).toBe(s.openRecheck?.dueOn ?? null);
    expect(row.quarantinedSince).not.toBeNull();
    expect(s.openRecheck).toBeNull();
  });
});

describe('My day', () => {
  it('lists the units at the person’s site that need something, each with why in words', async () => {
    now = new Date('2026-06-01T12:00:00Z');
    const res = await technician.get(`/api/day?siteId=${siteId}`);
    expect(res.status).toBe(200);
    expect(res.body.site.name).toBe('North quay');
    const groups = Object.fromEntries(res.body.groups.map((g: { id: string; rows: unknown[] }) => [g.id, g])) as Record<
      string,
      { total: number; rows: { why: string; action: string }[] }
    >;
    expect(groups.quarantine.total).toBeGreaterThan(0);
    expect(groups.quarantine.rows[0].why).toContain('In quarantine since');
    expect(groups.open_leak.total).toBeGreaterThan(0);
    expect(groups.open_leak.rows[0].action).toBe('repair');
    // Without a site: where the person last recorded work.
    const mine = await technician.get('/api/day');
    expect(mine.body.site?.id).toBe(siteId);
  });

  it('returns 400 for a site that is not a number and 404 for one that does not exist', async () => {
    expect((await technician.get('/api/day?siteId=x')).status).toBe(400);
    expect((await technician.get('/api/day?siteId=99999')).status).toBe(404);
  });
});

describe('upgrade of an existing database', () => {
  it('fills in the depot state of units that have no row yet, leaves the others, and then finds nothing to do', async () => {
    const before = await newUnit();
    const kept = await newUnit();
    for (const unitId of [before, kept])
      await recordVisits(technician, unitId, [
        { at: '2026-05-31T09:00:00Z', siteId, events: [{ kind: 'top_up', kg: 0.4, cylinder: 'CYL-U' }] },
      ]);
    // As on a database from before the table: no row for one unit; the other's row marked to show it is not rewritten.
    await db.delete(unitDepotState).where(eq(unitDepotState.unitId, before));
    const marker = new Date('2026-01-01T00:00:00Z');
    await db.update(unitDepotState).set({ computedAt: marker }).where(eq(unitDepotState.unitId, kept));

    expect(await depotBackfill(ctx)).toBeGreaterThanOrEqual(1);
    const [filled] = await db.select().from(unitDepotState).where(eq(unitDepotState.unitId, before));
    expect(filled.recheckReason).toBe('top_up');
    expect(filled.recheckDue).toBe('2026-06-01');
    const [untouched] = await db.select().from(unitDepotState).where(eq(unitDepotState.unitId, kept));
    expect(untouched.computedAt).toEqual(marker);
    expect((await depot(before)).openRecheck).not.toBeNull();

    expect(await depotBackfill(ctx)).toBe(0);
  });
});
