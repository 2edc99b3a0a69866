import AxeBuilder from '@axe-core/playwright';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { paths } from '../../src/config/paths';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { DESKTOP, openBrowser, PHONE, signInToApp } from '../support/browser';

const baseUrl = inject('baseUrl');
const engineer = DEMO_ACCOUNTS.find((a) => a.role === 'engineer')!;

describe('alert settings', () => {
  let desktop: Awaited<ReturnType<typeof openBrowser>>;
  let phone: Awaited<ReturnType<typeof openBrowser>>;

  beforeAll(async () => {
    desktop = await openBrowser({ viewport: DESKTOP });
    phone = await openBrowser({ viewport: PHONE });
  });
  afterAll(async () => {
    await desktop.close();
    await phone.close();
  });

  it('says what the engineer gets by default, keeps "All sites" for the digest after a reload, and goes back to the default', async () => {
    const { page } = desktop;
    await signInToApp(page, engineer.email, DEMO_PASSWORD);
    await page.goto(`${baseUrl}${paths.alertSettings.getHref()}`);
    await expect
      .poll(() => page.getByText(/^As a fleet engineer you get .* for your sites unless you change it\.$/).count())
      .toBe(1);

    const digest = page.getByRole('group', { name: 'Daily digest', exact: true });
    const allSites = digest.getByRole('checkbox', { name: /All sites/ });
    await allSites.focus();
    await page.keyboard.press('Space');
    await expect.poll(() => allSites.isChecked()).toBe(true);
    await expect.poll(() => digest.getByText('Every site, also sites added later.').isVisible()).toBe(true);
    const firstSite = page.getByTestId('alert-site').first();
    const siteDigest = firstSite.getByRole('checkbox', { name: /Daily digest/ });
    expect(await siteDigest.isChecked()).toBe(true);
    expect(await siteDigest.isDisabled()).toBe(true);

    await page.getByRole('button', { name: 'Save alert settings' }).click();
    await page.getByText('Saved. Mails follow these settings from now on.').waitFor();
    await page.reload();
    await digest.waitFor();
    expect(await allSites.isChecked()).toBe(true);
    expect(
      await page
        .getByTestId('alert-site')
        .last()
        .getByRole('checkbox', { name: /Daily digest/ })
        .isDisabled(),
    ).toBe(true);

    await digest.getByRole('button', { name: 'Use my default for “Daily digest”' }).click();
    expect(await allSites.isChecked()).toBe(false);
    await page.getByRole('button', { name: 'Save alert settings' }).click();
    await page.getByText('Saved. Mails follow these settings from now on.').waitFor();
    await page.reload();
    await digest.getByText(/^Your default: your sites/).waitFor();
    expect(await allSites.isChecked()).toBe(false);
  });

  it('has no serious accessibility problem on a phone', async () => {
    const { page } = phone;
    await signInToApp(page, engineer.email, DEMO_PASSWORD);
    await page.goto(`${baseUrl}${paths.alertSettings.getHref()}`);
    await page.getByRole('group', { name: 'Daily digest', exact: true }).waitFor();
    const { violations } = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21aa']).analyze();
    expect(violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => v.id)).toEqual([]);
  });
});
