import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { inArray } from 'drizzle-orm';
import { createDb } from '../../server/db/client';
import { units } from '../../server/db/schema';
import { newToken } from '../../server/lib/ids';
import { formatContainerNumber } from '../../shared/domain';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { openBrowser, PHONE, placeholderRoom, signInThroughForm } from '../support/browser';
import { halyardNumber, withWrongCheckDigit } from '../support/units';
import { writeQrY4m, zxingReadsFrame } from '../support/y4m';

const technician = DEMO_ACCOUNTS.find((a) => a.role === 'technician')!;
const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
const tmp = mkdtempSync(path.join(os.tmpdir(), 'tightloop-scan-'));
let unit: { id: number; containerNumber: string; qrToken: string };

/** A unit of our own, on a serial the demo fleet does not use, with a label token that passes `keep`. */
async function createUnit(keep: (qrToken: string) => boolean) {
  const candidates = Array.from({ length: 20 }, (_, i) => halyardNumber(990_000 + ((Date.now() + i * 37) % 9_999)));
  const taken = new Set(
    (await db.select({ n: units.containerNumber }).from(units).where(inArray(units.containerNumber, candidates))).map(
      (r) => r.n,
    ),
  );
  const containerNumber = candidates.find((c) => !taken.has(c))!;
  let qrToken = newToken();
  while (!keep(qrToken)) qrToken = newToken();
  const [{ id }] = await db
    .insert(units)
    .values({ containerNumber, refrigerant: 'R-134a', nominalChargeKg: 4.5, qrToken })
    .$returningId();
  return { id, containerNumber, qrToken };
}

const labelText = (qrToken: string) => `${inject('baseUrl')}/u/${qrToken}`;

/** Signs a technician in with the fake camera showing the label, opens Scan, and waits for the unit page. */
async function scanLabel(target: { id: number; containerNumber: string; qrToken: string }) {
  const video = path.join(tmp, `label-${target.id}.y4m`);
  writeQrY4m(video, labelText(target.qrToken));
  const browser = await openBrowser({
    extraArgs: [
      '--use-fake-ui-for-media-stream',
      '--use-fake-device-for-media-stream',
      `--use-file-for-fake-video-capture=${video}`,
    ],
  });
  try {
    const { page } = browser;
    await signInThroughForm(page, technician.email, DEMO_PASSWORD);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Scan' }).click();
    // The lazy scanner chunk, camera start and decoding can take a while on a loaded two-core machine.
    await page.waitForURL(new RegExp(`/units/${target.id}$`), { timeout: 60_000 });
    await page.getByRole('heading', { level: 1, name: formatContainerNumber(target.containerNumber) }).waitFor();
    expect(browser.pageErrors).toEqual([]);
    expect(browser.consoleErrors).toEqual([]);
  } finally {
    await browser.close();
  }
}

beforeAll(async () => {
  unit = await createUnit((token) => zxingReadsFrame(labelText(token)));
});
afterAll(async () => {
  await pool.end();
  rmSync(tmp, { recursive: true, force: true });
});

describe('scanning a label', () => {
  it('reads the QR label through the camera and lands on the unit page', async () => {
    await scanLabel(unit);
  });

  it('reads a label whose code zxing cannot place, through the second reader', async () => {
    // About one code in ten has data that zxing's finder search settles on instead of the real corners, on every
    // frame; this label is one of those, so only the fallback reader can open it.
    await scanLabel(await createUnit((token) => !zxingReadsFrame(labelText(token))));
  });

  it('says which check digit a typed number implies, then opens the unit once it is right', async () => {
    const browser = await openBrowser();
    try {
      const { page } = browser;
      await signInThroughForm(page, technician.email, DEMO_PASSWORD);
      await page.getByRole('link', { name: 'Home' }).first().waitFor();
      await page.goto('/scan');
      const { number, expected } = withWrongCheckDigit(unit.containerNumber);
      const field = page.getByLabel('Container number', { exact: true });
      await field.fill(number.toLowerCase());
      await page.getByText(`Check digit should be ${expected}`).waitFor();
      await page.getByRole('button', { name: 'Open unit' }).click();
      await page.getByText(`gives ${expected}, not ${number.charAt(10)}`).waitFor();
      expect(page.url()).toMatch(/\/scan$/);

      await field.fill(formatContainerNumber(unit.containerNumber));
      await page.getByText('Valid ISO 6346 number').waitFor();
      await page.getByRole('button', { name: 'Open unit' }).click();
      await page.waitForURL(new RegExp(`/units/${unit.id}$`));
      expect(browser.pageErrors).toEqual([]);
      expect(browser.consoleErrors).toEqual([]);
    } finally {
      await browser.close();
    }
  });

  it('fits the number box’s example and a typed number inside the box on a 390 px phone', async () => {
    const browser = await openBrowser({ viewport: PHONE });
    try {
      const { page } = browser;
      await signInThroughForm(page, technician.email, DEMO_PASSWORD);
      await page.getByRole('link', { name: 'Home' }).first().waitFor();
      await page.goto('/scan');
      const field = page.getByLabel('Container number', { exact: true });
      await field.waitFor();
      const placeholder = await placeholderRoom(field);
      expect(placeholder.text).toBeGreaterThan(0);
      expect(placeholder.text).toBeLessThanOrEqual(placeholder.room);
      await field.fill(formatContainerNumber(unit.containerNumber));
      const typed = await field.evaluate((input: HTMLInputElement) => [input.scrollWidth, input.clientWidth]);
      expect(typed[0]).toBeLessThanOrEqual(typed[1]);
    } finally {
      await browser.close();
    }
  });

  it('keeps a foreign QR code’s long address inside its message on a 390 px phone', async () => {
    // A supplier's long link, as printed on a spare part's box: not a Tightloop label.
    let text = '';
    for (let i = 0; !text || !zxingReadsFrame(text); i++)
      text = `https://catalogue.parts-supplier.example/products/reefer/controller/spare-part-0042-${i}?ref=QRCODE0123456789ABCDEFGHIJKLMNOP`;
    const video = path.join(tmp, 'foreign.y4m');
    writeQrY4m(video, text);
    const browser = await openBrowser({
      viewport: PHONE,
      extraArgs: [
        '--use-fake-ui-for-media-stream',
        '--use-fake-device-for-media-stream',
        `--use-file-for-fake-video-capture=${video}`,
      ],
    });
    try {
      const { page } = browser;
      await signInThroughForm(page, technician.email, DEMO_PASSWORD);
      await page.getByRole('link', { name: 'Home' }).first().waitFor();
      await page.goto('/scan');
      const alert = page.getByRole('status').filter({ hasText: 'That QR code is not a Tightloop label' });
      await alert.waitFor({ timeout: 60_000 });
      const fits = await alert.evaluate(
        (box) =>
          [box, ...box.querySelectorAll('*')].every((el) => el.scrollWidth <= el.clientWidth || el.clientWidth === 0) &&
          box.getBoundingClientRect().right <= document.documentElement.clientWidth,
      );
      expect(fits).toBe(true);
      expect(await alert.textContent()).toContain(text.slice(0, 40));
      expect(browser.pageErrors).toEqual([]);
      expect(browser.consoleErrors).toEqual([]);
    } finally {
      await browser.close();
    }
  });

  it('opens the unit from the label address itself, after signing in', async () => {
    const browser = await openBrowser();
    try {
      const { page } = browser;
      await page.goto(`/u/${unit.qrToken}`);
      await page.waitForURL(/\/sign-in\?next=/);
      await page.getByLabel('E-mail').fill(technician.email);
      await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL(new RegExp(`/units/${unit.id}$`));
      await page.goto(`/u/${'x'.repeat(43)}`);
      await page.getByText('This label is not linked to any unit').waitFor();
    } finally {
      await browser.close();
    }
  });
});
