import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { unitChanges, units } from '../../server/db/schema';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { createTestSite, halyardNumber, withWrongCheckDigit } from '../support/units';

const { db, pool } = openTestDb();
const { app } = createApp({ db, rateLimits: { signInPerIp: 1000 } });
let engineer: TestAgent;
let engineerId: string;
let technician: TestAgent;

beforeAll(async () => {
  await resetDb(db);
  const e = await signInAs(app, db, 'engineer');
  engineer = e.agent;
  engineerId = e.user.id;
  technician = (await signInAs(app, db, 'technician')).agent;
});
afterAll(() => pool.end());

const post = (agent: TestAgent, path: string, body: object) => agent.post(path).set('Origin', TEST_ORIGIN).send(body);
const patch = (agent: TestAgent, path: string, body: object) => agent.patch(path).set('Origin', TEST_ORIGIN).send(body);

describe('registering a unit', () => {
  it('normalises the container number and stores every field', async () => {
    const site = await createTestSite(db);
    const number = halyardNumber(100001);
    const loose = `${number.slice(0, 4).toLowerCase()} ${number.slice(4, 10)}-${number.slice(10)}`;
    const res = await post(engineer, '/api/units', {
      containerNumber: loose,
      refrigerant: 'r134a',
      nominalChargeKg: '4,5',
      commissionedOn: '2021-03-15',
      siteId: site.id,
      machinerySerial: ' MX-1 ',
      model: 'HX-40',
      manufactureYear: 2020,
      purchaseCost: 14800.456,
      residualValue: '',
      notes: 'Machinery from a retired box',
    });
    expect(res.status).toBe(201);
    expect(res.body.unit).toMatchObject({
      containerNumber: number,
      refrigerant: 'R-134a',
      nominalChargeKg: 4.5,
      commissionedOn: '2021-03-15',
      status: 'in_service',
      site: { id: site.id, code: site.code },
      machinerySerial: 'MX-1',
      model: 'HX-40',
      manufactureYear: 2020,
      purchaseCost: 14800.46,
      residualValue: null,
      notes: 'Machinery from a retired box',
    });
    expect(res.body.unit.qrToken).toBeUndefined();
    const [row] = await db.select().from(units).where(eq(units.id, res.body.unit.id));
    // 256 random bits, base64url.
    expect(row.qrToken).toMatch(/^[A-Za-z0-9_-]{43}$/);
  });

  it('answers 400 naming the expected check digit when the number has a typo', async () => {
    const { number, expected } = withWrongCheckDigit(halyardNumber(100002));
    const res = await post(engineer, '/api/units', {
      containerNumber: number,
      refrigerant: 'R-134a',
      nominalChargeKg: 4,
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.containerNumber).toContain(`gives ${expected}`);
  });

  it('answers 400 for an unknown refrigerant, a zero charge and an unknown site', async () => {
    const res = await post(engineer, '/api/units', {
      containerNumber: halyardNumber(100003),
      refrigerant: 'R-22',
      nominalChargeKg: 0,
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toMatchObject({
      refrigerant: expect.stringContaining('R-134a'),
      nominalChargeKg: expect.any(String),
    });
    const noSite = await post(engineer, '/api/units', {
      containerNumber: halyardNumber(100003),
      refrigerant: 'R-744',
      nominalChargeKg: 5,
      siteId: 999999,
    });
    expect(noSite.status).toBe(400);
    expect(noSite.body.error.fields.siteId).toBeTruthy();
  });

  it('answers 409 for a container number already registered', async () => {
    const unit = await createTestUnit(db);
    const res = await post(engineer, '/api/units', {
      containerNumber: unit.containerNumber,
      refrigerant: 'R-134a',
      nominalChargeKg: 4,
    });
    expect(res.status).toBe(409);
    expect(res.body.error.fields.containerNumber).toBe('Already registered');
  });

  it('refuses a technician with 403 and a visitor with 401', async () => {
    const body = { containerNumber: halyardNumber(100004), refrigerant: 'R-134a', nominalChargeKg: 4 };
    expect((await post(technician, '/api/units', body)).status).toBe(403);
    expect((await request(app).post('/api/units').set('Origin', TEST_ORIGIN).send(body)).status).toBe(401);
  });
});

describe('finding units', () => {
  let siteA: number;
  beforeAll(async () => {
    siteA = (await createTestSite(db, { code: 'LIST-A' })).id;
    for (let i = 0; i < 12; i++) {
      await createTestUnit(db, {
        containerNumber: halyardNumber(550000 + i),
        siteId: i % 2 === 0 ? siteA : null,
        status: i % 3 === 0 ? 'out_of_service' : 'in_service',
        refrigerant: i < 4 ? 'R-513A' : 'R-134a',
        nominalChargeKg: 3 + i / 10,
      });
    }
  });

  it('searches by container-number prefix, typed loosely, with paging', async () => {
    const res = await technician.get('/api/units').query({ q: 'hrlu 55', pageSize: 5, page: 2 });
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(12);
    expect(res.body.units).toHaveLength(5);
    expect(res.body.units[0].containerNumber).toBe(halyardNumber(550005));
  });

  it('filters by site, status and refrigerant together', async () => {
    const res = await technician
      .get('/api/units')
      .query({ q: 'HRLU55', siteId: siteA, status: 'out_of_service', refrigerant: 'R 513A' });
    expect(res.status).toBe(200);
    // i in 0..3 (R-513A), even (site A), divisible by 3 (out of service): 0 only.
    expect(res.body.units.map((u: { containerNumber: string }) => u.containerNumber)).toEqual([halyardNumber(550000)]);
  });

  it('sorts by charge, largest first', async () => {
    const res = await technician
      .get('/api/units')
      .query({ q: 'HRLU55', sort: 'nominalChargeKg', dir: 'desc', pageSize: 3 });
    expect(res.body.units.map((u: { nominalChargeKg: number }) => u.nominalChargeKg)).toEqual([4.1, 4, 3.9]);
  });

  it('answers 400 for a bad filter and 401 without a session', async () => {
    const bad = await technician.get('/api/units').query({ q: 'HRLU%', pageSize: 1000, sort: 'price' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(expect.arrayContaining(['q', 'pageSize', 'sort']));
    expect((await request(app).get('/api/units')).status).toBe(401);
  });

  it('opens a unit by id, 404 for an unknown id and 400 for a malformed one', async () => {
    const unit = await createTestUnit(db);
    const res = await technician.get(`/api/units/${unit.id}`);
    expect(res.status).toBe(200);
    expect(res.body.unit.containerNumber).toBe(unit.containerNumber);
    expect((await technician.get('/api/units/999999')).status).toBe(404);
    expect((await technician.get('/api/units/abc')).status).toBe(400);
  });

  it('opens a unit by its label code', async () => {
    const unit = await createTestUnit(db);
    const res = await technician.get(`/api/units/by-token/${unit.qrToken}`);
    expect(res.status).toBe(200);
    expect(res.body.unit.id).toBe(unit.id);
    expect((await technician.get(`/api/units/by-token/${'x'.repeat(43)}`)).status).toBe(404);
    expect((await technician.get('/api/units/by-token/not*a*token')).status).toBe(400);
  });

  it('opens a unit by container number typed loosely; 400 says the check digit; 404 when unknown', async () => {
    const unit = await createTestUnit(db);
    const loose = `${unit.containerNumber.slice(0, 4).toLowerCase()} ${unit.containerNumber.slice(4)}`;
    const res = await technician.get(`/api/units/by-number/${encodeURIComponent(loose)}`);
    expect(res.status).toBe(200);
    expect(res.body.unit.id).toBe(unit.id);

    const { number, expected } = withWrongCheckDigit(unit.containerNumber);
    const wrong = await technician.get(`/api/units/by-number/${number}`);
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.code).toBe('check_digit_mismatch');
    expect(wrong.body.error.message).toContain(`gives ${expected}`);

    const short = await technician.get('/api/units/by-number/HRLU12');
    expect(short.status).toBe(400);
    expect(short.body.error.code).toBe('invalid_container_number');

    const unknown = await technician.get(`/api/units/by-number/${halyardNumber(777777)}`);
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toContain('No unit is registered');
  });
});

describe('editing a unit', () => {
  it('keeps one change record per changed field, with who and when', async () => {
    const site = await createTestSite(db, { code: 'EDIT-NEW' });
    const unit = await createTestUnit(db, { nominalChargeKg: 4.5, status: 'in_service' });
    const res = await patch(engineer, `/api/units/${unit.id}`, {
      nominalChargeKg: 4.8,
      status: 'out_of_service',
      siteId: site.id,
      model: 'HX-40',
      refrigerant: 'R-134a',
    });
    expect(res.status).toBe(200);
    expect(res.body.unit).toMatchObject({
      nominalChargeKg: 4.8,
      status: 'out_of_service',
      model: 'HX-40',
      site: { code: 'EDIT-NEW' },
    });
    expect(new Date(res.body.unit.updatedAt).getTime()).toBeGreaterThan(Date.now() - 60_000);

    const history = await technician.get(`/api/units/${unit.id}/changes`);
    expect(history.status).toBe(200);
    const byField = Object.fromEntries(history.body.changes.map((c: { field: string }) => [c.field, c]));
    // The unchanged refrigerant is not recorded.
    expect(Object.keys(byField).sort()).toEqual(['model', 'nominalChargeKg', 'site', 'status']);
    expect(byField.nominalChargeKg).toMatchObject({
      before: '4.5',
      after: '4.8',
      label: 'Full charge (kg)',
      user: { id: engineerId },
    });
    expect(byField.site).toMatchObject({ before: null, after: 'EDIT-NEW' });
    expect(byField.status).toMatchObject({ before: 'in_service', after: 'out_of_service' });
  });

  it('writes no change record when nothing actually changes', async () => {
    const unit = await createTestUnit(db, { nominalChargeKg: 4.5 });
    const res = await patch(engineer, `/api/units/${unit.id}`, { nominalChargeKg: '4.50' });
    expect(res.status).toBe(200);
    expect(await db.select().from(unitChanges).where(eq(unitChanges.unitId, unit.id))).toHaveLength(0);
  });

  it('answers 409 when renumbering onto another unit, 404 for an unknown unit, 400 for an empty edit, 403 for a technician', async () => {
    const a = await createTestUnit(db);
    const b = await createTestUnit(db);
    const dup = await patch(engineer, `/api/units/${a.id}`, { containerNumber: b.containerNumber });
    expect(dup.status).toBe(409);
    expect((await patch(engineer, '/api/units/999999', { model: 'X' })).status).toBe(404);
    expect((await patch(engineer, `/api/units/${a.id}`, {})).status).toBe(400);
    expect((await patch(technician, `/api/units/${a.id}`, { model: 'X' })).status).toBe(403);
  });

  it('answers 404 for the history of an unknown unit', async () => {
    expect((await technician.get('/api/units/999999/changes')).status).toBe(404);
  });
});

describe('re-issuing a label code', () => {
  it('gives the unit a new code; the old one stops working', async () => {
    const unit = await createTestUnit(db);
    const res = await post(engineer, `/api/units/${unit.id}/qr-token`, {});
    expect(res.status).toBe(200);
    expect(new Date(res.body.unit.qrIssuedAt).getTime()).toBeGreaterThan(Date.now() - 60_000);
    const [row] = await db.select().from(units).where(eq(units.id, unit.id));
    expect(row.qrToken).not.toBe(unit.qrToken);
    expect((await technician.get(`/api/units/by-token/${unit.qrToken}`)).status).toBe(404);
    expect((await technician.get(`/api/units/by-token/${row.qrToken}`)).status).toBe(200);
    const history = await technician.get(`/api/units/${unit.id}/changes`);
    expect(history.body.changes[0]).toMatchObject({ field: 'qrIssuedAt', label: 'QR label issued' });
  });

  it('answers 404 for an unknown unit and 403 for a technician', async () => {
    const unit = await createTestUnit(db);
    expect((await post(engineer, '/api/units/999999/qr-token', {})).status).toBe(404);
    expect((await post(technician, `/api/units/${unit.id}/qr-token`, {})).status).toBe(403);
  });
});
