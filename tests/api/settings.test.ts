import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { units, unitStats } from '../../server/db/schema';
import { engineUnit, loadEngineHistory } from '../../server/lib/record/stats';
import { computeUnitStats } from '../../shared/domain';
import { DEFAULT_SETTINGS, settingsSchema, type Settings } from '../../shared/schemas/settings';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { chronicLeaker, recordVisits, tightUnit, waitForJob } from '../support/visits';

const { db, pool } = openTestDb();
const now = new Date('2026-06-01T12:00:00Z');
const { app, ctx } = createApp({ db, clock: { now: () => now }, rateLimits: { signInPerIp: 1000 } });

beforeAll(() => resetDb(db));
afterAll(async () => {
  await ctx.jobs.waitForAll();
  await pool.end();
});

const put = (agent: Awaited<ReturnType<typeof signInAs>>['agent'], body: object) =>
  agent.put('/api/settings').set('Origin', TEST_ORIGIN).send(body);
const clone = (s: Settings): Settings => JSON.parse(JSON.stringify(s)) as Settings;

describe('reading the settings', () => {
  it('returns 401 without a session', async () => {
    expect((await request(app).get('/api/settings')).status).toBe(401);
  });

  it('gives owners and admins the defaults while nothing was saved, prices included', async () => {
    for (const role of ['owner', 'admin'] as const) {
      const { agent } = await signInAs(app, db, role);
      const res = await agent.get('/api/settings');
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({
        version: 0,
        updatedAt: null,
        updatedBy: null,
        recompute: null,
        hiddenSections: [],
      });
      expect(res.body.settings).toEqual(JSON.parse(JSON.stringify(DEFAULT_SETTINGS)));
    }
  });

  it('gives engineers the policy, thresholds and PTI validity without the prices', async () => {
    const { agent } = await signInAs(app, db, 'engineer');
    const res = await agent.get('/api/settings');
    expect(res.status).toBe(200);
    expect(res.body.hiddenSections).toEqual(['economics']);
    expect(res.body.settings.economics).toBeUndefined();
    const { economics: _prices, ...rest } = JSON.parse(JSON.stringify(DEFAULT_SETTINGS)) as Settings;
    expect(res.body.settings).toEqual(rest);
  });

  it("refuses technicians with 403 (cost settings are the owners' and admins', ASVS 4.0 4.1.3)", async () => {
    const { agent } = await signInAs(app, db, 'technician');
    for (const path of ['/api/settings', '/api/settings/history', '/api/jobs/1']) {
      const res = await agent.get(path);
      expect(res.status, path).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
      expect(JSON.stringify(res.body)).not.toContain('refrigerantPricePerKg');
    }
  });
});

describe('changing the settings', () => {
  it('refuses technicians and engineers with 403', async () => {
    for (const role of ['technician', 'engineer'] as const) {
      const { agent } = await signInAs(app, db, role);
      const res = await put(agent, { settings: DEFAULT_SETTINGS, baseVersion: null });
      expect(res.status).toBe(403);
    }
  });

  it('lets an owner change prices, but not thresholds or PTI validity', async () => {
    const { agent, user } = await signInAs(app, db, 'owner');
    const prices = clone(DEFAULT_SETTINGS);
    prices.economics.refrigerantPricePerKg['R-134a'] = 42;
    const ok = await put(agent, { settings: prices, baseVersion: null });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({
      version: expect.any(Number),
      changedSections: ['economics'],
      updatedBy: { id: user.id },
    });
    expect(ok.body.settings.economics.refrigerantPricePerKg['R-134a']).toBe(42);
    // Prices do not change any unit's statistics: no recompute.
    expect(ok.body.recompute).toBeNull();

    const pti = clone(ok.body.settings as Settings);
    pti.ptiValidityDays = 30;
    const refused = await put(agent, { settings: pti, baseVersion: ok.body.version });
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toMatch(/pti validity/i);
    expect((await agent.get('/api/settings')).body.settings.ptiValidityDays).toBe(90);
  });

  it('answers 400 with the field for invalid settings and 409 for a stale base version', async () => {
    const { agent } = await signInAs(app, db, 'admin');
    const current = (await agent.get('/api/settings')).body;
    const bad = clone(current.settings);
    bad.score.weights.rate = 0.9; // the four weights no longer add up to 1
    const invalid = await put(agent, { settings: bad, baseVersion: current.version });
    expect(invalid.status).toBe(400);
    expect(Object.keys(invalid.body.error.fields).join()).toMatch(/score\.weights/);
    expect((await put(agent, { baseVersion: 0 })).status).toBe(400);

    const stale = await put(agent, { settings: current.settings, baseVersion: current.version - 1 });
    expect(stale.status).toBe(409);
  });

  it('saves nothing new when nothing changed', async () => {
    const { agent } = await signInAs(app, db, 'admin');
    const current = (await agent.get('/api/settings')).body;
    const res = await put(agent, { settings: current.settings, baseVersion: current.version });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ version: current.version, changedSections: [] });
  });
});

describe('a change that moves the statistics', () => {
  it('recomputes every unit in the background with the new settings, with progress', async () => {
    const { agent: tech } = await signInAs(app, db, 'technician');
    const { agent: admin } = await signInAs(app, db, 'admin');
    const a = await createTestUnit(db, { nominalChargeKg: 5, commissionedOn: '2023-01-10' });
    const b = await createTestUnit(db, { nominalChargeKg: 4, commissionedOn: '2022-03-01', refrigerant: 'R-404A' });
    const c = await createTestUnit(db, { nominalChargeKg: 6, commissionedOn: '2024-05-01' });
    await recordVisits(tech, a.id, chronicLeaker());
    await recordVisits(tech, b.id, chronicLeaker());
    await recordVisits(tech, c.id, tightUnit());

    const current = (await admin.get('/api/settings')).body;
    const next = clone(current.settings);
    next.ptiValidityDays = 30;
    next.score.weights = { rate: 0.1, count: 0.3, afterRepair: 0.3, sameSpot: 0.3 };
    next.score.rateCapPct = 20;
    next.policy = 'custom';
    next.customLeakCheck.bands = [{ fromTCO2e: 1, months: 3 }];
    const res = await put(admin, { settings: next, baseVersion: current.version });
    expect(res.status).toBe(200);
    expect(res.body.changedSections).toEqual(['policy', 'thresholds', 'pti']);
    expect(res.body.recompute).toMatchObject({ kind: 'stats_recompute', status: 'running', total: expect.any(Number) });
    expect(res.body.recompute.total).toBeGreaterThanOrEqual(3);

    // Reads are not blocked while it runs.
    expect((await admin.get('/api/settings')).status).toBe(200);
    const job = await waitForJob(admin, res.body.recompute.id);
    expect(job).toMatchObject({ status: 'done' });
    expect(job.processed).toBe(job.total);

    const settings = settingsSchema.parse(next);
    for (const u of [a, b, c]) {
      const [unit] = await db.select().from(units).where(eq(units.id, u.id));
      const [row] = await db.select().from(unitStats).where(eq(unitStats.unitId, u.id));
      const expected = computeUnitStats(
        engineUnit(unit),
        await loadEngineHistory(db, u.id),
        row.computedAt.toISOString(),
        settings,
      );
      expect(row.score).toBe(expected.score.value);
      expect(row.scoreBand).toBe(expected.score.band);
      expect(row.ptiValidUntil).toBe(expected.ptiValidUntil);
      expect(row.nextLeakCheckDue).toBe(expected.nextLeakCheckDue);
      expect(row.leakCheckIntervalMonths).toBe(3);
      expect(row.rollingLeakRatePct).toBeCloseTo(expected.rollingLeakRatePct, 9);
    }
    // And differs from the defaults where it should: PTI valid for 30 days after 2026-02-10 (the chronic leaker's PTI
    // could not pass with its leak open).
    const [rowTight] = await db.select().from(unitStats).where(eq(unitStats.unitId, c.id));
    expect(rowTight.ptiValidUntil).toBe('2026-03-12');

    const after = (await admin.get('/api/settings')).body;
    expect(after).toMatchObject({
      version: res.body.version,
      recompute: { id: res.body.recompute.id, status: 'done' },
    });
    // A visit after the change is computed with the new settings too.
    await recordVisits(tech, c.id, [{ at: '2026-05-20T08:00:00Z', events: [{ kind: 'pti', passed: true }] }]);
    const [rowC] = await db.select().from(unitStats).where(eq(unitStats.unitId, c.id));
    expect(rowC.ptiValidUntil).toBe('2026-06-19');
  });

  it('keeps every version in the change history, newest first', async () => {
    const { agent } = await signInAs(app, db, 'engineer');
    const res = await agent.get('/api/settings/history');
    expect(res.status).toBe(200);
    expect(res.body.versions.length).toBeGreaterThanOrEqual(2);
    expect(res.body.versions[0].sections).toEqual(['policy', 'thresholds', 'pti']);
    expect(res.body.versions.at(-1).sections).toEqual(['economics']);
  });
});

describe('jobs', () => {
  it('answers 404 for an unknown job and 400 for a bad id', async () => {
    const { agent } = await signInAs(app, db, 'engineer');
    expect((await agent.get('/api/jobs/999999')).status).toBe(404);
    expect((await agent.get('/api/jobs/abc')).status).toBe(400);
    expect((await request(app).get('/api/jobs/1')).status).toBe(401);
  });
});
