import { afterAll, describe, expect, inject, it } from 'vitest';
import { inArray } from 'drizzle-orm';
import { createDb } from '../../server/db/client';
import { units } from '../../server/db/schema';
import { formatContainerNumber } from '../../shared/domain';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { DESKTOP, openBrowser, signInThroughForm } from '../support/browser';
import { halyardNumber } from '../support/units';

const engineer = DEMO_ACCOUNTS.find((a) => a.role === 'engineer')!;
const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
afterAll(() => pool.end());

describe('fleet import in the browser', () => {
  it('imports a CSV as an engineer and lists the new units', async () => {
    // Three consecutive serials the demo fleet does not use, inside one block of ten so one prefix finds them all.
    let numbers: string[] = [];
    for (let base = 980_000 + (Date.now() % 900) * 10; numbers.length === 0; base += 10) {
      const candidates = [0, 1, 2].map((i) => halyardNumber(base + i));
      const taken = await db
        .select({ n: units.containerNumber })
        .from(units)
        .where(inArray(units.containerNumber, candidates));
      if (taken.length === 0) numbers = candidates;
    }
    const csv = [
      'container_number,refrigerant,nominal_charge_kg,status',
      ...numbers.map((n, i) => `${n},R-513A,${4 + i / 2},in_service`),
    ].join('\n');

    const browser = await openBrowser({ viewport: DESKTOP });
    try {
      const { page } = browser;
      await signInThroughForm(page, engineer.email, DEMO_PASSWORD);
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Import' }).click();
      await page.getByRole('heading', { name: 'Import the fleet' }).waitFor();
      await page
        .locator('input[type=file]')
        .setInputFiles({ name: 'halyard-fleet.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
      const summary = page.getByTestId('import-summary');
      await summary.getByText('Ready to import').waitFor();
      expect(await summary.textContent()).toContain('Ready to import3');
      await page.getByRole('button', { name: 'Import 3 units' }).click();
      await page.getByText('3 units imported').waitFor();
      await page.getByRole('link', { name: 'See the units' }).click();
      await page.getByLabel('Container number starts with').fill(numbers[0].slice(0, 9));
      await page.getByRole('button', { name: 'Search' }).click();
      for (const n of numbers) await page.locator(`[data-testid=unit-row][data-container-number="${n}"]`).waitFor();
      expect(await page.getByText(formatContainerNumber(numbers[1]), { exact: true }).count()).toBe(1);
      expect(browser.pageErrors).toEqual([]);
      expect(browser.consoleErrors).toEqual([]);
    } finally {
      await browser.close();
    }
  });
});
