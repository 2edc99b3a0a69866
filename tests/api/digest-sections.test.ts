// The daily digest lists at most DIGEST_SECTION_LIMIT units per section and counts the rest, for the leak-check and
// re-check sections alike.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { sites, units, unitStats } from '../../server/db/schema';
import { newToken } from '../../server/lib/ids';
import { DIGEST_SECTION_LIMIT, queueDailyDigest } from '../../server/features/alerts/digest.service';
import { createOutboxWorker } from '../../server/lib/mail/sender';
import { containerCheckDigit } from '../../shared/domain/container-number';
import { dayOf, isoDate } from '../../shared/domain/dates';
import { openTestDb, resetDb } from '../support/db';
import { signInAs, TEST_ORIGIN } from '../support/factories';
import { startTestSmtp, testClock } from '../support/mail';

const { db, pool } = openTestDb();
const { smtp, mailer } = await startTestSmtp();
const clock = testClock();
const { app, ctx } = createApp({ db, mailer, clock, publicUrl: 'http://localhost:3000' });
const worker = createOutboxWorker(ctx);

beforeAll(() => resetDb(db));
afterAll(async () => {
  await smtp.stop();
  await pool.end();
});

describe('a full digest section', () => {
  it('lists the first units of a section and says how many more there are', async () => {
    const [site] = await db.insert(sites).values({ code: 'FULL1', name: 'Full Depot', kind: 'depot' }).$returningId();
    const overdue = isoDate(dayOf(clock.now().getTime()) - 3);
    const extra = 3;
    for (let i = 0; i < DIGEST_SECTION_LIMIT + extra; i++) {
      const first10 = `HLXU${String(700000 + i)}`;
      const [u] = await db
        .insert(units)
        .values({
          containerNumber: `${first10}${containerCheckDigit(first10) % 10}`,
          refrigerant: 'R-134a',
          nominalChargeKg: 4.5,
          siteId: site.id,
          qrToken: newToken(),
        })
        .$returningId();
      await db.insert(unitStats).values({ unitId: u.id, computedAt: clock.now(), nextLeakCheckDue: overdue });
    }
    const { agent, user } = await signInAs(app, db, 'engineer');
    const res = await agent
      .put('/api/alerts/subscriptions')
      .set('Origin', TEST_ORIGIN)
      .send({ subscriptions: [{ siteId: site.id, kind: 'digest' }] });
    expect(res.status).toBe(200);

    expect(await queueDailyDigest(db, ctx, clock.now())).toBe(1);
    await worker.drain();
    const mail = smtp.messages.find((m) => m.envelopeTo.includes(user.email))!;
    expect(mail.text).toContain(`…and ${extra} more in Tightloop.`);
    expect(mail.text.match(/\/units\/\d+/g)).toHaveLength(DIGEST_SECTION_LIMIT);
  });
});
