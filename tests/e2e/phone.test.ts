import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { demoAccounts } from '../../server/dev/seed';
import { browserSuite } from '../setup/e2e-suite';

const suite = browserSuite();
const { consoleErrors } = suite;
const builderEmail = demoAccounts.find((a) => a.email === 'juno@builders.test')!.email;
const shopEmail = demoAccounts.find((a) => a.email === 'bench@lanternhill.test')!.email;
const adminEmail = demoAccounts.find((a) => a.role === 'admin')!.email;
const phone = { width: 390, height: 844 };

/** Opens `path` and waits until its heading shows and nothing is still loading. */
async function open(page: Page, path: string) {
  await page.goto(suite.url(path));
  await page.locator('main h1').first().waitFor();
  await page.waitForLoadState('networkidle');
}

/**
 * The paths among `paths` where the page is wider than the phone, with how
 * wide it is and the outermost element reaching past the screen's edge.
 */
async function tooWide(page: Page, paths: string[]) {
  const wide: Array<[string, number, string]> = [];
  for (const path of paths) {
    await open(page, path);
    const [width, culprit] = await page.evaluate((screenWidth) => {
      // Content scrolled inside its own container (with a positioned scroller, so its absolute parts are clipped too) does not count.
      const scrolled = (el: Element): boolean => el.parentElement?.closest('body *') && getComputedStyle(el.parentElement).overflowX !== 'visible' ? true : el.parentElement ? scrolled(el.parentElement) : false;
      const past = [...document.querySelectorAll('body *')].find((el) => el.getBoundingClientRect().right > screenWidth + 0.5 && !scrolled(el));
      const name = past ? `${past.tagName.toLowerCase()}.${[...past.classList].join('.')} "${past.textContent?.slice(0, 40)}"` : '';
      return [document.documentElement.scrollWidth, name] as const;
    }, phone.width);
    if (width > phone.width) wide.push([path, width, culprit]);
  }
  return wide;
}

describe('on a phone (390 × 844)', () => {
  it('when a builder, a shop, an admin and a visitor open each of their pages, then none is wider than the screen', async () => {
    const completed = await suite.jobIn('completed', builderEmail, shopEmail, { input: { title: 'Phone width check, accepted record' } });
    const inWork = await suite.jobIn('inWork', builderEmail, shopEmail, { input: { title: 'Phone width check, in the shop' } });
    const disputed = await suite.jobIn('disputed', builderEmail, shopEmail, { input: { title: 'Phone width check, disputed' } });
    const everyone = ['/calculator', '/help', '/settings', '/settings/notifications', '/notifications', '/dashboard', '/shops'];

    const builder = await suite.pageFor(builderEmail, '/dashboard', phone);
    const builderPaths = [...everyone, '/jobs', '/jobs/new', `/jobs/${completed.job.id}`, `/jobs/${inWork.job.id}`, `/jobs/${disputed.job.id}`, '/money', '/messages'];
    const shop = await suite.pageFor(shopEmail, '/dashboard', phone);
    const shopPaths = [...everyone, '/board', '/bids', '/queue', '/shop/profile', `/jobs/${completed.job.id}`, `/jobs/${inWork.job.id}/inspection/new`, '/money', '/messages'];
    const admin = await suite.pageFor(adminEmail, '/dashboard', phone);
    const adminPaths = ['/dashboard', '/admin/disputes', `/admin/disputes/${disputed.dispute!.id}`, '/admin/people', '/admin/shops', '/admin/ledger', '/admin/settings', '/admin/audit', `/jobs/${disputed.job.id}`];
    const visitor = await suite.newPage(phone);
    const visitorPaths = ['/', '/shops', '/calculator', '/help', '/terms', '/privacy', '/signin', '/signup'];

    expect({
      builder: await tooWide(builder, builderPaths),
      shop: await tooWide(shop, shopPaths),
      admin: await tooWide(admin, adminPaths),
      visitor: await tooWide(visitor, visitorPaths),
    }).toEqual({ builder: [], shop: [], admin: [], visitor: [] });
    expect(consoleErrors).toEqual([]);
  }, 300_000);

  it('when the shop scrolls the reading grid sideways, then the cylinder column stays in view', async () => {
    const { job } = await suite.jobIn('inWork', builderEmail, shopEmail, { input: { title: 'Phone reading grid check' } });
    const page = await suite.pageFor(shopEmail, `/jobs/${job.id}/inspection/new`, phone);
    const scroller = page.getByTestId('reading-grid-scroller').first();
    await scroller.waitFor();
    const cylinder = scroller.getByRole('rowheader', { name: '1', exact: true });
    const reading = scroller.locator('tbody tr').first().locator('input').first();
    const [cylinderBefore, readingBefore, edge] = await Promise.all([cylinder.boundingBox(), reading.boundingBox(), scroller.boundingBox()]);
    expect(await scroller.evaluate((el) => el.scrollWidth > el.clientWidth)).toBe(true);
    await scroller.evaluate((el) => el.scrollBy({ left: 200 }));
    await expect.poll(() => scroller.evaluate((el) => el.scrollLeft)).toBe(200);
    // The readings moved under it; the cylinder number only closed the small gap to the scroller's edge, where it sticks.
    expect((await reading.boundingBox())!.x).toBeCloseTo(readingBefore!.x - 200, 0);
    const cylinderAfter = (await cylinder.boundingBox())!;
    expect(cylinderAfter.x).toBeGreaterThanOrEqual(edge!.x);
    expect(cylinderAfter.x).toBeLessThanOrEqual(cylinderBefore!.x);
    expect(consoleErrors).toEqual([]);
  }, 120_000);

  it('when a builder opens the menu, then its links show, one navigates and closes it; Escape closes it and gives the focus back', async () => {
    const page = await suite.pageFor(builderEmail, '/dashboard', phone);
    const header = await page.locator('header').first().boundingBox();
    expect(header!.height).toBeLessThan(120);
    // The bell and the messages link (where the unread count shows) stay on the bar.
    expect(await page.getByTestId('notification-bell').isVisible()).toBe(true);
    expect(await page.getByRole('link', { name: /^Messages/ }).isVisible()).toBe(true);

    const button = page.getByRole('button', { name: 'Menu' });
    expect(await button.getAttribute('aria-expanded')).toBe('false');
    expect(await page.getByRole('navigation', { name: 'Main' }).count()).toBe(0);
    await button.click();
    expect(await button.getAttribute('aria-expanded')).toBe('true');
    const menu = page.locator(`#${await button.getAttribute('aria-controls')}`);
    expect(await menu.isVisible()).toBe(true);
    await menu.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Money' }).click();
    await page.waitForURL(suite.url('/money'));
    await expect.poll(() => button.getAttribute('aria-expanded')).toBe('false');
    expect(await menu.count()).toBe(0);

    await button.click();
    await menu.getByRole('link', { name: 'Settings' }).focus();
    await page.keyboard.press('Escape');
    expect(await button.getAttribute('aria-expanded')).toBe('false');
    expect(await page.evaluate(() => document.activeElement?.textContent?.trim())).toBe('Menu');
    expect(consoleErrors).toEqual([]);
  }, 120_000);
});
