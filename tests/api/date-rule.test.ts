// One date rule at every entry point (shared/schemas/common.ts): dates the engine cannot compute, or that cannot be
// true, are a 400 naming the field, never a 500; and a unit already in the database with such a date (an old row)
// does not break the fleet-wide reads.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type TestAgent from 'supertest/lib/agent';
import { parse } from 'csv-parse/sync';
import { eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { units } from '../../server/db/schema';
import { createStatsBackfill } from '../../server/features/history/stats-backfill';
import { newToken } from '../../server/lib/ids';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { createTestSite, halyardNumber } from '../support/units';

// The system clock, as in production: a date-only "today" in the schemas is the clock of whoever parses.
const { db, pool } = openTestDb();
const { app, ctx } = createApp({ db, rateLimits: { signInPerIp: 1000 } });
const DAY_MS = 86_400_000;
const dayFromNow = (days: number) => new Date(Date.now() + days * DAY_MS).toISOString().slice(0, 10);
const RANGE = 'Enter a date between 1 Jan 1960 and today';

let engineer: TestAgent;
let technician: TestAgent;
let siteId = 0;

beforeAll(async () => {
  await resetDb(db);
  engineer = (await signInAs(app, db, 'engineer')).agent;
  technician = (await signInAs(app, db, 'technician')).agent;
  siteId = (await createTestSite(db, { code: 'DATE-DEPOT' })).id;
});
afterAll(async () => {
  await ctx.jobs.waitForAll();
  await pool.end();
});

const post = (agent: TestAgent, path: string, body: object) => agent.post(path).set('Origin', TEST_ORIGIN).send(body);
const newUnit = (serial: number, commissionedOn: unknown) =>
  post(engineer, '/api/units', {
    containerNumber: halyardNumber(serial),
    refrigerant: 'R-134a',
    nominalChargeKg: 5,
    commissionedOn,
  });
const visit = (unitId: number, occurredAt: string) =>
  post(technician, '/api/visits', {
    idempotencyKey: randomUUID(),
    unitId,
    occurredAt,
    events: [{ kind: 'pti', passed: true }],
  });

describe('commissioning date: registering a unit', () => {
  it.each([
    ['1850-01-01', RANGE],
    ['1959-12-31', RANGE],
    ['2300-01-01', RANGE],
    ['0000-01-01', RANGE],
    [dayFromNow(3), RANGE],
    ['2024-02-30', 'Use a date like 2024-05-31'],
    ['yesterday', 'Use a date like 2024-05-31'],
  ])('answers 400 naming commissionedOn for %s', async (date, message) => {
    const res = await newUnit(700100, date);
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.error.fields).toEqual({ commissionedOn: message });
  });

  it('accepts the first day of 1960, today and a blank date', async () => {
    expect((await newUnit(700101, '1960-01-01')).status).toBe(201);
    expect((await newUnit(700102, dayFromNow(0))).status).toBe(201);
    const blank = await newUnit(700103, '');
    expect(blank.status).toBe(201);
    expect(blank.body.unit.commissionedOn).toBeNull();
  });
});

describe('commissioning date: editing a unit', () => {
  it('answers 400 naming commissionedOn for 1850 and for next week, and keeps the date it had', async () => {
    const unit = await createTestUnit(db, { commissionedOn: '2021-03-15' });
    for (const date of ['1850-01-01', dayFromNow(7)]) {
      const res = await engineer
        .patch(`/api/units/${unit.id}`)
        .set('Origin', TEST_ORIGIN)
        .send({ commissionedOn: date });
      expect(res.status).toBe(400);
      expect(res.body.error.fields).toEqual({ commissionedOn: RANGE });
    }
    const [row] = await db.select({ on: units.commissionedOn }).from(units).where(eq(units.id, unit.id));
    expect(row.on).toBe('2021-03-15');
  });
});

describe('commissioning date: CSV import', () => {
  const csv = (date: string) =>
    `container_number,refrigerant,nominal_charge_kg,commissioned_on,site_code\n${halyardNumber(700200)},R-134a,4.5,2022-01-01,DATE-DEPOT\n${halyardNumber(700201)},R-134a,4.5,${date},DATE-DEPOT\n`;
  const upload = (path: string, body: string) => {
    const req = engineer.post(path).set('Origin', TEST_ORIGIN);
    if (path === '/api/unit-imports') req.field('importKey', newToken());
    return req.attach('file', Buffer.from(body), { filename: 'fleet.csv', contentType: 'text/csv' });
  };

  it('shows the same field error in the preview and refuses the commit with 400 naming the row', async () => {
    const preview = await upload('/api/unit-imports/preview', csv('1850-06-01'));
    expect(preview.status).toBe(200);
    expect(preview.body.preview.errors).toEqual([
      expect.objectContaining({ row: 3, column: 'commissioned_on', field: 'commissionedOn', message: RANGE }),
    ]);
    const commit = await upload('/api/unit-imports', csv(dayFromNow(30)));
    expect(commit.status).toBe(400);
    expect(commit.body.error.fields).toEqual({ 'rows.3.commissionedOn': RANGE });
    expect(
      await db
        .select()
        .from(units)
        .where(eq(units.containerNumber, halyardNumber(700200))),
    ).toHaveLength(0);
  });
});

describe('visit time', () => {
  let unitId = 0;
  beforeAll(async () => {
    unitId = (await createTestUnit(db, { commissionedOn: '2024-01-10', siteId })).id;
  });

  it.each([
    ['1850-06-01T10:00:00Z', 'Enter a time between 1 Jan 1960 and now'],
    ['2300-01-01T10:00:00Z', 'Enter a time between 1 Jan 1960 and now'],
  ])('answers 400 naming occurredAt for %s', async (at, message) => {
    const res = await visit(unitId, at);
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ occurredAt: message });
  });

  it('answers 400 for a time an hour ahead of the server clock and accepts one two minutes ahead (clock skew)', async () => {
    const ahead = await visit(unitId, new Date(Date.now() + 3600_000).toISOString());
    expect(ahead.status).toBe(400);
    expect(ahead.body.error.fields).toEqual({ occurredAt: 'That time is in the future' });
    expect((await visit(unitId, new Date(Date.now() + 120_000).toISOString())).status).toBe(201);
  });

  it('answers 400 for a visit more than a year before the unit was commissioned, and accepts one a few months before', async () => {
    const early = await visit(unitId, '2022-06-01T10:00:00Z');
    expect(early.status).toBe(400);
    expect(early.body.error.fields.occurredAt).toMatch(
      /more than a year before this unit was commissioned \(10 Jan 2024\)/,
    );
    expect((await visit(unitId, '2023-10-01T10:00:00Z')).status).toBe(201);
  });
});

describe('query ranges', () => {
  const RANGE_LIMITS = 'Enter a date between 1 Jan 1960 and 31 Dec 2199';

  it.each([
    ['/api/refrigerant-log', 'from=0001-01-01&to=0001-06-30', { from: RANGE_LIMITS, to: RANGE_LIMITS }],
    ['/api/refrigerant-log/export.csv', 'from=9999-01-01&to=9999-12-31', { from: RANGE_LIMITS, to: RANGE_LIMITS }],
    ['/api/refrigerant-log', 'from=2026-01-01&to=2026-13-01', { to: 'Enter the last day, e.g. 2026-12-31' }],
    ['/api/traceability', 'siteId=1&from=1850-01-01&to=1850-12-31', { from: RANGE_LIMITS, to: RANGE_LIMITS }],
    [
      '/api/traceability/export.csv',
      'siteId=1&from=2199-06-01&to=10000-01-01',
      { to: 'Enter the last day as a date, e.g. 2026-03-31' },
    ],
    ['/api/traceability/export.csv', 'cylinder=LOT&from=2199-12-01&to=2200-01-01', { to: RANGE_LIMITS }],
  ])('GET %s?%s answers 400 naming the day', async (path, query, fields) => {
    const res = await engineer.get(`${path}?${query}`);
    expect(res.status, res.text).toBe(400);
    expect(res.body.error.fields).toEqual(fields);
  });

  it('answers 400 when marking units for inspection from a search with an absurd year', async () => {
    const res = await post(engineer, '/api/traceability/mark-for-inspection', {
      query: { siteId, from: '0999-01-01', to: '0999-02-01' },
      reason: 'Suspect lot',
      idempotencyKey: randomUUID(),
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toMatchObject({ from: RANGE_LIMITS });
  });
});

describe('a unit whose commissioning date the engine cannot compute, already in the database', () => {
  it('leaves the fleet table, its count and its export answering 200, the unit listed as one that cannot be computed', async () => {
    await resetDb(db);
    engineer = (await signInAs(app, db, 'engineer')).agent;
    // Straight into the database, past every schema, as a row from before the date rule would be.
    await createTestUnit(db, { containerNumber: halyardNumber(700301), commissionedOn: '1850-01-01' });
    await createTestUnit(db, { containerNumber: halyardNumber(700302), commissionedOn: '2021-05-01' });
    // Rows loaded past the API get their figures from the scheduler's backfill, not from a read.
    await createStatsBackfill().run(ctx);
    const table = await engineer.get('/api/fleet?sort=containerNumber&dir=asc');
    expect(table.status, table.text).toBe(200);
    expect(table.body.rows).toEqual([
      expect.objectContaining({
        containerNumber: halyardNumber(700301),
        computeError: expect.stringMatching(/commissioning date/i),
      }),
      expect.objectContaining({
        containerNumber: halyardNumber(700302),
        computeError: null,
        co2eTonnes: expect.any(Number),
      }),
    ]);
    const count = await engineer.get('/api/fleet/count');
    expect(count.status, count.text).toBe(200);
    expect(count.body.total).toBe(2);
    const csv = await engineer.get('/api/fleet/export.csv?sort=containerNumber&dir=asc').buffer(true);
    expect(csv.status, csv.text).toBe(200);
    const rows = parse(csv.text.replace(/^\uFEFF/, ''), { columns: true }) as Record<string, string>[];
    expect(rows.map((r) => [r['Container number'], r.Figures.slice(0, 15)])).toEqual([
      [halyardNumber(700301), 'cannot compute:'],
      [halyardNumber(700302), 'computed'],
    ]);
  });
});
