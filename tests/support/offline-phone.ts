// A phone for the offline journeys (issue 19): a browser profile that survives closing the browser (same IndexedDB,
// same service worker), and a wait until the app can open with no signal.
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { inject } from 'vitest';
import { CHROMIUM_ARGS, PHONE } from './browser';

/** A phone whose browser can be closed and opened again on the same profile (same IndexedDB, same service worker). */
export function phoneProfile() {
  const tmp = path.join(os.tmpdir(), 'tightloop-e2e');
  mkdirSync(tmp, { recursive: true });
  process.env.TMPDIR = tmp;
  const dir = mkdtempSync(path.join(tmp, 'profile-'));
  const errors: string[] = [];
  return {
    errors,
    /** `offline`: with no network from the first moment (a page the browser reopens by itself must not get any). */
    async open({ offline = false } = {}): Promise<{ context: BrowserContext; page: Page }> {
      const context = await chromium.launchPersistentContext(dir, {
        offline,
        executablePath: '/usr/bin/chromium',
        args: CHROMIUM_ARGS,
        viewport: PHONE,
        baseURL: inject('baseUrl'),
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
export async function readyForOffline(page: Page) {
  await page.evaluate(async () => {
    await navigator.serviceWorker.ready;
  });
  await page.waitForTimeout(1500);
  // Controlled from the next navigation on; the cache is written at most once a second.
  await page.reload();
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null);
  await page.waitForTimeout(1500);
}
