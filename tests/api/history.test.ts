import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import { count, eq } from 'drizzle-orm';
import { createApp } from '../../server/app';
import { events, unitStats, unitStatsDetail, visits } from '../../server/db/schema';
import { createLocalStorage } from '../../server/lib/storage';
import { computeUnitStats } from '../../shared/domain';
import { DEFAULT_SETTINGS } from '../../shared/schemas/settings';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';

const { db, pool } = openTestDb();
let now = new Date('2026-06-01T12:00:00Z');
const clock = { now: () => now };
const storage = createLocalStorage(mkdtempSync(path.join(os.tmpdir(), 'tightloop-uploads-')));
const { app } = createApp({ db, clock, storage, rateLimits: { signInPerIp: 1000 } });

beforeAll(() => resetDb(db));
afterAll(() => pool.end());

const key = () => randomUUID();
const eventsOf = async (unitId: number) =>
  Number((await db.select({ n: count() }).from(events).where(eq(events.unitId, unitId)))[0].n);

describe('recording a visit', () => {
  it('saves a leak check, repair, recovery, recharge and pressure snapshot as one visit and updates the figures', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const unit = await createTestUnit(db, { nominalChargeKg: 5 });
    const res = await agent
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({
        idempotencyKey: key(),
        unitId: unit.id,
        occurredAt: '2026-06-01T09:30:00Z',
        events: [
          { kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'service_valve' },
          { kind: 'repair', location: 'service_valve', action: 'valve_core_replaced', verified: true },
          { kind: 'recovery', kg: 1.9, cylinder: 'REC-07' },
          { kind: 'recharge', kg: 5.0, cylinder: 'CYL-2231', enteredAs: { value: 5, unit: 'kg' } },
          { kind: 'pressure', suctionKPaG: 120, dischargeKPaG: 950, ambientC: 24, sightGlass: 'full', setPointC: -25 },
        ],
      });
    expect(res.status).toBe(201);
    expect(res.body.replayed).toBe(false);
    expect(res.body.events).toHaveLength(5);
    expect(new Set(res.body.events.map((e: { visitId: number }) => e.visitId))).toEqual(new Set([res.body.visitId]));
    expect(res.body.stats).toMatchObject({ scoreBand: expect.any(String), co2eTonnes: expect.any(Number) });
    // Made-up refrigerant of the visit: max(0, 5.0 − 1.9) = 3.1 kg (DOMAIN.md §4).
    expect(res.body.stats.detail.totalMadeUpKg365).toBeCloseTo(3.1, 6);
    // The figures travel without the per-visit and per-snapshot series; the timeline brings the snapshots.
    expect(res.body.stats.detail).not.toHaveProperty('visits');
    expect(res.body.stats.detail).not.toHaveProperty('snapshots');
    const timeline = await agent.get(`/api/units/${unit.id}/timeline`);
    expect(timeline.status).toBe(200);
    const engine = computeUnitStats(
      { refrigerant: unit.refrigerant, nominalChargeKg: 5, commissionedOn: unit.commissionedOn },
      // The same visit as the engine sees it: the recharge sets the pressure baseline the snapshot drifts from.
      [
        { kind: 'leak_check', leakFound: true, location: 'service_valve' },
        { kind: 'repair', location: 'service_valve', action: 'valve_core_replaced', verified: true },
        { kind: 'recovery', kg: 1.9, excluded: false },
        { kind: 'recharge', kg: 5.0, excluded: false },
        { kind: 'pressure', suctionKPaG: 120, dischargeKPaG: 950, ambientC: 24, sightGlass: 'full' },
      ].map((e) => ({ ...e, at: '2026-06-01T09:30:00.000Z', visitId: String(res.body.visitId) }) as never),
      now.toISOString(),
      DEFAULT_SETTINGS,
    );
    expect(timeline.body.snapshots).toEqual(JSON.parse(JSON.stringify(engine.snapshots)));
    expect(timeline.body.snapshots[0].condensingC).toEqual(expect.any(Number));
  });

  it('saves nothing when one entry is invalid, and names the failing field', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const unit = await createTestUnit(db);
    const res = await agent
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({
        idempotencyKey: key(),
        unitId: unit.id,
        occurredAt: '2026-06-01T09:30:00Z',
        events: [
          { kind: 'leak_check', method: 'uv_dye', leakFound: false },
          { kind: 'top_up', kg: 0.8, cylinder: 'CYL-1' },
          { kind: 'top_up', kg: -1, cylinder: 'CYL-1' },
        ],
      });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['events.2.kg']).toBeTruthy();
    expect(await eventsOf(unit.id)).toBe(0);
  });

  it('refuses implausible figures with the unit in mind: a top-up above twice the charge, a future time', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const unit = await createTestUnit(db, { nominalChargeKg: 4 });
    const res = await agent
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({
        idempotencyKey: key(),
        unitId: unit.id,
        occurredAt: '2026-06-02T12:00:00Z',
        events: [{ kind: 'top_up', kg: 9, cylinder: 'C' }],
      });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toMatchObject({
      occurredAt: expect.any(String),
      'events.0.kg': expect.stringMatching(/twice/),
    });
    expect(await eventsOf(unit.id)).toBe(0);
  });

  it('returns the first result for a retried submission, never a second copy', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const unit = await createTestUnit(db);
    const body = {
      idempotencyKey: key(),
      unitId: unit.id,
      occurredAt: '2026-05-30T08:00:00Z',
      events: [{ kind: 'top_up', kg: 0.5, cylinder: 'C-9' }],
    };
    const first = await agent.post('/api/visits').set('Origin', TEST_ORIGIN).send(body);
    const [second, third] = await Promise.all([
      agent.post('/api/visits').set('Origin', TEST_ORIGIN).send(body),
      agent.post('/api/visits').set('Origin', TEST_ORIGIN).send(body),
    ]);
    expect(first.status).toBe(201);
    expect(second.status).toBe(200);
    expect(third.status).toBe(200);
    expect(second.body.replayed).toBe(true);
    expect(second.body.visitId).toBe(first.body.visitId);
    expect(await eventsOf(unit.id)).toBe(1);
    const [{ n }] = await db.select({ n: count() }).from(visits).where(eq(visits.unitId, unit.id));
    expect(Number(n)).toBe(1);
  });

  it('answers 404 for an unknown unit and 400 for a visit with no entries', async () => {
    const { agent } = await signInAs(app, db, 'engineer');
    const missing = await agent
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({
        idempotencyKey: key(),
        unitId: 99999999,
        occurredAt: '2026-05-30T08:00:00Z',
        events: [{ kind: 'note', note: 'x' }],
      });
    expect(missing.status).toBe(404);
    const empty = await agent
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({ idempotencyKey: key(), unitId: 1, occurredAt: '2026-05-30T08:00:00Z', events: [] });
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields.events).toBeTruthy();
  });

  it('refuses an owner recording a visit with 403', async () => {
    const { agent } = await signInAs(app, db, 'owner');
    const unit = await createTestUnit(db);
    const res = await agent
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({
        idempotencyKey: key(),
        unitId: unit.id,
        occurredAt: '2026-05-30T08:00:00Z',
        events: [{ kind: 'note', note: 'x' }],
      });
    expect(res.status).toBe(403);
  });
});

describe('voiding', () => {
  async function topUp(agent: Awaited<ReturnType<typeof signInAs>>['agent'], unitId: number, kg = 0.7) {
    const res = await agent
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({
        idempotencyKey: key(),
        unitId,
        occurredAt: new Date(now.getTime() - 3600_000).toISOString(),
        events: [{ kind: 'top_up', kg, cylinder: 'CYL-5' }],
      });
    expect(res.status).toBe(201);
    return res.body.events[0].id as number;
  }

  it('lets a technician void their own entry within 24 hours; it stays visible and drops out of the figures', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const unit = await createTestUnit(db);
    const id = await topUp(agent, unit.id, 1.2);
    const before = await db.select().from(unitStats).where(eq(unitStats.unitId, unit.id));
    expect(before[0].madeUpKg365).toBeCloseTo(1.2);
    const res = await agent
      .post(`/api/events/${id}/void`)
      .set('Origin', TEST_ORIGIN)
      .send({ reason: 'Typed on the wrong unit' });
    expect(res.status).toBe(201);
    expect(res.body.event.voided).toMatchObject({ reason: 'Typed on the wrong unit' });
    expect(res.body.stats.detail.totalMadeUpKg365).toBe(0);
    const history = await agent.get(`/api/units/${unit.id}/history`);
    expect(history.body.events.map((e: { id: number }) => e.id)).toContain(id);
  });

  it("refuses a technician voiding someone else's entry, or their own after 24 hours", async () => {
    const { agent: a } = await signInAs(app, db, 'technician');
    const { agent: b } = await signInAs(app, db, 'technician');
    const unit = await createTestUnit(db);
    const id = await topUp(a, unit.id);
    expect(
      (await b.post(`/api/events/${id}/void`).set('Origin', TEST_ORIGIN).send({ reason: 'not mine' })).status,
    ).toBe(403);
    now = new Date(now.getTime() + 25 * 3600_000);
    const late = await a.post(`/api/events/${id}/void`).set('Origin', TEST_ORIGIN).send({ reason: 'too late now' });
    expect(late.status).toBe(403);
    expect(late.body.error.message).toMatch(/24 hours/);
  });

  it('lets an engineer void any entry, once; a reason is required', async () => {
    const { agent: tech } = await signInAs(app, db, 'technician');
    const { agent: eng } = await signInAs(app, db, 'engineer');
    const unit = await createTestUnit(db);
    const id = await topUp(tech, unit.id);
    expect((await eng.post(`/api/events/${id}/void`).set('Origin', TEST_ORIGIN).send({ reason: '' })).status).toBe(400);
    expect(
      (await eng.post(`/api/events/${id}/void`).set('Origin', TEST_ORIGIN).send({ reason: 'Duplicate entry' })).status,
    ).toBe(201);
    expect((await eng.post(`/api/events/${id}/void`).set('Origin', TEST_ORIGIN).send({ reason: 'Again' })).status).toBe(
      409,
    );
    expect(
      (await eng.post('/api/events/987654321/void').set('Origin', TEST_ORIGIN).send({ reason: 'Nothing there' }))
        .status,
    ).toBe(404);
  });
});

describe('photos and documents', () => {
  let agent: Awaited<ReturnType<typeof signInAs>>['agent'];
  let eventId: number;
  beforeAll(async () => {
    agent = (await signInAs(app, db, 'technician')).agent;
    const unit = await createTestUnit(db);
    const res = await agent
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({
        idempotencyKey: key(),
        unitId: unit.id,
        occurredAt: '2026-05-30T08:00:00Z',
        events: [{ kind: 'note', note: 'Photo of the valve' }],
      });
    eventId = res.body.events[0].id;
  });

  it('stores a photo checked by its content, with a thumbnail, served only to signed-in users', async () => {
    const png = await sharp({ create: { width: 800, height: 600, channels: 3, background: '#2a6' } })
      .png()
      .toBuffer();
    const res = await agent
      .post(`/api/events/${eventId}/attachments`)
      .set('Origin', TEST_ORIGIN)
      .attach('files', png, 'valve.jpg');
    expect(res.status).toBe(201);
    expect(res.body.attachments[0]).toMatchObject({ mimeType: 'image/png', originalName: 'valve.jpg' });
    const file = await agent.get(res.body.attachments[0].url);
    expect(file.status).toBe(200);
    expect(Buffer.compare(file.body as Buffer, png)).toBe(0);
    const thumb = await agent.get(res.body.attachments[0].thumbnailUrl);
    expect(thumb.headers['content-type']).toBe('image/webp');
    const meta = await sharp(thumb.body as Buffer).metadata();
    expect(Math.max(meta.width ?? 0, meta.height ?? 0)).toBe(320);
    const { default: request } = await import('supertest');
    expect((await request(app).get(res.body.attachments[0].url)).status).toBe(401);
  });

  it('refuses a file that is not an image or PDF, whatever its name', async () => {
    const res = await agent
      .post(`/api/events/${eventId}/attachments`)
      .set('Origin', TEST_ORIGIN)
      .attach('files', Buffer.from('just text'), 'photo.png');
    expect(res.status).toBe(415);
  });

  it('refuses a file over 10 MB', async () => {
    const big = Buffer.concat([Buffer.from('%PDF-1.4\n'), Buffer.alloc(10 * 1024 * 1024 + 1)]);
    const res = await agent
      .post(`/api/events/${eventId}/attachments`)
      .set('Origin', TEST_ORIGIN)
      .attach('files', big, 'big.pdf');
    expect(res.status).toBe(413);
  });

  it('refuses more than 8 files on one entry', async () => {
    const pdf = Buffer.from('%PDF-1.4\n%%EOF\n');
    let req = agent.post(`/api/events/${eventId}/attachments`).set('Origin', TEST_ORIGIN);
    for (let i = 0; i < 9; i++) req = req.attach('files', pdf, `doc${i}.pdf`);
    const res = await req;
    expect(res.status).toBe(400);
    // Seven more fit beside the photo; the eighth does not.
    let seven = agent.post(`/api/events/${eventId}/attachments`).set('Origin', TEST_ORIGIN);
    for (let i = 0; i < 7; i++) seven = seven.attach('files', pdf, `doc${i}.pdf`);
    expect((await seven).status).toBe(201);
    const one = await agent
      .post(`/api/events/${eventId}/attachments`)
      .set('Origin', TEST_ORIGIN)
      .attach('files', pdf, 'one.pdf');
    expect(one.status).toBe(400);
  });
});

describe('the statistics row', () => {
  it('equals computeUnitStats on the same history after a scripted series of visits and a void', async () => {
    now = new Date('2026-06-01T12:00:00Z');
    const { agent } = await signInAs(app, db, 'engineer');
    const unit = await createTestUnit(db, { nominalChargeKg: 5, commissionedOn: '2024-01-10' });
    const script = [
      { at: '2025-08-05T10:00:00Z', events: [{ kind: 'top_up', kg: 1.0, cylinder: 'A1' }] },
      {
        at: '2025-11-03T10:00:00Z',
        events: [
          { kind: 'leak_check', method: 'bubble_solution', leakFound: true, location: 'brazed_joint' },
          { kind: 'repair', location: 'brazed_joint', action: 'rebrazed', verified: true },
          { kind: 'top_up', kg: 1.2, cylinder: 'A2' },
        ],
      },
      {
        at: '2026-02-20T10:00:00Z',
        events: [{ kind: 'pressure', suctionKPaG: 90, dischargeKPaG: 860, ambientC: 21, sightGlass: 'bubbles' }],
      },
      {
        at: '2026-04-22T10:00:00Z',
        events: [
          { kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'brazed_joint' },
          { kind: 'top_up', kg: 0.8, cylinder: 'A3' },
        ],
      },
      { at: '2026-05-01T10:00:00Z', events: [{ kind: 'top_up', kg: 3.0, cylinder: 'A4' }] },
    ];
    let lastId = 0;
    for (const v of script) {
      const res = await agent
        .post('/api/visits')
        .set('Origin', TEST_ORIGIN)
        .send({ idempotencyKey: key(), unitId: unit.id, occurredAt: v.at, events: v.events });
      expect(res.status).toBe(201);
      lastId = res.body.events[0].id;
    }
    // The last top-up was a typing error.
    expect(
      (await agent.post(`/api/events/${lastId}/void`).set('Origin', TEST_ORIGIN).send({ reason: 'Wrong unit' })).status,
    ).toBe(201);

    const expected = computeUnitStats(
      { refrigerant: 'R-134a', nominalChargeKg: 5, commissionedOn: '2024-01-10' },
      // The same history as the engine sees it: the voided visit is left out.
      script.slice(0, 4).flatMap((v, i) => v.events.map((e) => ({ ...e, at: v.at, visitId: `v${i}` }) as never)),
      now.toISOString(),
      DEFAULT_SETTINGS,
    );
    const [row] = await db.select().from(unitStats).where(eq(unitStats.unitId, unit.id));
    expect(row.score).toBe(expected.score.value);
    expect(row.scoreBand).toBe(expected.score.band);
    expect(row.rollingLeakRatePct).toBeCloseTo(expected.rollingLeakRatePct, 9);
    expect(row.forecastDate).toBe(expected.forecast?.date ?? null);
    expect(row.co2eTonnes).toBeCloseTo(expected.co2eTonnes, 9);
    expect(row.nextLeakCheckDue).toBe(expected.nextLeakCheckDue ?? null);
    expect(row.pressureFlag).toBe(expected.pressureHealth.flag);
    expect(row.madeUpKg365).toBeCloseTo(expected.totalMadeUpKg365, 9);
    // Factor by factor, as the unit page shows them.
    const [wide] = await db.select().from(unitStatsDetail).where(eq(unitStatsDetail.unitId, unit.id));
    expect(wide.scoreFactors).toEqual(JSON.parse(JSON.stringify(expected.score.factors)));
  });
});

describe('reading a unit', () => {
  it('pages through the history newest first and serves the overview and the timeline', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const unit = await createTestUnit(db);
    for (let i = 0; i < 3; i++) {
      await agent
        .post('/api/visits')
        .set('Origin', TEST_ORIGIN)
        .send({
          idempotencyKey: key(),
          unitId: unit.id,
          occurredAt: `2026-0${i + 1}-10T10:00:00Z`,
          events: [
            { kind: 'pti', passed: true },
            { kind: 'note', note: `n${i}` },
          ],
        });
    }
    const page1 = await agent.get(`/api/units/${unit.id}/history?limit=4`);
    expect(page1.status).toBe(200);
    expect(page1.body.events).toHaveLength(4);
    expect(page1.body.events[0].occurredAt).toBe('2026-03-10T10:00:00.000Z');
    const page2 = await agent.get(`/api/units/${unit.id}/history?limit=4&before=${page1.body.nextBefore}`);
    expect(page2.body.events).toHaveLength(2);
    expect(page2.body.nextBefore).toBeNull();
    const overview = await agent.get(`/api/units/${unit.id}/overview`);
    expect(overview.body.stats.ptiPassed).toBe(true);
    const timeline = await agent.get(`/api/units/${unit.id}/timeline`);
    expect(timeline.body.events).toHaveLength(6);
    expect((await agent.get('/api/units/99999999/overview')).status).toBe(404);
    expect((await agent.get('/api/units/abc/history')).status).toBe(400);
  });
});

describe('alerts from the write path', () => {
  it('queues one chronic-band alert for subscribed engineers when visits push a unit over, not one per later visit', async () => {
    const { mailOutbox, sites } = await import('../../server/db/schema');
    now = new Date('2026-06-01T12:00:00Z');
    const [site] = await db
      .insert(sites)
      .values({ code: 'ALR1', name: 'Alert Test Depot', kind: 'depot' })
      .$returningId();
    const { agent: eng, user: engineer } = await signInAs(app, db, 'engineer');
    const sub = await eng
      .put('/api/alerts/subscriptions')
      .set('Origin', TEST_ORIGIN)
      .send({ subscriptions: [{ siteId: site.id, kind: 'chronic' }] });
    expect(sub.status).toBe(200);
    const { agent: tech } = await signInAs(app, db, 'technician');
    const unit = await createTestUnit(db, { nominalChargeKg: 5, siteId: site.id, commissionedOn: '2023-01-01' });
    // The worked example of DOMAIN.md §6: score 64, "chronic", reached on the third visit.
    const visitsToRecord = [
      { at: '2025-08-05T10:00:00Z', events: [{ kind: 'top_up', kg: 1.0, cylinder: 'A1' }] },
      {
        at: '2026-01-02T10:00:00Z',
        events: [
          { kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'service_valve' },
          { kind: 'repair', location: 'service_valve', action: 'valve_core_replaced', verified: true },
          { kind: 'top_up', kg: 1.2, cylinder: 'A2' },
        ],
      },
      {
        at: '2026-04-22T10:00:00Z',
        events: [
          { kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'service_valve' },
          { kind: 'top_up', kg: 0.8, cylinder: 'A3' },
        ],
      },
      { at: '2026-05-20T10:00:00Z', events: [{ kind: 'top_up', kg: 0.4, cylinder: 'A4' }] },
    ];
    const bands: string[] = [];
    for (const v of visitsToRecord) {
      const res = await tech
        .post('/api/visits')
        .set('Origin', TEST_ORIGIN)
        .send({ idempotencyKey: key(), unitId: unit.id, occurredAt: v.at, events: v.events });
      expect(res.status).toBe(201);
      bands.push(res.body.stats.scoreBand);
    }
    expect(bands[2]).toBe('chronic');
    const mails = await db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, engineer.email));
    expect(mails).toHaveLength(1);
    expect(mails[0].subject).toMatch(/repeat leaker/);
  });
});

describe('voiding by role', () => {
  it('lets an owner void an entry and marks it voided in the timeline', async () => {
    now = new Date('2026-06-01T12:00:00Z');
    const { agent: tech } = await signInAs(app, db, 'technician');
    const { agent: owner } = await signInAs(app, db, 'owner');
    const unit = await createTestUnit(db);
    const res = await tech
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({
        idempotencyKey: key(),
        unitId: unit.id,
        occurredAt: '2026-05-30T08:00:00Z',
        events: [
          { kind: 'top_up', kg: 0.6, cylinder: 'C-1' },
          { kind: 'note', note: 'kept' },
        ],
      });
    const topUpId = res.body.events.find((e: { kind: string }) => e.kind === 'top_up').id;
    expect(
      (await owner.post(`/api/events/${topUpId}/void`).set('Origin', TEST_ORIGIN).send({ reason: 'Wrong unit' }))
        .status,
    ).toBe(201);
    const timeline = await owner.get(`/api/units/${unit.id}/timeline`);
    const byKind = Object.fromEntries(
      timeline.body.events.map((e: { kind: string; voided: boolean }) => [e.kind, e.voided]),
    );
    expect(byKind).toEqual({ top_up: true, note: false });
  });
});

describe('history paging with late entries', () => {
  it('keeps an entry recorded late for an earlier date on the right page', async () => {
    const { agent } = await signInAs(app, db, 'technician');
    const unit = await createTestUnit(db);
    const record = (at: string, note: string) =>
      agent
        .post('/api/visits')
        .set('Origin', TEST_ORIGIN)
        .send({ idempotencyKey: key(), unitId: unit.id, occurredAt: at, events: [{ kind: 'note', note }] });
    await record('2026-03-01T10:00:00Z', 'march');
    await record('2026-04-01T10:00:00Z', 'april');
    await record('2026-05-01T10:00:00Z', 'may');
    await record('2026-02-01T10:00:00Z', 'february, entered last');
    const seen: string[] = [];
    let before: number | null = null;
    do {
      const res = await agent.get(`/api/units/${unit.id}/history?limit=1${before ? `&before=${before}` : ''}`);
      expect(res.status).toBe(200);
      seen.push(...res.body.events.map((e: { note: string }) => e.note));
      before = res.body.nextBefore;
    } while (before);
    expect(seen).toEqual(['may', 'april', 'march', 'february, entered last']);
  });
});
