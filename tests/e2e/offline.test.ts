// Issue 19: a technician with no signal. The app shell comes from the service worker, units seen before from the
// query cache kept in IndexedDB, and visits (with their photos) wait in IndexedDB until the connection is back.
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { count, eq } from 'drizzle-orm';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import sharp from 'sharp';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { createDb } from '../../server/db/client';
import { attachments, visits } from '../../server/db/schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { CHROMIUM_ARGS, PHONE, signInThroughForm } from '../support/browser';
import { createHistoryUnit, recordVisits } from '../support/history';
import { PROJECT_ROOT } from '../../scripts/lib/mariadb';

const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
afterAll(() => pool.end());

const baseUrl = inject('baseUrl');
const DIST = path.join(PROJECT_ROOT, 'dist');
const technician = DEMO_ACCOUNTS.find((a) => a.role === 'technician')!;
const DAY = 86_400_000;
const at = (msAgo: number) => new Date(Date.now() - msAgo).toISOString();
const countOf = async (table: typeof visits | typeof attachments, unitId: number) =>
  Number((await db.select({ n: count() }).from(table).where(eq(table.unitId, unitId)))[0].n);

/** A phone whose browser can be closed and opened again on the same profile (same IndexedDB, same service worker). */
function phoneProfile() {
  const tmp = path.join(os.tmpdir(), 'tightloop-e2e');
  mkdirSync(tmp, { recursive: true });
  process.env.TMPDIR = tmp;
  const dir = mkdtempSync(path.join(tmp, 'profile-'));
  const errors: string[] = [];
  return {
    errors,
    async open(): Promise<{ context: BrowserContext; page: Page }> {
      const context = await chromium.launchPersistentContext(dir, {
        executablePath: '/usr/bin/chromium',
        args: CHROMIUM_ARGS,
        viewport: PHONE,
        baseURL: baseUrl,
      });
      const page = context.pages()[0] ?? (await context.newPage());
      page.on('pageerror', (e) => errors.push(e.message));
      page.on('console', (m) => {
        // Offline, the browser itself logs every refused request; only the app's own errors count.
        if (m.type() === 'error' && !/^Failed to load resource|ERR_INTERNET_DISCONNECTED/.test(m.text()))
          errors.push(m.text());
      });
      return { context, page };
    },
    remove: () => rmSync(dir, { recursive: true, force: true }),
  };
}

/** Until the service worker controls the page and the query cache has been written to IndexedDB. */
async function readyForOffline(page: Page) {
  await page.evaluate(async () => {
    await navigator.serviceWorker.ready;
  });
  await page.waitForTimeout(1500);
  // Controlled from the next navigation on; the cache is written at most once a second.
  await page.reload();
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null);
  await page.waitForTimeout(1500);
}

describe('working with no signal', () => {
  it('opens a unit seen before by its label offline, keeps a visit with a photo through a browser restart, and sends it exactly once', async () => {
    const phone = phoneProfile();
    let session = await phone.open();
    try {
      const unit = await createHistoryUnit(db);
      await signInThroughForm(session.page, technician.email, DEMO_PASSWORD);
      await session.page.getByRole('navigation', { name: 'Main' }).waitFor();
      await recordVisits(session.page.request, baseUrl, unit.id, [
        { at: at(30 * DAY), events: [{ kind: 'top_up', kg: 0.5, cylinder: 'CYL-OFF-1' }] },
      ]);
      // Seen once with a connection, as a scanned label opens it.
      await session.page.goto(`/u/${unit.qrToken}`);
      await session.page.waitForURL(new RegExp(`/units/${unit.id}$`));
      await session.page.getByTestId('unit-figures').waitFor();
      await session.page.getByTestId('history-entry').first().waitFor();
      await readyForOffline(session.page);

      // No signal at all: the label's address opens the unit with its figures and history.
      await session.context.setOffline(true);
      await session.page.goto(`/u/${unit.qrToken}`);
      await session.page.waitForURL(new RegExp(`/units/${unit.id}$`));
      await session.page.getByTestId('unit-figures').waitFor();
      await session.page.getByTestId('history-entry').first().waitFor();
      await expect.poll(() => session.page.getByTestId('connection-status').getAttribute('data-online')).toBe('false');

      await session.page.getByRole('link', { name: 'Record a visit' }).first().click();
      await session.page.getByRole('button', { name: 'Add Note' }).click();
      await session.page
        .getByRole('textbox', { name: 'Note', exact: true })
        .fill('Condenser fan guard cracked; taped for now.');
      await session.page.getByRole('button', { name: /Save visit/ }).click();
      await session.page.getByText('Kept on this phone: no connection right now').waitFor();
      const photo = await sharp({ create: { width: 80, height: 60, channels: 3, background: '#a9d62e' } })
        .png()
        .toBuffer();
      await session.page
        .getByTestId('queued-attach-0')
        .setInputFiles({ name: 'fan-guard.png', mimeType: 'image/png', buffer: photo });
      await session.page.getByText('1 photo waiting with the visit').waitFor();
      await expect.poll(() => session.page.getByTestId('connection-status').getAttribute('data-waiting')).toBe('1');

      // The browser is closed and opened again, still with no signal: the visit and its photo are still there.
      await session.context.close();
      session = await phone.open();
      await session.context.setOffline(true);
      await session.page.goto(`/units/${unit.id}`);
      await session.page.getByTestId('unit-figures').waitFor();
      await expect.poll(() => session.page.getByTestId('connection-status').getAttribute('data-waiting')).toBe('1');
      expect(await countOf(visits, unit.id)).toBe(1);

      // Back online: the visit goes out by itself, once, and its photo with it.
      await session.context.setOffline(false);
      await expect.poll(() => countOf(visits, unit.id), { timeout: 20_000 }).toBe(2);
      await expect.poll(() => countOf(attachments, unit.id), { timeout: 20_000 }).toBe(1);
      await expect.poll(() => session.page.getByTestId('connection-status').getAttribute('data-waiting')).toBe('0');
      await session.page.getByRole('img', { name: 'Photo: fan-guard.png' }).waitFor();
      // And again after a reload (from the cache kept on the phone or the server): still one visit, one photo.
      await session.page.waitForTimeout(1500);
      await session.page.reload();
      await session.page.getByRole('img', { name: 'Photo: fan-guard.png' }).waitFor();
      expect(await countOf(visits, unit.id)).toBe(2);
      expect(await countOf(attachments, unit.id)).toBe(1);
      expect(phone.errors).toEqual([]);
    } finally {
      await session.context.close().catch(() => undefined);
      phone.remove();
    }
  });

  it('says so when a label never opened on this phone is opened offline, and opens it once the signal is back', async () => {
    const phone = phoneProfile();
    const session = await phone.open();
    try {
      const seen = await createHistoryUnit(db);
      const unseen = await createHistoryUnit(db);
      await signInThroughForm(session.page, technician.email, DEMO_PASSWORD);
      await session.page.getByRole('navigation', { name: 'Main' }).waitFor();
      await session.page.goto(`/units/${seen.id}`);
      await session.page.getByTestId('service-history').waitFor();
      await readyForOffline(session.page);

      await session.context.setOffline(true);
      await session.page.goto(`/u/${unseen.qrToken}`);
      await session.page.getByText('No signal, and this label has not been opened on this phone before').waitFor();
      await session.context.setOffline(false);
      await session.page.waitForURL(new RegExp(`/units/${unseen.id}$`), { timeout: 20_000 });
      await session.page.getByTestId('service-history').waitFor();
      expect(phone.errors).toEqual([]);
    } finally {
      await session.context.close();
      phone.remove();
    }
  });
});

describe('first load of a unit page (budget)', () => {
  it('sends a production entry script of at most 150 KB compressed, cached for a year', async () => {
    const phone = phoneProfile();
    const { context, page } = await phone.open();
    try {
      const cdp = await context.newCDPSession(page);
      await cdp.send('Network.enable');
      const sizes = new Map<string, number>();
      const urls = new Map<string, { url: string; headers: Record<string, string> }>();
      cdp.on('Network.responseReceived', (e) =>
        urls.set(e.requestId, { url: e.response.url, headers: e.response.headers }),
      );
      cdp.on('Network.loadingFinished', (e) => sizes.set(e.requestId, e.encodedDataLength));
      await page.goto('/sign-in');
      await page.getByLabel('E-mail').waitFor();
      const entryPath = /<script type="module"[^>]*src="([^"]+)"/.exec(
        readFileSync(path.join(DIST, 'index.html'), 'utf8'),
      )![1];
      const [id, entry] = [...urls].find(([, r]) => new URL(r.url).pathname === entryPath)!;
      const header = (name: string) => Object.entries(entry.headers).find(([k]) => k.toLowerCase() === name)?.[1];
      expect(header('content-encoding')).toMatch(/^(br|gzip)$/);
      expect(header('cache-control')).toBe('public, max-age=31536000, immutable');
      expect(sizes.get(id)! / 1024).toBeLessThanOrEqual(150);
      expect(readFileSync(path.join(DIST, entryPath), 'utf8')).not.toContain('jsxDEV');
      expect(phone.errors).toEqual([]);
    } finally {
      await context.close();
      phone.remove();
    }
  });

  it("keeps the unit page's first load (shell, figures, fonts; not the charts, which come after) at most 250 KB", () => {
    type Chunk = { file: string; isEntry?: boolean; imports?: string[]; css?: string[] };
    const manifest = JSON.parse(readFileSync(path.join(DIST, '.vite', 'manifest.json'), 'utf8')) as Record<
      string,
      Chunk
    >;
    const closure = (key: string, seen = new Set<string>()): Set<string> => {
      if (seen.has(key)) return seen;
      seen.add(key);
      for (const i of manifest[key].imports ?? []) closure(i, seen);
      return seen;
    };
    const entryKey = Object.keys(manifest).find((k) => manifest[k].isEntry)!;
    // The unit page is in the entry; its history (with the figures) is the one chunk it loads at once.
    const keys = new Set([...closure(entryKey), ...closure('src/features/history/components/service-history.tsx')]);
    const files = new Set([...keys].flatMap((k) => [manifest[k].file, ...(manifest[k].css ?? [])]));
    // The weights the app uses (font-normal, font-semibold, font-bold), latin only.
    for (const f of readdirSync(path.join(DIST, 'assets')))
      if (/^work-sans-latin-(400|600|700)-normal-.+\.woff2$/.test(f)) files.add(`assets/${f}`);
    files.add('index.html');
    const wire = (f: string) => {
      const br = path.join(DIST, `${f}.br`);
      return existsSync(br) ? statSync(br).size : statSync(path.join(DIST, f)).size;
    };
    const kb = [...files].reduce((s, f) => s + wire(f), 0) / 1024;
    expect(kb, [...files].map((f) => `${f} ${wire(f)}`).join('\n')).toBeLessThanOrEqual(250);
    expect([...files].some((f) => /unit-timeline|pressure-trend/.test(f))).toBe(false);
  });
});
