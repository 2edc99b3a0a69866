import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { and, desc, eq, like } from 'drizzle-orm';
import { createDb } from '../../server/db/client';
import { devMailbox } from '../../server/db/schema';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { DESKTOP, openBrowser, PHONE, signInThroughForm } from '../support/browser';
import { linkIn } from '../support/mail';

const { db, pool } = createDb(inject('e2eDatabaseUrl'), { connectionLimit: 2 });
const baseUrl = inject('baseUrl');
const admin = DEMO_ACCOUNTS.find((a) => a.role === 'admin')!;

/** The e2e app's fake SMTP server files every mail in dev_mailbox; wait for the one to this address. */
async function mailTo(email: string, subject: string, timeoutMs = 15_000) {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const [mail] = await db
      .select()
      .from(devMailbox)
      .where(and(like(devMailbox.toHeader, `%${email}%`), eq(devMailbox.subject, subject)))
      .orderBy(desc(devMailbox.id))
      .limit(1);
    if (mail) return mail;
    if (Date.now() > until) throw new Error(`No mail to ${email} arrived`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

afterAll(() => pool.end());

describe('inviting a technician', () => {
  const email = `ines.fallow.${Date.now()}@halyard.example`;
  const password = 'tide-gauge-lantern-44';
  let adminBrowser: Awaited<ReturnType<typeof openBrowser>>;
  let techBrowser: Awaited<ReturnType<typeof openBrowser>>;

  beforeAll(async () => {
    adminBrowser = await openBrowser({ viewport: DESKTOP });
    techBrowser = await openBrowser({ viewport: PHONE });
  });
  afterAll(async () => {
    await adminBrowser.close();
    await techBrowser.close();
  });

  it('lets an admin invite from the People page and the technician set a password from the mail and sign in', async () => {
    const { page } = adminBrowser;
    await signInThroughForm(page, admin.email, DEMO_PASSWORD);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'People' }).click();
    await page.getByRole('button', { name: 'Add person' }).click();
    await page.getByLabel('Name', { exact: true }).fill('Ines Fallow');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Role', { exact: true }).selectOption('technician');
    await page.getByRole('button', { name: 'Add person' }).click();
    await page.getByText('Ines Fallow was added as technician').waitFor();

    const mail = await mailTo(email, 'You are invited to Tightloop');
    const link = linkIn(mail.textBody, `${baseUrl}/invite/`);

    const tech = techBrowser.page;
    await tech.goto(link);
    await tech.getByText(`choose a password for ${email}`, { exact: false }).waitFor();
    await tech.getByLabel('New password', { exact: true }).fill(password);
    await tech.getByLabel('Repeat the password', { exact: true }).fill(password);
    await tech.getByRole('button', { name: 'Set password and sign in' }).click();
    await tech.waitForURL(`${baseUrl}/`);
    await tech.getByTestId('current-user').getByText('Ines Fallow').waitFor();

    // The password works for an ordinary sign-in, and the link does not work a second time.
    await tech.getByRole('button', { name: 'Sign out' }).click();
    await tech.waitForURL(/\/sign-in/);
    await signInThroughForm(tech, email, password);
    await tech.waitForURL(`${baseUrl}/`);
    await tech.getByRole('button', { name: 'Sign out' }).click();
    await tech.waitForURL(/\/sign-in/);
    await tech.goto(link);
    const problem = tech.getByTestId('link-problem');
    await problem.waitFor();
    expect(await problem.getAttribute('data-code')).toBe('link_used');
    expect(adminBrowser.pageErrors).toEqual([]);
    expect(adminBrowser.consoleErrors).toEqual([]);
    expect(techBrowser.pageErrors).toEqual([]);
    expect(techBrowser.consoleErrors).toEqual([]);
  });

  it('resets a forgotten password through the link from the sign-in page', async () => {
    const tech = techBrowser.page;
    await tech.goto('/sign-in');
    await tech.getByRole('link', { name: 'Forgot password?' }).click();
    // The page is loaded on demand: filling before it shows would type into the sign-in form's e-mail field.
    await tech.getByRole('button', { name: 'Send me a link' }).waitFor();
    await tech.getByLabel('E-mail').fill(email);
    await tech.getByRole('button', { name: 'Send me a link' }).click();
    await tech.getByText('Check your e-mail').waitFor();

    const mail = await mailTo(email, 'Reset your Tightloop password');
    const link = linkIn(mail.textBody, `${baseUrl}/reset/`);
    await tech.goto(link);
    await tech.getByLabel('New password', { exact: true }).fill('harbour-light-keeper-9');
    await tech.getByLabel('Repeat the password', { exact: true }).fill('harbour-light-keeper-9');
    await tech.getByRole('button', { name: 'Save password and sign in' }).click();
    await tech.waitForURL(`${baseUrl}/`);
    await tech.getByTestId('current-user').getByText('Ines Fallow').waitFor();
    expect(techBrowser.pageErrors).toEqual([]);
    expect(techBrowser.consoleErrors).toEqual([]);
  });

  it('shows the administrator the mail in the development mailbox', async () => {
    const { page } = adminBrowser;
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Mailbox' }).click();
    await page.getByRole('heading', { name: 'Mailbox' }).waitFor();
    await page.getByTestId('mailbox-item').filter({ hasText: email }).first().waitFor();
    expect(adminBrowser.pageErrors).toEqual([]);
    expect(adminBrowser.consoleErrors).toEqual([]);
  });
});
