// Cylinders in the browser: a technician charges from a cylinder found by its label number (typed where a camera is
// absent) and recovers into a recovery cylinder; an owner downloads a unit's handover pack; the register and a
// cylinder's page at phone and desktop widths.
import { mkdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { createDb } from '../../server/db/client';
import { cylinderMoves, cylinders, cylinderWeighings, users } from '../../server/db/schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { fmtKg, fmtPct } from '../../shared/format';
import type { CylinderDetailDto } from '../../shared/schemas/cylinders';
import { DESKTOP, openBrowser, PHONE, signInToApp } from '../support/browser';
import { createHistoryUnit } from '../support/history';

const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
afterAll(() => pool.end());

const account = (role: string) => DEMO_ACCOUNTS.find((a) => a.role === role)!;
// Screenshots for looking at the pages, when asked for.
const SCREENS = process.env.SCREENS_DIR;

async function registerCylinder(code: string, kind: 'new' | 'recovery', capacityKg: number) {
  const [eng] = await db
    .select({ id: users.id })
    .from(users)
    .where(eq(users.email, account('engineer').email));
  const [{ id }] = await db
    .insert(cylinders)
    .values({
      code,
      kind,
      refrigerant: 'R-134a',
      tareKg: 12,
      capacityKg,
      gasOrigin: kind === 'new' ? 'virgin' : null,
      lot: kind === 'new' ? 'E2E-LOT' : null,
      status: kind === 'new' ? 'full' : 'empty',
      createdBy: eng.id,
    })
    .$returningId();
  await db.insert(cylinderWeighings).values({
    cylinderId: id,
    grossKg: kind === 'new' ? 12 + capacityKg : 12,
    weighedAt: new Date(Date.now() - 3_600_000),
    recordedBy: eng.id,
  });
  return id;
}

describe('cylinders on visits', () => {
  it('charges from a cylinder found by its label number and recovers into a recovery cylinder', async () => {
    const unit = await createHistoryUnit(db);
    const supply = await registerCylinder(`E2E-NC${unit.id}`, 'new', 13.6);
    const recovery = await registerCylinder(`E2E-RC${unit.id}`, 'recovery', 20);
    const b = await openBrowser({ viewport: PHONE });
    try {
      const { page } = b;
      await signInToApp(page, account('technician').email, DEMO_PASSWORD);
      await page.goto(`/units/${unit.id}/visit`);
      await page.getByRole('button', { name: 'Add Top-up' }).click();
      await page.getByLabel('Mass added').fill('0,7');
      const pickers = page.getByTestId('cylinder-picker');
      // No camera here: the number printed under the label's QR code, typed.
      await pickers.nth(0).getByLabel('Number on the cylinder label').fill(`e2e-nc${unit.id}`);
      await pickers.nth(0).getByRole('button', { name: 'Use' }).click();
      await expect.poll(() => pickers.nth(0).getByTestId('picked-cylinder').textContent()).toBe(`E2E-NC${unit.id}`);
      await page.getByRole('button', { name: 'Add Recovery' }).click();
      await page.getByLabel('Mass recovered').fill('0,5');
      await pickers.nth(1).getByLabel('Number on the cylinder label').fill(`E2E-RC${unit.id}`);
      await pickers.nth(1).getByRole('button', { name: 'Use' }).click();
      await expect.poll(() => pickers.nth(1).getByTestId('picked-cylinder').textContent()).toBe(`E2E-RC${unit.id}`);
      await page
        .getByText(/beyond the cylinder maker's marked maximum/)
        .first()
        .waitFor();
      await page.getByRole('button', { name: /Save visit/ }).click();
      await page.getByText('Visit saved').waitFor();
      const moves = await db.select().from(cylinderMoves).where(eq(cylinderMoves.unitId, unit.id));
      expect(moves.map((m) => [m.cylinderId, m.direction, m.kg]).sort()).toEqual(
        [
          [supply, 'out', 0.7],
          [recovery, 'in', 0.5],
        ].sort(),
      );
      expect([...b.pageErrors, ...b.consoleErrors]).toEqual([]);
    } finally {
      await b.close();
    }
  });

  it('shows the register and a cylinder page at phone and desktop widths', async () => {
    for (const viewport of [PHONE, DESKTOP]) {
      const b = await openBrowser({ viewport });
      try {
        const { page } = b;
        await signInToApp(page, account('engineer').email, DEMO_PASSWORD);
        await page.goto('/cylinders');
        await page.getByTestId('cylinder-row').first().waitFor();
        expect(await page.locator('[data-testid="reconciliation"][data-flagged="true"]').count()).toBeGreaterThan(0);
        if (SCREENS) {
          mkdirSync(SCREENS, { recursive: true });
          await page.screenshot({
            path: path.join(SCREENS, `cylinders-register-${viewport.width}.png`),
            fullPage: true,
          });
        }
        // The demo's cylinder whose scale disagrees with its visits.
        await page
          .getByTestId('cylinder-row')
          .filter({ has: page.locator('[data-flagged="true"]') })
          .first()
          .getByRole('link')
          .click();
        await page.getByRole('heading', { name: /^Cylinder / }).waitFor();
        await page.getByRole('heading', { name: 'Weighings' }).waitFor();
        // Kilograms and the fill by the one number rule of every screen (shared/format.ts).
        const id = /\/cylinders\/(\d+)$/.exec(page.url())![1];
        const { cylinder } = (await (await page.request.get(`/api/cylinders/${id}`)).json()) as CylinderDetailDto;
        const { contentKg, fillPct } = cylinder.ledger;
        if (contentKg != null && fillPct != null) {
          const fill = `About ${fmtKg(Math.max(0, contentKg))} of ${fmtKg(cylinder.capacityKg)} (${fmtPct(Math.min(100, Math.max(0, fillPct)))})`;
          await page.getByText(fill).waitFor();
        }
        if (SCREENS) {
          await page.evaluate(() => window.scrollTo(0, 0));
          await page.screenshot({ path: path.join(SCREENS, `cylinder-page-${viewport.width}.png`), fullPage: true });
        }
        expect([...b.pageErrors, ...b.consoleErrors]).toEqual([]);
      } finally {
        await b.close();
      }
    }
  });
});

describe('the handover pack', () => {
  it('lets an owner download a unit’s handover pack from its page', async () => {
    const unit = await createHistoryUnit(db);
    const b = await openBrowser({ viewport: DESKTOP });
    try {
      const { page } = b;
      await signInToApp(page, account('owner').email, DEMO_PASSWORD);
      await page.goto(`/units/${unit.id}`);
      await page.getByRole('button', { name: 'Handover pack' }).click();
      const download = page.waitForEvent('download');
      await page.getByRole('button', { name: 'Download PDF' }).click();
      const file = await download;
      expect(file.suggestedFilename()).toMatch(/^tightloop-handover-[A-Z]{4}\d{7}-[\d-]+\.pdf$/);
      const saved = await file.path();
      expect(readFileSync(saved!).subarray(0, 5).toString('latin1')).toBe('%PDF-');
      await page.getByText('Handover pack ready').waitFor();
      expect([...b.pageErrors, ...b.consoleErrors]).toEqual([]);
    } finally {
      await b.close();
    }
  });
});
