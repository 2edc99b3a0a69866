import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { DESKTOP, openBrowser, PHONE, signInThroughForm, signInToApp } from '../support/browser';

const account = (role: string) => DEMO_ACCOUNTS.find((a) => a.role === role)!;

describe('signing in by role', () => {
  let browser: Awaited<ReturnType<typeof openBrowser>>;
  beforeAll(async () => {
    browser = await openBrowser({ viewport: PHONE });
  });
  afterAll(() => browser.close());

  it('signs a technician in on a phone and refuses them the People page', async () => {
    const { page } = browser;
    await signInThroughForm(page, account('technician').email, DEMO_PASSWORD);
    const nav = page.getByRole('navigation', { name: 'Main' });
    await nav.getByRole('link', { name: 'Home' }).waitFor();
    expect(await nav.getByRole('link', { name: 'People' }).count()).toBe(0);
    await page.goto('/people');
    await page.getByTestId('not-allowed').waitFor();
    expect(browser.pageErrors).toEqual([]);
    expect(browser.consoleErrors).toEqual([]);
  });

  it('sends a signed-out visitor to sign in and back to the page they asked for', async () => {
    const { page } = browser;
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);
    await page.goto('/people');
    await page.waitForURL(/\/sign-in\?next=%2Fpeople/);
    await page.getByLabel('E-mail').fill(account('admin').email);
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/people$/);
    await page.getByTestId('user-row').first().waitFor();
    expect(await page.getByTestId('user-row').count()).toBeGreaterThanOrEqual(4);
  });
});

describe('navigation by role on a desktop', () => {
  for (const [role, shows, hides] of [
    ['engineer', ['Home', 'Units'], ['People']],
    ['owner', ['Home', 'Units'], ['People']],
    ['admin', ['Home', 'Units', 'People'], []],
  ] as const) {
    it(`shows the ${role} the entries their role allows`, async () => {
      const b = await openBrowser({ viewport: DESKTOP });
      try {
        await signInThroughForm(b.page, account(role).email, DEMO_PASSWORD);
        const nav = b.page.getByRole('navigation', { name: 'Main' });
        await nav.getByRole('link', { name: 'Home' }).waitFor();
        for (const label of shows) expect(await nav.getByRole('link', { name: label, exact: true }).count()).toBe(1);
        for (const label of hides) expect(await nav.getByRole('link', { name: label, exact: true }).count()).toBe(0);
      } finally {
        await b.close();
      }
    });
  }
});

describe('unknown pages', () => {
  it('shows a real 404 page', async () => {
    const b = await openBrowser({ viewport: PHONE });
    try {
      await signInToApp(b.page, account('owner').email, DEMO_PASSWORD);
      await b.page.goto('/no/such/page');
      await expect
        .poll(() => b.page.getByRole('heading').first().textContent(), { timeout: 15_000 })
        .toMatch(/no page|not found/i);
    } finally {
      await b.close();
    }
  });
});
