import { count, eq } from 'drizzle-orm';
import sharp from 'sharp';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { createDb } from '../../server/db/client';
import { attachments, visits } from '../../server/db/schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { openBrowser, PHONE, signInToApp } from '../support/browser';
import { createHistoryUnit, recordVisits } from '../support/history';
import { readVisitQueue, writeVisitQueue } from '../support/visit-queue';

const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
afterAll(() => pool.end());

const technician = DEMO_ACCOUNTS.find((a) => a.role === 'technician')!;
const DAY = 86_400_000;
const at = (msAgo: number) => new Date(Date.now() - msAgo).toISOString();

const visitsOf = async (unitId: number) =>
  Number((await db.select({ n: count() }).from(visits).where(eq(visits.unitId, unitId)))[0].n);

describe('recording a visit on a phone', () => {
  it('records a top-up with a photo, and the timeline, score and forecast follow without a reload', async () => {
    const b = await openBrowser({ viewport: PHONE });
    try {
      const { page } = b;
      const unit = await createHistoryUnit(db, { nominalChargeKg: 4.5, commissionedOn: '2024-01-15' });
      await signInToApp(page, technician.email, DEMO_PASSWORD);
      // Two earlier top-ups, 100 days apart, recorded through the API as this technician.
      await recordVisits(page.request, inject('baseUrl'), unit.id, [
        { at: at(200 * DAY), events: [{ kind: 'top_up', kg: 0.8, cylinder: 'CYL-E2E-1' }] },
        { at: at(100 * DAY), events: [{ kind: 'top_up', kg: 0.6, cylinder: 'CYL-E2E-1' }] },
      ]);

      await page.goto(`/units/${unit.id}`);
      const score = page.getByTestId('score-value');
      const forecast = page.getByTestId('forecast-value');
      const refrigerantMarks = page.locator('[data-testid="timeline-mark"][data-kind="top_up"]');
      await score.waitFor();
      await expect.poll(() => refrigerantMarks.count()).toBe(2);
      const before = { score: await score.textContent(), forecast: await forecast.textContent() };
      // Survives only as long as the page is not reloaded.
      await page.evaluate(() => Object.assign(window, { sameDocument: true }));

      await page.getByRole('link', { name: 'Record a visit' }).first().click();
      await page.waitForURL(new RegExp(`/units/${unit.id}/visit$`));
      await page.getByRole('button', { name: 'Add Top-up' }).click();
      await page.getByText(/Certified technicians only/).waitFor();
      expect(await page.getByText(/take precedence over anything Tightloop computes/).count()).toBeGreaterThan(0);
      await page.getByLabel('Mass added').fill('0,9');
      await page.getByLabel('Cylinder or lot').fill('CYL-E2E-2');
      await page.getByRole('button', { name: /Save visit/ }).click();
      await page.getByText('Visit saved').waitFor();

      const photo = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#3a6ea5' } })
        .png()
        .toBuffer();
      await page
        .locator('input[type="file"]')
        .first()
        .setInputFiles({ name: 'leak.png', mimeType: 'image/png', buffer: photo });
      await page.getByText('1 file attached').waitFor();

      await page.getByRole('link', { name: /^Back to/ }).click();
      await page.waitForURL(new RegExp(`/units/${unit.id}$`));
      await expect.poll(() => refrigerantMarks.count()).toBe(3);
      await expect.poll(() => score.textContent()).not.toBe(before.score);
      await expect.poll(() => forecast.textContent()).not.toBe(before.forecast);
      // Two intervals now: the forecast has a range.
      await page
        .getByTestId('forecast-card')
        .getByText(/^Range /)
        .waitFor();
      await page.getByRole('img', { name: 'Photo: leak.png' }).waitFor();
      expect(await page.evaluate(() => (window as unknown as { sameDocument?: boolean }).sameDocument)).toBe(true);

      // The photo went to the new top-up, and it was stored with the mass converted from what was typed.
      const [row] = await db.select({ n: count() }).from(attachments).where(eq(attachments.unitId, unit.id));
      expect(Number(row.n)).toBe(1);
      expect(await visitsOf(unit.id)).toBe(3);
      expect(b.pageErrors).toEqual([]);
      expect(b.consoleErrors).toEqual([]);
    } finally {
      await b.close();
    }
  });

  it('keeps a visit made offline on the phone and sends it exactly once when back online', async () => {
    const b = await openBrowser({ viewport: PHONE });
    try {
      const { page, context } = b;
      const unit = await createHistoryUnit(db);
      await signInToApp(page, technician.email, DEMO_PASSWORD);
      await page.goto(`/units/${unit.id}/visit`);
      await page.getByRole('button', { name: 'Add Note' }).waitFor();

      await context.setOffline(true);
      await page.getByRole('button', { name: 'Add Note' }).click();
      await page
        .getByRole('textbox', { name: 'Note', exact: true })
        .fill('Door gasket torn at the lower hinge; reported to the depot.');
      await page.getByRole('button', { name: /Save visit/ }).click();
      await page.getByText('Kept on this phone: no connection right now').waitFor();
      await page.getByText('1 visit waiting to send').waitFor();
      expect(await visitsOf(unit.id)).toBe(0);
      const queued = await readVisitQueue(page);
      expect(queued.value).toHaveLength(1);

      await context.setOffline(false);
      await expect.poll(() => visitsOf(unit.id), { timeout: 15_000 }).toBe(1);
      await page.getByTestId('visit-queue').waitFor({ state: 'detached' });

      // The same submission once more (an answer lost on the way back): the server knows the key; nothing doubles.
      await writeVisitQueue(page, queued);
      await page.goto(`/units/${unit.id}`);
      await page.getByTestId('history-entry').first().waitFor();
      await page.getByTestId('visit-queue').waitFor({ state: 'detached' });
      expect(await visitsOf(unit.id)).toBe(1);
      expect(await page.getByTestId('history-entry').count()).toBe(1);
      expect(b.pageErrors).toEqual([]);
      expect(b.consoleErrors).toEqual([]);
    } finally {
      await b.close();
    }
  });

  it('shows a visit sent from the queue on the unit page opened seconds later, without a reload', async () => {
    const b = await openBrowser({ viewport: PHONE });
    try {
      const { page, context } = b;
      const unit = await createHistoryUnit(db);
      await signInToApp(page, technician.email, DEMO_PASSWORD);
      await recordVisits(page.request, inject('baseUrl'), unit.id, [
        { at: at(30 * DAY), events: [{ kind: 'top_up', kg: 0.5, cylinder: 'CYL-E2E-Q' }] },
      ]);
      // Seen with a connection: the unit, its figures and its history are in the page's cache.
      await page.goto(`/units/${unit.id}`);
      await page.getByTestId('history-entry').first().waitFor();
      await page.evaluate(() => ((window as unknown as { sameDocument?: boolean }).sameDocument = true));
      const note = 'Unit parked at the gate: compressor noise.';

      await page.getByRole('link', { name: 'Record a visit' }).first().click();
      await page.getByRole('button', { name: 'Add Note' }).waitFor();
      await context.setOffline(true);
      await page.getByRole('button', { name: 'Add Status change' }).click();
      await page.getByText('Out of service', { exact: true }).click();
      await page.getByRole('button', { name: 'Add Note' }).click();
      await page.getByRole('textbox', { name: 'Note', exact: true }).last().fill(note);
      await page.getByRole('button', { name: /Save visit/ }).click();
      await page.getByText('Kept on this phone: no connection right now').waitFor();

      // Elsewhere in the app when the signal comes back: the header's queue sends it.
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Home' }).click();
      await context.setOffline(false);
      await expect.poll(() => visitsOf(unit.id), { timeout: 20_000 }).toBe(2);
      await expect.poll(() => page.getByTestId('connection-status').getAttribute('data-waiting')).toBe('0');
      await page.waitForTimeout(6_000);

      // Back to the unit within the cache's freshness: the new entry and the status it set are there.
      await page.goBack();
      await page.goBack();
      await page.waitForURL(new RegExp(`/units/${unit.id}$`));
      await page.getByTestId('history-entry').filter({ hasText: note }).waitFor({ timeout: 10_000 });
      await page
        .locator('section[aria-labelledby="unit-title"]')
        .getByText('Out of service', { exact: true })
        .waitFor({ timeout: 10_000 });
      expect(await page.evaluate(() => (window as unknown as { sameDocument?: boolean }).sameDocument)).toBe(true);
      expect(b.pageErrors).toEqual([]);
      expect(b.consoleErrors).toEqual([]);
    } finally {
      await b.close();
    }
  });

  it('draws two pressure readings of one visit (before and after a top-up) as two points, with no warnings', async () => {
    const b = await openBrowser({ viewport: PHONE });
    try {
      const { page } = b;
      const unit = await createHistoryUnit(db, { nominalChargeKg: 4.5, commissionedOn: '2024-01-15' });
      await signInToApp(page, technician.email, DEMO_PASSWORD);
      const reading = (suctionKPaG: number, dischargeKPaG: number) =>
        ({
          kind: 'pressure',
          suctionKPaG,
          dischargeKPaG,
          ambientC: 24,
          sightGlass: 'full',
          enteredAs: { pressureUnit: 'kPa', temperatureUnit: 'C' },
        }) as const;
      await recordVisits(page.request, inject('baseUrl'), unit.id, [
        { at: at(40 * DAY), events: [reading(150, 900)] },
        {
          at: at(10 * DAY),
          events: [reading(60, 780), { kind: 'top_up', kg: 0.4, cylinder: 'CYL-E2E-3' }, reading(150, 905)],
        },
      ]);
      await page.goto(`/units/${unit.id}`);
      await page.getByRole('img', { name: /^Saturation temperatures of 3 pressure readings/ }).waitFor();
      expect(b.consoleErrors).toEqual([]);
      expect(b.pageErrors).toEqual([]);
    } finally {
      await b.close();
    }
  });
});
