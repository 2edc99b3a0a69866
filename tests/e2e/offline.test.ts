// Issue 19: a technician with no signal. The app shell comes from the service worker, units seen before from the
// query cache kept in IndexedDB, and visits (with their photos) wait in IndexedDB until the connection is back.
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { count, eq } from 'drizzle-orm';
import sharp from 'sharp';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { createDb } from '../../server/db/client';
import { attachments, visits } from '../../server/db/schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { signInToApp } from '../support/browser';
import { phoneProfile, readyForOffline } from '../support/offline-phone';
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

describe('working with no signal', () => {
  it('opens a unit seen before by its label offline, keeps a visit with a photo through a browser restart, and sends it exactly once', async () => {
    const phone = phoneProfile();
    let session = await phone.open();
    try {
      const unit = await createHistoryUnit(db);
      await signInToApp(session.page, technician.email, DEMO_PASSWORD);
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
      session = await phone.open({ offline: true });
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
      await signInToApp(session.page, technician.email, DEMO_PASSWORD);
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
    // The unit page's data is in the entry; its code (page, history and figures) is the one chunk it loads at once.
    const keys = new Set([...closure(entryKey), ...closure('src/app/routes/units/unit.tsx')]);
    const files = new Set([...keys].flatMap((k) => [manifest[k].file, ...(manifest[k].css ?? [])]));
    // The three preloaded core faces (scripts/subset-fonts.ts), and the label's boot script (vite.config.ts).
    for (const f of readdirSync(path.join(DIST, 'assets')))
      if (/^(work-sans-(400|600|700)-core|label-boot)-.+\.(woff2|js)$/.test(f)) files.add(`assets/${f}`);
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
