import { afterAll, describe, expect, inject, it } from 'vitest';
import { createDb } from '../../server/db/client';
import { compareRepairOptions } from '../../shared/domain';
import type { UnitDecisionDto } from '../../shared/schemas/decisions';
import { DEFAULT_SETTINGS } from '../../shared/schemas/settings';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { DESKTOP, openBrowser, PHONE, placeholderRoom, signInToApp } from '../support/browser';
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
      await signInToApp(page, account('engineer').email, DEMO_PASSWORD);
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
      await signInToApp(page, account('owner').email, DEMO_PASSWORD);
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
      await signInToApp(page, account('owner').email, DEMO_PASSWORD);
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
      // The fleet's search box shows its whole example on a phone.
      await page.goto('/fleet');
      const { text, room } = await placeholderRoom(page.getByLabel('Container number starts with'));
      expect(text).toBeGreaterThan(0);
      expect(text).toBeLessThanOrEqual(room);
      expect(owner.pageErrors).toEqual([]);
      expect(owner.consoleErrors).toEqual([]);
    } finally {
      await owner.close();
    }
  });
});

describe('overview counts to fleet rows', () => {
  it("an engineer follows a My day group to the fleet table and finds the group's units there", async () => {
    const site = await createTestSite(db, { name: `E2E leak quay ${Date.now() % 100000}` });
    const engineer = await openBrowser({ viewport: DESKTOP });
    try {
      const { page } = engineer;
      await signInToApp(page, account('engineer').email, DEMO_PASSWORD);
      for (const daysAgo of [3, 9]) {
        const unit = await createHistoryUnit(db, { siteId: site.id, nominalChargeKg: 5, commissionedOn: '2019-06-01' });
        await recordVisits(page.request, inject('baseUrl'), unit.id, [
          {
            at: at(daysAgo),
            events: [{ kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'service_valve' }],
          },
        ]);
      }
      await page.goto('/');
      const myDay = page.getByRole('region', { name: /^My day/ });
      await myDay.getByLabel('Site').selectOption(String(site.id));
      const group = myDay.locator('#day-open_leak');
      await group.getByRole('heading', { name: /Open leaks without a repair \(2\)/ }).waitFor();
      await group.getByRole('link', { name: 'In the fleet table' }).click();
      await page.waitForURL((u) => u.pathname === '/fleet' && u.search.includes('openLeak=1'));
      await page.getByRole('list', { name: 'Also filtered by' }).getByText('Open leak without a repair').waitFor();
      await expect.poll(() => page.getByTestId('fleet-row').count()).toBe(2);
      expect(engineer.pageErrors).toEqual([]);
      expect(engineer.consoleErrors).toEqual([]);
    } finally {
      await engineer.close();
    }
  });

  it('on a phone, a count tapped low on the overview opens the fleet table at its top', async () => {
    const phone = await openBrowser({ viewport: PHONE });
    try {
      const { page } = phone;
      await signInToApp(page, account('engineer').email, DEMO_PASSWORD);
      await page.goto('/fleet/overview');
      const overdue = page.getByTestId('overview-count').filter({ hasText: /overdue/ });
      await overdue.scrollIntoViewIfNeeded();
      expect(await page.evaluate(() => window.scrollY)).toBeGreaterThan(0);
      await overdue.click();
      await page.waitForURL((u) => u.pathname === '/fleet' && u.search.includes('leakCheckOverdue=1'));
      await page.getByRole('heading', { level: 1, name: 'Fleet' }).waitFor();
      await expect.poll(() => page.evaluate(() => window.scrollY)).toBe(0);
      // The filter is counted on the folded panel, which stays folded on a phone: the first unit is on screen.
      const panel = page.locator('details').filter({ has: page.locator('summary', { hasText: 'Filters' }) });
      expect(await panel.evaluate((d) => (d as HTMLDetailsElement).open)).toBe(false);
      expect((await page.getByTestId('fleet-row').first().boundingBox())!.y).toBeLessThan(PHONE.height - 120);
      expect(phone.pageErrors).toEqual([]);
      expect(phone.consoleErrors).toEqual([]);
    } finally {
      await phone.close();
    }
  });

  it('on a phone, Back from a unit opened low in the fleet list returns to that place in the list', async () => {
    const phone = await openBrowser({ viewport: PHONE });
    try {
      const { page } = phone;
      await signInToApp(page, account('engineer').email, DEMO_PASSWORD);
      await page.goto('/fleet');
      const row = page.getByTestId('fleet-row').nth(8);
      await row.scrollIntoViewIfNeeded();
      const listY = await page.evaluate(() => window.scrollY);
      expect(listY).toBeGreaterThan(PHONE.height);
      const unitId = await row.getAttribute('data-unit-id');
      await row.getByRole('link').first().click();
      await page.waitForURL(new RegExp(`/units/${unitId}$`));
      await page.getByTestId('unit-figures').waitFor();
      // A new page starts at its top.
      expect(await page.evaluate(() => window.scrollY)).toBe(0);
      await page.goBack();
      await page.waitForURL((u) => u.pathname === '/fleet');
      await expect.poll(() => page.evaluate(() => window.scrollY)).toBeGreaterThan(listY - 40);
      expect(await page.evaluate(() => window.scrollY)).toBeLessThan(listY + 40);
      const box = (await page.locator(`[data-testid="fleet-row"][data-unit-id="${unitId}"]`).boundingBox())!;
      expect(box.y + box.height).toBeGreaterThan(0);
      expect(box.y).toBeLessThan(PHONE.height);
      expect(phone.pageErrors).toEqual([]);
    } finally {
      await phone.close();
    }
  });

  it('an engineer clicks a count on the overview and lands on a fleet table with exactly that many units', async () => {
    const site = await createTestSite(db, { name: `E2E counting quay ${Date.now() % 100000}` });
    // Leak checked 400 days ago twice (overdue under a 12-month interval), 350 days ago (due within 30 days), 20 days ago.
    const checkedDaysAgo = [400, 400, 350, 20];
    const engineer = await openBrowser({ viewport: DESKTOP });
    try {
      const { page } = engineer;
      await signInToApp(page, account('engineer').email, DEMO_PASSWORD);
      for (const daysAgo of checkedDaysAgo) {
        const unit = await createHistoryUnit(db, { siteId: site.id, nominalChargeKg: 5, commissionedOn: '2019-06-01' });
        await recordVisits(page.request, inject('baseUrl'), unit.id, [
          { at: at(daysAgo), events: [{ kind: 'leak_check', method: 'electronic_detector', leakFound: false }] },
        ]);
      }

      const tile = (label: RegExp) => page.getByTestId('overview-count').filter({ hasText: label });
      for (const [label, expected, param] of [
        [/overdue/, 2, 'leakCheckOverdue=1'],
        [/due in the next 30 days/, 1, 'leakCheckDueDays=30'],
        [/needed no refrigerant/, 4, 'rateAtMost=0'],
        [/units/, 4, `siteId=${site.id}`],
      ] as const) {
        await page.goto(`/fleet/overview?siteId=${site.id}`);
        await tile(label).waitFor();
        const shown = Number((await tile(label).locator('span').first().textContent())!.replace(/\D/g, ''));
        expect({ label: String(label), shown }).toEqual({ label: String(label), shown: expected });
        await tile(label).click();
        await page.waitForURL((u) => u.pathname === '/fleet' && u.search.includes(param));
        expect(new URL(page.url()).searchParams.get('siteId')).toBe(String(site.id));
        await expect.poll(() => page.getByTestId('fleet-row').count()).toBe(expected);
      }
      // A filter without a control of its own is said in words and can be removed.
      await page.goto(`/fleet?siteId=${site.id}&leakCheckDueDays=30`);
      await page.getByRole('button', { name: 'Remove the filter: Leak check due within 30 days' }).click();
      await page.waitForURL((u) => !u.search.includes('leakCheckDueDays'));
      await expect.poll(() => page.getByTestId('fleet-row').count()).toBe(4);
      expect(engineer.pageErrors).toEqual([]);
      expect(engineer.consoleErrors).toEqual([]);
    } finally {
      await engineer.close();
    }
  });
});
