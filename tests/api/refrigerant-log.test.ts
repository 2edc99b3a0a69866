import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { parse } from 'csv-parse/sync';
import { eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { sites, users } from '../../server/db/schema';
import { co2eTonnes } from '../../shared/domain';
import type { RefrigerantLogDto, RefrigerantLogEntryDto } from '../../shared/schemas/refrigerant-log';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { createTestSite, halyardNumber } from '../support/units';
import { recordVisits } from '../support/visits';

const { db, pool } = openTestDb();
const now = new Date('2026-06-01T12:00:00Z');
const { app } = createApp({ db, clock: { now: () => now }, rateLimits: { signInPerIp: 1000 } });

type Agent = Awaited<ReturnType<typeof signInAs>>['agent'];
let engineer: Agent;
let site: { id: number };
let otherSite: { id: number };
let voidedTopUp = 0;

beforeAll(async () => {
  await resetDb(db);
  const tech = await signInAs(app, db, 'technician');
  await db.update(users).set({ certificateNumber: 'F-GAS-NL-0042' }).where(eq(users.id, tech.user.id));
  engineer = (await signInAs(app, db, 'engineer')).agent;
  site = await createTestSite(db, { name: 'North quay' });
  otherSite = await createTestSite(db, { name: 'South quay' });
  const a = await createTestUnit(db, { containerNumber: halyardNumber(410001), siteId: site.id, nominalChargeKg: 5 });
  const b = await createTestUnit(db, {
    containerNumber: halyardNumber(410002),
    siteId: site.id,
    nominalChargeKg: 4,
    refrigerant: 'R-404A',
  });
  const c = await createTestUnit(db, {
    containerNumber: halyardNumber(410003),
    siteId: otherSite.id,
    nominalChargeKg: 5,
  });
  await recordVisits(tech.agent, a.id, [
    { at: '2026-01-15T09:00:00Z', events: [{ kind: 'top_up', kg: 0.75, cylinder: 'CYL-1', reusedRecovered: true }] },
    {
      at: '2026-02-20T09:00:00Z',
      events: [
        { kind: 'leak_check', method: 'uv_dye', leakFound: true, location: 'brazed_joint' },
        { kind: 'repair', location: 'brazed_joint', action: 'rebrazed', verified: true },
        { kind: 'recovery', kg: 2.1, cylinder: 'REC-9' },
        { kind: 'recharge', kg: 5, cylinder: 'CYL-2' },
      ],
    },
    {
      at: '2026-03-05T09:00:00Z',
      events: [
        { kind: 'leak_check', method: 'electronic_detector', leakFound: false },
        { kind: 'pti', passed: true },
      ],
    },
  ]);
  await recordVisits(tech.agent, b.id, [
    { at: '2026-02-01T09:00:00Z', events: [{ kind: 'top_up', kg: 1.25, cylinder: 'CYL-40' }] },
  ]);
  const [[wrong]] = await recordVisits(tech.agent, b.id, [
    { at: '2026-02-02T09:00:00Z', events: [{ kind: 'top_up', kg: 9.5 / 3, cylinder: 'CYL-40' }] },
  ]);
  voidedTopUp = wrong;
  expect(
    (await engineer.post(`/api/events/${wrong}/void`).set('Origin', TEST_ORIGIN).send({ reason: 'Typed twice' }))
      .status,
  ).toBe(201);
  // Another site, and outside the period.
  await recordVisits(tech.agent, c.id, [
    { at: '2026-02-10T09:00:00Z', events: [{ kind: 'top_up', kg: 0.5, cylinder: 'CYL-7' }] },
  ]);
  await recordVisits(tech.agent, a.id, [
    { at: '2025-12-31T23:00:00Z', events: [{ kind: 'top_up', kg: 0.3, cylinder: 'CYL-1' }] },
  ]);
});
afterAll(() => pool.end());

const log = async (query: string) => {
  const res = await engineer.get(`/api/refrigerant-log?${query}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as RefrigerantLogDto;
};

describe('GET /api/refrigerant-log', () => {
  it('lists every addition, recovery and leak check of the period and site, newest first, with technician and certificate', async () => {
    const l = await log(`from=2026-01-01&to=2026-03-31&siteId=${site.id}`);
    const times = l.entries.map((e) => e.occurredAt);
    expect(times).toEqual([...times].sort().reverse());
    const kinds = l.entries.map((e) => e.kind).sort();
    expect(kinds).toEqual(['leak_check', 'leak_check', 'recharge', 'recovery', 'top_up', 'top_up']);
    const first = l.entries.find((e) => e.kind === 'top_up' && e.refrigerant === 'R-134a')!;
    expect(first).toMatchObject({
      kg: 0.75,
      cylinder: 'CYL-1',
      reusedRecovered: true,
      technician: { certificateNumber: 'F-GAS-NL-0042' },
    });
    expect(first.co2eTonnes).toBeCloseTo(co2eTonnes('R-134a', 0.75), 4);
    const check = l.entries.find((e) => e.kind === 'leak_check' && e.leakFound)!;
    expect(check).toMatchObject({ method: 'uv_dye', location: 'brazed_joint', kg: null });
  });

  it('leaves voided entries out of the list and the totals, and says how many', async () => {
    const l = await log(`from=2026-01-01&to=2026-03-31&siteId=${site.id}`);
    expect(l.entries.map((e) => e.eventId)).not.toContain(voidedTopUp);
    expect(l.voidedExcluded).toBe(1);
  });

  it('has totals equal to the sum of the listed entries, per refrigerant', async () => {
    const l = await log('from=2026-01-01&to=2026-03-31');
    expect(l.nextBefore).toBeNull();
    const sum = (r: string, pred: (e: RefrigerantLogEntryDto) => boolean) =>
      l.entries.filter((e) => e.refrigerant === r && pred(e)).reduce((s, e) => s + (e.kg ?? 0), 0);
    for (const t of l.totals) {
      expect(t.addedKg).toBeCloseTo(
        sum(t.refrigerant, (e) => e.kind === 'top_up' || e.kind === 'recharge'),
        6,
      );
      expect(t.recoveredKg).toBeCloseTo(
        sum(t.refrigerant, (e) => e.kind === 'recovery'),
        6,
      );
      expect(t.addedCo2eTonnes).toBeCloseTo(co2eTonnes(t.refrigerant, t.addedKg), 4);
      expect(t.leakChecks).toBe(
        l.entries.filter((e) => e.refrigerant === t.refrigerant && e.kind === 'leak_check').length,
      );
    }
    const r134 = l.totals.find((t) => t.refrigerant === 'R-134a')!;
    // 0.75 + 5 (site 1) + 0.5 (site 2) added; 2.1 recovered; the 2025 top-up is outside the period.
    expect(r134).toMatchObject({
      addedKg: 6.25,
      recoveredKg: 2.1,
      additions: 3,
      recoveries: 1,
      leakChecks: 2,
      leaksFound: 1,
    });
    expect(l.totals.find((t) => t.refrigerant === 'R-404A')).toMatchObject({ addedKg: 1.25, additions: 1 });
  });

  it('filters by refrigerant and counts a UTC day boundary exactly', async () => {
    const l = await log('from=2025-12-31&to=2025-12-31&refrigerant=R-134a');
    expect(l.entries).toHaveLength(1);
    expect(l.entries[0].kg).toBe(0.3);
    expect(
      (await log('from=2026-01-01&to=2026-12-31&refrigerant=R-404A')).entries.every((e) => e.refrigerant === 'R-404A'),
    ).toBe(true);
  });

  it('pages with a marker and returns 400 for a bad period or marker', async () => {
    for (const q of [
      'from=2026-01-01',
      'from=2026-03-01&to=2026-01-01',
      'from=2025-01-01&to=2026-06-01',
      'from=x&to=y',
      'from=2026-01-01&to=2026-02-01&before=42',
      'from=2026-01-01&to=2026-02-01&refrigerant=R-12',
    ]) {
      const res = await engineer.get(`/api/refrigerant-log?${q}`);
      expect(res.status, q).toBe(400);
    }
    const page = await log('from=2026-01-01&to=2026-03-31&before=2026-02-20T09:00:00.000Z_1');
    expect(page.entries.every((e) => e.occurredAt <= '2026-02-20T09:00:00.000Z')).toBe(true);
  });

  it('is refused to technicians (403) and to visitors (401)', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    expect((await agent.get('/api/refrigerant-log?from=2026-01-01&to=2026-01-31')).status).toBe(403);
    expect((await request(app).get('/api/refrigerant-log?from=2026-01-01&to=2026-01-31')).status).toBe(401);
    const { agent: owner } = await signInAs(app, db, 'owner');
    expect((await owner.get('/api/refrigerant-log?from=2026-01-01&to=2026-01-31')).status).toBe(200);
  });
});

describe('GET /api/refrigerant-log/export.csv', () => {
  it('exports the same entries with totals that match, its notes on a first comment line and no free-text row', async () => {
    const res = await engineer
      .get(`/api/refrigerant-log/export.csv?from=2026-01-01&to=2026-03-31&siteId=${site.id}`)
      .buffer(true);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toContain(
      `refrigerant-log-2026-01-01-to-2026-03-31-site-${site.id}.csv`,
    );
    const text = res.text.replace(/^\uFEFF/, '');
    const [first] = text.split('\n');
    expect(first).toMatch(
      /^# Refrigerant log, period 2026-01-01 to 2026-03-31; GWP basis .*voided entries are excluded/,
    );
    // Every line after the comment is a record of the header's width: a machine reads the file as it is.
    const rows = parse(text, { comment: '#' }) as string[][];
    const [header, ...rest] = rows;
    expect(header.slice(0, 3)).toEqual(['Date (UTC)', 'Entry', 'Container number']);
    expect(rest.every((r) => r.length === header.length)).toBe(true);
    const entries = rest.filter((r) => r[0] !== 'Total');
    expect(entries).toHaveLength(6);
    expect(entries.every((r) => !Number.isNaN(Date.parse(r[0])))).toBe(true);
    expect(entries.find((r) => r[1] === 'Top-up')?.[14]).toBe('F-GAS-NL-0042');
    const added134 = rest.find((r) => r[0] === 'Total' && r[1] === 'added' && r[3] === 'R-134a')!;
    expect(Number(added134[5])).toBeCloseTo(5.75, 6);
    const checks134 = rest.find((r) => r[0] === 'Total' && r[1] === 'leak checks' && r[3] === 'R-134a')!;
    expect(checks134[header.indexOf('Leak found')]).toMatch(/found$/);
    expect(checks134.at(-1)).toMatch(/^\d+ entries$/);
    expect(rest.at(-1)![0]).toBe('Total');
  });

  it('answers 400 without a period and 403 for a technician', async () => {
    expect((await engineer.get('/api/refrigerant-log/export.csv')).status).toBe(400);
    const { agent } = await signInAs(app, db, 'technician');
    expect((await agent.get('/api/refrigerant-log/export.csv?from=2026-01-01&to=2026-01-31')).status).toBe(403);
  });
});

describe('certificates in the log', () => {
  it('shows the certificate held on the day of the work after the person’s certificate changes', async () => {
    const admin = (await signInAs(app, db, 'admin')).agent;
    const tech = await signInAs(app, db, 'technician');
    const setCert = (certificateNumber: string, certificateExpiresOn: string) =>
      admin
        .patch(`/api/users/${tech.user.id}`)
        .set('Origin', TEST_ORIGIN)
        .send({ certificateNumber, certificateExpiresOn });
    const first = await setCert('F-GAS-OLD-7', '2026-09-30');
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body.user).toMatchObject({ certificateNumber: 'F-GAS-OLD-7', certificateExpiresOn: '2026-09-30' });
    const unit = await createTestUnit(db, { containerNumber: halyardNumber(410099), siteId: otherSite.id });
    await recordVisits(tech.agent, unit.id, [
      { at: '2026-05-10T09:00:00Z', events: [{ kind: 'top_up', kg: 0.3, cylinder: 'CYL-CERT' }] },
    ]);
    expect((await setCert('F-GAS-NEW-8', '2028-12-31')).status).toBe(200);

    const l = await log(`from=2026-05-01&to=2026-05-31&siteId=${otherSite.id}`);
    const entry = l.entries.find((e) => e.cylinder === 'CYL-CERT')!;
    expect(entry.technician).toMatchObject({ certificateNumber: 'F-GAS-OLD-7', certificateExpiresOn: '2026-09-30' });
    // The person's own session knows today's certificate (the visit form warns when it has expired).
    const me = await tech.agent.get('/api/auth/me');
    expect(me.body.user).toMatchObject({ certificateNumber: 'F-GAS-NEW-8', certificateExpiresOn: '2028-12-31' });
  });

  it('returns 400 with the field for a certificate expiry that is not a date', async () => {
    const admin = (await signInAs(app, db, 'admin')).agent;
    const tech = await signInAs(app, db, 'technician');
    const res = await admin
      .patch(`/api/users/${tech.user.id}`)
      .set('Origin', TEST_ORIGIN)
      .send({ certificateExpiresOn: '31/12/2027' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('certificateExpiresOn');
  });
});

describe('the rule the log is kept under', () => {
  it('states the chosen site’s own rule, else the fleet’s policy', async () => {
    await db.update(sites).set({ jurisdiction: 'US' }).where(eq(sites.id, otherSite.id));
    const atSite = await log(`from=2026-01-01&to=2026-03-31&siteId=${otherSite.id}`);
    expect(atSite.rule).toMatchObject({ jurisdiction: 'US', siteName: 'South quay' });
    expect(atSite.rule.words).toMatch(/40 CFR 82/);
    const fleet = await log('from=2026-01-01&to=2026-03-31');
    expect(fleet.rule).toMatchObject({ jurisdiction: 'EU', siteName: null });
    await db.update(sites).set({ jurisdiction: null }).where(eq(sites.id, otherSite.id));
  });
});
