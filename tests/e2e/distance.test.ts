import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { createDb, createPool } from '../../server/db/client';
import { buildDemoScenario } from '../../server/dev/demo-scenario';
import { browserSuite } from '../setup/e2e-suite';
import { artifactsDir } from '../setup/browser';

/**
 * Distances as a shop and a builder see them, on the demo scenario (every demo
 * shop and job has a real town's postal code): each board row says how far the
 * parts are, "within" narrows the board, and each bid says how far the shop is.
 */
const suite = browserSuite();
const shopEmail = 'bench@lanternhill.test'; // Dayton, Ohio
const builderEmail = 'juno@builders.test';
const OPEN_JOB = 'Iron small-block V8: bore .030 over, torque-plate hone, deck'; // Columbus, Ohio, with three bids

beforeAll(async () => {
  const pool = createPool(suite.app.databaseUrl, 2);
  try {
    await buildDemoScenario({ appUrl: suite.app.server.url, db: createDb(pool) });
  } finally {
    await pool.end();
  }
}, 240_000);

describe('distances on the board and on bids', () => {
  it('when the demo shop sorts the board by distance and narrows it to 100 miles, then each row says how far away it is', async () => {
    const page = await suite.pageFor(shopEmail, '/board?sort=distance');
    const table = page.getByRole('table');
    await table.getByText(OPEN_JOB).waitFor();
    const first = await table.getByTestId('job-distance').first().textContent();
    expect(first).toMatch(/^\d+(\.\d)? miles away$/);
    await page.getByLabel('Within (miles of your shop)').fill('100');
    await page.waitForURL(/within=100/);
    await expect.poll(async () => page.getByTestId('board-total').textContent()).toMatch(/match(es)? these filters/);
    // The rows of the earlier answer stay on screen until the narrowed one arrives.
    const shown = async () => (await table.getByTestId('job-distance').allTextContents()).map((text) => Number(text.replace(/[^\d.]/g, '')));
    await expect.poll(async () => { const now = await shown(); return now.length > 0 && now.every((d) => d <= 100); }).toBe(true);
    const distances = await shown();
    expect(distances.length).toBeGreaterThan(0);
    expect([...distances].sort((a, b) => a - b)).toEqual(distances);
    await page.screenshot({ path: join(artifactsDir, 'board-within-100-miles.png'), fullPage: true });
  });

  it('when the builder compares the bids on the open demo job, then each says how far the shop is from the parts', async () => {
    const page = await suite.pageFor(builderEmail, '/dashboard');
    await page.getByRole('link', { name: OPEN_JOB }).first().click();
    await page.getByTestId('bid-distance').first().waitFor();
    const texts = await page.getByTestId('bid-distance').allTextContents();
    expect(texts.length).toBeGreaterThanOrEqual(3);
    for (const text of texts) expect(text).toMatch(/· \d[\d,.]* miles from the parts$/);
    await page.screenshot({ path: join(artifactsDir, 'bids-with-distance.png'), fullPage: true });
  });

  it('when the demo shop opens a job, then the job page says how far it is from the shop', async () => {
    const page = await suite.pageFor(shopEmail, '/board');
    await page.getByRole('table').getByRole('link', { name: OPEN_JOB }).click();
    await expect.poll(async () => page.getByText(/miles from your shop$/).first().textContent()).toMatch(/^\d[\d,.]* miles from your shop$/);
  });

  it('when the builder opens the shop directory, then the shops nearest their latest job come first, and another postal code can be typed', async () => {
    const page = await suite.pageFor(builderEmail, '/shops');
    await expect.poll(async () => page.getByTestId('directory-origin').textContent()).toMatch(/^Nearest to \d{5} \(your latest job\) first/);
    const distances = (await page.getByTestId('shop-distance').allTextContents()).map((text) => Number(text.replace(/[^\d.]/g, '')));
    expect(distances.length).toBeGreaterThan(0);
    expect([...distances].sort((a, b) => a - b)).toEqual(distances);
    await page.getByLabel('Near postal code').fill('45402');
    await page.waitForURL(/near=45402/);
    await expect.poll(async () => page.getByTestId('directory-origin').textContent()).toMatch(/^Nearest to 45402 first/);
    await page.screenshot({ path: join(artifactsDir, 'directory-near-latest-job.png'), fullPage: true });
  });
});
