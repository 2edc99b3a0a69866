import { mkdtempSync, mkdirSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Locator, type Page } from 'playwright-core';
import { inject } from 'vitest';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../../scripts/lib/chromium';

export { CHROMIUM_ARGS };

// Fixed once: os.tmpdir() follows TMPDIR, which is pointed here below. Short, because Chromium's socket path is limited.
const BROWSER_TMP = path.join(os.tmpdir(), 'tightloop-e2e');

export const PHONE = { width: 390, height: 844 };
export const DESKTOP = { width: 1280, height: 900 };

/** A fresh Chromium profile per context (launchPersistentContext; launch() refuses --user-data-dir). */
export async function openBrowser(opts: { viewport?: { width: number; height: number }; extraArgs?: string[] } = {}) {
  mkdirSync(BROWSER_TMP, { recursive: true });
  process.env.TMPDIR = BROWSER_TMP;
  const tmp = BROWSER_TMP;
  const profile = mkdtempSync(path.join(tmp, 'profile-'));
  const launch = () =>
    chromium.launchPersistentContext(profile, {
      executablePath: CHROMIUM_PATH,
      args: [...CHROMIUM_ARGS, ...(opts.extraArgs ?? [])],
      viewport: opts.viewport ?? PHONE,
      baseURL: inject('baseUrl'),
    });
  let context: BrowserContext;
  try {
    context = await launch();
  } catch {
    // A loaded two-core machine occasionally loses a Chromium start; one more try is enough.
    await new Promise((r) => setTimeout(r, 1000));
    context = await launch();
  }
  const page: Page = context.pages()[0] ?? (await context.newPage());
  const pageErrors: string[] = [];
  page.on('pageerror', (e) => pageErrors.push(e.message));
  // What the app logs as an error in the browser console (React's warnings among them); the browser's own line for
  // each answer with an error status is left out, since the tests ask for many of those on purpose.
  const consoleErrors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error' && !m.text().startsWith('Failed to load resource:')) consoleErrors.push(m.text());
  });
  return {
    context,
    page,
    pageErrors,
    consoleErrors,
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

/** Signs in through the form and waits for the signed-in layout's main navigation. */
export async function signInToApp(page: Page, email: string, password: string) {
  await signInThroughForm(page, email, password);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}

/**
 * An input's placeholder width in its own font against the room inside the box. The placeholder is drawn inside the
 * input, where scrollWidth cannot see it, so it is measured on a probe.
 */
export function placeholderRoom(input: Locator): Promise<{ text: number; room: number }> {
  return input.evaluate((el: HTMLInputElement) => {
    const box = getComputedStyle(el);
    const ph = getComputedStyle(el, '::placeholder');
    const probe = document.createElement('span');
    probe.textContent = el.placeholder;
    Object.assign(probe.style, {
      position: 'absolute',
      whiteSpace: 'pre',
      fontFamily: ph.fontFamily,
      fontSize: ph.fontSize,
      fontWeight: ph.fontWeight,
      letterSpacing: ph.letterSpacing,
      textTransform: ph.textTransform,
    });
    document.body.append(probe);
    const text = probe.getBoundingClientRect().width;
    probe.remove();
    return { text, room: el.clientWidth - parseFloat(box.paddingLeft) - parseFloat(box.paddingRight) };
  });
}
