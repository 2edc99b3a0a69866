import { mkdtempSync, mkdirSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { inject } from 'vitest';

export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export const PHONE = { width: 390, height: 844 };
export const DESKTOP = { width: 1280, height: 900 };

/** A fresh Chromium profile per context (launchPersistentContext; launch() refuses --user-data-dir). */
export async function openBrowser(opts: { viewport?: { width: number; height: number }; extraArgs?: string[] } = {}) {
  const tmp = path.join(os.tmpdir(), 'tightloop-e2e');
  mkdirSync(tmp, { recursive: true });
  process.env.TMPDIR = tmp;
  const profile = mkdtempSync(path.join(tmp, 'profile-'));
  const context: BrowserContext = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    args: [...CHROMIUM_ARGS, ...(opts.extraArgs ?? [])],
    viewport: opts.viewport ?? PHONE,
    baseURL: inject('baseUrl'),
  });
  const page: Page = context.pages()[0] ?? (await context.newPage());
  const pageErrors: string[] = [];
  page.on('pageerror', (e) => pageErrors.push(e.message));
  return {
    context,
    page,
    pageErrors,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

export async function signInThroughForm(page: Page, email: string, password: string) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}
