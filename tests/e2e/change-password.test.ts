import { describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, demoAccounts } from '../../server/dev/seed';
import { browserSuite } from '../setup/e2e-suite';

const suite = browserSuite();
const builder = demoAccounts.find((a) => a.email === 'teodor@builders.test')!;

describe('changing the password in the browser', () => {
  it('when the signed-in person changes it on the Settings page, then a wrong current password is marked beside its field, and on success the other devices are signed out at once', async () => {
    const otherDevice = await suite.apiAs(builder.email);
    expect(await otherDevice<{ user: { email: string } }>('GET', '/api/auth/me')).toMatchObject({ user: { email: builder.email } });
    // Another browser, open on the dashboard with its live connection up.
    const otherBrowser = await suite.pageFor(builder.email, '/dashboard');
    await expect.poll(() => otherBrowser.getByTestId('signed-in-as').isVisible()).toBe(true);

    const page = await suite.pageFor(builder.email, '/dashboard');
    await page.getByRole('link', { name: 'Settings' }).click();
    await page.waitForURL(suite.url('/settings'));
    const form = page.getByRole('form', { name: 'Change password' });

    await form.getByLabel('Current password').fill('not my password at all');
    await form.getByLabel('New password', { exact: true }).fill('a fresh garage password');
    await form.getByLabel('New password again').fill('a fresh garage password');
    await form.getByRole('button', { name: 'Change password' }).click();
    await expect.poll(() => form.getByText('This is not your current password.').isVisible()).toBe(true);
    await expect.poll(() => form.getByLabel('Current password').getAttribute('aria-invalid')).toBe('true');

    await form.getByLabel('New password again').fill('a different password');
    await form.getByLabel('Current password').fill(DEMO_PASSWORD);
    await form.getByRole('button', { name: 'Change password' }).click();
    await expect.poll(() => form.getByText('The two new passwords differ.').isVisible()).toBe(true);

    await form.getByLabel('New password again').fill('a fresh garage password');
    await form.getByRole('button', { name: 'Change password' }).click();
    await expect.poll(() => page.getByText('Password changed. Your other devices are signed out.').isVisible()).toBe(true);

    await expect(otherDevice('GET', '/api/auth/me')).rejects.toThrow(/401/);
    // The other browser hears its socket close and shows itself signed out, without a reload.
    await expect.poll(() => otherBrowser.getByRole('link', { name: 'Sign in' }).first().isVisible(), { timeout: 10_000 }).toBe(true);
    expect(await otherBrowser.getByTestId('signed-in-as').count()).toBe(0);
    // This browser stays signed in.
    await page.reload();
    await expect.poll(() => page.getByTestId('signed-in-as').textContent()).toContain(builder.displayName);
    // The browser logs the refused attempt's 400 itself; nothing else went wrong.
    expect(suite.consoleErrors.filter((line) => !/status of 400/.test(line))).toEqual([]);
  });
});
