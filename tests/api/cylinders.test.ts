// The cylinder register: registering, weighing and reconciling, capacity of recovery cylinders, charges and
// recoveries linked to cylinders, traceability from the register, quarantine marking units, and the CSV import.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { cylinderMoves, cylinders, events } from '../../server/db/schema';
import type { CylinderDetailDto, CylinderDto } from '../../shared/schemas/cylinders';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { createTestSite, halyardNumber } from '../support/units';

const { db, pool } = openTestDb();
let clockNow = new Date('2026-06-01T12:00:00Z');
const { app } = createApp({ db, clock: { now: () => clockNow }, rateLimits: { signInPerIp: 1000 } });

type Agent = Awaited<ReturnType<typeof signInAs>>['agent'];
let engineer: Agent;
let tech: Agent;
let owner: Agent;
let site: { id: number; code: string };
let unitA: number;
let unitB: number;
let unit404: number;

beforeAll(async () => {
  await resetDb(db);
  engineer = (await signInAs(app, db, 'engineer')).agent;
  tech = (await signInAs(app, db, 'technician')).agent;
  owner = (await signInAs(app, db, 'owner')).agent;
  site = await createTestSite(db, { name: 'North quay', code: 'NQ' });
  unitA = (await createTestUnit(db, { containerNumber: halyardNumber(610001), siteId: site.id })).id;
  unitB = (await createTestUnit(db, { containerNumber: halyardNumber(610002), siteId: site.id })).id;
  unit404 = (await createTestUnit(db, { containerNumber: halyardNumber(610003), refrigerant: 'R-404A' })).id;
});
afterAll(() => pool.end());

const post = (agent: Agent, path: string, body: unknown) =>
  agent
    .post(path)
    .set('Origin', TEST_ORIGIN)
    .send(body as object);

async function register(body: Record<string, unknown>): Promise<CylinderDto> {
  const res = await post(engineer, '/api/cylinders', { siteId: site.id, ...body });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return (res.body as CylinderDetailDto).cylinder;
}

function visit(unitId: number, at: string, evs: Record<string, unknown>[]) {
  return post(tech, '/api/visits', { idempotencyKey: randomUUID(), unitId, occurredAt: at, events: evs });
}

describe('registering cylinders', () => {
  it('registers a supply cylinder with a first weighing and gives it a number when none is given', async () => {
    const c = await register({
      kind: 'new',
      refrigerant: 'r134a',
      tareKg: 12,
      capacityKg: 13.6,
      grossKg: 25.6,
      gasOrigin: 'virgin',
      lot: 'L-77',
    });
    expect(c.code).toMatch(/^CY\d{5}$/);
    expect(c.refrigerant).toBe('R-134a');
    expect(c.status).toBe('full');
    expect(c.ledger.contentKg).toBeCloseTo(13.6);
    expect(c.labelUrl).toContain(`/c/${c.code}`);
  });

  it('returns 400 naming the field when a supply cylinder does not say where its gas comes from', async () => {
    const res = await post(engineer, '/api/cylinders', {
      kind: 'new',
      refrigerant: 'R-134a',
      tareKg: 12,
      capacityKg: 13,
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.gasOrigin).toMatch(/virgin/);
  });

  it('returns 409 when the number is already in the register', async () => {
    await register({ code: 'rc-9', kind: 'recovery', refrigerant: 'R-134a', tareKg: 14, capacityKg: 20 });
    const res = await post(engineer, '/api/cylinders', {
      code: 'RC-9',
      kind: 'recovery',
      refrigerant: 'R-134a',
      tareKg: 14,
      capacityKg: 20,
    });
    expect(res.status).toBe(409);
    expect(res.body.error.fields.code).toBeTruthy();
  });

  it('returns 403 when a technician registers a cylinder, and lets a technician read the register', async () => {
    const res = await post(tech, '/api/cylinders', {
      kind: 'recovery',
      refrigerant: 'R-134a',
      tareKg: 14,
      capacityKg: 20,
    });
    expect(res.status).toBe(403);
    const list = await tech.get('/api/cylinders');
    expect(list.status).toBe(200);
    expect(list.body.cylinders.length).toBeGreaterThan(0);
  });

  it('finds a cylinder by the number on its label, and returns 404 for an unknown one', async () => {
    const found = await tech.get('/api/cylinders/by-code/rc-9');
    expect(found.status).toBe(200);
    expect(found.body.cylinder.code).toBe('RC-9');
    expect((await tech.get('/api/cylinders/by-code/NOPE-1')).status).toBe(404);
  });

  it('prints the cylinder its own QR label', async () => {
    const c = await register({ kind: 'recovery', refrigerant: 'R-134a', tareKg: 14, capacityKg: 20 });
    const res = await engineer.get(`/api/cylinders/${c.id}/label`).buffer(true);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
  });
});

describe('charges, recoveries and the ledger', () => {
  let supply: CylinderDto;
  let recovery: CylinderDto;

  beforeAll(async () => {
    // Registered (and first weighed) before the visits that use them.
    clockNow = new Date('2026-05-01T08:00:00Z');
    supply = await register({
      code: 'NC-100',
      kind: 'new',
      refrigerant: 'R-134a',
      tareKg: 12,
      capacityKg: 13.6,
      grossKg: 25.6,
      gasOrigin: 'virgin',
      lot: 'LOT-42',
    });
    recovery = await register({
      code: 'RC-100',
      kind: 'recovery',
      refrigerant: 'R-134a',
      tareKg: 14,
      capacityKg: 5,
      grossKg: 14,
    });
    clockNow = new Date('2026-06-01T12:00:00Z');
  });

  it('links a top-up to the supply cylinder it came from and reconciles it against a weighing', async () => {
    const res = await visit(unitA, '2026-05-10T10:00:00Z', [
      { kind: 'top_up', kg: 1.5, cylinder: 'NC-100', cylinderId: supply.id },
    ]);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const [move] = await db.select().from(cylinderMoves).where(eq(cylinderMoves.cylinderId, supply.id));
    expect(move).toMatchObject({ unitId: unitA, direction: 'out', kg: 1.5 });
    // The scale says 1.5 kg left: within the tolerance, no flag.
    const w = await post(tech, `/api/cylinders/${supply.id}/weighings`, { grossKg: 24.1 });
    expect(w.status, JSON.stringify(w.body)).toBe(201);
    const c = (w.body as CylinderDetailDto).cylinder;
    expect(c.ledger.reconciliation).toMatchObject({ visitsOutKg: 1.5, weighedLossKg: 1.5, flagged: false });
    expect(c.status).toBe('in_use');
  });

  it('flags a cylinder whose weighed loss is more than the visits wrote, beyond the tolerance', async () => {
    const w = await post(tech, `/api/cylinders/${supply.id}/weighings`, { grossKg: 22.9 });
    const r = (w.body as CylinderDetailDto).cylinder.ledger.reconciliation!;
    expect(r.weighedLossKg).toBeCloseTo(2.7);
    expect(r.visitsOutKg).toBeCloseTo(1.5);
    expect(r.differenceKg).toBeCloseTo(1.2);
    expect(r.flagged).toBe(true);
  });

  it('follows the tolerance in the settings: raised to 2 kg, the same 1.2 kg difference is no longer flagged', async () => {
    const admin = (await signInAs(app, db, 'admin')).agent;
    const current = await admin.get('/api/settings');
    const settings = { ...current.body.settings, cylinders: { ...current.body.settings.cylinders, toleranceKg: 2 } };
    const put = await admin
      .put('/api/settings')
      .set('Origin', TEST_ORIGIN)
      .send({ settings, baseVersion: current.body.version });
    expect(put.status, JSON.stringify(put.body)).toBe(200);
    const res = await engineer.get(`/api/cylinders/${supply.id}`);
    expect(res.status).toBe(200);
    expect((res.body as CylinderDetailDto).cylinder.ledger.reconciliation).toMatchObject({ flagged: false });
    settings.cylinders.toleranceKg = 0.5;
    const back = await admin
      .put('/api/settings')
      .set('Origin', TEST_ORIGIN)
      .send({ settings, baseVersion: put.body.version });
    expect(back.status, JSON.stringify(back.body)).toBe(200);
  });

  it('returns 400 when a weighing is below the tare', async () => {
    const res = await post(tech, `/api/cylinders/${supply.id}/weighings`, { grossKg: 5 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.grossKg).toBeTruthy();
  });

  it('returns 400 when the cylinder holds another refrigerant than the unit', async () => {
    const res = await visit(unit404, '2026-05-11T10:00:00Z', [
      { kind: 'top_up', kg: 0.5, cylinder: 'NC-100', cylinderId: supply.id },
    ]);
    expect(res.status).toBe(400);
    expect(res.body.error.fields['events.0.cylinderId']).toMatch(/R-134a/);
  });

  it('returns 400 when a recovery goes into a supply cylinder', async () => {
    const res = await visit(unitA, '2026-05-11T10:00:00Z', [
      { kind: 'recovery', kg: 0.5, cylinder: 'NC-100', cylinderId: supply.id },
    ]);
    expect(res.status).toBe(400);
    expect(res.body.error.fields['events.0.cylinderId']).toMatch(/recovery cylinder/);
  });

  it('fills a recovery cylinder, warns near the maximum and returns 409 rather than overfill it', async () => {
    const ok = await visit(unitA, '2026-05-12T10:00:00Z', [
      { kind: 'recovery', kg: 4.6, cylinder: 'RC-100', cylinderId: recovery.id },
    ]);
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    const c = (await tech.get(`/api/cylinders/${recovery.id}`)).body as CylinderDetailDto;
    expect(c.cylinder.ledger.contentKg).toBeCloseTo(4.6);
    expect(c.cylinder.ledger.nearFull).toBe(true);
    const over = await visit(unitB, '2026-05-13T10:00:00Z', [
      { kind: 'recovery', kg: 0.5, cylinder: 'RC-100', cylinderId: recovery.id },
    ]);
    expect(over.status).toBe(409);
    expect(over.body.error.fields['events.0.cylinderId']).toMatch(/never overfill/);
    // Nothing of the refused visit was kept.
    expect(await db.select().from(events).where(eq(events.unitId, unitB))).toHaveLength(0);
  });

  it('counts a voided charge out of the ledger', async () => {
    const res = await visit(unitB, '2026-05-14T10:00:00Z', [
      { kind: 'top_up', kg: 0.4, cylinder: 'NC-100', cylinderId: supply.id },
    ]);
    const before = ((await tech.get(`/api/cylinders/${supply.id}`)).body as CylinderDetailDto).cylinder.ledger.outKg;
    const v = await post(engineer, `/api/events/${res.body.events[0].id}/void`, { reason: 'wrong unit' });
    expect(v.status, JSON.stringify(v.body)).toBe(201);
    const after = (await tech.get(`/api/cylinders/${supply.id}`)).body as CylinderDetailDto;
    expect(after.cylinder.ledger.outKg).toBeCloseTo(before - 0.4);
    expect(after.moves.find((m) => m.eventId === res.body.events[0].id)?.voided).toBe(true);
  });

  it('lets concurrent weighings and charges on one cylinder all land, each counted once', async () => {
    const c = await register({
      code: 'NC-200',
      kind: 'new',
      refrigerant: 'R-134a',
      tareKg: 10,
      capacityKg: 50,
      grossKg: 60,
      gasOrigin: 'reclaimed',
    });
    const units = await Promise.all(
      [0, 1, 2, 3].map(async (i) => (await createTestUnit(db, { containerNumber: halyardNumber(620010 + i) })).id),
    );
    const writers = [
      ...units.map((u) =>
        visit(u, '2026-05-20T10:00:00Z', [{ kind: 'top_up', kg: 1, cylinder: 'NC-200', cylinderId: c.id }]),
      ),
      post(tech, `/api/cylinders/${c.id}/weighings`, { grossKg: 59.9, weighedAt: '2026-05-19T10:00:00Z' }),
      post(tech, `/api/cylinders/${c.id}/weighings`, { grossKg: 59.8, weighedAt: '2026-05-18T10:00:00Z' }),
    ];
    const results = await Promise.all(writers);
    for (const r of results) expect(r.status, JSON.stringify(r.body)).toBe(201);
    const d = (await tech.get(`/api/cylinders/${c.id}`)).body as CylinderDetailDto;
    expect(d.moves).toHaveLength(4);
    expect(d.weighings).toHaveLength(3);
    expect(d.cylinder.ledger.outKg).toBeCloseTo(4);
  });
});

describe('traceability and quarantine', () => {
  let suspect: CylinderDto;

  beforeAll(async () => {
    suspect = await register({
      code: 'NC-300',
      kind: 'new',
      refrigerant: 'R-134a',
      tareKg: 12,
      capacityKg: 13.6,
      grossKg: 25.6,
      gasOrigin: 'recycled',
      lot: 'SUSPECT-LOT',
    });
    for (const u of [unitA, unitB]) {
      const r = await visit(u, '2026-05-25T10:00:00Z', [
        { kind: 'top_up', kg: 0.7, cylinder: 'NC-300', cylinderId: suspect.id },
      ]);
      expect(r.status, JSON.stringify(r.body)).toBe(201);
    }
  });

  it('lists every unit charged from a register cylinder, and from a register lot the technician never typed', async () => {
    const byCylinder = await engineer.get(`/api/traceability?cylinderId=${suspect.id}`);
    expect(byCylinder.status, JSON.stringify(byCylinder.body)).toBe(200);
    expect(byCylinder.body.units.map((u: { unitId: number }) => u.unitId).sort()).toEqual([unitA, unitB].sort());
    const byLot = await engineer.get('/api/traceability?cylinder=SUSPECT');
    expect(byLot.body.units.map((u: { unitId: number }) => u.unitId).sort()).toEqual([unitA, unitB].sort());
  });

  it('returns 400 when a cylinder is quarantined without a reason', async () => {
    const res = await post(engineer, `/api/cylinders/${suspect.id}/status`, { status: 'quarantined' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.reason).toBeTruthy();
  });

  it('marks every unit charged from a quarantined cylinder, once, and refuses further charges from it', async () => {
    const res = await post(engineer, `/api/cylinders/${suspect.id}/status`, {
      status: 'quarantined',
      reason: 'Supplier recall of lot SUSPECT-LOT',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.unitsMarked).toBe(2);
    expect(res.body.cylinder.quarantine.reason).toMatch(/recall/);
    // Repeating the request writes no second mark.
    await post(engineer, `/api/cylinders/${suspect.id}/status`, {
      status: 'quarantined',
      reason: 'Supplier recall of lot SUSPECT-LOT',
    });
    const notes = await db.select().from(events).where(eq(events.unitId, unitA));
    const marks = notes.filter((e) => (e.details as { quarantine?: unknown } | null)?.quarantine);
    expect(marks).toHaveLength(1);
    expect(marks[0].details).toMatchObject({ quarantine: { cylinderId: suspect.id, code: 'NC-300' } });
    const detail = (await tech.get(`/api/cylinders/${suspect.id}`)).body as CylinderDetailDto;
    expect(detail.quarantinedUnits.map((u) => u.unitId).sort()).toEqual([unitA, unitB].sort());
    const again = await visit(unitA, '2026-05-28T10:00:00Z', [
      { kind: 'top_up', kg: 0.2, cylinder: 'NC-300', cylinderId: suspect.id },
    ]);
    expect(again.status).toBe(400);
    expect(again.body.error.fields['events.0.cylinderId']).toMatch(/quarantined/);
  });

  it('returns 403 when an owner changes a cylinder status', async () => {
    const res = await post(owner, `/api/cylinders/${suspect.id}/status`, { status: 'empty' });
    expect(res.status).toBe(403);
  });
});

describe('importing cylinders from CSV', () => {
  const upload = (csv: string) =>
    engineer.post('/api/cylinder-imports').set('Origin', TEST_ORIGIN).attach('file', Buffer.from(csv), 'cylinders.csv');

  it('imports nothing when one row is wrong, and names every bad row and field', async () => {
    const csv = [
      'code,kind,refrigerant,tareKg,capacityKg,grossKg,gasOrigin,siteCode',
      'IMP-1,new,R-134a,12,13.6,25.6,virgin,NQ',
      'IMP-2,recovery,R-999,14,20,,,NQ',
      'IMP-3,new,R-134a,12,13.6,,,NQ',
      'IMP-1,recovery,R-134a,14,20,,,NOPE',
    ].join('\n');
    const res = await upload(csv);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_rows');
    expect(Object.keys(res.body.error.fields)).toEqual(
      expect.arrayContaining(['rows.3.refrigerant', 'rows.4.gasOrigin', 'rows.5.siteCode']),
    );
    expect(await db.select().from(cylinders).where(eq(cylinders.code, 'IMP-1'))).toHaveLength(0);
  });

  it('imports every row of a clean file with the same rule as the form, first weighings included', async () => {
    const csv = [
      'Cylinder number;Kind;Refrigerant;Tare;Capacity;Gross;Origin;Site;Lot',
      'IMP-1;new;R-134a;12;13,6;25,6;virgin;NQ;L-1',
      'IMP-2;recovery;R-134a;14;20;14;;NQ;',
    ].join('\n');
    const res = await upload(csv);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.imported).toBe(2);
    const found = (await tech.get('/api/cylinders/by-code/IMP-1')).body.cylinder as CylinderDto;
    expect(found.ledger.contentKg).toBeCloseTo(13.6);
    expect(found.site?.id).toBe(site.id);
  });

  it('returns 415 when the file is not CSV', async () => {
    const res = await engineer
      .post('/api/cylinder-imports')
      .set('Origin', TEST_ORIGIN)
      .attach('file', Buffer.from('%PDF-1.7 nope'), 'cylinders.pdf');
    expect(res.status).toBe(415);
  });
});
