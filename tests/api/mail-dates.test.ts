// Mails write days and times the app's way: "5 Dec 2026, 03:20 UTC", never a runtime's own date text.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { mailOutbox } from '../../server/db/schema';
import { queuePasswordChangedNotice } from '../../server/features/account/password-notice';
import { openTestDb, resetDb } from '../support/db';

const { db, pool } = openTestDb();
beforeAll(() => resetDb(db));
afterAll(() => pool.end());

describe('dates in mails', () => {
  it('writes the moment of a password change as day, 24-hour time and UTC offset', async () => {
    const ctx = { publicUrl: 'http://localhost:3000', clock: { now: () => new Date('2026-12-05T03:20:41Z') } };
    await db.transaction((tx) =>
      queuePasswordChangedNotice(tx, ctx, { email: 'dates@example.test', name: 'Dana' }, 'changed', {
        address: '203.0.113.9',
        browser: null,
      }),
    );
    const [mail] = await db.select().from(mailOutbox).where(eq(mailOutbox.toAddress, 'dates@example.test'));
    expect(mail.textBody).toContain('changed on the account page on 5 Dec 2026, 03:20 UTC, from 203.0.113.9');
    expect(mail.textBody).not.toMatch(/GMT|\d{4}-\d{2}-\d{2}/);
  });
});
