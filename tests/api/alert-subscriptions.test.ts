import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { eq } from 'drizzle-orm';
import type TestAgent from 'supertest/lib/agent';
import { createApp } from '../../server/app';
import { alertKindChoices, alertSubscriptions, events, sites, unitStats, visits } from '../../server/db/schema';
import { queueAlertsForStatsChange, type UnitStatsRow } from '../../server/lib/record/alerts';
import { queueDailyDigest, queueOverdueLeakAlerts } from '../../server/features/alerts/digest.service';
import { createOutboxWorker } from '../../server/lib/mail/sender';
import { newToken } from '../../server/lib/ids';
import { dayOf, isoDate, MS_PER_DAY } from '../../shared/domain/dates';
import { ALERT_KINDS, type AlertKind, type SubscriptionsDto } from '../../shared/schemas/alerts';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { linkIn, startTestSmtp, testClock } from '../support/mail';

const { db, pool } = openTestDb();
const { smtp, mailer } = await startTestSmtp();
const clock = testClock();
const PUBLIC_URL = 'http://localhost:3000';
const { app, ctx } = createApp({ db, mailer, clock, publicUrl: PUBLIC_URL, rateLimits: { signInPerIp: 1000 } });
const worker = createOutboxWorker(ctx);

let siteCounter = 0;
async function createSite(name: string) {
  siteCounter += 1;
  const [r] = await db
    .insert(sites)
    .values({ code: `SUB${siteCounter}`, name, kind: 'depot' })
    .$returningId();
  return r.id;
}

async function unitAt(siteId: number) {
  const unit = await createTestUnit(db, { siteId, qrToken: newToken() });
  return { id: unit.id, containerNumber: unit.containerNumber, siteId };
}

/** A visit recorded by this person at the unit's site: that makes the site one of "my sites". */
async function recordVisit(agent: TestAgent, unitId: number) {
  const res = await agent
    .post('/api/visits')
    .set('Origin', TEST_ORIGIN)
    .send({
      idempotencyKey: newToken(),
      unitId,
      occurredAt: new Date(clock.now().getTime() - 60_000).toISOString(),
      events: [{ kind: 'leak_check', method: 'electronic_detector', leakFound: false }],
    });
  expect(res.status).toBe(201);
}

async function statsChange(
  unit: { id: number; containerNumber: string; siteId: number },
  values: Partial<UnitStatsRow>,
) {
  return db.transaction(async (tx) => {
    const [before] = await tx.select().from(unitStats).where(eq(unitStats.unitId, unit.id)).for('update');
    const row = { unitId: unit.id, computedAt: clock.now(), ...values };
    await tx
      .insert(unitStats)
      .values(row)
      .onDuplicateKeyUpdate({ set: { ...values, computedAt: row.computedAt } });
    const [after] = await tx.select().from(unitStats).where(eq(unitStats.unitId, unit.id));
    return queueAlertsForStatsChange(tx, ctx, {
      unitId: unit.id,
      siteId: unit.siteId,
      containerNumber: unit.containerNumber,
      before: before ?? null,
      after,
    });
  });
}

const put = (agent: TestAgent, body: object) =>
  agent.put('/api/alerts/subscriptions').set('Origin', TEST_ORIGIN).send(body);

const sitesOf = (dto: SubscriptionsDto, kind: AlertKind) =>
  dto.subscriptions.filter((s) => s.kind === kind).map((s) => s.siteId);
const scopeOf = (dto: SubscriptionsDto, kind: AlertKind) => dto.kinds.find((k) => k.kind === kind)!.scope;

beforeAll(() => resetDb(db));
beforeEach(async () => {
  await worker.drain();
  smtp.clear();
});
afterAll(async () => {
  await smtp.stop();
  await pool.end();
});

describe('defaults by role for people who never chose', () => {
  it('gives an engineer every kind for the sites they recorded visits at, and nothing elsewhere', async () => {
    const worked = await createSite('Gannet Quay');
    const never = await createSite('Heron Basin');
    const { agent } = await signInAs(app, db, 'engineer');
    await recordVisit(agent, (await unitAt(worked)).id);

    const res = await agent.get('/api/alerts/subscriptions');
    expect(res.status).toBe(200);
    const dto = res.body as SubscriptionsDto;
    expect(dto.role).toBe('engineer');
    expect(dto.mySiteIds).toEqual([worked]);
    for (const kind of ALERT_KINDS) {
      expect(scopeOf(dto, kind)).toBe('default');
      expect(sitesOf(dto, kind)).toEqual([worked]);
    }
    expect(dto.subscriptions.some((s) => s.siteId === never)).toBe(false);
    expect(await db.select().from(alertKindChoices)).toEqual([]);
  });

  it("counts the unit's site for a note recorded away from any site (an engineer's office note)", async () => {
    const reviewed = await createSite('Tern Wharf');
    const { agent, user } = await signInAs(app, db, 'engineer');
    const unit = await unitAt(reviewed);
    const at = new Date(clock.now().getTime() - 3 * MS_PER_DAY);
    const [v] = await db
      .insert(visits)
      .values({
        unitId: unit.id,
        siteId: null,
        recordedBy: user.id,
        occurredAt: at,
        enteredAt: at,
        idempotencyKey: newToken(),
      })
      .$returningId();
    await db.insert(events).values({
      kind: 'note',
      note: 'Reviewed from the office.',
      unitId: unit.id,
      visitId: v.id,
      siteId: null,
      recordedBy: user.id,
      occurredAt: at,
      enteredAt: at,
    });

    const dto = (await agent.get('/api/alerts/subscriptions')).body as SubscriptionsDto;
    expect(dto.mySiteIds).toEqual([reviewed]);
    expect(sitesOf(dto, 'recheck')).toEqual([reviewed]);
  });

  it('gives the owner repeat leakers and the administrator the leak-rate threshold at every site', async () => {
    const siteA = await createSite('Ibis Wharf');
    const { agent: owner } = await signInAs(app, db, 'owner');
    const { agent: admin } = await signInAs(app, db, 'admin');
    const allSiteIds = (await db.select({ id: sites.id }).from(sites)).map((s) => s.id).sort((a, b) => a - b);

    const ownerDto = (await owner.get('/api/alerts/subscriptions')).body as SubscriptionsDto;
    expect(sitesOf(ownerDto, 'chronic')).toEqual(allSiteIds);
    expect(sitesOf(ownerDto, 'digest')).toEqual([]);
    expect(ownerDto.kinds.find((k) => k.kind === 'chronic')).toEqual({
      kind: 'chronic',
      scope: 'default',
      defaultReach: 'all_sites',
    });
    const adminDto = (await admin.get('/api/alerts/subscriptions')).body as SubscriptionsDto;
    expect(sitesOf(adminDto, 'leak_rate')).toContain(siteA);
    expect(sitesOf(adminDto, 'chronic')).toEqual([]);
  });

  it('mails a defaulted engineer about a unit at their site, and the digest for it, but nothing about other sites', async () => {
    const mine = await createSite('Jetty Seven');
    const other = await createSite('Kestrel Yard');
    const { agent, user } = await signInAs(app, db, 'engineer');
    const unit = await unitAt(mine);
    await recordVisit(agent, unit.id);
    const elsewhere = await unitAt(other);

    await statsChange(unit, { score: 70, scoreBand: 'chronic', nextLeakCheckDue: isoDate(dayOf(Date.now()) - 2) });
    await statsChange(elsewhere, { score: 72, scoreBand: 'chronic' });
    expect(await queueDailyDigest(db, ctx, clock.now())).toBeGreaterThanOrEqual(1);
    await worker.drain();

    const toEngineer = smtp.messages.filter((m) => m.envelopeTo.includes(user.email));
    expect(toEngineer.map((m) => m.subject)).toEqual([
      expect.stringMatching(/is now a repeat leaker/),
      expect.stringMatching(/^Tightloop daily digest for Jetty Seven/),
    ]);
    expect(toEngineer[0].text).toContain(`${PUBLIC_URL}/units/${unit.id}`);
    expect(toEngineer.some((m) => m.text.includes(`${PUBLIC_URL}/units/${elsewhere.id}\n`))).toBe(false);
  });

  it('keeps a kind off after its unsubscribe link, and brings the default back when asked', async () => {
    const site = await createSite('Lantern Pier');
    const { agent, user } = await signInAs(app, db, 'engineer');
    const unit = await unitAt(site);
    await recordVisit(agent, unit.id);
    await statsChange(unit, { score: 80, scoreBand: 'chronic' });
    await worker.drain();
    const mail = smtp.messages.find((m) => m.envelopeTo.includes(user.email))!;
    const body = Object.fromEntries(new URL(linkIn(mail.text, `${PUBLIC_URL}/unsubscribe?`)).searchParams);

    const res = await request(app).post('/api/alerts/unsubscribe').set('Origin', TEST_ORIGIN).send(body);
    expect(res.body).toEqual({ kind: 'chronic', removed: 1 });
    const after = (await agent.get('/api/alerts/subscriptions')).body as SubscriptionsDto;
    expect(scopeOf(after, 'chronic')).toBe('sites');
    expect(sitesOf(after, 'chronic')).toEqual([]);
    expect(sitesOf(after, 'digest')).toEqual([site]);

    const back = await put(agent, { subscriptions: after.subscriptions, useDefaults: ['chronic'] });
    expect(back.status).toBe(200);
    expect(scopeOf(back.body, 'chronic')).toBe('default');
    expect(sitesOf(back.body, 'chronic')).toEqual([site]);
  });
});

describe('all sites per kind', () => {
  it('follows a site created after the choice, on the screen and by mail', async () => {
    const before = await createSite('Marram Depot');
    const { agent, user } = await signInAs(app, db, 'engineer');
    const saved = await put(agent, { subscriptions: [{ siteId: before, kind: 'digest' }], allSites: ['open_leak'] });
    expect(saved.status).toBe(200);
    expect(scopeOf(saved.body, 'open_leak')).toBe('all_sites');
    expect(scopeOf(saved.body, 'digest')).toBe('sites');
    expect(scopeOf(saved.body, 'chronic')).toBe('sites');
    expect(sitesOf(saved.body, 'chronic')).toEqual([]);

    const later = await createSite('Nettle Harbour');
    const dto = (await agent.get('/api/alerts/subscriptions')).body as SubscriptionsDto;
    expect(sitesOf(dto, 'open_leak')).toEqual(expect.arrayContaining([before, later]));
    expect(sitesOf(dto, 'digest')).toEqual([before]);
    // Only the choice is stored, not one row per site.
    const rows = await db.select().from(alertSubscriptions).where(eq(alertSubscriptions.userId, user.id));
    expect(rows.map((r) => [r.siteId, r.kind])).toEqual([[before, 'digest']]);

    const unit = await unitAt(later);
    await statsChange(unit, { openLeakFoundAt: new Date(clock.now().getTime() - 30 * MS_PER_DAY) });
    expect(await queueOverdueLeakAlerts(db, ctx, clock.now())).toBe(0);
    await worker.drain();
    const mails = smtp.messages.filter((m) => m.envelopeTo.includes(user.email));
    expect(mails.map((m) => m.subject)).toEqual([expect.stringMatching(/leak found 30 days ago/)]);
  });

  it('keeps one whole set when two tabs save at once, with no duplicate or lost rows', async () => {
    const a = await createSite('Osprey Reach');
    const b = await createSite('Plover Point');
    const { agent, user } = await signInAs(app, db, 'engineer');
    const first = { subscriptions: [{ siteId: a, kind: 'chronic' }], allSites: ['digest'] };
    const second = {
      subscriptions: [
        { siteId: a, kind: 'leak_rate' },
        { siteId: b, kind: 'leak_rate' },
      ],
      allSites: ['chronic'],
      useDefaults: ['digest'],
    };
    for (let round = 0; round < 4; round++) {
      const saves = await Promise.all([put(agent, first), put(agent, second), put(agent, first), put(agent, second)]);
      expect(saves.map((r) => r.status)).toEqual([200, 200, 200, 200]);
    }
    const choices = await db
      .select({ kind: alertKindChoices.kind, allSites: alertKindChoices.allSites })
      .from(alertKindChoices)
      .where(eq(alertKindChoices.userId, user.id));
    const rows = await db
      .select({ siteId: alertSubscriptions.siteId, kind: alertSubscriptions.kind })
      .from(alertSubscriptions)
      .where(eq(alertSubscriptions.userId, user.id));
    const kept = choices.find((c) => c.kind === 'digest')?.allSites ? 'first' : 'second';
    if (kept === 'first') {
      expect(rows).toEqual([{ siteId: a, kind: 'chronic' }]);
      expect(choices).toHaveLength(ALERT_KINDS.length);
    } else {
      expect(rows.sort((x, y) => x.siteId - y.siteId)).toEqual([
        { siteId: a, kind: 'leak_rate' },
        { siteId: b, kind: 'leak_rate' },
      ]);
      expect(choices).toHaveLength(ALERT_KINDS.length - 1);
      expect(choices.find((c) => c.kind === 'chronic')?.allSites).toBe(true);
    }
  });
});

describe('refusals', () => {
  it('answers 400 with the fields for an unknown kind, a kind both all-sites and default, or a list that is not one', async () => {
    const { agent } = await signInAs(app, db, 'engineer');
    const unknownKind = await put(agent, { subscriptions: [], allSites: ['gossip'] });
    expect(unknownKind.status).toBe(400);
    expect(unknownKind.body.error.fields).toEqual({ 'allSites.0': 'Unknown alert kind' });
    const both = await put(agent, { subscriptions: [], allSites: ['digest'], useDefaults: ['chronic', 'digest'] });
    expect(both.status).toBe(400);
    expect(Object.keys(both.body.error.fields)).toEqual(['useDefaults.1']);
    const notAList = await put(agent, { subscriptions: 'all' });
    expect(notAList.status).toBe(400);
    expect(notAList.body.error.code).toBe('invalid_input');
    expect(Object.keys(notAList.body.error.fields)).toEqual(['subscriptions']);
  });

  it('answers 403 to a technician, who gets no alert mails by default either', async () => {
    const site = await createSite('Quillet Dock');
    const { agent, user } = await signInAs(app, db, 'technician');
    await recordVisit(agent, (await unitAt(site)).id);
    expect((await agent.get('/api/alerts/subscriptions')).status).toBe(403);
    const res = await put(agent, { subscriptions: [], allSites: ['digest'] });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
    expect(await db.select().from(alertKindChoices).where(eq(alertKindChoices.userId, user.id))).toEqual([]);
  });
});
