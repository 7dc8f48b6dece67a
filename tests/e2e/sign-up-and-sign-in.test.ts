import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { beforeEach, describe, expect, inject, it } from 'vitest';
import { DEMO_PASSWORD, demoAccounts } from '../../server/dev/seed';
import { jobInput, uniqueEmail } from '../factories';
import { confirmationLink } from '../setup/mail-links';
import { artifactsDir } from '../setup/browser';
import { browserSuite } from '../setup/e2e-suite';

const suite = browserSuite();
const { url, consoleErrors } = suite;
let page: Page;

beforeEach(async () => {
  page = await suite.newTabletPage();
});

async function waitForMail(to: string, subject: string) {
  const deadline = Date.now() + 10_000;
  while (Date.now() < deadline) {
    const res = await fetch(`${inject('maildevUrl')}/api/email`);
    const mails = (await res.json()) as Array<{ subject: string; text: string; to: Array<{ address: string }> }>;
    const mail = mails.find((m) => m.subject === subject && m.to.some((t) => t.address === to));
    if (mail) return mail;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`no mail "${subject}" to ${to} arrived`);
}

describe('in a real browser', () => {
  it('when a new shop signs up through the form, then it lands on its dashboard and can confirm its e-mail from the real mail', async () => {
    const email = uniqueEmail('browser-shop');
    await page.goto(url('/signup'));
    await page.getByRole('radio', { name: /I run a machine shop/ }).check();
    await page.getByLabel('Your name or business name').fill('Harrow Lane Cylinder Works');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill('shop floor password');
    await page.getByLabel('I accept the terms of use and the privacy notice').check();
    await page.getByRole('button', { name: 'Create my account' }).click();

    await page.waitForURL(url('/dashboard'));
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('Your shop floor');
    await expect(page.getByTestId('signed-in-as').textContent()).resolves.toContain('Harrow Lane Cylinder Works');
    await expect(page.getByText('Please confirm your e-mail address').isVisible()).resolves.toBe(true);
    await page.screenshot({ path: join(artifactsDir, 'dashboard-after-sign-up.png'), fullPage: true });

    // The verification mail went through the outbox, over SMTP, into maildev.
    const mail = await waitForMail(email, 'Confirm your e-mail address for Tenthmark');
    const link = /https?:\/\/\S+\/verify-email\?token=[\w-]+/.exec(mail.text)![0];
    await page.goto(url(new URL(link).pathname + new URL(link).search));
    await page.getByText('Confirmed').waitFor();
    await page.goto(url('/dashboard'));
    await page.getByText('(confirmed)').waitFor();
    expect(consoleErrors).toEqual([]);
  });

  it('when a new builder has not confirmed the e-mail address, then the dashboard and the draft say why publishing waits, the link can be sent again, and after following it the job publishes', async () => {
    const email = uniqueEmail('browser-builder');
    await page.goto(url('/signup'));
    await page.getByRole('radio', { name: /I build engines/ }).check();
    await page.getByLabel('Your name or business name').fill('Corwen Thistlebank');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill('engine bench password');
    await page.getByLabel('I accept the terms of use and the privacy notice').check();
    await page.getByRole('button', { name: 'Create my account' }).click();
    await page.waitForURL(url('/dashboard'));

    // The dashboard says what waits and why, and sends the link again on request.
    const notice = page.getByRole('status').filter({ hasText: 'Please confirm your e-mail address' });
    await expect(notice.textContent()).resolves.toContain('publishing a job and paying wait until you confirm it');
    await notice.getByRole('button', { name: 'Send the link again' }).click();
    await notice.getByText('A new link is on its way. Check your inbox.').waitFor();

    // A draft (saving one needs no confirmation); on its page Publish waits, with the reason beside it.
    const { id } = await page.evaluate(async (input) => {
      const { csrfToken } = (await (await fetch('/api/auth/csrf')).json()) as { csrfToken: string };
      const res = await fetch('/api/jobs', { method: 'POST', headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': csrfToken }, body: JSON.stringify(input) });
      return ((await res.json()) as { job: { id: string } }).job;
    }, jobInput({ title: 'Unconfirmed builder draft' }));
    await page.goto(url(`/jobs/${id}`));
    const publishNotice = page.getByRole('status').filter({ hasText: 'Confirm your e-mail address to publish' });
    await expect(publishNotice.textContent()).resolves.toContain('Shops rely on reaching you');
    await expect(publishNotice.textContent()).resolves.toContain(email);
    await publishNotice.getByRole('button', { name: 'Send the link again' }).waitFor();
    await expect(page.getByRole('button', { name: 'Publish', exact: true }).isDisabled()).resolves.toBe(true);
    await page.screenshot({ path: join(artifactsDir, 'publish-waits-for-confirmation.png'), fullPage: true });

    // The link from the real mail confirms the address; then the draft publishes.
    await page.goto(url((await confirmationLink(email)).path));
    await page.getByText('Confirmed').waitFor();
    await page.goto(url(`/jobs/${id}`));
    await page.getByRole('button', { name: 'Publish', exact: true }).click();
    await page.getByText('Published. Shops can see the job on the board now.').waitFor();
    await expect(page.getByText('Confirm your e-mail address to publish').count()).resolves.toBe(0);
    expect(consoleErrors).toEqual([]);
  });

  it('when the sign-up form is sent with mistakes, then each message shows beside its field and the typed values stay', async () => {
    await page.goto(url('/signup'));
    await page.getByLabel('E-mail').fill('not-an-address');
    await page.getByLabel('Password').fill('short');
    await page.getByRole('button', { name: 'Create my account' }).click();

    await page.getByText('Use at least 10 characters.').waitFor();
    await page.getByText('Enter a valid e-mail address, like name@example.com.').waitFor();
    await page.getByText('Choose whether you build engines or run a machine shop.').waitFor();
    await expect(page.getByLabel('E-mail').inputValue()).resolves.toBe('not-an-address');
    await expect(page.getByLabel('E-mail').getAttribute('aria-invalid')).resolves.toBe('true');
    expect(page.url()).toBe(url('/signup'));
    await page.screenshot({ path: join(artifactsDir, 'sign-up-errors.png'), fullPage: true });
  });

  it('when a demo builder signs in through the form, then the dashboard greets them; a wrong password shows the server message', async () => {
    const builder = demoAccounts.find((a) => a.role === 'builder')!;
    await page.goto(url('/signin'));
    await page.getByLabel('E-mail').fill(builder.email);
    await page.getByLabel('Password').fill('not the demo password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('That e-mail and password do not match an account.').waitFor();

    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(url('/dashboard'));
    await expect(page.getByTestId('signed-in-as').textContent()).resolves.toContain(builder.displayName);
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('Your workbench');

    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(url('/'));
    await page.goto(url('/dashboard'));
    await page.waitForURL(/\/signin\?returnTo=%2Fdashboard$/);
  });

  it('when a suspended account is refused at sign-in, then the page says how to reach us: the support address and the help page', async () => {
    // The GitHub sign-in comes back with ?error=suspended; a password sign-in shows the same line under the server's message.
    await page.goto(url('/signin?error=suspended'));
    const notice = page.getByText('This account is suspended.', { exact: false });
    await notice.waitFor();
    const contact = page.getByTestId('contact-line');
    await contact.getByRole('link', { name: 'help@tenthmark.test' }).waitFor();
    await expect(contact.getByRole('link', { name: 'help@tenthmark.test' }).getAttribute('href')).resolves.toBe('mailto:help@tenthmark.test');
    await contact.getByRole('link', { name: 'help page' }).click();
    await page.waitForURL(url('/help'));
    await page.getByRole('heading', { name: 'How do I reach Tenthmark’s people?' }).waitFor();
    await page.getByTestId('contact-line').getByRole('link', { name: 'help@tenthmark.test' }).waitFor();
    expect(consoleErrors, consoleErrors.join('\n')).toEqual([]);
  });

  it('when the demo admin adds an administrator, then the newcomer shows in the people list; a builder cannot open that page', async () => {
    const admin = demoAccounts.find((a) => a.role === 'admin')!;
    await suite.signIn(page, admin.email, '/admin/people');
    await page.getByText(/^\d+ accounts$/).waitFor();

    const email = uniqueEmail('staff');
    const form = page.getByRole('form', { name: 'Add an administrator' });
    await form.getByLabel('Name').fill('Wren Ashcombe');
    await form.getByLabel('E-mail').fill(email);
    await form.getByRole('button', { name: 'Add administrator' }).click();
    await page.getByText('Wren Ashcombe is an administrator now').waitFor();
    await page.getByRole('cell', { name: email }).waitFor();
    await page.screenshot({ path: join(artifactsDir, 'admin-people.png'), fullPage: true });
    await waitForMail(email, 'You have a Tenthmark staff account');

    const builderContext = await suite.browser.newContext();
    const builderPage = await builderContext.newPage();
    const builder = demoAccounts.find((a) => a.role === 'builder')!;
    await builderPage.goto(url('/signin?returnTo=%2Fadmin%2Fpeople'));
    await builderPage.getByLabel('E-mail').fill(builder.email);
    await builderPage.getByLabel('Password').fill(DEMO_PASSWORD);
    await builderPage.getByRole('button', { name: 'Sign in' }).click();
    await builderPage.getByText('Not for your account').waitFor();
    await expect(builderPage.getByRole('link', { name: 'People' }).count()).resolves.toBe(0);
    await builderContext.close();
  });

  it('when an unknown page is opened, then the 404 page shows inside the layout', async () => {
    await page.goto(url('/no/such/page'));
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe('Page not found');
    await expect(page.getByRole('link', { name: 'Go to the front page' }).isVisible()).resolves.toBe(true);
  });
});
