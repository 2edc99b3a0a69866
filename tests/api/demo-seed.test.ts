// The demo as a visitor meets it: the invented fleet's sites keep their own leak-check rules in their own time zones,
// the figures stored for their units follow those rules, and the demo technician's My day has units in every group.
import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { eq, isNotNull } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { sites, units, unitStats, users } from '../../server/db/schema';
import { recomputeUnitStats } from '../../server/lib/record/stats';
import { getSettings } from '../../server/lib/settings';
import { DEMO_UNITS, seedDemo } from '../../seed/index';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import type { SubscriptionsDto } from '../../shared/schemas/alerts';
import { DAY_GROUPS, type DayDto } from '../../shared/schemas/day';
import { dayGroupRows, type FleetPageDto } from '../../shared/schemas/fleet';
import { openTestDb, resetDb } from '../support/db';
import { TEST_ORIGIN } from '../support/factories';

const { db, pool } = openTestDb();
let now = new Date('2026-06-01T12:00:00Z');
const { app, ctx } = createApp({ db, clock: { now: () => now }, rateLimits: { signInPerIp: 1000 } });
afterAll(async () => {
  await ctx.jobs.waitForAll();
  await pool.end();
});

async function seeded(units: number, at: string) {
  now = new Date(at);
  await resetDb(db);
  ctx.caches.settings.invalidate();
  await seedDemo(db, { units, now, log: () => undefined });
}

async function demoAgent(role: string) {
  const agent = request.agent(app);
  const account = DEMO_ACCOUNTS.find((a) => a.role === role)!;
  const signIn = await agent
    .post('/api/auth/sign-in')
    .set('Origin', TEST_ORIGIN)
    .send({ email: account.email, password: DEMO_PASSWORD });
  expect(signIn.status).toBe(200);
  return agent;
}

async function technicianDay(): Promise<DayDto> {
  const res = await (await demoAgent('technician')).get('/api/day');
  expect(res.status).toBe(200);
  return res.body as DayDto;
}

const nonEmptyGroups = (day: DayDto) =>
  Object.fromEntries(DAY_GROUPS.map((g) => [g.id, 0 < (day.groups.find((d) => d.id === g.id)?.total ?? 0)]));
const everyGroup = Object.fromEntries(DAY_GROUPS.map((g) => [g.id, true]));

describe('the demo fleet', () => {
  it("has units in every group of the demo technician's My day, at its full size", async () => {
    await seeded(DEMO_UNITS, '2026-06-01T12:00:00Z');
    const day = await technicianDay();
    expect(day.site).not.toBeNull();
    expect(nonEmptyGroups(day)).toEqual(everyGroup);
  }, 180_000);

  it("gives the demo engineer sites of their own, so their alert defaults reach someone's units", async () => {
    const res = await (await demoAgent('engineer')).get('/api/alerts/subscriptions');
    expect(res.status).toBe(200);
    const dto = res.body as SubscriptionsDto;
    expect(dto.mySiteIds.length).toBeGreaterThanOrEqual(3);
    expect(dto.subscriptions.filter((s) => s.kind === 'recheck').length).toBe(dto.mySiteIds.length);
  });

  it('has EU sites in European zones, US reference sites in US zones and a site with a custom rule', async () => {
    const rows = await db.select().from(sites);
    const withRule = (j: string) => rows.filter((s) => s.jurisdiction === j);
    expect(withRule('EU').length).toBeGreaterThan(0);
    expect(withRule('EU').every((s) => s.timeZone?.startsWith('Europe/'))).toBe(true);
    expect(withRule('US').length).toBeGreaterThan(0);
    expect(withRule('US').every((s) => s.timeZone?.startsWith('America/'))).toBe(true);
    expect(withRule('custom').length).toBeGreaterThan(0);
    expect(rows.filter((s) => s.kind !== 'vessel').every((s) => s.timeZone)).toBe(true);
  });

  it("gives certificates expiries: the demo sign-ins' well ahead, some of the staff's expiring within 60 days or expired", async () => {
    const today = now.toISOString().slice(0, 10);
    const in60 = new Date(now.getTime() + 60 * 86_400_000).toISOString().slice(0, 10);
    const people = await db.select().from(users).where(isNotNull(users.certificateNumber));
    expect(people.every((p) => p.certificateExpiresOn)).toBe(true);
    const demo = people.filter((p) => DEMO_ACCOUNTS.some((a) => a.email === p.email));
    expect(demo.length).toBe(2);
    expect(demo.every((p) => p.certificateExpiresOn! > in60)).toBe(true);
    expect(people.some((p) => p.certificateExpiresOn! < today)).toBe(true);
    expect(people.some((p) => p.certificateExpiresOn! >= today && p.certificateExpiresOn! <= in60)).toBe(true);
  });

  it("stores every unit's leak-check figures under its own site's rule, as the write path would", async () => {
    const settings = await getSettings(db);
    for (const jurisdiction of ['EU', 'US', 'custom'] as const) {
      const [u] = await db
        .select({ unit: units, stats: unitStats })
        .from(units)
        .innerJoin(sites, eq(sites.id, units.siteId))
        .innerJoin(unitStats, eq(unitStats.unitId, units.id))
        .where(eq(sites.jurisdiction, jurisdiction))
        .orderBy(units.id)
        .limit(1);
      const again = await recomputeUnitStats(db, u.unit, now, settings);
      expect({ jurisdiction, interval: u.stats.leakCheckIntervalMonths, due: u.stats.nextLeakCheckDue }).toEqual({
        jurisdiction,
        interval: again.stats.leakCheckIntervalMonths,
        due: again.stats.nextLeakCheckDue,
      });
    }
    expect((await db.select().from(unitStats).where(isNotNull(unitStats.computeError))).length).toBe(0);
  });

  it.each([
    [40, '2026-06-01T12:00:00Z'],
    [40, '2026-11-20T08:00:00Z'],
    [80, '2027-03-09T15:00:00Z'],
  ])(
    "has units in every group of My day in a fleet of %i seen on %s, the fleet table the same under each group's filters",
    async (n, at) => {
      await seeded(n, at);
      const day = await technicianDay();
      expect(nonEmptyGroups(day)).toEqual(everyGroup);
      // Each group's units are the fleet table's under the group's filters (My day's links for engineers).
      const engineer = await demoAgent('engineer');
      for (const g of day.groups) {
        const filters = Object.entries(dayGroupRows(day.site!.id, g.id)).map(([k, v]) => `${k}=${v === true ? 1 : v}`);
        const res = await engineer.get(`/api/fleet?${filters.join('&')}&count=1&pageSize=100`);
        expect(res.status).toBe(200);
        const page = res.body as FleetPageDto;
        expect({ group: g.id, total: page.count!.total }).toEqual({ group: g.id, total: g.total });
        const ids = new Set(page.rows.map((r) => r.unitId));
        expect({ group: g.id, missing: g.rows.filter((r) => !ids.has(r.unitId)) }).toEqual({
          group: g.id,
          missing: [],
        });
      }
    },
    60_000,
  );
});
