import AxeBuilder from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { asc } from 'drizzle-orm';
import { createDb } from '../../server/db/client';
import { units } from '../../server/db/schema';
import { can, ROLES, type Role } from '../../shared/permissions';
import { paths } from '../../src/config/paths';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { DESKTOP, openBrowser, PHONE, signInToApp } from '../support/browser';

const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
afterAll(() => pool.end());

type PathKey = keyof typeof paths;
type Target = { key: PathKey; href: string };

// Pages that only make sense signed out (each one signed in sends the person home, already checked there).
const SIGNED_OUT_ONLY: PathKey[] = ['signIn', 'forgotPassword', 'invitation', 'passwordReset'];
// Every page visited signed out, with made-up tokens where the address carries one.
const PUBLIC: PathKey[] = [...SIGNED_OUT_ONLY, 'unsubscribe'];
const BLOCKING = new Set(['serious', 'critical']);
const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];

let unit: { id: number; qrToken: string };

beforeAll(async () => {
  [unit] = await db.select({ id: units.id, qrToken: units.qrToken }).from(units).orderBy(asc(units.id)).limit(1);
});

/** Every address of paths.ts with its parameters filled: a demo unit for ids, its label for the QR address. */
function hrefOf(key: PathKey): string {
  const p = paths[key].path;
  if (key === 'labelLink') return `/u/${unit.qrToken}`;
  return p.replace(/:id|:unitId/g, String(unit.id)).replace(/:token/g, 'a-made-up-token-for-the-page');
}

function pagesFor(role: Role | null): Target[] {
  return (Object.keys(paths) as PathKey[])
    .filter((key) => {
      if (role === null) return PUBLIC.includes(key);
      if (SIGNED_OUT_ONLY.includes(key)) return false;
      const permission = (paths[key] as { permission?: Parameters<typeof can>[1] }).permission;
      return !permission || can({ role }, permission);
    })
    .map((key) => ({ key, href: hrefOf(key) }));
}

/** Waits until the page has stopped fetching and no spinner turns, so axe sees what a person reads. */
async function settle(page: Page) {
  await page
    .locator('h1')
    .first()
    .waitFor({ timeout: 15_000 })
    .catch(() => undefined);
  await page.waitForLoadState('networkidle', { timeout: 3_000 }).catch(() => undefined);
  await page
    .locator('.animate-spin')
    .first()
    .waitFor({ state: 'hidden', timeout: 10_000 })
    .catch(() => undefined);
}

async function violationsOn(page: Page, target: Target) {
  const started = Date.now();
  await page.goto(target.href);
  await settle(page);
  // The WCAG 2.1 A/AA rules; axe's best-practice extras are left out, which also keeps a long unit page quick.
  const result = await new AxeBuilder({ page }).withTags(WCAG_TAGS).analyze();
  if (process.env.AXE_TIMES)
    console.log(
      target.key,
      Date.now() - started,
      'ms',
      result.violations.map((v) => `${v.impact} ${v.id}`),
    );
  return result.violations
    .filter((v) => BLOCKING.has(v.impact ?? ''))
    .map((v) => ({
      page: `${target.key} ${page.url().replace(inject('baseUrl'), '')}`,
      rule: v.id,
      impact: v.impact,
      help: v.help,
      nodes: v.nodes.slice(0, 3).map((n) => n.target.join(' ')),
    }));
}

async function checkAll(role: Role | null, viewport: { width: number; height: number }) {
  const browser = await openBrowser({ viewport });
  try {
    const { page } = browser;
    if (role) {
      const account = DEMO_ACCOUNTS.find((a) => a.role === role)!;
      await signInToApp(page, account.email, DEMO_PASSWORD);
    }
    const found = [];
    for (const target of pagesFor(role)) found.push(...(await violationsOn(page, target)));
    expect(found).toEqual([]);
    expect(browser.pageErrors).toEqual([]);
  } finally {
    await browser.close();
  }
}

// Every role on a phone; on a desktop the engineer and the administrator, who between them open every page (the
// technician's and owner's desktop pages are the same pages with fewer buttons), keeping the run near ten minutes.
const DESKTOP_ROLES: Role[] = ['engineer', 'admin'];

describe('accessibility (axe-core): no serious or critical violation on any page', () => {
  for (const viewport of [PHONE, DESKTOP]) {
    const size = `${viewport.width} px`;
    it(`every page a signed-out person can open, at ${size}`, () => checkAll(null, viewport), 180_000);
    for (const role of viewport === PHONE ? ROLES : DESKTOP_ROLES) {
      it(`every page a ${role} can open, at ${size}`, () => checkAll(role, viewport), 300_000);
    }
  }
});
