// The depot's day on a phone: My day lists what needs doing at the technician's site; a re-check is done from it and
// clears; a structured PTI passes and the unit is released; a quarantined unit's release and passed PTI are refused.
import { afterAll, describe, expect, inject, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { createDb } from '../../server/db/client';
import { events, sites, users, visits } from '../../server/db/schema';
import { createCaches } from '../../server/lib/caches';
import { writeUnit } from '../../server/lib/record/write-path';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { formatContainerNumber } from '../../shared/domain';
import { openBrowser, PHONE, signInToApp } from '../support/browser';
import { createHistoryUnit, recordVisits } from '../support/history';

const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
afterAll(() => pool.end());

const technician = DEMO_ACCOUNTS.find((a) => a.role === 'technician')!;
const SCREENS = process.env.SCREENS_DIR ?? '/work/notes/screens';
const HOUR = 3_600_000;
const ago = (ms: number) => new Date(Date.now() - ms).toISOString();

async function quarantine(unitId: number, recordedBy: string, reason: string) {
  const ctx = { db, clock: { now: () => new Date() }, publicUrl: inject('baseUrl'), caches: createCaches() };
  await writeUnit(ctx, unitId, async (tx, { unit }, now) => {
    const [v] = await tx
      .insert(visits)
      .values({
        unitId,
        siteId: unit.siteId,
        recordedBy,
        occurredAt: now,
        enteredAt: now,
        idempotencyKey: `e2e-q-${unitId}-${now.getTime()}`,
      })
      .$returningId();
    await tx.insert(events).values({
      unitId,
      visitId: v.id,
      siteId: unit.siteId,
      recordedBy,
      kind: 'note',
      occurredAt: now,
      enteredAt: now,
      note: `Quarantined: ${reason}`,
      details: { quarantine: { reason } },
    });
    return { result: null };
  });
}

describe('the depot’s day on a phone', () => {
  it('does a re-check from My day, passes a structured PTI, releases a unit and is refused on a quarantined one', async () => {
    const [site] = await db
      .insert(sites)
      .values({ code: `E2E${Date.now() % 100000}`, name: 'Quay Nine', kind: 'depot' })
      .$returningId();
    const [person] = await db.select({ id: users.id }).from(users).where(eq(users.email, technician.email));
    const recheckUnit = await createHistoryUnit(db, { siteId: site.id, commissionedOn: '2024-02-01' });
    const releaseUnit = await createHistoryUnit(db, { siteId: site.id, commissionedOn: '2024-02-01' });
    const quarantinedUnit = await createHistoryUnit(db, { siteId: site.id, commissionedOn: '2024-02-01' });
    await quarantine(quarantinedUnit.id, person.id, 'Charged from suspect lot LOT-E2E-7');

    const b = await openBrowser({ viewport: PHONE });
    try {
      const { page } = b;
      await signInToApp(page, technician.email, DEMO_PASSWORD);
      // A recharge with a baseline reading a month ago, then yesterday's top-up without a leak found.
      const base = inject('baseUrl');
      const withSite = async (unitId: number, at: string, evs: object[]) => {
        const res = await page.request.post(`${base}/api/visits`, {
          headers: { Origin: base },
          data: { idempotencyKey: crypto.randomUUID(), unitId, siteId: site.id, occurredAt: at, events: evs },
        });
        expect(res.status(), await res.text()).toBe(201);
      };
      await withSite(recheckUnit.id, ago(30 * 24 * HOUR), [
        { kind: 'recharge', kg: 4.5, cylinder: 'CYL-E2E-R' },
        { kind: 'pressure', dischargeKPaG: 965, ambientC: 30, sightGlass: 'full' },
      ]);
      await withSite(recheckUnit.id, ago(20 * HOUR), [{ kind: 'top_up', kg: 0.4, cylinder: 'CYL-E2E-R' }]);
      void recordVisits;

      // The unit page's re-check panel writes its days the app's way ("due 6 Nov 2026"), never 2026-11-06.
      await page.goto(`/units/${recheckUnit.id}`);
      const depotPanel = page.getByRole('region', { name: 'Release and re-checks' });
      await depotPanel.getByText(/Re-check after the top-up of/).waitFor();
      const panelText = (await depotPanel.textContent()) ?? '';
      expect(panelText).toMatch(/due \d{1,2} [A-Z][a-z]{2} \d{4}/);
      expect(panelText).not.toMatch(/\d{4}-\d{2}-\d{2}/);
      await depotPanel.evaluate((el) => el.scrollIntoView({ block: 'center' }));
      await page.screenshot({ path: `${SCREENS}/unit-recheck-panel-390.png` });

      await page.goto('/');
      await page.getByRole('heading', { name: 'My day at Quay Nine' }).waitFor();
      const rechecks = page.locator('#day-recheck');
      await rechecks.getByText(formatContainerNumber(recheckUnit.containerNumber)).waitFor();
      await page.locator('#day-quarantine').getByText(formatContainerNumber(quarantinedUnit.containerNumber)).waitFor();
      await page.screenshot({ path: `${SCREENS}/my-day-390.png`, fullPage: true });

      // The re-check, from My day: the row opens the visit form for this unit.
      await rechecks
        .getByRole('link', { name: new RegExp(formatContainerNumber(recheckUnit.containerNumber)) })
        .click();
      await page.waitForURL(new RegExp(`/units/${recheckUnit.id}/visit\\?entry=pressure$`));
      // The link preselects the entry: the pressure reading is on the form without adding it.
      await page.getByLabel(/^Discharge \(/).waitFor();
      // 960 kPa(g) in whichever unit the form starts in; 30 °C ambient.
      const discharge = page.getByLabel(/^Discharge \(/);
      const unit = /\((\w+) gauge\)/.exec(
        (await page
          .getByText(/^Discharge \(/)
          .first()
          .textContent()) ?? '',
      )?.[1];
      await discharge.fill(unit === 'psi' ? '139' : unit === 'kPa' ? '960' : unit === 'MPa' ? '0.96' : '9.6');
      const fahrenheit = (
        await page
          .getByText(/^Ambient/)
          .first()
          .textContent()
      )?.includes('F');
      await page.getByLabel(/^Ambient/).fill(fahrenheit ? '86' : '30');
      await page.getByText('Full, clear').click();
      await page.getByRole('button', { name: /Save visit/ }).click();
      await page.getByText('Visit saved').waitFor();
      await page.goto(`/units/${recheckUnit.id}/release`);
      await page.getByText(/Charge held/).waitFor();
      await page.goto('/');
      await page.getByRole('heading', { name: 'My day at Quay Nine' }).waitFor();
      await expect
        .poll(() => page.locator('#day-recheck').getByText(formatContainerNumber(recheckUnit.containerNumber)).count())
        .toBe(0);

      // A structured PTI, every step passed, then the release.
      await page.goto(`/units/${releaseUnit.id}/release`);
      const checklist = page.getByRole('form', { name: 'PTI checklist' });
      await checklist.waitFor();
      await page.getByText(/380–460 V three-phase/).waitFor();
      await page
        .getByRole('complementary', { name: 'Safety' })
        .getByText(/take precedence over anything Tightloop computes/)
        .waitFor();
      const passes = checklist.getByRole('button', { name: 'Pass', exact: true });
      for (let i = 0; i < (await passes.count()); i++) await passes.nth(i).click();
      await page
        .getByRole('group', { name: /Pull-down/ })
        .getByLabel('Set point, °C')
        .fill('-25');
      await page.screenshot({ path: `${SCREENS}/pti-form-390.png`, fullPage: true });
      await page.getByRole('button', { name: 'Record the PTI' }).click();
      await page.getByText('PTI recorded: passed').waitFor();
      await page.getByRole('button', { name: 'Release for loading' }).click();
      await page.getByText(/Recorded in the unit's history/).waitFor();

      // The quarantined unit: banner, release refused, a passed PTI refused.
      await page.goto('/');
      await page
        .locator('#day-quarantine')
        .getByRole('link', { name: new RegExp(formatContainerNumber(quarantinedUnit.containerNumber)) })
        .click();
      await page.waitForURL(new RegExp(`/units/${quarantinedUnit.id}/release$`));
      await page.getByText('In quarantine — not to be released').waitFor();
      await page.getByRole('button', { name: 'Release for loading' }).click();
      await page.getByText('Release refused').waitFor();
      await page
        .getByText(/must lift the quarantine/)
        .first()
        .waitFor();
      const qPasses = page
        .getByRole('form', { name: 'PTI checklist' })
        .getByRole('button', { name: 'Pass', exact: true });
      for (let i = 0; i < (await qPasses.count()); i++) await qPasses.nth(i).click();
      await page.getByRole('button', { name: 'Record the PTI' }).click();
      await page.getByText('This PTI cannot pass').waitFor();
      await page.screenshot({ path: `${SCREENS}/quarantine-refused-390.png`, fullPage: true });
      // A technician is offered no override.
      expect(await page.getByRole('button', { name: 'Pass with override' }).count()).toBe(0);

      // The unit's own page shows the same state and leads to the release page.
      await page.goto(`/units/${quarantinedUnit.id}`);
      await page.getByText('In quarantine — not to be released').waitFor();
      await page.getByRole('link', { name: 'PTI and release' }).click();
      await page.waitForURL(new RegExp(`/units/${quarantinedUnit.id}/release$`));
    } catch (err) {
      await b.page.screenshot({ path: `${SCREENS}/depot-day-failure.png`, fullPage: true });
      throw err;
    } finally {
      await b.close();
    }
  });
});
