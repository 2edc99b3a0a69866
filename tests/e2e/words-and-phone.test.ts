import { existsSync, mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { createDb } from '../../server/db/client';
import { units, users } from '../../server/db/schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { DESKTOP, openBrowser, PHONE, signInThroughForm, signInToApp } from '../support/browser';
import { createTestUser, TEST_PASSWORD } from '../support/factories';

const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
afterAll(() => pool.end());

const account = (role: string) => DEMO_ACCOUNTS.find((a) => a.role === role)!;

// Screenshots for a person to look at, only where the notes folder exists (not in CI's clone).
const SCREENS = '/work/notes/screens';
async function shot(page: Page, name: string) {
  if (!existsSync(path.dirname(SCREENS))) return;
  mkdirSync(SCREENS, { recursive: true });
  await page.screenshot({ path: path.join(SCREENS, `h8-${name}.png`), fullPage: false });
}

describe('words and numbers on the screens (390 px)', () => {
  it('tells a deactivated person at sign-in that the account was deactivated', async () => {
    const person = await createTestUser(db, { role: 'technician', active: false });
    const browser = await openBrowser({ viewport: PHONE });
    try {
      const { page } = browser;
      await signInThroughForm(page, person.email, TEST_PASSWORD);
      const alert = page.getByTestId('sign-in-error');
      await expect.poll(() => alert.textContent()).toMatch(/This account is deactivated.*administrator deactivated/);
      await shot(page, 'sign-in-deactivated-390');
    } finally {
      await browser.close();
    }
  });

  it('tells a person whose role changed what changed at the next sign-in', async () => {
    const person = await createTestUser(db, { role: 'technician' });
    const browser = await openBrowser({ viewport: PHONE });
    try {
      const { page } = browser;
      await signInToApp(page, person.email, TEST_PASSWORD);
      await db.update(users).set({ role: 'engineer' }).where(eq(users.id, person.id));
      await db.execute(sql`DELETE FROM sessions WHERE user_id = ${person.id}`);
      await signInThroughForm(page, person.email, TEST_PASSWORD);
      await page.getByRole('heading', { name: 'Your role changed' }).waitFor();
      await expect
        .poll(() => page.getByRole('status').first().textContent())
        .toMatch(/from Technician to Fleet engineer/);
      await shot(page, 'sign-in-role-changed-390');
      await page.getByRole('button', { name: 'Continue' }).click();
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Fleet' }).waitFor();
    } finally {
      await browser.close();
    }
  });

  it('shows a date box’s value in Tightloop’s format beside the browser’s own, and no bare ISO dates in the log', async () => {
    const [unit] = await db.select({ id: units.id }).from(units).orderBy(units.id).limit(1);
    await db.update(units).set({ commissionedOn: '2014-03-12' }).where(eq(units.id, unit.id));
    const browser = await openBrowser({ viewport: PHONE });
    try {
      const { page } = browser;
      await signInToApp(page, account('engineer').email, DEMO_PASSWORD);
      await page.goto(`/units/${unit.id}/edit`);
      const echo = page.getByTestId('date-echo').first();
      await expect.poll(() => echo.textContent()).toBe('Reads 12 Mar 2014.');
      await page.getByLabel('Commissioned on').fill('2015-07-01');
      await expect.poll(() => echo.textContent()).toBe('Reads 1 Jul 2015.');
      await echo.scrollIntoViewIfNeeded();
      await shot(page, 'unit-edit-date-390');

      await page.goto('/refrigerant-log');
      await page.getByRole('heading', { level: 1 }).waitFor();
      await page.waitForLoadState('networkidle').catch(() => undefined);
      const main = (await page.locator('main').textContent()) ?? '';
      expect(main).not.toMatch(/\b20\d\d-\d\d-\d\d\b/);
      await shot(page, 'refrigerant-log-390');
    } finally {
      await browser.close();
    }
  });

  it('does not offer "Import 2 units" while nothing can go in', async () => {
    const csv = [
      'container_number,refrigerant,nominal_charge_kg',
      'HRLU1000017,R-134a,4.5',
      'NOT-A-NUMBER,R-134a,4',
    ].join('\n');
    const browser = await openBrowser({ viewport: PHONE });
    try {
      const { page } = browser;
      await signInToApp(page, account('engineer').email, DEMO_PASSWORD);
      await page.goto('/units/import');
      await page
        .locator('input[type=file]')
        .setInputFiles({ name: 'broken.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
      const button = page.getByRole('button', { name: 'Nothing can be imported yet' });
      await button.waitFor();
      expect(await button.isDisabled()).toBe(true);
      await button.scrollIntoViewIfNeeded();
      await shot(page, 'import-blocked-390');
    } finally {
      await browser.close();
    }
  });

  it('keeps the visit form’s Save off the entry buttons until something is entered', async () => {
    const [unit] = await db.select({ id: units.id }).from(units).orderBy(units.id).limit(1);
    const browser = await openBrowser({ viewport: PHONE });
    try {
      const { page } = browser;
      await signInToApp(page, account('technician').email, DEMO_PASSWORD);
      await page.goto(`/units/${unit.id}/visit`);
      await page
        .getByRole('heading', { name: 'What did you do?' })
        .waitFor()
        .catch(async (e: unknown) => {
          await shot(page, 'debug-visit');
          throw e;
        });
      await shot(page, 'visit-form-empty-390');
      await page.getByRole('button', { name: 'Add Top-up' }).click();
      const save = page.getByRole('button', { name: /^Save visit/ });
      const box = await save.boundingBox();
      // Resting on the tab bar (72 px) at 48 px: the bar and the tab bar take ~14 % of an 844 px screen, not ~24 %.
      expect(box!.height).toBeLessThanOrEqual(50);
      expect(PHONE.height - box!.y).toBeLessThanOrEqual(72 + 50 + 2);
      await shot(page, 'visit-form-entry-390');
    } finally {
      await browser.close();
    }
  });

  it('Home’s Find unit opens the unit for a whole correct number and names the implied check digit for a wrong one', async () => {
    const [unit] = await db
      .select({ id: units.id, containerNumber: units.containerNumber })
      .from(units)
      .orderBy(units.id)
      .limit(1);
    const browser = await openBrowser({ viewport: PHONE });
    try {
      const { page } = browser;
      await signInToApp(page, account('technician').email, DEMO_PASSWORD);
      const field = page.getByLabel('Container number');
      const right = Number(unit.containerNumber.charAt(10));
      await field.fill(`${unit.containerNumber.slice(0, 10)}${(right + 1) % 10}`);
      await page.getByRole('button', { name: 'Find unit' }).click();
      await expect
        .poll(() => page.getByRole('search').getByRole('alert').textContent())
        .toMatch(new RegExp(`^Check digit should be ${right}: `));
      await shot(page, 'home-find-wrong-digit-390');
      await field.fill(unit.containerNumber);
      await page.getByRole('button', { name: 'Find unit' }).click();
      await page.waitForURL(new RegExp(`/units/${unit.id}$`));
    } finally {
      await browser.close();
    }
  });

  it('shows "−17.5" whole in a temperature box and gives list links a 44 px target on a 390 px phone', async () => {
    const [unit] = await db.select({ id: units.id }).from(units).orderBy(units.id).limit(1);
    const browser = await openBrowser({ viewport: PHONE });
    try {
      const { page } = browser;
      await signInToApp(page, account('engineer').email, DEMO_PASSWORD);
      await page.goto(`/units/${unit.id}/visit`);
      await page.getByRole('button', { name: 'Add Pressure reading' }).click();
      const ambient = page.getByLabel('Ambient');
      await ambient.fill('-17.5');
      await expect.poll(() => ambient.inputValue()).toMatch(/^[-−]17\.5$/);
      // The text fits the box: nothing scrolls out of sight beside the unit.
      const fits = await ambient.evaluate((el: HTMLInputElement) => el.scrollWidth <= el.clientWidth);
      expect(fits).toBe(true);
      await ambient.evaluate((el) => el.scrollIntoView({ block: 'center' }));
      await shot(page, 'temperature-box-390');

      await page.goto('/fleet');
      const link = page.getByTestId('fleet-unit-link').first();
      await link.waitFor();
      expect((await link.boundingBox())!.height).toBeGreaterThanOrEqual(44);
      await shot(page, 'fleet-links-390');
    } finally {
      await browser.close();
    }
  });

  it('lets a keyboard focus a timeline mark to see its entry, with every drawn symbol in the key', async () => {
    const [unit] = await db.select({ id: units.id }).from(units).orderBy(units.id).limit(1);
    const browser = await openBrowser({ viewport: PHONE });
    try {
      const { page } = browser;
      await signInToApp(page, account('engineer').email, DEMO_PASSWORD);
      await page.goto(`/units/${unit.id}`);
      const mark = page.getByTestId('timeline-mark').last();
      await mark.waitFor();
      await mark.focus();
      const label = (await mark.getAttribute('aria-label')) ?? '';
      expect(label).toMatch(/, \d{1,2} [A-Z][a-z]{2} \d{4}/);
      const key = page.getByRole('list', { name: 'Key' }).filter({ hasText: 'Top-up' });
      for (const words of [
        'Leak check, no leak',
        'Repair not verified',
        'PTI failed',
        'Other entries',
        'Reading with a warning',
      ]) {
        await expect.poll(() => key.textContent()).toContain(words);
      }
      await mark.scrollIntoViewIfNeeded();
      await shot(page, 'timeline-focus-390');
    } finally {
      await browser.close();
    }
  });

  it('tells the overview chart’s series apart: at most ten, the rest as "Other sites" (1280 px)', async () => {
    const browser = await openBrowser({ viewport: DESKTOP });
    try {
      const { page } = browser;
      await signInToApp(page, account('engineer').email, DEMO_PASSWORD);
      await page.goto('/fleet/overview');
      const chart = page.getByRole('img', { name: /Made-up refrigerant per month/ });
      await chart.waitFor();
      const legend = page.getByRole('list', { name: 'Legend' }).first().getByRole('listitem');
      await expect.poll(() => legend.count()).toBeGreaterThan(0);
      expect(await legend.count()).toBeLessThanOrEqual(10);
      await chart.scrollIntoViewIfNeeded();
      await shot(page, 'overview-chart-1280');
    } finally {
      await browser.close();
    }
  });
});
