// Writers side by side: visits with refrigerant movements, voids (several of the same entry at once) and unit edits
// on a handful of units, for seconds on end. Afterwards the stored figures, the monthly totals and the void markers
// must be exactly what a fresh computation from the events gives.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { and, eq, inArray, isNotNull, sql } from 'drizzle-orm';
import { inject } from 'vitest';
import { createApp } from '../../server/app';
import { createDb } from '../../server/db/client';
import { events, fleetMonthly, units, unitStats, unitStatsDetail, visitMadeUp, visits } from '../../server/db/schema';
import { engineUnit, loadEngineHistory, statsRowsFrom } from '../../server/lib/record/stats';
import { getSettings } from '../../server/lib/settings';
import { computeUnitStats, groupVisits, type UnitEvent } from '../../shared/domain';
import type { Role } from '../../shared/permissions';
import { resetDb } from '../support/db';
import { createTestUnit, createTestUser, TEST_ORIGIN, TEST_PASSWORD } from '../support/factories';

const { db, pool } = createDb(inject('apiDatabaseUrl'), { connectionLimit: 24 });
const NOW = new Date('2026-06-01T12:00:00Z');
const { app, ctx } = createApp({ db, clock: { now: () => NOW }, rateLimits: { signInPerIp: 10_000 } });
const server = http.createServer(app);
let base = '';

beforeAll(async () => {
  await resetDb(db);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(async () => {
  await new Promise((r) => server.close(r));
  await pool.end();
});

async function writer(role: Role): Promise<{ agent: TestAgent; userId: string }> {
  const user = await createTestUser(db, { role });
  const agent = request.agent(base);
  const res = await agent
    .post('/api/auth/sign-in')
    .set('Origin', TEST_ORIGIN)
    .send({ email: user.email, password: TEST_PASSWORD });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status}`);
  return { agent, userId: user.id };
}

type Tally = { total: number; byStatus: Map<number, number>; serverErrors: string[] };
const tally = (): Tally => ({ total: 0, byStatus: new Map(), serverErrors: [] });
function count(t: Tally, what: string, res: { status: number; body: unknown }) {
  t.total++;
  t.byStatus.set(res.status, (t.byStatus.get(res.status) ?? 0) + 1);
  if (res.status >= 500) t.serverErrors.push(`${what}: ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`);
}
const summary = (t: Tally) =>
  [...t.byStatus]
    .sort(([a], [b]) => a - b)
    .map(([s, n]) => `${s}×${n}`)
    .join(' ');

const pick = <T>(list: readonly T[]) => list[Math.floor(Math.random() * list.length)];
const between = (lo: number, hi: number) => Math.round((lo + Math.random() * (hi - lo)) * 100) / 100;
/** A moment in the two years before NOW, so the events fall in several months and in and out of the 365-day window. */
const someTimeBefore = () =>
  new Date(NOW.getTime() - Math.floor(Math.random() * 700 * 86_400_000) - 60_000).toISOString();

function randomVisitEvents(): Record<string, unknown>[] {
  switch (Math.floor(Math.random() * 4)) {
    case 0:
      return [{ kind: 'top_up', kg: between(0.2, 1.5), cylinder: pick(['CYL-A1', 'CYL-A2', 'CYL-B7']) }];
    case 1:
      return [
        { kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'service_valve' },
        { kind: 'repair', location: 'service_valve', action: 'valve_core_replaced', verified: Math.random() < 0.5 },
        { kind: 'recovery', kg: between(1, 3), cylinder: 'REC-3' },
        { kind: 'recharge', kg: between(3, 5), cylinder: 'CYL-C4' },
      ];
    case 2:
      return [
        { kind: 'top_up', kg: between(0.2, 1), cylinder: 'CYL-A2' },
        {
          kind: 'pressure',
          suctionKPaG: between(60, 140),
          dischargeKPaG: between(700, 1000),
          ambientC: between(10, 35),
          sightGlass: pick(['full', 'bubbles']),
        },
      ];
    default:
      return [
        {
          kind: 'pressure',
          suctionKPaG: between(60, 140),
          dischargeKPaG: between(700, 1000),
          ambientC: between(10, 35),
        },
        { kind: 'pti', passed: Math.random() < 0.7 },
      ];
  }
}

/** The stored figures of each unit against a fresh computation from its events, field by field. */
async function staleUnits(
  unitIds: number[],
): Promise<{ unitId: number; field: string; stored: unknown; fresh: unknown }[]> {
  const settings = await getSettings(db);
  const out: { unitId: number; field: string; stored: unknown; fresh: unknown }[] = [];
  for (const unitId of unitIds) {
    const [unit] = await db.select().from(units).where(eq(units.id, unitId));
    const history = await loadEngineHistory(db, unitId);
    const [stored] = await db.select().from(unitStats).where(eq(unitStats.unitId, unitId));
    const [storedDetail] = await db.select().from(unitStatsDetail).where(eq(unitStatsDetail.unitId, unitId));
    const last = history.length ? new Date(history[history.length - 1].at) : null;
    const fresh = statsRowsFrom(
      unitId,
      computeUnitStats(engineUnit(unit), history, NOW.toISOString(), settings),
      NOW,
      last,
    );
    for (const [field, value] of Object.entries(fresh.stats)) {
      const s = (stored as Record<string, unknown> | undefined)?.[field];
      const norm = (v: unknown) => (v instanceof Date ? v.toISOString() : typeof v === 'boolean' ? Number(v) : v);
      if (JSON.stringify(norm(s)) !== JSON.stringify(norm(value))) out.push({ unitId, field, stored: s, fresh: value });
    }
    if (JSON.stringify(storedDetail?.detail) !== JSON.stringify(JSON.parse(JSON.stringify(fresh.detail.detail)))) {
      out.push({ unitId, field: 'detail', stored: '…', fresh: '…' });
    }
  }
  return out;
}

/** Each visit's made-up kg against its counted events, and fleet_monthly against the per-visit shares. */
async function monthlyMismatches(): Promise<string[]> {
  const problems: string[] = [];
  const rows = await db
    .select({
      visitId: events.visitId,
      kind: events.kind,
      kg: events.kg,
      excluded: events.excludedFromLeakRate,
      at: events.occurredAt,
    })
    .from(events)
    .where(
      and(
        isNotNull(events.visitId),
        inArray(events.kind, ['top_up', 'recovery', 'recharge']),
        sql`NOT EXISTS (SELECT 1 FROM events v WHERE v.voids_event_id = ${events.id})`,
      ),
    );
  const byVisit = new Map<number, UnitEvent[]>();
  for (const r of rows) {
    const list = byVisit.get(r.visitId!) ?? [];
    list.push({
      kind: r.kind as 'top_up',
      at: r.at.toISOString(),
      visitId: 'v',
      kg: r.kg ?? 0,
      excluded: Boolean(r.excluded),
    });
    byVisit.set(r.visitId!, list);
  }
  const shares = new Map((await db.select().from(visitMadeUp)).map((r) => [r.visitId, r]));
  for (const v of await db.select({ id: visits.id }).from(visits)) {
    const expected = groupVisits(byVisit.get(v.id) ?? []).reduce((s, x) => s + x.madeUpKg, 0);
    const kept = shares.get(v.id)?.madeUpKg ?? 0;
    if (Math.abs(expected - kept) > 1e-9) problems.push(`visit ${v.id}: kept ${kept} kg, events say ${expected} kg`);
  }
  const sums = new Map<string, { kg: number; visits: number }>();
  for (const s of shares.values()) {
    const k = `${s.month}|${s.siteId}|${s.refrigerant}`;
    const acc = sums.get(k) ?? { kg: 0, visits: 0 };
    acc.kg += s.madeUpKg;
    acc.visits += s.madeUpKg > 0 ? 1 : 0;
    sums.set(k, acc);
  }
  const monthly = await db.select().from(fleetMonthly);
  for (const m of monthly) {
    const k = `${m.month}|${m.siteId}|${m.refrigerant}`;
    const want = sums.get(k) ?? { kg: 0, visits: 0 };
    if (Math.abs(want.kg - m.madeUpKg) > 1e-6 || want.visits !== m.visits) {
      problems.push(
        `month ${k}: kept ${m.madeUpKg} kg / ${m.visits} visits, visits say ${want.kg} kg / ${want.visits}`,
      );
    }
    sums.delete(k);
  }
  for (const [k, want] of sums) if (want.kg > 1e-9) problems.push(`month ${k}: missing, visits say ${want.kg} kg`);
  return problems;
}

async function duplicateVoids(): Promise<number> {
  const [rows] = (await db.execute(
    sql`SELECT voids_event_id AS id, COUNT(*) AS n FROM events WHERE voids_event_id IS NOT NULL GROUP BY voids_event_id HAVING n > 1`,
  )) as unknown as [{ id: number; n: number }[]];
  return rows.length;
}

const report = (line: string) => process.stdout.write(`  [concurrency] ${line}\n`);

describe('writers side by side', () => {
  it('answers 20 technicians recording top-ups on the same few units at once without a server error', async () => {
    const unitList = await Promise.all(
      [0, 1, 2].map(() => createTestUnit(db, { nominalChargeKg: 5, commissionedOn: '2020-01-01' })),
    );
    const techs = await Promise.all(Array.from({ length: 20 }, () => writer('technician')));
    const t = tally();
    const until = Date.now() + 4_000;
    await Promise.all(
      techs.map(async ({ agent }) => {
        while (Date.now() < until) {
          const res = await agent
            .post('/api/visits')
            .set('Origin', TEST_ORIGIN)
            .send({
              idempotencyKey: randomUUID(),
              unitId: pick(unitList).id,
              occurredAt: someTimeBefore(),
              events: [{ kind: 'top_up', kg: between(0.2, 1.2), cylinder: 'CYL-A1' }],
            });
          count(t, 'top-up', res);
        }
      }),
    );
    report(`top-ups by 20 writers: ${t.total} requests, ${summary(t)}`);
    expect(t.serverErrors).toEqual([]);
    expect(t.byStatus.get(201) ?? 0).toBe(t.total);
    expect(await staleUnits(unitList.map((u) => u.id))).toEqual([]);
    expect(await monthlyMismatches()).toEqual([]);
  });

  it('keeps every figure, void and monthly total right under 16 mixed writers and two settings changes for 10 seconds', async () => {
    const unitList = await Promise.all(
      [0, 1, 2, 3, 4, 5].map(() =>
        createTestUnit(db, { nominalChargeKg: 5, commissionedOn: '2020-01-01', refrigerant: 'R-134a' }),
      ),
    );
    const roles: Role[] = ['technician', 'engineer'];
    const writers = await Promise.all(Array.from({ length: 16 }, (_, i) => writer(roles[i % 2])));
    // Entries recorded so far, newest last: voids pick among the latest few, so several writers strike the same one.
    const recent: { id: number; by: string }[] = [];
    const admin = await writer('admin');
    const t = tally();
    const until = Date.now() + 10_000;
    // An administrator changes the PTI validity twice meanwhile: each save recomputes every unit in a background job.
    const settingsChanges = (async () => {
      for (const days of [60, 120]) {
        await new Promise((r) => setTimeout(r, 3_000));
        const current = await admin.agent.get('/api/settings');
        const res = await admin.agent
          .put('/api/settings')
          .set('Origin', TEST_ORIGIN)
          .send({
            settings: { ...current.body.settings, ptiValidityDays: days },
            baseVersion: current.body.version || null,
          });
        count(t, 'settings', res);
      }
    })();
    await Promise.all([
      settingsChanges,
      ...writers.map(async ({ agent, userId }, w) => {
        const engineer = w % 2 === 1;
        while (Date.now() < until) {
          const roll = Math.random();
          if (roll < 0.55 || recent.length < 5) {
            const res = await agent
              .post('/api/visits')
              .set('Origin', TEST_ORIGIN)
              .send({
                idempotencyKey: randomUUID(),
                unitId: pick(unitList).id,
                occurredAt: someTimeBefore(),
                events: randomVisitEvents(),
              });
            count(t, 'visit', res);
            if (res.status === 201)
              for (const e of res.body.events as { id: number }[]) recent.push({ id: e.id, by: userId });
          } else if (roll < 0.85) {
            const mine = engineer ? recent.slice(-6) : recent.filter((e) => e.by === userId).slice(-3);
            if (!mine.length) continue;
            const target = pick(mine);
            // The same entry from several writers at once: a burst of three.
            const burst = await Promise.all(
              [0, 1, 2].map(() =>
                agent
                  .post(`/api/events/${target.id}/void`)
                  .set('Origin', TEST_ORIGIN)
                  .send({ reason: 'Entered on the wrong unit' }),
              ),
            );
            for (const res of burst) count(t, 'void', res);
          } else if (engineer) {
            const unit = pick(unitList);
            const res = await agent
              .patch(`/api/units/${unit.id}`)
              .set('Origin', TEST_ORIGIN)
              .send(
                Math.random() < 0.5
                  ? { nominalChargeKg: between(4, 6) }
                  : Math.random() < 0.5
                    ? { refrigerant: pick(['R-134a', 'R-513A']) }
                    : { commissionedOn: pick(['2019-03-01', '2020-01-01', '2021-06-15']) },
              );
            count(t, 'unit edit', res);
          }
        }
      }),
    ]);
    // The settings recompute runs through the same write path in the background: let it finish before comparing.
    await ctx.jobs.waitForAll();
    const stale = await staleUnits(unitList.map((u) => u.id));
    const monthly = await monthlyMismatches();
    const duplicates = await duplicateVoids();
    report(
      `mixed: ${t.total} requests, ${summary(t)}; stale figures ${stale.length}, monthly mismatches ${monthly.length}, doubly voided entries ${duplicates}`,
    );
    expect(t.serverErrors).toEqual([]);
    expect(t.total).toBeGreaterThan(100);
    // Only refusals a person can act on: a second void of the same entry (409).
    for (const status of t.byStatus.keys()) expect([200, 201, 409]).toContain(status);
    expect((await getSettings(db)).ptiValidityDays).toBe(120);
    expect(stale).toEqual([]);
    expect(monthly).toEqual([]);
    expect(duplicates).toBe(0);
  }, 60_000);
});
