// Re-checks in the alerts: a re-check after a top-up or repair mailed to the people who follow it at the unit's site,
// on its day and once more when missed, in the words of the site's rule and the app's date format; a reading that
// answers it stops the mails; a missed one shows in the unit's score reasons.
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type TestAgent from 'supertest/lib/agent';
import { createApp } from '../../server/app';
import { createOutboxWorker } from '../../server/lib/mail/sender';
import { queueRecheckAlerts } from '../../server/lib/record/recheck-alerts';
import { queueDailyDigest, refreshMissedRechecks } from '../../server/features/alerts/digest.service';
import { formatContainerNumber } from '../../shared/domain/container-number';
import type { Jurisdiction } from '../../shared/schemas/sites';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { startTestSmtp } from '../support/mail';
import { createTestSite, halyardNumber } from '../support/units';
import { recordVisits } from '../support/visits';

const { db, pool } = openTestDb();
const { smtp, mailer } = await startTestSmtp();
let now = new Date('2026-03-03T13:05:00Z');
const PUBLIC_URL = 'http://localhost:3000';
const { app, ctx } = createApp({
  db,
  mailer,
  clock: { now: () => now },
  publicUrl: PUBLIC_URL,
  rateLimits: { signInPerIp: 1000 },
});
const worker = createOutboxWorker(ctx);
let engineer: TestAgent;
let engineerEmail: string;
let serial = 730001;

// Sessions lapse when the clock jumps days ahead: each step signs in at its own time.
const technician = async () => (await signInAs(app, db, 'technician')).agent;
async function engineerAt(at: string) {
  now = new Date(at);
  const eng = await signInAs(app, db, 'engineer');
  engineer = eng.agent;
  engineerEmail = eng.user.email;
}

beforeAll(() => resetDb(db));
beforeEach(async () => {
  await worker.drain();
  smtp.clear();
});
afterAll(async () => {
  await smtp.stop();
  await pool.end();
});

async function siteFollowed(name: string, jurisdiction: Jurisdiction | null, timeZone: string | null) {
  const site = await createTestSite(db, { name, jurisdiction, timeZone });
  const res = await engineer
    .put('/api/alerts/subscriptions')
    .set('Origin', TEST_ORIGIN)
    .send({
      subscriptions: [
        { siteId: site.id, kind: 'recheck' },
        { siteId: site.id, kind: 'digest' },
      ],
    });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return site.id;
}
const newUnit = async (siteId: number) =>
  createTestUnit(db, {
    containerNumber: halyardNumber(serial++),
    siteId,
    nominalChargeKg: 5,
    commissionedOn: '2024-01-10',
  });
const mailsTo = (email: string) => smtp.messages.filter((m) => m.envelopeTo.includes(email));

describe('re-check alerts', () => {
  it('mails a follower when a re-check after a top-up falls due and once more when it is missed, until a reading answers it', async () => {
    await engineerAt('2026-03-03T13:05:00Z');
    const siteId = await siteFollowed('Westpier Depot', 'EU', 'Europe/Amsterdam');
    const unit = await newUnit(siteId);
    const unitId = unit.id;
    await recordVisits(await technician(), unitId, [
      { at: '2026-03-03T13:05:00Z', siteId, events: [{ kind: 'top_up', kg: 0.4, cylinder: 'CYL-R1' }] },
    ]);
    await worker.drain();
    expect(mailsTo(engineerEmail)).toHaveLength(0);

    now = new Date('2026-03-04T05:00:00Z');
    expect(await queueRecheckAlerts(db, ctx, now)).toBe(1);
    expect(await queueRecheckAlerts(db, ctx, now)).toBe(0);
    await worker.drain();
    const [due] = mailsTo(engineerEmail);
    const shown = formatContainerNumber(unit.containerNumber);
    expect(due.subject).toBe(`${shown}: re-check after the top-up of 3 Mar 2026 is due today`);
    // The top-up's time at the site, with its offset; days in the app's format, never ISO.
    expect(due.text).toContain('had a top-up on 3 Mar 2026, 14:05 UTC+1');
    expect(due.text).toContain('due today, 4 Mar 2026');
    expect(due.text).toContain('Common practice (no regulation sets it)');
    expect(due.text).toContain(`${PUBLIC_URL}/units/${unitId}/visit?entry=pressure`);
    expect(due.text).not.toMatch(/\d{4}-\d{2}-\d{2}/);
    expect(due.headers['list-unsubscribe']).toMatch(/^<http:\/\/localhost:3000\/unsubscribe\?/);

    smtp.clear();
    now = new Date('2026-03-05T05:00:00Z');
    expect(await queueRecheckAlerts(db, ctx, now)).toBe(1);
    await worker.drain();
    const [missed] = mailsTo(engineerEmail);
    expect(missed.subject).toBe(`${shown}: re-check after the top-up of 3 Mar 2026 missed (due 4 Mar 2026)`);
    expect(missed.text).toContain('was due on 4 Mar 2026 and nobody has recorded one since');

    // The daily run writes the unit again, so its score's reasons show the missed re-check before anyone comes back;
    // the mail it would set off went already.
    expect(await refreshMissedRechecks(db, ctx, now)).toBe(1);
    expect(await refreshMissedRechecks(db, ctx, now)).toBe(0);
    const before = (await (await technician()).get(`/api/units/${unitId}/overview`)).body;
    expect(before.stats.detail.score.missedRechecks.items).toEqual([
      'Re-check after the top-up of 3 Mar 2026 missed (due 4 Mar 2026, not done).',
    ]);

    // The day's digest lists it too, in the app's date format.
    smtp.clear();
    expect(await queueDailyDigest(db, ctx, now)).toBe(1);
    await worker.drain();
    const [digest] = mailsTo(engineerEmail);
    expect(digest.subject).toBe('Tightloop daily digest for Westpier Depot, 5 Mar 2026');
    expect(digest.text).toContain(
      `Re-checks due or missed\n-----------------------\n- ${shown} — re-check after the top-up of 3 Mar 2026, missed (due 4 Mar 2026) · Westpier Depot`,
    );

    // The reading answers the re-check: nothing more is mailed about it.
    now = new Date('2026-03-05T10:00:00Z');
    await recordVisits(await technician(), unitId, [
      {
        at: '2026-03-05T09:30:00Z',
        siteId,
        events: [{ kind: 'pressure', dischargeKPaG: 900, ambientC: 20, sightGlass: 'full' }],
      },
    ]);
    now = new Date('2026-03-06T05:00:00Z');
    expect(await queueRecheckAlerts(db, ctx, now)).toBe(0);
    const tech = await technician();
    const depot = (await tech.get(`/api/units/${unitId}/depot`)).body;
    expect(depot.openRecheck).toBeNull();

    // Missed, then done late: evidence in the score's reasons, with its days.
    const overview = (await tech.get(`/api/units/${unitId}/overview`)).body;
    expect(overview.stats.detail.score.missedRechecks.items).toEqual([
      'Re-check after the top-up of 3 Mar 2026 missed (due 4 Mar 2026, done 5 Mar 2026).',
    ]);
    // Evidence only: the score is the four factors' sum, the missed re-check adds nothing (DOMAIN.md §6).
    expect(overview.stats.detail.score.missedRechecks.explanation).toContain('it does not change the score');
    const factorSum = Object.values(
      overview.stats.detail.score.factors as Record<string, { weight: number; value: number }>,
    ).reduce((sum, f) => sum + 100 * f.weight * f.value, 0);
    expect(overview.stats.score).toBe(Math.round(factorSum));
  });

  it('mails nothing to people who do not follow re-checks at the site', async () => {
    const siteId = (await createTestSite(db, { name: 'Unfollowed Yard', jurisdiction: 'EU' })).id;
    const unitId = (await newUnit(siteId)).id;
    now = new Date('2026-04-01T10:00:00Z');
    await recordVisits(await technician(), unitId, [
      { at: '2026-04-01T09:00:00Z', siteId, events: [{ kind: 'top_up', kg: 0.3, cylinder: 'CYL-R2' }] },
    ]);
    now = new Date('2026-04-02T05:00:00Z');
    expect(await queueRecheckAlerts(db, ctx, now)).toBe(0);
  });

  it('words the leak check after a repair by the site’s rule: EU regulation, US reference, the company’s own', async () => {
    const rules: [Jurisdiction, string, RegExp][] = [
      ['EU', 'EU Regulation 2024/573 asks for a leak check within one month of a repair', /CFR|company/],
      ['US', 'The US reference rule (40 CFR 82.157) follows a repair with verification tests', /EU Regulation|company/],
      ['custom', "Your company's rule: a leak check 30 days after a repair.", /EU Regulation|CFR/],
    ];
    await engineerAt('2026-05-31T12:00:00Z');
    const tech = await technician();
    for (const [rule, words, never] of rules) {
      smtp.clear();
      const siteId = await siteFollowed(`Rule ${rule} Terminal`, rule, rule === 'US' ? 'America/New_York' : null);
      const unitId = (await newUnit(siteId)).id;
      // A repair recorded 30 days after the fact: its re-check is due today, so the write itself mails it.
      await recordVisits(tech, unitId, [
        {
          at: '2026-05-01T14:00:00Z',
          siteId,
          events: [
            { kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'service_valve' },
            { kind: 'repair', location: 'service_valve', action: 'valve_core_replaced', verified: false },
          ],
        },
      ]);
      await worker.drain();
      const [mail] = mailsTo(engineerEmail);
      expect(mail?.subject, rule).toMatch(/leak check after the repair of 1 May 2026 is due today$/);
      expect(mail.text).toContain(words);
      expect(mail.text).not.toMatch(never);
      expect(mail.text).toContain(`visit?entry=leak_check`);
      expect(mail.text).toContain(rule === 'US' ? '1 May 2026, 10:00 UTC-4' : '1 May 2026, 14:00 UTC');
    }
  });
});
