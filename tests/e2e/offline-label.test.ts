// Issue 19, a label this phone has never opened, with no signal: a visit recorded against the label's token goes to
// the right unit once the signal is back, exactly once; and with "keep my depot's units on this phone" the label opens
// the unit with its figures and entries.
import { and, count, eq } from 'drizzle-orm';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { createDb } from '../../server/db/client';
import { events, sites, visits } from '../../server/db/schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { signInToApp } from '../support/browser';
import { createHistoryUnit, recordVisits } from '../support/history';
import { phoneProfile, readyForOffline } from '../support/offline-phone';

const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
afterAll(() => pool.end());

const baseUrl = inject('baseUrl');
const technician = DEMO_ACCOUNTS.find((a) => a.role === 'technician')!;
const visitsOf = async (unitId: number) =>
  Number((await db.select({ n: count() }).from(visits).where(eq(visits.unitId, unitId)))[0].n);

describe('a label never opened on this phone, with no signal', () => {
  it('records a visit against the label and sends it to the right unit, once, when the signal is back', async () => {
    const phone = phoneProfile();
    const session = await phone.open();
    const { page, context } = session;
    try {
      const seen = await createHistoryUnit(db);
      const unseen = await createHistoryUnit(db);
      await signInToApp(page, technician.email, DEMO_PASSWORD);
      await page.goto(`/units/${seen.id}`);
      await page.getByTestId('service-history').waitFor();
      await readyForOffline(page);

      await context.setOffline(true);
      await page.goto(`/u/${unseen.qrToken}`);
      await page.getByText('No signal, and this label has not been opened on this phone before').waitFor();
      await page.getByRole('button', { name: 'Record a visit for this label' }).click();
      await page.getByText('this phone does not know the unit yet').waitFor();
      await page.getByRole('button', { name: 'Add Note' }).click();
      await page.getByRole('textbox', { name: 'Note', exact: true }).fill('Door gasket torn at the lower hinge.');
      await page.getByRole('button', { name: /Save visit/ }).click();
      await page.getByText('Kept on this phone: no connection right now').waitFor();
      await expect.poll(() => page.getByTestId('connection-status').getAttribute('data-waiting')).toBe('1');
      expect(await visitsOf(unseen.id)).toBe(0);

      await context.setOffline(false);
      await expect.poll(() => visitsOf(unseen.id), { timeout: 20_000 }).toBe(1);
      await expect.poll(() => page.getByTestId('connection-status').getAttribute('data-waiting')).toBe('0');
      // Long enough for a second send to have landed, had there been one.
      await page.waitForTimeout(2000);
      expect(await visitsOf(unseen.id)).toBe(1);
      expect(await visitsOf(seen.id)).toBe(0);
      const [note] = await db
        .select({ note: events.note })
        .from(events)
        .where(and(eq(events.unitId, unseen.id), eq(events.kind, 'note')));
      expect(note.note).toBe('Door gasket torn at the lower hinge.');
      // The label now opens its unit, with the visit.
      await page.goto(`/u/${unseen.qrToken}`);
      await page.waitForURL(new RegExp(`/units/${unseen.id}$`));
      await page.getByText('Door gasket torn at the lower hinge.').waitFor();
      expect(phone.errors).toEqual([]);
    } finally {
      await context.close().catch(() => undefined);
      phone.remove();
    }
  });

  it("opens the unit with its figures and entries when the phone keeps its depot's units", async () => {
    const phone = phoneProfile();
    const { page, context } = await phone.open();
    try {
      const name = `Keep Depot ${Date.now() % 100_000}`;
      const [{ id: siteId }] = await db
        .insert(sites)
        .values({ code: `K${Date.now() % 100_000}`, name, kind: 'depot' })
        .$returningId();
      const unit = await createHistoryUnit(db, { siteId });
      await createHistoryUnit(db, { siteId });
      await signInToApp(page, technician.email, DEMO_PASSWORD);
      await recordVisits(page.request, baseUrl, unit.id, [
        {
          at: new Date(Date.now() - 20 * 86_400_000).toISOString(),
          events: [{ kind: 'top_up', kg: 0.7, cylinder: 'CYL-DPT-1' }],
        },
      ]);

      await page.goto('/scan');
      await page.getByLabel('Depot', { exact: true }).selectOption({ label: `${name} (2 units)` });
      await page.getByRole('button', { name: 'Keep its units' }).click();
      await expect
        .poll(() => page.getByTestId('depot-copy-state').textContent(), { timeout: 20_000 })
        .toMatch(new RegExp(`^2 units of ${name} open here with no signal`));
      await readyForOffline(page);

      await context.setOffline(true);
      await page.goto(`/u/${unit.qrToken}`);
      await page.waitForURL(new RegExp(`/units/${unit.id}$`));
      await page.getByTestId('unit-figures').waitFor();
      await page.getByTestId('history-entry').first().waitFor();
      expect(phone.errors).toEqual([]);
    } finally {
      await context.close().catch(() => undefined);
      phone.remove();
    }
  });
});
