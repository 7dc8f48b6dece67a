import type { Page, Route } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { demoAccounts } from '../../server/dev/seed';
import { browserSuite } from '../setup/e2e-suite';

const suite = browserSuite();
const { consoleErrors } = suite;
const shopEmail = demoAccounts.find((a) => a.email === 'bench@lanternhill.test')!.email;

/** Holds the requests matching `pattern` until `release()` is called; `held` resolves once one has arrived. */
async function holdRequests(page: Page, pattern: string | RegExp) {
  let release!: () => void;
  const released = new Promise<void>((resolve) => (release = resolve));
  let arrived!: () => void;
  const held = new Promise<void>((resolve) => (arrived = resolve));
  // Registered later, it answers before an earlier hold of the same requests.
  await page.route(pattern, async (route: Route) => {
    arrived();
    await released;
    await route.continue();
  });
  return { held, release };
}

const bar = (page: Page) => page.getByRole('progressbar', { name: 'Loading page' });

describe('the page-change progress bar, in a real browser', () => {
  it('when the next page’s code is slow to come, then a bar says the page is loading, and goes once the page shows', async () => {
    const page = await suite.newPage();
    await page.goto(suite.url('/'));
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    expect(await bar(page).count()).toBe(0);

    const chunk = await holdRequests(page, /\/assets\/help-[^/]*\.js$/);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Help' }).click();
    await chunk.held;
    await bar(page).waitFor();
    // Still on the page it came from: nothing of Help is shown yet.
    expect(await page.getByRole('heading', { name: 'Help', level: 1 }).count()).toBe(0);

    chunk.release();
    await page.getByRole('heading', { name: 'Help', level: 1 }).waitFor();
    await bar(page).waitFor({ state: 'detached' });
    expect(consoleErrors).toEqual([]);
  });

  it('when the new page’s first data is slow, then the bar shows until it has come; coming back to data already here shows none', async () => {
    const page = await suite.pageFor(shopEmail, '/dashboard');
    const mainNav = page.getByRole('navigation', { name: 'Main' });
    await mainNav.waitFor();
    const loaded = page.getByText(/Loading your bids/);

    const first = await holdRequests(page, /\/api\/bids\/mine(\?|$)/);
    await mainNav.getByRole('link', { name: 'My bids' }).click();
    await first.held;
    await page.getByRole('heading', { name: 'My bids', level: 1 }).waitFor();
    await bar(page).waitFor();
    first.release();
    await loaded.waitFor({ state: 'detached' });
    await bar(page).waitFor({ state: 'detached' });

    await mainNav.getByRole('link', { name: 'Shop floor' }).click();
    await page.waitForURL(suite.url('/dashboard'));
    await page.waitForLoadState('networkidle');
    // Back to My bids: its list is already here, so fetching it again is a background refresh and shows no bar,
    // however long it takes. Watch from inside the page so even a brief bar would be seen.
    await page.evaluate(() => {
      const seen = { bar: false };
      (window as unknown as { seen: typeof seen }).seen = seen;
      new MutationObserver(() => {
        if (document.querySelector('[role="progressbar"][aria-label="Loading page"]')) seen.bar = true;
      }).observe(document.body, { childList: true, subtree: true });
    });
    const again = await holdRequests(page, /\/api\/bids\/mine(\?|$)/);
    await mainNav.getByRole('link', { name: 'My bids' }).click();
    await page.getByRole('heading', { name: 'My bids', level: 1 }).waitFor();
    await again.held;
    await page.waitForTimeout(600);
    expect(await page.evaluate(() => (window as unknown as { seen: { bar: boolean } }).seen.bar)).toBe(false);
    again.release();
    await page.waitForLoadState('networkidle');
    expect(consoleErrors).toEqual([]);
  });
});
