// My day says why a leak check is due in the words of the site's own rule: the EU regulation's interval, the US
// reference, or the company's rule — never one text for the whole fleet.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { unitStats } from '../../server/db/schema';
import type { Jurisdiction } from '../../shared/schemas/sites';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs } from '../support/factories';
import { createTestSite, halyardNumber } from '../support/units';
import { recordVisits } from '../support/visits';

const { db, pool } = openTestDb();
const now = new Date('2026-06-01T12:00:00Z');
const { app } = createApp({ db, clock: { now: () => now }, rateLimits: { signInPerIp: 1000 } });
let serial = 741001;

beforeAll(() => resetDb(db));
afterAll(() => pool.end());

type Row = { why: string };
type Group = { id: string; rows: Row[] };

async function myDayAt(jurisdiction: Jurisdiction | null) {
  const site = await createTestSite(db, { name: `Rule ${jurisdiction ?? 'fleet'} depot`, jurisdiction });
  const unit = await createTestUnit(db, {
    containerNumber: halyardNumber(serial++),
    siteId: site.id,
    commissionedOn: '2024-01-10',
  });
  const other = await createTestUnit(db, {
    containerNumber: halyardNumber(serial++),
    siteId: site.id,
    commissionedOn: '2024-01-10',
  });
  const { agent } = await signInAs(app, db, 'technician');
  // A repair five weeks ago with no leak check since: its re-check is overdue.
  await recordVisits(agent, unit.id, [
    {
      at: '2026-04-25T10:00:00Z',
      siteId: site.id,
      events: [{ kind: 'repair', location: 'service_valve', action: 'valve_core_replaced', verified: false }],
    },
  ]);
  await db
    .insert(unitStats)
    .values({ unitId: other.id, computedAt: now, nextLeakCheckDue: '2026-05-20', leakCheckIntervalMonths: 12 });
  const res = await agent.get(`/api/day?siteId=${site.id}`);
  expect(res.status).toBe(200);
  const groups = res.body.groups as Group[];
  const of = (id: string) => groups.find((g) => g.id === id)!.rows.map((r) => r.why);
  return { overdue: of('leak_check_overdue'), recheck: of('recheck') };
}

describe('My day words by the site’s rule', () => {
  it('cites the EU regulation’s interval at an EU site, and the fleet’s policy where a site has no rule', async () => {
    for (const rule of ['EU', null] as const) {
      const { overdue, recheck } = await myDayAt(rule);
      // Source: Regulation (EU) 2024/573, Art. 5 — 5 to < 50 t CO2e: a leak check every 12 months; a re-check within
      // one month of a repair (DOMAIN.md §5).
      expect(overdue).toContain('Leak check overdue since 20 May 2026 — EU 2024/573: every 12 months.');
      expect(recheck).toEqual([
        'Leak check after a repair, overdue since 25 May 2026 — EU 2024/573: a leak check within a month of a repair.',
      ]);
    }
  });

  it('names the US reference rule at a US site', async () => {
    const { overdue, recheck } = await myDayAt('US');
    // Source: 40 CFR 82.157 (leak inspection and verification after a repair), as a reference line only (DOMAIN.md §4).
    expect(overdue).toEqual(['Leak check overdue since 20 May 2026 — US reference (40 CFR 82.157): every 12 months.']);
    expect(recheck[0]).toContain('US reference (40 CFR 82.157): verification after a repair');
    expect([...overdue, ...recheck].join(' ')).not.toContain('EU');
  });

  it('speaks of the company’s own rule at a custom site', async () => {
    const { overdue, recheck } = await myDayAt('custom');
    expect(overdue).toContain("Leak check overdue since 20 May 2026 — your company's rule: every 12 months.");
    expect(recheck[0]).toContain("your company's rule: a leak check 30 days after a repair");
    expect([...overdue, ...recheck].join(' ')).not.toMatch(/EU|CFR/);
  });
});
