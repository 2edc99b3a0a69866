import { afterAll, describe, expect, inject, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { createDb } from '../../server/db/client';
import { users } from '../../server/db/schema';
import { newId } from '../../server/lib/ids';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { openBrowser, PHONE, signInToApp } from '../support/browser';

const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
afterAll(() => pool.end());

const admin = DEMO_ACCOUNTS.find((a) => a.role === 'admin')!;

describe("a person's refrigerant certificate", () => {
  it('an administrator on a phone changes a technician’s certificate number and expiry, with the errors in place', async () => {
    const email = `mirela.quaye.${Date.now()}@halyard.example`;
    const id = newId();
    await db.insert(users).values({
      id,
      email,
      name: 'Mirela Quaye',
      role: 'technician',
      certificateNumber: 'HX-CERT-50210',
      certificateExpiresOn: '2026-01-31',
    });
    const browser = await openBrowser({ viewport: PHONE });
    try {
      const { page } = browser;
      await signInToApp(page, admin.email, DEMO_PASSWORD);
      await page.goto('/people');
      const row = page.locator(`[data-testid="user-row"][data-user-email="${email}"]`);
      await row.getByText('HX-CERT-50210').waitFor();
      await row.getByRole('button', { name: 'Change certificate of Mirela Quaye' }).click();

      const form = row.getByRole('form', { name: 'Certificate of Mirela Quaye' });
      const number = form.getByLabel('Certificate number');
      await expect.poll(() => number.evaluate((el) => el === document.activeElement)).toBe(true);
      // Checked by the server's own schema before anything is sent.
      await number.fill('X'.repeat(65));
      await form.getByRole('button', { name: /^Save/ }).click();
      await form.getByText('Certificate number is too long').waitFor();
      expect(await number.getAttribute('aria-invalid')).toBe('true');

      await number.fill('HX-CERT-61877');
      await form.getByLabel('Valid until').fill('2028-03-31');
      await form.getByRole('button', { name: /^Save/ }).click();
      await row.getByText('Certificate saved.').waitFor();
      await row.getByText('HX-CERT-61877').waitFor();
      await row.getByText('valid until 31 Mar 2028').waitFor();
      const [stored] = await db
        .select({ number: users.certificateNumber, expires: users.certificateExpiresOn })
        .from(users)
        .where(eq(users.id, id));
      expect(stored).toEqual({ number: 'HX-CERT-61877', expires: '2028-03-31' });

      // Cancel leaves it as it was; the card stays within the phone's width.
      await row.getByRole('button', { name: 'Change certificate of Mirela Quaye' }).click();
      await form.getByLabel('Certificate number').fill('HX-CERT-00000');
      await form.getByRole('button', { name: 'Cancel' }).click();
      await row.getByText('HX-CERT-61877').waitFor();
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBe(PHONE.width);
      expect(browser.pageErrors).toEqual([]);
      expect(browser.consoleErrors).toEqual([]);
    } finally {
      await browser.close();
    }
  });
});
