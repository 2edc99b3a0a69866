import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { createDb } from '../../server/db/client';
import { users } from '../../server/db/schema';
import { hashPassword } from '../../server/lib/password';
import { newId } from '../../server/lib/ids';
import { DESKTOP, openBrowser, PHONE, signInThroughForm } from '../support/browser';

const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
afterAll(() => pool.end());

describe('signed-in devices and the password', () => {
  const email = `tomasz.veld.${Date.now()}@halyard.example`;
  const password = 'bilge-pump-lantern-31';
  const newPassword = 'quayside-crane-morning-77';
  let laptop: Awaited<ReturnType<typeof openBrowser>>;
  let phone: Awaited<ReturnType<typeof openBrowser>>;

  beforeAll(async () => {
    await db.insert(users).values({
      id: newId(),
      email,
      name: 'Tomasz Veld',
      role: 'engineer',
      passwordHash: await hashPassword(password),
    });
    laptop = await openBrowser({ viewport: DESKTOP });
    phone = await openBrowser({ viewport: PHONE });
  });
  afterAll(async () => {
    await laptop.close();
    await phone.close();
  });

  it('lists both devices, signs the phone out with the password, and the phone lands on sign-in', async () => {
    await signInThroughForm(phone.page, email, password);
    await phone.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Home' }).waitFor();
    await signInThroughForm(laptop.page, email, password);
    await laptop.page.getByTestId('current-user').click();
    await laptop.page.getByRole('heading', { name: 'Signed-in devices' }).waitFor();
    const devices = laptop.page.getByTestId('device-list').getByRole('listitem');
    await expect.poll(() => devices.count(), { timeout: 15_000 }).toBe(2);
    expect(await laptop.page.getByText('This device').count()).toBe(1);

    await laptop.page.getByLabel('Your password').fill(password);
    await laptop.page.getByRole('button', { name: /^Sign out Chrome/ }).click();
    await laptop.page.getByText('That device is signed out.').waitFor();
    await expect.poll(() => devices.count(), { timeout: 15_000 }).toBe(1);

    await phone.page.goto('/units');
    await phone.page.waitForURL(/\/sign-in/);
    expect(laptop.pageErrors).toEqual([]);
    expect(laptop.consoleErrors).toEqual([]);
  });

  it('refuses a common new password with the reason, then changes it', async () => {
    const { page } = laptop;
    const form = page.getByTestId('change-password');
    await form.getByLabel('Current password').fill(password);
    await form.getByLabel('New password', { exact: true }).fill('password1234');
    await form.getByLabel('Repeat the new password').fill('password1234');
    // The meter says why before saving; the server refuses it all the same.
    await form
      .getByTestId('password-strength')
      .getByText(/commonly used password/)
      .waitFor();
    await form.getByRole('button', { name: 'Change password' }).click();
    // …and its reason stands under the field as well as in the meter.
    await expect.poll(() => form.getByText(/commonly used password/).count(), { timeout: 15_000 }).toBe(2);

    await form.getByLabel('New password', { exact: true }).fill(newPassword);
    await form.getByLabel('Repeat the new password').fill(newPassword);
    await form.getByRole('button', { name: 'Change password' }).click();
    await form.getByText('Password changed.', { exact: false }).waitFor();

    await page.getByRole('button', { name: 'Sign out', exact: true }).click();
    await page.waitForURL(/\/sign-in/);
    await signInThroughForm(page, email, newPassword);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Home' }).waitFor();
    expect(laptop.pageErrors).toEqual([]);
  });
});
