import { existsSync, mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { createDb } from '../../server/db/client';
import { cylinders, units } from '../../server/db/schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { openBrowser, PHONE, signInToApp } from '../support/browser';
import { createTestUnit } from '../support/factories';

const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
afterAll(() => pool.end());

const account = (role: string) => DEMO_ACCOUNTS.find((a) => a.role === role)!;
const PRECEDENCE = /Local regulations and the equipment maker's service instructions take precedence/;

const SCREENS = '/work/notes/screens';
async function shot(page: Page, name: string) {
  if (!existsSync(path.dirname(SCREENS))) return;
  mkdirSync(SCREENS, { recursive: true });
  await page.screenshot({ path: path.join(SCREENS, `h8-${name}.png`) });
}

describe('cautions where the work can hurt (390 px)', () => {
  it('warns of flammable gas on a pressure reading of an A2L unit and of the supply when charging', async () => {
    const unit = await createTestUnit(db, { refrigerant: 'R-1234yf', nominalChargeKg: 4 });
    const browser = await openBrowser({ viewport: PHONE });
    try {
      const { page } = browser;
      await signInToApp(page, account('technician').email, DEMO_PASSWORD);
      await page.goto(`/units/${unit.id}/visit`);
      await page.getByRole('button', { name: 'Add Pressure reading' }).click();
      const safety = page.getByRole('complementary', { name: 'Safety' }).first();
      await expect.poll(() => safety.textContent()).toMatch(/R-1234yf is flammable/);
      await safety.scrollIntoViewIfNeeded();
      await shot(page, 'caution-a2l-pressure-390');
      await page.getByRole('button', { name: 'Add Top-up' }).click();
      await expect
        .poll(() => page.getByRole('complementary', { name: 'Safety' }).last().textContent())
        .toMatch(/380–460 V/);
    } finally {
      await browser.close();
    }
  });

  it('notes under the unit’s figures that computed dates give way to local rules and the maker', async () => {
    const [unit] = await db.select({ id: units.id }).from(units).orderBy(units.id).limit(1);
    const browser = await openBrowser({ viewport: PHONE });
    try {
      const { page } = browser;
      await signInToApp(page, account('engineer').email, DEMO_PASSWORD);
      await page.goto(`/units/${unit.id}`);
      const note = page.getByTestId('caution').filter({ hasText: 'Computed dates' });
      await expect.poll(() => note.textContent()).toMatch(PRECEDENCE);
      await note.scrollIntoViewIfNeeded();
      await shot(page, 'caution-computed-dates-390');
    } finally {
      await browser.close();
    }
  });

  it('puts the entry, PTI and cylinder cautions in the one caution box, each with the precedence sentence', async () => {
    const unit = await createTestUnit(db, { refrigerant: 'R-134a', nominalChargeKg: 4 });
    const [cylinder] = await db.select({ id: cylinders.id }).from(cylinders).orderBy(cylinders.id).limit(1);
    const browser = await openBrowser({ viewport: PHONE });
    try {
      const { page } = browser;
      await signInToApp(page, account('engineer').email, DEMO_PASSWORD);
      // The shared box (data-testid="caution") is what always adds the sentence.
      const box = (hasText: RegExp) => page.getByTestId('caution').filter({ hasText });
      await page.goto(`/units/${unit.id}/visit`);
      await page.getByRole('button', { name: 'Add Repair' }).click();
      await expect.poll(() => box(/Opening the circuit/).textContent()).toMatch(PRECEDENCE);
      await page.goto(`/units/${unit.id}/release`);
      await expect.poll(() => box(/380–460 V three-phase/).textContent()).toMatch(PRECEDENCE);
      await page.goto(`/cylinders/${cylinder.id}`);
      await expect.poll(() => box(/Never mix refrigerants in one cylinder/).textContent()).toMatch(PRECEDENCE);
      expect(browser.pageErrors).toEqual([]);
      expect(browser.consoleErrors).toEqual([]);
    } finally {
      await browser.close();
    }
  });

  it('says on "Keep topping up" that many regulations require a found leak to be repaired', async () => {
    const [unit] = await db.select({ id: units.id }).from(units).orderBy(units.id).limit(1);
    const browser = await openBrowser({ viewport: PHONE });
    try {
      const { page } = browser;
      await signInToApp(page, account('owner').email, DEMO_PASSWORD);
      await page.goto(`/decisions/${unit.id}`);
      const keep = page.getByTestId('option-keep_topping_up');
      await expect.poll(() => keep.textContent()).toMatch(/require a leak that has been found to be repaired/);
      await expect.poll(() => keep.textContent()).toMatch(PRECEDENCE);
      await keep.scrollIntoViewIfNeeded();
      await shot(page, 'caution-keep-topping-up-390');
    } finally {
      await browser.close();
    }
  });
});
