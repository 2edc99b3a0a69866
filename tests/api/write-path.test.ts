// The unit write path's promises one by one: unit edits and registrations recompute in the same request, a
// submission key means one content, an entry is voided once, and a record the engine refuses says why.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type TestAgent from 'supertest/lib/agent';
import { and, eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { events, unitChanges, units, unitStats } from '../../server/db/schema';
import { engineUnit, loadEngineHistory } from '../../server/lib/record/stats';
import { newToken } from '../../server/lib/ids';
import { computeUnitStats } from '../../shared/domain';
import { DEFAULT_SETTINGS } from '../../shared/schemas/settings';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { halyardNumber } from '../support/units';

const { db, pool } = openTestDb();
const NOW = new Date('2026-06-01T12:00:00Z');
const { app } = createApp({ db, clock: { now: () => NOW }, rateLimits: { signInPerIp: 1000 } });
let engineer: TestAgent;
let technician: TestAgent;
let owner: TestAgent;

beforeAll(async () => {
  await resetDb(db);
  engineer = (await signInAs(app, db, 'engineer')).agent;
  technician = (await signInAs(app, db, 'technician')).agent;
  owner = (await signInAs(app, db, 'owner')).agent;
});
afterAll(() => pool.end());

const topUp = (unitId: number, at: string, kg: number, key = randomUUID()) =>
  technician
    .post('/api/visits')
    .set('Origin', TEST_ORIGIN)
    .send({ idempotencyKey: key, unitId, occurredAt: at, events: [{ kind: 'top_up', kg, cylinder: 'CYL-W1' }] });

async function freshFigures(unitId: number) {
  const [unit] = await db.select().from(units).where(eq(units.id, unitId));
  return computeUnitStats(engineUnit(unit), await loadEngineHistory(db, unitId), NOW.toISOString(), DEFAULT_SETTINGS);
}

describe('unit edits through the write path', () => {
  it('recomputes the leak rate, CO2e and leak-check interval when the charge and refrigerant change, and records who changed what', async () => {
    const unit = await createTestUnit(db, { nominalChargeKg: 5, refrigerant: 'R-134a', commissionedOn: '2020-01-01' });
    expect((await topUp(unit.id, '2026-03-01T10:00:00Z', 1.0)).status).toBe(201);
    expect((await topUp(unit.id, '2026-05-01T10:00:00Z', 1.2)).status).toBe(201);
    const edit = await engineer
      .patch(`/api/units/${unit.id}`)
      .set('Origin', TEST_ORIGIN)
      .send({ nominalChargeKg: 15.6, refrigerant: 'R-404A' });
    expect(edit.status).toBe(200);
    const overview = await engineer.get(`/api/units/${unit.id}/overview`);
    const fresh = await freshFigures(unit.id);
    expect(overview.body.stats.rollingLeakRatePct).toBeCloseTo(fresh.rollingLeakRatePct, 9);
    // Source: Reg. (EU) 2024/573 Annex VI method with IPCC AR4 values — R-404A GWP 3921.6, rounded to 3922;
    // t CO2e = kg × GWP / 1000 = 61.18 t (the figure stayed at 7.4 t before edits recomputed).
    expect(overview.body.stats.co2eTonnes).toBeCloseTo((15.6 * 3922) / 1000, 2);
    // Source: Reg. (EU) 2024/573 — 50 to < 500 t CO2e: a leak check every 6 months.
    expect(overview.body.stats.leakCheckIntervalMonths).toBe(6);
    const changes = await engineer.get(`/api/units/${unit.id}/changes`);
    expect(
      changes.body.changes.map((c: { field: string; before: string; after: string }) => [c.field, c.before, c.after]),
    ).toEqual(
      expect.arrayContaining([
        ['nominalChargeKg', '5', '15.6'],
        ['refrigerant', 'R-134a', 'R-404A'],
      ]),
    );
  });

  it('refuses a commissioning date more than a year after the first entry of the history (400 on the field)', async () => {
    const unit = await createTestUnit(db, { commissionedOn: '2020-01-01' });
    expect((await topUp(unit.id, '2021-03-01T10:00:00Z', 0.5)).status).toBe(201);
    const late = await engineer
      .patch(`/api/units/${unit.id}`)
      .set('Origin', TEST_ORIGIN)
      .send({ commissionedOn: '2023-05-01' });
    expect(late.status).toBe(400);
    expect(late.body.error.fields.commissionedOn).toMatch(/1 Mar 2021/);
    const fine = await engineer
      .patch(`/api/units/${unit.id}`)
      .set('Origin', TEST_ORIGIN)
      .send({ commissionedOn: '2021-06-01' });
    expect(fine.status).toBe(200);
  });

  it('gives a unit registered through the API its figures and a change record at once', async () => {
    const res = await engineer
      .post('/api/units')
      .set('Origin', TEST_ORIGIN)
      .send({
        containerNumber: halyardNumber(710_001),
        refrigerant: 'R-134a',
        nominalChargeKg: 5,
        commissionedOn: '2024-02-01',
      });
    expect(res.status).toBe(201);
    const [row] = await db.select().from(unitStats).where(eq(unitStats.unitId, res.body.unit.id));
    // Source: DOMAIN.md §3 — 5 kg × 1430 (HFC-134a, AR4) / 1000 = 7.15 t CO2e.
    expect(row.co2eTonnes).toBeCloseTo(7.15, 9);
    const [change] = await db
      .select()
      .from(unitChanges)
      .where(and(eq(unitChanges.unitId, res.body.unit.id), eq(unitChanges.field, 'registered')));
    expect(change).toBeDefined();
  });

  it('gives every imported unit its figures and a change record in the import transaction', async () => {
    const numbers = [halyardNumber(720_001), halyardNumber(720_002)];
    const csv = [
      'container_number,refrigerant,nominal_charge_kg',
      `${numbers[0]},R-134a,5`,
      `${numbers[1]},R-513A,4.5`,
    ].join('\n');
    const res = await engineer
      .post('/api/unit-imports')
      .set('Origin', TEST_ORIGIN)
      .field('importKey', newToken())
      .attach('file', Buffer.from(csv), { filename: 'two.csv', contentType: 'text/csv' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    for (const n of numbers) {
      const [u] = await db.select({ id: units.id }).from(units).where(eq(units.containerNumber, n));
      expect(await db.select().from(unitStats).where(eq(unitStats.unitId, u.id))).toHaveLength(1);
      const changes = await db
        .select()
        .from(unitChanges)
        .where(and(eq(unitChanges.unitId, u.id), eq(unitChanges.field, 'registered')));
      expect(changes[0].after).toContain('two.csv');
    }
  });
});

describe('submission keys and voids', () => {
  it('replays a visit sent again with the same key and content, and refuses the key with other content (409)', async () => {
    const unit = await createTestUnit(db);
    const key = randomUUID();
    expect((await topUp(unit.id, '2026-05-10T10:00:00Z', 0.8, key)).status).toBe(201);
    const again = await topUp(unit.id, '2026-05-10T10:00:00Z', 0.8, key);
    expect(again.status).toBe(200);
    expect(again.body.replayed).toBe(true);
    const other = await topUp(unit.id, '2026-05-10T10:00:00Z', 1.8, key);
    expect(other.status).toBe(409);
    expect(other.body.error.message).toMatch(/other entries/);
    expect(other.body.error.fields).toHaveProperty('idempotencyKey');
  });

  it('voids an entry once: a second void answers 409 and the database refuses a second void row', async () => {
    const unit = await createTestUnit(db);
    const res = await topUp(unit.id, '2026-05-12T10:00:00Z', 0.5);
    const eventId = res.body.events[0].id as number;
    const voids = await Promise.all(
      [0, 1, 2, 3].map(() =>
        engineer.post(`/api/events/${eventId}/void`).set('Origin', TEST_ORIGIN).send({ reason: 'Wrong unit' }),
      ),
    );
    expect(voids.map((v) => v.status).sort()).toEqual([201, 409, 409, 409]);
    const [first] = await db.select().from(events).where(eq(events.voidsEventId, eventId));
    await expect(db.insert(events).values({ ...first, id: undefined, createdAt: undefined })).rejects.toMatchObject({
      cause: { code: 'ER_DUP_ENTRY' },
    });
  });
});

describe('a record the engine cannot compute', () => {
  it('keeps the write, stores the reason and shows it on the unit instead of failing', async () => {
    // An old row from before the date rule: the engine places no date before 1900.
    const unit = await createTestUnit(db, { commissionedOn: '1850-01-01' });
    const res = await topUp(unit.id, '2026-05-20T10:00:00Z', 0.4);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.stats.computeError).toEqual(expect.any(String));
    const overview = await engineer.get(`/api/units/${unit.id}/overview`);
    expect(overview.status).toBe(200);
    expect(overview.body.stats.computeError).toBe(
      'the commissioning date (1 Jan 1850) is outside 1 Jan 1960 to today.',
    );
    expect(overview.body.stats.detail).toBeNull();
    // Fixing the record through the write path brings the figures back.
    const timeline = await engineer.get(`/api/units/${unit.id}/timeline`);
    expect(timeline.status).toBe(200);
    expect(timeline.body.events.length).toBeGreaterThan(0);
    const decision = await owner.get(`/api/decisions/units/${unit.id}`);
    expect(decision.status).toBe(409);
    expect(decision.body.error.code).toBe('cannot_compute');
    const fix = await engineer
      .patch(`/api/units/${unit.id}`)
      .set('Origin', TEST_ORIGIN)
      .send({ commissionedOn: '2019-01-01' });
    expect(fix.status).toBe(200);
    const after = await engineer.get(`/api/units/${unit.id}/overview`);
    expect(after.body.stats.computeError).toBeNull();
    expect(after.body.stats.detail).not.toBeNull();
  });
});
