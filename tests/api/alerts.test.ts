import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { eq } from 'drizzle-orm';
import type TestAgent from 'supertest/lib/agent';
import { createApp } from '../../server/app';
import type { DbOrTx } from '../../server/db/client';
import { alertSubscriptions, sites, units, unitStats, users } from '../../server/db/schema';
import { newToken } from '../../server/lib/ids';
import { queueAlertsForStatsChange, type UnitStatsRow } from '../../server/lib/record/alerts';
import { queueDailyDigest, queueOverdueLeakAlerts } from '../../server/features/alerts/digest.service';
import { createOutboxWorker } from '../../server/lib/mail/sender';
import { containerCheckDigit } from '../../shared/domain/container-number';
import { isoDate, dayOf, MS_PER_DAY } from '../../shared/domain/dates';
import { fmtIsoDay } from '../../shared/format-dates';
import { ALERT_KINDS, type AlertKind } from '../../shared/schemas/alerts';
import { openTestDb, resetDb } from '../support/db';
import { signInAs, TEST_ORIGIN } from '../support/factories';
import { linkIn, startTestSmtp, testClock } from '../support/mail';

const { db, pool } = openTestDb();
const { smtp, mailer } = await startTestSmtp();
const clock = testClock();
const PUBLIC_URL = 'http://localhost:3000';
const { app, ctx } = createApp({ db, mailer, clock, publicUrl: PUBLIC_URL, rateLimits: { signInPerIp: 1000 } });
const worker = createOutboxWorker(ctx);

let siteCounter = 0;
let unitCounter = 0;

async function createSite(name: string) {
  siteCounter += 1;
  const [r] = await db
    .insert(sites)
    .values({ code: `HLY${siteCounter}`, name, kind: 'depot' })
    .$returningId();
  return r.id;
}

async function createUnit(siteId: number) {
  unitCounter += 1;
  const first10 = `HLXU${String(400000 + unitCounter)}`;
  const containerNumber = `${first10}${containerCheckDigit(first10) % 10}`;
  const [r] = await db
    .insert(units)
    .values({ containerNumber, refrigerant: 'R-134a', nominalChargeKg: 4.5, siteId, qrToken: newToken() })
    .$returningId();
  return { id: r.id, containerNumber, siteId };
}

/** Writes the unit's statistics row and returns it as it now stands in the database. */
async function setStats(unitId: number, values: Partial<UnitStatsRow>, on: DbOrTx = db): Promise<UnitStatsRow> {
  const row = { unitId, computedAt: clock.now(), ...values };
  await on
    .insert(unitStats)
    .values(row)
    .onDuplicateKeyUpdate({ set: { ...values, computedAt: row.computedAt } });
  const [stored] = await on.select().from(unitStats).where(eq(unitStats.unitId, unitId));
  return stored;
}

async function subscribe(agent: TestAgent, subscriptions: { siteId: number; kind: AlertKind }[]) {
  const res = await agent.put('/api/alerts/subscriptions').set('Origin', TEST_ORIGIN).send({ subscriptions });
  expect(res.status).toBe(200);
  return res;
}

/** Recomputes "the history" the way the service history does: new stats inside a transaction, then alerts. */
async function statsChange(
  unit: { id: number; containerNumber: string; siteId: number },
  values: Partial<UnitStatsRow>,
) {
  return db.transaction(async (tx) => {
    const [before] = await tx.select().from(unitStats).where(eq(unitStats.unitId, unit.id)).for('update');
    const after = await setStats(unit.id, values, tx);
    return queueAlertsForStatsChange(tx, ctx, {
      unitId: unit.id,
      siteId: unit.siteId,
      containerNumber: unit.containerNumber,
      before: before ?? null,
      after,
    });
  });
}

beforeAll(() => resetDb(db));
// Whatever an earlier test queued goes out first, so each test reads only its own mail.
beforeEach(async () => {
  await worker.drain();
  smtp.clear();
});
afterAll(async () => {
  await smtp.stop();
  await pool.end();
});

describe('alerts on a statistics change', () => {
  it('mails one alert when a unit crosses into the chronic band, not one per later event', async () => {
    const siteId = await createSite('Harbour Row Depot');
    const unit = await createUnit(siteId);
    const { agent, user } = await signInAs(app, db, 'engineer');
    await subscribe(agent, [{ siteId, kind: 'chronic' }]);
    await setStats(unit.id, { score: 40, scoreBand: 'watch', rollingLeakRatePct: 8 });

    expect(await statsChange(unit, { score: 66, scoreBand: 'chronic', rollingLeakRatePct: 12 })).toBe(1);
    expect(await statsChange(unit, { score: 71, scoreBand: 'chronic', rollingLeakRatePct: 14 })).toBe(0);
    expect(await statsChange(unit, { score: 75, scoreBand: 'chronic', rollingLeakRatePct: 15 })).toBe(0);
    await worker.drain();

    expect(smtp.messages).toHaveLength(1);
    const mail = smtp.messages[0];
    expect(mail.envelopeTo).toEqual([user.email]);
    expect(mail.subject).toBe(
      `HLXU ${unit.containerNumber.slice(4, 10)} ${unit.containerNumber[10]} is now a repeat leaker (score 66 of 100)`,
    );
    expect(mail.text).toContain(`${PUBLIC_URL}/units/${unit.id}`);
    expect(mail.html).toContain(`${PUBLIC_URL}/units/${unit.id}`);
    expect(mail.text).toContain('Harbour Row Depot');
    expect(mail.headers['list-unsubscribe']).toMatch(/^<http:\/\/localhost:3000\/unsubscribe\?/);
  });

  it('mails again only after the unit left the band and crossed in again on another day', async () => {
    const siteId = await createSite('Quay Nine Terminal');
    const unit = await createUnit(siteId);
    const { agent } = await signInAs(app, db, 'engineer');
    await subscribe(agent, [{ siteId, kind: 'chronic' }]);
    expect(await statsChange(unit, { score: 70, scoreBand: 'chronic' })).toBe(1);
    expect(await statsChange(unit, { score: 50, scoreBand: 'watch' })).toBe(0);
    // Flapping back in the same day is the same crossing.
    expect(await statsChange(unit, { score: 65, scoreBand: 'chronic' })).toBe(0);
    clock.advance(3 * MS_PER_DAY);
    try {
      expect(await statsChange(unit, { score: 50, scoreBand: 'watch' })).toBe(0);
      expect(await statsChange(unit, { score: 68, scoreBand: 'chronic' })).toBe(1);
    } finally {
      clock.advance(-3 * MS_PER_DAY);
    }
  });

  it('mails when the rolling leak rate reaches the policy threshold of 20 %', async () => {
    const siteId = await createSite('Saltmarsh Yard');
    const unit = await createUnit(siteId);
    const { agent, user } = await signInAs(app, db, 'engineer');
    await subscribe(agent, [{ siteId, kind: 'leak_rate' }]);
    await setStats(unit.id, { rollingLeakRatePct: 12.5 });
    expect(await statsChange(unit, { rollingLeakRatePct: 19.9 })).toBe(0);
    expect(await statsChange(unit, { rollingLeakRatePct: 24.2 })).toBe(1);
    expect(await statsChange(unit, { rollingLeakRatePct: 31 })).toBe(0);
    await worker.drain();
    expect(smtp.messages).toHaveLength(1);
    expect(smtp.messages[0].envelopeTo).toEqual([user.email]);
    expect(smtp.messages[0].subject).toMatch(/rolling leak rate 24\.2 % reached the 20 % threshold/);
  });

  it('mails once about a leak left unrepaired past 14 days, from a stats change or the daily run', async () => {
    const siteId = await createSite('North Basin Depot');
    const early = await createUnit(siteId);
    const late = await createUnit(siteId);
    const { agent } = await signInAs(app, db, 'engineer');
    await subscribe(agent, [{ siteId, kind: 'open_leak' }]);
    const foundAt = new Date(clock.now().getTime() - 20 * MS_PER_DAY);
    expect(await statsChange(early, { openLeakFoundAt: foundAt })).toBe(1);
    expect(await statsChange(early, { openLeakFoundAt: foundAt, rollingLeakRatePct: 3 })).toBe(0);
    // A recent leak is still within the allowed days.
    expect(await statsChange(late, { openLeakFoundAt: new Date(clock.now().getTime() - 5 * MS_PER_DAY) })).toBe(0);
    expect(await queueOverdueLeakAlerts(db, ctx, clock.now())).toBe(0);
    expect(await queueOverdueLeakAlerts(db, ctx, new Date(clock.now().getTime() + 10 * MS_PER_DAY))).toBe(1);
    await worker.drain();
    expect(smtp.messages.map((m) => m.subject)).toEqual([
      expect.stringMatching(/leak found 20 days ago and still not repaired/),
      expect.stringMatching(/leak found 15 days ago and still not repaired/),
    ]);
  });

  it('mails nobody for a unit without a site, a site nobody follows, or a person who lost fleet access', async () => {
    const siteId = await createSite('Lonely Depot');
    const unit = await createUnit(siteId);
    expect(await statsChange(unit, { scoreBand: 'chronic', score: 90 })).toBe(0);
    const other = await createUnit(siteId);
    const { agent, user } = await signInAs(app, db, 'engineer');
    await subscribe(agent, [{ siteId, kind: 'chronic' }]);
    await db.update(users).set({ role: 'technician' }).where(eq(users.id, user.id));
    expect(await statsChange(other, { scoreBand: 'chronic', score: 90 })).toBe(0);
    const noSite = await queueAlertsForStatsChange(db, ctx, {
      unitId: other.id,
      siteId: null,
      containerNumber: other.containerNumber,
      before: null,
      after: null,
    });
    expect(noSite).toBe(0);
  });
});

describe('unsubscribing', () => {
  it('stops one kind of alert through the signed link in the mail', async () => {
    const siteId = await createSite('Breakwater Depot');
    const unit = await createUnit(siteId);
    const { agent, user } = await signInAs(app, db, 'engineer');
    await subscribe(agent, [
      { siteId, kind: 'chronic' },
      { siteId, kind: 'digest' },
    ]);
    await statsChange(unit, { scoreBand: 'chronic', score: 80 });
    await worker.drain();
    const link = new URL(linkIn(smtp.messages[0].text, `${PUBLIC_URL}/unsubscribe?`));
    const body = Object.fromEntries(link.searchParams);
    expect(body).toMatchObject({ user: user.id, kind: 'chronic' });

    const forged = await request(app)
      .post('/api/alerts/unsubscribe')
      .set('Origin', TEST_ORIGIN)
      .send({ ...body, kind: 'digest' });
    expect(forged.status).toBe(404);
    expect(forged.body.error.code).toBe('link_invalid');

    const res = await request(app).post('/api/alerts/unsubscribe').set('Origin', TEST_ORIGIN).send(body);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ kind: 'chronic', removed: 1 });
    const left = await db.select().from(alertSubscriptions).where(eq(alertSubscriptions.userId, user.id));
    expect(left.map((s) => s.kind)).toEqual(['digest']);
  });

  it('answers 400 for a malformed unsubscribe request', async () => {
    const res = await request(app)
      .post('/api/alerts/unsubscribe')
      .set('Origin', TEST_ORIGIN)
      .send({ user: 'x', kind: 'everything' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(expect.arrayContaining(['kind', 'sig']));
  });
});

describe('alert settings', () => {
  it('lists sites and replaces the signed-in person’s subscriptions', async () => {
    const a = await createSite('Alder Wharf');
    const b = await createSite('Birch Pier');
    const { agent } = await signInAs(app, db, 'engineer');
    const empty = await agent.get('/api/alerts/subscriptions');
    expect(empty.status).toBe(200);
    expect(empty.body.subscriptions).toEqual([]);
    expect(empty.body.sites.map((s: { name: string }) => s.name)).toEqual(
      expect.arrayContaining(['Alder Wharf', 'Birch Pier']),
    );
    await subscribe(agent, [
      { siteId: a, kind: 'digest' },
      { siteId: b, kind: 'chronic' },
      { siteId: b, kind: 'chronic' },
    ]);
    const res = await subscribe(agent, [{ siteId: b, kind: 'leak_rate' }]);
    expect(res.body.subscriptions).toEqual([{ siteId: b, kind: 'leak_rate' }]);
  });

  it('answers every one of several saves at once (a double click) and keeps one of them whole, never a mix', async () => {
    const sitesFollowed = [await createSite('Cedar Quay'), await createSite('Dock Eleven')];
    const { agent, user } = await signInAs(app, db, 'engineer');
    const choices = ALERT_KINDS.map((kind) => sitesFollowed.map((siteId) => ({ siteId, kind })));
    for (let round = 0; round < 5; round++) {
      const saves = await Promise.all(
        [...choices, ...choices].map((subscriptions) =>
          agent.put('/api/alerts/subscriptions').set('Origin', TEST_ORIGIN).send({ subscriptions }),
        ),
      );
      expect(saves.map((r) => r.status)).toEqual(saves.map(() => 200));
    }
    const kept = await db
      .select({ siteId: alertSubscriptions.siteId, kind: alertSubscriptions.kind })
      .from(alertSubscriptions)
      .where(eq(alertSubscriptions.userId, user.id));
    expect(choices.map((c) => JSON.stringify(c))).toContain(
      JSON.stringify([...kept].sort((x, y) => x.siteId - y.siteId)),
    );
  });

  it('answers 400 for an unknown site or kind, 403 for a technician, 401 signed out', async () => {
    const { agent } = await signInAs(app, db, 'engineer');
    const unknownSite = await agent
      .put('/api/alerts/subscriptions')
      .set('Origin', TEST_ORIGIN)
      .send({ subscriptions: [{ siteId: 999999, kind: 'digest' }] });
    expect(unknownSite.status).toBe(400);
    expect(unknownSite.body.error.fields).toEqual({ 'subscriptions.0.siteId': 'No such site' });
    const badKind = await agent
      .put('/api/alerts/subscriptions')
      .set('Origin', TEST_ORIGIN)
      .send({ subscriptions: [{ siteId: 1, kind: 'gossip' }] });
    expect(badKind.status).toBe(400);
    const { agent: tech } = await signInAs(app, db, 'technician');
    expect((await tech.get('/api/alerts/subscriptions')).status).toBe(403);
    expect((await request(app).get('/api/alerts/subscriptions')).status).toBe(401);
  });
});

describe('daily digest', () => {
  it('lists leak checks due, forecast top-ups and PTIs running out for the sites a person follows, once a day', async () => {
    const followed = await createSite('Digest Depot');
    const elsewhere = await createSite('Other Depot');
    const asOf = clock.now();
    const day = (n: number) => isoDate(dayOf(asOf.getTime()) + n);
    const checkDue = await createUnit(followed);
    const topUp = await createUnit(followed);
    const pti = await createUnit(followed);
    const quiet = await createUnit(followed);
    const notMine = await createUnit(elsewhere);
    await setStats(checkDue.id, { nextLeakCheckDue: day(-3) });
    await setStats(topUp.id, { forecastDate: day(9), forecastEarliest: day(5), forecastLatest: day(20) });
    await setStats(pti.id, { ptiValidUntil: day(4) });
    await setStats(quiet.id, { nextLeakCheckDue: day(90), forecastDate: day(60), ptiValidUntil: day(40) });
    await setStats(notMine.id, { nextLeakCheckDue: day(1) });
    const { agent, user } = await signInAs(app, db, 'engineer');
    await subscribe(agent, [{ siteId: followed, kind: 'digest' }]);

    expect(await queueDailyDigest(db, ctx, asOf)).toBe(1);
    expect(await queueDailyDigest(db, ctx, asOf)).toBe(0);
    await worker.drain();
    const mail = smtp.messages.find((m) => m.envelopeTo.includes(user.email))!;
    // Days the app's way (4 Mar 2026), never ISO, in the subject and the rows.
    expect(mail.subject).toBe(`Tightloop daily digest for Digest Depot, ${fmtIsoDay(day(0))}`);
    expect(mail.text).not.toMatch(/\d{4}-\d{2}-\d{2}/);
    expect(mail.text).toContain(`overdue since ${fmtIsoDay(day(-3))}`);
    expect(mail.text).toContain(`around ${fmtIsoDay(day(9))} (${fmtIsoDay(day(5))} – ${fmtIsoDay(day(20))})`);
    expect(mail.text).toMatch(/Leak checks due within 30 days or overdue[\s\S]*overdue since/);
    expect(mail.text).toMatch(/Top-ups forecast within 14 days[\s\S]*around/);
    expect(mail.text).toMatch(/PTIs running out within 7 days/);
    for (const u of [checkDue, topUp, pti]) expect(mail.text).toContain(`${PUBLIC_URL}/units/${u.id}`);
    for (const u of [quiet, notMine]) expect(mail.text).not.toContain(`${PUBLIC_URL}/units/${u.id}\n`);
    expect(mail.html).toContain('Digest Depot');
    expect(mail.text).toMatch(/unsubscribe: http:\/\/localhost:3000\/unsubscribe\?.*kind=digest/);
  });

  it('words each site’s leak checks by the site’s own rule: EU regulation, US reference, the company’s rule', async () => {
    const asOf = clock.now();
    const rules = [
      ['EU', 'Rule EU Quay', 'EU 2024/573: every 12 months'],
      ['US', 'Rule US Yard', 'US reference (40 CFR 82.157): every 12 months'],
      ['custom', 'Rule Own Depot', "your company's rule: every 12 months"],
      [null, 'Rule Fleet Depot', 'EU 2024/573: every 12 months'], // no rule of its own: the fleet's policy (EU)
    ] as const;
    const subs: { siteId: number; kind: AlertKind }[] = [];
    const unitsBySite: number[] = [];
    for (const [jurisdiction, name] of rules) {
      const siteId = await createSite(name);
      await db.update(sites).set({ jurisdiction }).where(eq(sites.id, siteId));
      const unit = await createUnit(siteId);
      await setStats(unit.id, {
        nextLeakCheckDue: isoDate(dayOf(asOf.getTime()) - 2),
        leakCheckIntervalMonths: 12,
      });
      subs.push({ siteId, kind: 'digest' });
      unitsBySite.push(unit.id);
    }
    const { agent, user } = await signInAs(app, db, 'engineer');
    await subscribe(agent, subs);
    expect(await queueDailyDigest(db, ctx, asOf)).toBeGreaterThanOrEqual(1);
    await worker.drain();
    const mail = smtp.messages.find((m) => m.envelopeTo.includes(user.email))!;
    const lines = mail.text.split('\n');
    rules.forEach(([, name, words]) => {
      const row = lines.find((l) => l.includes(`· ${name}`));
      expect(row, name).toContain(`· ${words} · ${name}`);
    });
    expect(lines.find((l) => l.includes('· Rule US Yard'))).not.toContain('EU');
    expect(lines.find((l) => l.includes('· Rule Own Depot'))).not.toMatch(/EU|CFR/);
  });

  it('sends no digest when nothing is due', async () => {
    const siteId = await createSite('Calm Depot');
    const unit = await createUnit(siteId);
    await setStats(unit.id, { nextLeakCheckDue: isoDate(dayOf(clock.now().getTime()) + 200) });
    const { agent } = await signInAs(app, db, 'engineer');
    await db.delete(alertSubscriptions);
    await subscribe(agent, [{ siteId, kind: 'digest' }]);
    expect(await queueDailyDigest(db, ctx, clock.now())).toBe(0);
  });
});
