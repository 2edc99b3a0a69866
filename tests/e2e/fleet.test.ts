import { afterAll, describe, expect, inject, it } from 'vitest';
import { createDb } from '../../server/db/client';
import { compareRepairOptions } from '../../shared/domain';
import type { UnitDecisionDto } from '../../shared/schemas/decisions';
import { DEFAULT_SETTINGS } from '../../shared/schemas/settings';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { DESKTOP, openBrowser, PHONE, signInThroughForm } from '../support/browser';
import { createHistoryUnit, recordVisits, type VisitSpec } from '../support/history';
import { createTestSite } from '../support/units';

const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
afterAll(() => pool.end());

const account = (role: string) => DEMO_ACCOUNTS.find((a) => a.role === role)!;
const DAY = 86_400_000;
const at = (daysAgo: number) => new Date(Date.now() - daysAgo * DAY).toISOString();

// Tops up every two months and leaks again at the same service valve after a repair.
const leaker: VisitSpec[] = [
  { at: at(330), events: [{ kind: 'top_up', kg: 1.0, cylinder: 'LOT-E2E-1' }] },
  { at: at(270), events: [{ kind: 'top_up', kg: 1.1, cylinder: 'LOT-E2E-1' }] },
  {
    at: at(210),
    events: [
      { kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'service_valve' },
      { kind: 'repair', location: 'service_valve', action: 'valve_core_replaced', verified: true },
    ],
  },
  {
    at: at(150),
    events: [
      { kind: 'leak_check', method: 'bubble_solution', leakFound: true, location: 'service_valve' },
      { kind: 'top_up', kg: 1.0, cylinder: 'LOT-E2E-2' },
    ],
  },
  { at: at(90), events: [{ kind: 'top_up', kg: 1.1, cylinder: 'LOT-E2E-2' }] },
  { at: at(30), events: [{ kind: 'top_up', kg: 1.0, cylinder: 'LOT-E2E-3' }] },
];

describe('fleet table to decision', () => {
  it('an engineer sorts the fleet by score and opens the top unit; an owner changes the refrigerant price and sees the recommendation follow', async () => {
    const site = await createTestSite(db, { name: `E2E quay ${Date.now() % 100000}` });
    const top = await createHistoryUnit(db, { siteId: site.id, nominalChargeKg: 5, commissionedOn: '2019-06-01' });
    const quiet = await createHistoryUnit(db, { siteId: site.id, nominalChargeKg: 5, commissionedOn: '2022-06-01' });

    const engineer = await openBrowser({ viewport: DESKTOP });
    let unitId: number;
    try {
      const { page } = engineer;
      await signInThroughForm(page, account('engineer').email, DEMO_PASSWORD);
      await page.getByRole('navigation', { name: 'Main' }).waitFor();
      await recordVisits(page.request, inject('baseUrl'), top.id, leaker);
      await recordVisits(page.request, inject('baseUrl'), quiet.id, [
        {
          at: at(20),
          events: [
            { kind: 'pti', passed: true },
            { kind: 'leak_check', method: 'uv_dye', leakFound: false },
          ],
        },
      ]);

      // Start from another order, then sort by score with the column header.
      await page.goto(`/fleet?siteId=${site.id}&sort=containerNumber&dir=asc`);
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Fleet' }).waitFor();
      await expect.poll(() => page.getByTestId('fleet-row').count()).toBe(2);
      await page
        .getByRole('columnheader', { name: /^Score/ })
        .getByRole('button')
        .click();
      // Score, highest first, is the default order: the address drops the sort.
      await page.waitForURL((u) => !u.search.includes('sort='));
      await expect
        .poll(() => page.getByRole('columnheader', { name: /^Score/ }).getAttribute('aria-sort'))
        .toBe('descending');
      await expect
        .poll(async () => page.getByTestId('fleet-row').first().getAttribute('data-unit-id'))
        .toBe(String(top.id));

      await page.getByTestId('fleet-row').first().getByTestId('fleet-unit-link').click();
      await page.waitForURL(new RegExp(`/units/${top.id}$`));
      unitId = top.id;
      expect(engineer.pageErrors).toEqual([]);
      expect(engineer.consoleErrors).toEqual([]);
    } finally {
      await engineer.close();
    }

    const owner = await openBrowser({ viewport: PHONE });
    try {
      const { page } = owner;
      await signInThroughForm(page, account('owner').email, DEMO_PASSWORD);
      await page.getByRole('navigation', { name: 'Main' }).waitFor();
      await page.goto(`/decisions/${unitId}`);
      const recommendation = page.getByTestId('recommendation');
      await recommendation.waitFor();
      // The estimate's notice defers to local rules; the known-leak caution on "keep topping up" says it again.
      await page
        .getByText(/take precedence over anything Tightloop computes/)
        .first()
        .waitFor();

      // What the engine says for a much dearer refrigerant, from the same inputs the page shows.
      const res = await page.request.get(`${inject('baseUrl')}/api/decisions/units/${unitId}`);
      const d = (await res.json()) as UnitDecisionDto;
      const before = compareRepairOptions(d.engineInput, { ...DEFAULT_SETTINGS, economics: d.economics });
      expect(await recommendation.textContent()).toContain(before.options.find((o) => o.cheapest)!.label);
      const price = 2000;
      const inputs = {
        ...d.engineInput,
        topUpIntervalDays: Math.round(d.engineInput.topUpIntervalDays! * 10) / 10,
        madeUpKgPerVisit: Math.round(d.engineInput.madeUpKgPerVisit! * 1000) / 1000,
      };
      const after = compareRepairOptions(inputs, {
        ...DEFAULT_SETTINGS,
        economics: { ...d.economics, refrigerantPricePerKg: { ...d.economics.refrigerantPricePerKg, 'R-134a': price } },
      });
      const expected = after.options.find((o) => o.cheapest)!;
      expect(expected.id).not.toBe(before.cheapestId);

      await page.getByLabel('R-134a per kg').fill(String(price));
      await expect.poll(() => recommendation.textContent()).toContain(expected.label);
      await expect.poll(() => page.getByTestId(`option-${expected.id}`).textContent()).toContain('Cheapest');
      expect(owner.pageErrors).toEqual([]);
      expect(owner.consoleErrors).toEqual([]);
    } finally {
      await owner.close();
    }
  });

  it('keeps every fleet and decision page within a 390 px phone screen', async () => {
    const owner = await openBrowser({ viewport: PHONE });
    try {
      const { page } = owner;
      await signInThroughForm(page, account('owner').email, DEMO_PASSWORD);
      await page.getByRole('navigation', { name: 'Main' }).waitFor();
      for (const [path, ready] of [
        ['/fleet', page.getByTestId('fleet-row').first()],
        ['/fleet/overview', page.getByRole('heading', { name: 'Repeat leakers' })],
        ['/fleet/trace', page.getByRole('heading', { level: 1 })],
        ['/refrigerant-log', page.getByRole('heading', { level: 1 })],
        ['/decisions', page.getByRole('heading', { level: 1 })],
      ] as const) {
        await page.goto(path);
        await ready.waitFor();
        await page.waitForLoadState('networkidle');
        const width = await page.evaluate(() => document.documentElement.scrollWidth);
        expect({ path, width }).toEqual({ path, width: PHONE.width });
      }
      expect(owner.pageErrors).toEqual([]);
      expect(owner.consoleErrors).toEqual([]);
    } finally {
      await owner.close();
    }
  });
});
