import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { demoAccounts } from '../../server/dev/seed';
import { uniformRecordInput } from '../factories';
import { browserSuite } from '../setup/e2e-suite';

const suite = browserSuite();
const { consoleErrors } = suite;
const builderEmail = demoAccounts.find((a) => a.email === 'juno@builders.test')!.email;
const shopEmail = demoAccounts.find((a) => a.email === 'bench@lanternhill.test')!.email;

/** The unread count the bell says to a screen reader ("Notifications, 3 unread"; none when all is read). */
const bellCount = async (page: Page) => Number((await page.getByTestId('notification-bell').getAttribute('aria-label'))?.match(/(\d+) unread/)?.[1] ?? 0);

describe('needs you and the notification centre, in a real browser', () => {
  it('when the shop submits a record while the builder’s home page is open, then the bell counts it live and "results to review" shows with the time left', async () => {
    const title = 'Live notice check block';
    const { job, shop } = await suite.jobIn('inWork', builderEmail, shopEmail, { input: { title } });

    const page = await suite.pageFor(builderEmail, '/dashboard');
    await page.getByRole('heading', { name: 'Needs you' }).waitFor();
    await page.waitForFunction(() => !/Looking for what waits/.test(document.querySelector('main')?.textContent ?? ''));
    const review = page.locator('[data-kind="results-to-review"]', { hasText: title });
    expect(await review.count()).toBe(0);
    const before = await bellCount(page);
    const bellBox = await page.getByTestId('notification-bell').boundingBox();

    await shop('POST', `/api/jobs/${job.id}/inspection`, uniformRecordInput());

    // No reload: the socket tells the page, the bell counts and the list fetches what waits.
    await expect.poll(() => bellCount(page), { timeout: 10_000 }).toBe(before + 1);
    await expect.poll(() => review.count(), { timeout: 10_000 }).toBe(1);
    expect(await review.textContent()).toMatch(/Results to review.*review window/);
    expect(await review.textContent()).toMatch(/\d+ (day|hour)s? .*left/);
    expect(await review.getByRole('link', { name: title }).getAttribute('href')).toBe(`/jobs/${job.id}`);
    // It sits in the list named by the "Needs you" heading.
    expect(await page.getByRole('list', { name: 'Needs you' }).locator('[data-kind="results-to-review"]', { hasText: title }).count()).toBe(1);
    // The count sits over the bell's corner: the bell did not move or grow.
    expect(await page.getByTestId('notification-bell').boundingBox()).toEqual(bellBox);

    // The notification centre lists it unread; following it marks it read and the bell counts one fewer.
    await page.getByTestId('notification-bell').click();
    await page.getByRole('heading', { name: 'Notifications', level: 1 }).waitFor();
    const notice = page.getByTestId('notification').filter({ hasText: title }).first();
    await expect.poll(() => notice.getAttribute('data-unread')).toBe('true');
    expect(await notice.textContent()).toMatch(/submitted inspection results/);
    await notice.getByRole('link').click();
    await page.waitForURL(suite.url(`/jobs/${job.id}`));
    await expect.poll(() => bellCount(page)).toBe(before);
    await page.goBack();
    await expect.poll(() => notice.getAttribute('data-unread')).toBe('false');
    expect(consoleErrors).toEqual([]);
  });

  it('when the builder turns off an optional e-mail, then the choice is kept; receipts show as always sent', async () => {
    const page = await suite.pageFor(builderEmail, '/settings/notifications');
    const box = page.getByRole('checkbox', { name: 'A new job matches my shop' });
    await box.waitFor();
    expect(await page.getByRole('checkbox', { name: /Receipts/ }).isDisabled()).toBe(true);
    await box.uncheck();
    await page.getByRole('button', { name: 'Save e-mail choices' }).click();
    await page.getByText('Your e-mail choices are saved.').waitFor();
    await page.reload();
    await box.waitFor();
    expect(await box.isChecked()).toBe(false);
    expect(consoleErrors).toEqual([]);
  });
});
