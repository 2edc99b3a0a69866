import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { parse } from 'csv-parse/sync';
import { eq, sql } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { fleetMonthly, unitStats } from '../../server/db/schema';
import { createStatsBackfill } from '../../server/features/history/stats-backfill';
import { co2eTonnes } from '../../shared/domain';
import {
  FLEET_SORTS,
  overviewRows,
  type FleetFilters,
  type FleetOverviewDto,
  type FleetPageDto,
} from '../../shared/schemas/fleet';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { createTestSite, halyardNumber } from '../support/units';
import { chronicLeaker, recordVisits, tightUnit, waitForJob } from '../support/visits';

const { db, pool } = openTestDb();
const now = new Date('2026-06-01T12:00:00Z');
const { app, ctx } = createApp({ db, clock: { now: () => now }, rateLimits: { signInPerIp: 1000 } });

type Agent = Awaited<ReturnType<typeof signInAs>>['agent'];
let engineer: Agent;
let siteA: { id: number; name: string };
let siteB: { id: number; name: string };
const ids: Record<string, number> = {};

beforeAll(async () => {
  await resetDb(db);
  engineer = (await signInAs(app, db, 'engineer')).agent;
  siteA = await createTestSite(db, { name: 'Harbour depot' });
  siteB = await createTestSite(db, { name: 'River terminal' });
  const make = async (name: string, serial: number, over: Record<string, unknown>) =>
    (ids[name] = (
      await createTestUnit(db, { containerNumber: halyardNumber(serial), commissionedOn: '2022-01-01', ...over })
    ).id);
  await make('leakerA', 100001, { siteId: siteA.id, nominalChargeKg: 5 });
  await make('leakerB', 100002, { siteId: siteB.id, nominalChargeKg: 4, refrigerant: 'R-404A' });
  await make('tightA', 100003, { siteId: siteA.id, nominalChargeKg: 5 });
  await make('tightB', 200001, { siteId: siteB.id, nominalChargeKg: 6 });
  // Registered past the API, never visited: the scheduler's backfill gives it figures from its registry record alone.
  await make('fresh', 200002, { siteId: siteB.id, nominalChargeKg: 5 });
  await createStatsBackfill().run(ctx);
  await recordVisits(engineer, ids.leakerA, chronicLeaker());
  await recordVisits(engineer, ids.leakerB, chronicLeaker());
  await recordVisits(engineer, ids.tightA, tightUnit());
  await recordVisits(engineer, ids.tightB, tightUnit());
});
afterAll(async () => {
  await ctx.jobs.waitForAll();
  await pool.end();
});

const list = async (query: string, agent: Agent = engineer) => {
  const res = await agent.get(`/api/fleet?${query}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as FleetPageDto;
};
const numbers = (p: FleetPageDto) => p.rows.map((r) => r.containerNumber);

describe('GET /api/fleet', () => {
  it('returns 401 without a session and 403 for a technician', async () => {
    expect((await request(app).get('/api/fleet')).status).toBe(401);
    const { agent } = await signInAs(app, db, 'technician');
    expect((await agent.get('/api/fleet')).status).toBe(403);
  });

  it('lists every unit by score, highest first, with a count when asked', async () => {
    const page = await list('count=1');
    expect(page.rows).toHaveLength(5);
    expect(page.count).toEqual({ total: 5, capped: false });
    expect(page.rows[0].score).toBeGreaterThanOrEqual(page.rows[1].score);
    expect([ids.leakerA, ids.leakerB]).toContain(page.rows[0].unitId);
    expect(page.rows.find((r) => r.unitId === ids.fresh)).toMatchObject({
      score: 0,
      scoreBand: 'tight',
      forecastDate: null,
    });
    expect(page.asOf).toBe('2026-06-01');
    expect(page.rows[0].site).toMatchObject({ id: expect.any(Number), name: expect.any(String) });
  });

  it('pages without repeating or losing a unit', async () => {
    const p1 = await list('pageSize=10&sort=containerNumber&dir=asc');
    expect(numbers(p1)).toEqual([...numbers(p1)].sort());
    const first = await list('pageSize=10&sort=score&dir=desc&page=1');
    expect(first.hasMore).toBe(false);
    // A number search that keeps most of the fleet walks the score index for ids, then reads the page's rows:
    // the same units in the same order as the whole list filtered here.
    const all = await list('sort=score&dir=desc');
    const searched = await list('q=hrlu10&sort=score&dir=desc');
    expect(searched.rows.map((r) => r.unitId)).toEqual(
      all.rows.filter((r) => r.containerNumber.startsWith('HRLU10')).map((r) => r.unitId),
    );
    expect(searched.rows.length).toBeGreaterThan(0);
    expect((await list('sort=score&dir=desc&page=2')).rows).toEqual([]);
  });

  it('orders a number search read from the unit index (ids first, then the page) like the whole list, every sort both ways', async () => {
    // With a filter on the statistics the sort index is not walked: the units the number keeps are read and sorted.
    for (const sort of FLEET_SORTS) {
      for (const dir of ['asc', 'desc']) {
        const whole = await list(`rateAbove=0&sort=${sort}&dir=${dir}`);
        const searched = await list(`rateAbove=0&q=hrlu10&sort=${sort}&dir=${dir}`);
        const expected = whole.rows.filter((r) => r.containerNumber.startsWith('HRLU10')).map((r) => r.unitId);
        expect({ sort, dir, ids: searched.rows.map((r) => r.unitId) }).toEqual({ sort, dir, ids: expected });
        expect(expected.length).toBeGreaterThan(1);
      }
    }
  });

  it('filters by site, refrigerant, status, band, leak rate and container-number prefix', async () => {
    expect(new Set((await list(`siteId=${siteA.id}`)).rows.map((r) => r.unitId))).toEqual(
      new Set([ids.leakerA, ids.tightA]),
    );
    expect((await list('refrigerant=r-404a')).rows.map((r) => r.unitId)).toEqual([ids.leakerB]);
    expect((await list('status=retired')).rows).toHaveLength(0);
    const chronic = await list('band=chronic');
    expect(chronic.rows.every((r) => r.scoreBand === 'chronic')).toBe(true);
    expect((await list('rateAbove=5')).rows.map((r) => r.unitId).sort()).toEqual([ids.leakerA, ids.leakerB].sort());
    const prefix = await list('q=hrlu%2010&sort=containerNumber&dir=asc&count=1');
    expect(numbers(prefix)).toEqual([halyardNumber(100001), halyardNumber(100002), halyardNumber(100003)]);
    expect(prefix.count?.total).toBe(3);
    expect((await engineer.get(`/api/fleet/count?siteId=${siteB.id}`)).body).toEqual({ total: 3, capped: false });
  });

  it('filters forecast, leak-check and PTI states against today', async () => {
    const forecast = await list('forecastDays=365');
    expect(forecast.rows.map((r) => r.unitId).sort()).toEqual([ids.leakerA, ids.leakerB].sort());
    for (const r of (await list('forecastOverdue=1')).rows) expect(r.forecastOverdue).toBe(true);
    for (const r of (await list('leakCheckOverdue=1')).rows) expect(r.leakCheckOverdue).toBe(true);
    const pti = await list('ptiExpired=1');
    expect(pti.rows.every((r) => !r.ptiValid)).toBe(true);
    // The unit never visited has no PTI at all.
    expect(pti.rows.map((r) => r.unitId)).toContain(ids.fresh);
  });

  it('sorts by every column; units without a date come last both ways', async () => {
    for (const sort of ['rate', 'forecast', 'leakCheck', 'pti', 'co2e', 'containerNumber', 'score']) {
      for (const dir of ['asc', 'desc']) {
        const p = await list(`sort=${sort}&dir=${dir}`);
        expect(p.rows).toHaveLength(5);
      }
    }
    const asc = await list('sort=forecast&dir=asc');
    expect(asc.rows.slice(0, 2).every((r) => r.forecastDate !== null)).toBe(true);
    expect(asc.rows.slice(2).every((r) => r.forecastDate === null)).toBe(true);
    expect(asc.rows[0].forecastDate! <= asc.rows[1].forecastDate!).toBe(true);
    // Page 2 of size 10 with only 5 units: empty, no error.
    expect((await list('sort=forecast&dir=asc&page=2&pageSize=10')).rows).toHaveLength(0);
    const co2e = await list('sort=co2e&dir=desc');
    expect(co2e.rows[0].unitId).toBe(ids.leakerB); // R-404A: 4 kg × 3922 = 15.7 t
  });

  it('answers 400 for a bad filter, sort or page size', async () => {
    for (const q of [
      'sort=price',
      'pageSize=7',
      'page=0',
      'band=leaky',
      'refrigerant=R-22',
      'rateAbove=x',
      'q=%25%25',
      'ptiExpired=maybe',
      'siteId=-1',
    ]) {
      const res = await engineer.get(`/api/fleet?${q}`);
      expect(res.status, q).toBe(400);
      expect(res.body.error.code).toBe('invalid_input');
    }
  });
});

describe('GET /api/fleet/export.csv', () => {
  it('streams the current view as CSV with the same filters', async () => {
    const res = await engineer
      .get(`/api/fleet/export.csv?siteId=${siteA.id}&sort=containerNumber&dir=asc`)
      .buffer(true);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="fleet-2026-06-01\.csv"/);
    const rows = parse(res.text.replace(/^\uFEFF/, ''), { columns: true }) as Record<string, string>[];
    expect(rows.map((r) => r['Container number'])).toEqual([halyardNumber(100001), halyardNumber(100003)]);
    expect(rows[0]).toMatchObject({ Site: 'Harbour depot', Refrigerant: 'R-134a', Band: expect.any(String) });
    // The screens' words, never the internal codes.
    for (const r of rows) {
      expect(['Holding', 'Slipping', 'Repeat leaker']).toContain(r.Band);
      expect(['In service', 'Out of service', 'Retired']).toContain(r.Status);
      expect(['Charge looks right', 'Possible low charge', 'Not enough readings']).toContain(r['Pressure health']);
    }
    expect(res.text).not.toMatch(/in_service|chronic|possible_low_charge/);
  });

  it('refuses a technician and bad filters', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    expect((await agent.get('/api/fleet/export.csv')).status).toBe(403);
    expect((await engineer.get('/api/fleet/export.csv?sort=nope')).status).toBe(400);
  });
});

describe('GET /api/fleet/overview', () => {
  it('shows the distribution, emissions per month from the visits, the chronic leakers and leak checks due', async () => {
    const refresh = await engineer.post('/api/fleet/repair-effectiveness/refresh').set('Origin', TEST_ORIGIN);
    expect(refresh.status).toBe(202);
    expect(await waitForJob(engineer, refresh.body.job.id)).toMatchObject({ status: 'done' });

    const res = await engineer.get('/api/fleet/overview?months=12');
    expect(res.status).toBe(200);
    const o = res.body;
    expect(o.units).toBe(5);
    const binned = o.leakRate.bins.reduce((s: number, b: { units: number }) => s + b.units, 0);
    expect(o.leakRate.zero + binned).toBe(5);
    expect(o.leakRate.thresholdPct).toBe(20);
    expect(o.emissions.months).toHaveLength(12);
    expect(o.emissions.months.at(-1)).toBe('2026-06');

    // Made-up per visit (DOMAIN.md §4): 1.0, 1.1, max(0, 4.5 − 2.0) = 2.5, 0.9, 0.8 kg per leaker.
    const kg = (month: string, refrigerant: string) =>
      o.emissions.byRefrigerant
        .filter((r: { month: string; refrigerant: string }) => r.month === month && r.refrigerant === refrigerant)
        .reduce((s: number, r: { madeUpKg: number }) => s + r.madeUpKg, 0);
    expect(kg('2025-12', 'R-134a')).toBeCloseTo(2.5, 6);
    expect(kg('2025-07', 'R-134a')).toBeCloseTo(1.0, 6);
    expect(kg('2026-05', 'R-404A')).toBeCloseTo(0.8, 6);
    const dec404 = o.emissions.byRefrigerant.find(
      (r: { month: string; refrigerant: string }) => r.month === '2025-12' && r.refrigerant === 'R-404A',
    );
    expect(dec404.co2eTonnes).toBeCloseTo(co2eTonnes('R-404A', 2.5), 4);
    // Per site, the CO2e is summed over the site's refrigerants: site B has only the R-404A leaker.
    const decB = o.emissions.bySite.find(
      (r: { month: string; site: { id: number } | null }) => r.month === '2025-12' && r.site?.id === siteB.id,
    );
    expect(decB).toMatchObject({ site: { id: siteB.id, name: 'River terminal' }, madeUpKg: 2.5 });
    expect(decB.co2eTonnes).toBeCloseTo(co2eTonnes('R-404A', 2.5), 4);
    const sum = (rows: { madeUpKg: number }[]) => rows.reduce((s, r) => s + r.madeUpKg, 0);
    expect(sum(o.emissions.bySite)).toBeCloseTo(sum(o.emissions.byRefrigerant), 6);

    expect(o.chronicLeakers.map((c: { unitId: number }) => c.unitId).sort()).toEqual([ids.leakerA, ids.leakerB].sort());
    expect(o.chronicLeakers[0].factors[0]).toMatchObject({
      name: expect.any(String),
      points: expect.any(Number),
      explanation: expect.any(String),
    });

    // Two service-valve repairs, both leaked again within 180 days → fewer than 5: no rate.
    const valve = o.repairEffectiveness.rows.find(
      (r: { location: string; action: string | null }) =>
        r.location === 'service_valve' && r.action === 'valve_core_replaced',
    );
    expect(valve).toMatchObject({ repairs: 2, recurred: 2, holdRatePct: null });
    expect(o.repairEffectiveness).toMatchObject({ holdDays: 180, minRepairs: 5, computedAt: expect.any(String) });
    expect(o.leakChecksDue).toMatchObject({ days: 30, count: expect.any(Number), overdue: expect.any(Number) });
  });

  it('keeps fleet_monthly equal to the visits after a void', async () => {
    const unit = await createTestUnit(db, {
      containerNumber: halyardNumber(300001),
      siteId: siteA.id,
      nominalChargeKg: 5,
    });
    const [[topUp]] = await recordVisits(engineer, unit.id, [
      { at: '2026-04-10T10:00:00Z', events: [{ kind: 'top_up', kg: 0.7, cylinder: 'CYL-Z' }] },
    ]);
    const sumApril = async () =>
      Number(
        (
          await db
            .select({ kg: sql<number>`COALESCE(SUM(${fleetMonthly.madeUpKg}), 0)` })
            .from(fleetMonthly)
            .where(sql`${fleetMonthly.month} = '2026-04' AND ${fleetMonthly.siteId} = ${siteA.id}`)
        )[0].kg,
      );
    const before = await sumApril();
    const v = await engineer
      .post(`/api/events/${topUp}/void`)
      .set('Origin', TEST_ORIGIN)
      .send({ reason: 'Entered on the wrong unit' });
    expect(v.status).toBe(201);
    expect(await sumApril()).toBeCloseTo(before - 0.7, 9);
  });

  it('filters by site and refrigerant, refuses technicians, and answers 400 for bad input', async () => {
    const res = await engineer.get(`/api/fleet/overview?siteId=${siteB.id}&refrigerant=R-404A`);
    expect(res.status).toBe(200);
    expect(res.body.emissions.byRefrigerant.every((r: { refrigerant: string }) => r.refrigerant === 'R-404A')).toBe(
      true,
    );
    expect(res.body.emissions.bySite.every((r: { site: { id: number } | null }) => r.site?.id === siteB.id)).toBe(true);
    expect(res.body.units).toBe(1);
    const { agent } = await signInAs(app, db, 'technician');
    expect((await agent.get('/api/fleet/overview')).status).toBe(403);
    expect((await engineer.get('/api/fleet/overview?months=99')).status).toBe(400);
    expect((await request(app).get('/api/fleet/overview')).status).toBe(401);
  });

  it('reads every unit as having a statistics row', async () => {
    const [{ n }] = await db.select({ n: sql<number>`COUNT(*)` }).from(unitStats);
    expect(Number(n)).toBe(6);
  });

  it('shares the fleet-wide figures for a few seconds, and the monthly totals until a write changes them', async () => {
    const query = `/api/fleet/overview?siteId=${siteA.id}`;
    const madeUpMay = (o: { emissions: { bySite: { month: string; madeUpKg: number }[] } }) =>
      o.emissions.bySite.filter((r) => r.month === '2026-05').reduce((s, r) => s + r.madeUpKg, 0);
    const first = (await engineer.get(query)).body;
    const unit = await createTestUnit(db, {
      containerNumber: halyardNumber(300002),
      siteId: siteA.id,
      nominalChargeKg: 5,
    });
    const [[topUp]] = await recordVisits(engineer, unit.id, [
      { at: '2026-05-12T10:00:00Z', events: [{ kind: 'top_up', kg: 0.3, cylinder: 'CYL-Y' }] },
    ]);
    const second = (await engineer.get(query)).body;
    // The unit's new statistics row is not in the distribution yet: the figures are the ones read a moment ago.
    expect(second.figuresAt).toBe(first.figuresAt);
    expect(second.units).toBe(first.units);
    // The monthly totals are kept too, but only until a write changes them: the top-up and then its void show at once.
    expect(madeUpMay(second)).toBeCloseTo(madeUpMay(first) + 0.3, 9);
    expect(
      (await engineer.post(`/api/events/${topUp}/void`).set('Origin', TEST_ORIGIN).send({ reason: 'Wrong unit' }))
        .status,
    ).toBe(201);
    const third = (await engineer.get(query)).body;
    expect(madeUpMay(third)).toBeCloseTo(madeUpMay(first), 9);
  });
});

describe('every overview count links to its rows', () => {
  const search = (f: FleetFilters) =>
    Object.entries(f)
      .filter(([, v]) => v !== undefined)
      .map(([k, v]) => `${k}=${encodeURIComponent(v === true ? '1' : String(v))}`)
      .join('&');
  // Each unit: its rolling leak rate, when its leak check falls due (days from today), retired or not.
  const shapes = {
    noneOverdue: { rate: 0, due: -5 },
    firstBar: { rate: 5, due: 10 },
    tenExactly: { rate: 10, due: 0 },
    justUnderTwenty: { rate: 19.99, due: 30 },
    twentyExactly: { rate: 20, due: 31 },
    aboveHundred: { rate: 150, due: -1 },
    retiredOverdue: { rate: 0, due: -10, retired: true },
  } as const;
  const made: Record<string, number> = {};
  let site: { id: number };

  beforeAll(async () => {
    site = await createTestSite(db, { name: 'Counting quay' });
    let serial = 400001;
    for (const [name, shape] of Object.entries(shapes)) {
      made[name] = (
        await createTestUnit(db, {
          containerNumber: halyardNumber(serial++),
          siteId: site.id,
          nominalChargeKg: 5,
          status: 'retired' in shape ? 'retired' : 'in_service',
        })
      ).id;
    }
    await createStatsBackfill().run(ctx);
    const day = (n: number) => new Date(Date.parse('2026-06-01T00:00:00Z') + n * 86_400_000).toISOString().slice(0, 10);
    for (const [name, shape] of Object.entries(shapes))
      await db
        .update(unitStats)
        .set({ rollingLeakRatePct: shape.rate, nextLeakCheckDue: day(shape.due) })
        .where(eq(unitStats.unitId, made[name]));
  });

  const rowsOf = async (f: FleetFilters) => {
    const page = await list(`${search(f)}&count=1&pageSize=100`);
    return { total: page.count!.total, ids: page.rows.map((r) => r.unitId).sort((a, b) => a - b) };
  };
  const idsOf = (...names: (keyof typeof shapes)[]) => names.map((n) => made[n]).sort((a, b) => a - b);

  it('finds in the fleet table exactly the units behind each count, retired units out of the leak checks due', async () => {
    const q = { siteId: site.id };
    const res = await engineer.get(`/api/fleet/overview?siteId=${site.id}`);
    expect(res.status).toBe(200);
    const o = res.body as FleetOverviewDto;
    expect(o.units).toBe(7);
    expect(await rowsOf(overviewRows.units(q))).toEqual({ total: 7, ids: idsOf(...(Object.keys(shapes) as never[])) });
    expect(o.leakRate.zero).toBe(2);
    expect(await rowsOf(overviewRows.noRefrigerant(q))).toEqual({
      total: 2,
      ids: idsOf('noneOverdue', 'retiredOverdue'),
    });
    const expected: Record<number, (keyof typeof shapes)[]> = {
      0: ['firstBar'],
      10: ['tenExactly', 'justUnderTwenty'],
      20: ['twentyExactly'],
      100: ['aboveHundred'],
    };
    for (const bin of o.leakRate.bins) {
      const names = expected[bin.fromPct] ?? [];
      expect({ from: bin.fromPct, units: bin.units }).toEqual({ from: bin.fromPct, units: names.length });
      expect(await rowsOf(overviewRows.bin(q, bin))).toEqual({ total: names.length, ids: idsOf(...names) });
    }
    expect(o.leakChecksDue.count).toBe(3);
    expect(await rowsOf(overviewRows.leakChecksDue(q))).toEqual({
      total: 3,
      ids: idsOf('firstBar', 'tenExactly', 'justUnderTwenty'),
    });
    expect(o.leakChecksDue.overdue).toBe(2);
    expect(await rowsOf(overviewRows.leakChecksOverdue(q))).toEqual({
      total: 2,
      ids: idsOf('noneOverdue', 'aboveHundred'),
    });
  });

  it("counts the whole fleet under each of My day's filters without a site", async () => {
    for (const f of [
      'quarantined=1',
      'recheckDue=1',
      'openLeak=1',
      'ptiExpiredDays=30',
      'ptiExpiringDays=14',
      'forecastRangeDays=14',
    ]) {
      const page = await list(`${f}&count=1`);
      expect({ f, total: page.count!.total }).toEqual({ f, total: page.rows.length });
    }
  });

  it('answers 400 with the field for a bad rate or day count', async () => {
    const bad = await engineer.get('/api/fleet?rateBelow=lots&leakCheckDueDays=-3');
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['leakCheckDueDays', 'rateBelow']);
  });
});

describe('the whole fleet count', () => {
  it('is kept between reads and follows a registration at once', async () => {
    const before = (await list('count=1')).count!.total;
    expect((await engineer.get('/api/fleet/count')).body).toEqual({ total: before, capped: false });
    await createTestUnit(db, { containerNumber: halyardNumber(300003), siteId: siteB.id, nominalChargeKg: 5 });
    expect((await list('count=1')).count).toEqual({ total: before + 1, capped: false });
    expect((await engineer.get('/api/fleet/count')).body).toEqual({ total: before + 1, capped: false });
  });

  it('counts again after units are added below the highest id, once the adding code says so', async () => {
    // Two registrations committing out of id order: the later-committed unit has the lower id.
    const last = await createTestUnit(db, { containerNumber: halyardNumber(300010) });
    await createTestUnit(db, { id: last.id + 5, containerNumber: halyardNumber(300011) });
    const before = await ctx.caches.fleetSize.get(db);
    await createTestUnit(db, { id: last.id + 2, containerNumber: halyardNumber(300012) });
    // The highest id did not move, so the kept count still stands…
    expect(await ctx.caches.fleetSize.get(db)).toBe(before);
    // …until registration or import reports the units it added.
    ctx.caches.fleetSize.invalidate();
    expect(await ctx.caches.fleetSize.get(db)).toBe(before + 1);
  });
});
