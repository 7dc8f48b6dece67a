import { eq } from 'drizzle-orm';
import type { Page, Response } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, createPool } from '../../server/db/client';
import { jobs } from '../../server/db/schema';
import { buildDemoScenario } from '../../server/dev/demo-scenario';
import { browserSuite } from '../setup/e2e-suite';

/**
 * What a person sees while a page arrives: nothing on it jumps once the data
 * behind it comes (who is signed in, unread counts, the page's own queries),
 * and a signed-out visitor's browser reports no error and no refused request.
 * On the demo scenario (server/dev/demo-scenario.ts), as `npm start` builds it.
 */
const suite = browserSuite();
const builderEmail = 'juno@builders.test';
const shopEmail = 'bench@lanternhill.test';
/** The demo's open job with three bids and photos, and its job in the shop. */
const OPEN_JOB = 'Iron small-block V8: bore .030 over, torque-plate hone, deck';
const IN_WORK_JOB = 'Circle-track V8: bore, torque-plate hone, deck square';
const jobIds = new Map<string, string>();

// Source of the limit: web.dev, "Cumulative Layout Shift (CLS)" (Core Web Vitals): a CLS of 0.1 or
// less is "good". This is a check of layout, not of speed: a shift's size does not depend on how fast
// the machine is, only on what moves and how far.
const GOOD_CLS = 0.1;

let pool: ReturnType<typeof createPool>;
beforeAll(async () => {
  pool = createPool(suite.app.databaseUrl, 2);
  const db = createDb(pool);
  await buildDemoScenario({ appUrl: suite.app.server.url, db });
  for (const title of [OPEN_JOB, IN_WORK_JOB]) {
    const [job] = await db.select({ id: jobs.id }).from(jobs).where(eq(jobs.title, title));
    if (!job) throw new Error(`the demo scenario has no job "${title}"`);
    jobIds.set(title, job.id);
  }
}, 240_000);
afterAll(async () => {
  await pool?.end();
});

declare global {
  interface Window {
    __layoutShifts?: Array<{ value: number; sources: string[] }>;
  }
}

/**
 * Records every layout shift not caused by input from the first moment of each document, with the
 * elements that moved and how far, so a failure says what jumped.
 */
async function recordShifts(page: Page) {
  await page.addInitScript(() => {
    window.__layoutShifts = [];
    const describe = (node: Node | null) => {
      if (!(node instanceof Element)) return node ? node.nodeName : '(gone)';
      const id = node.getAttribute('data-testid') ?? node.id;
      const text = (node.textContent ?? '').trim().replace(/\s+/g, ' ').slice(0, 40);
      return `${node.tagName.toLowerCase()}${id ? `#${id}` : ''}.${[...node.classList].slice(0, 4).join('.')} "${text}"`;
    };
    new PerformanceObserver((list) => {
      for (const entry of list.getEntries() as Array<PerformanceEntry & { value: number; hadRecentInput: boolean; sources?: Array<{ node: Node | null; previousRect: DOMRectReadOnly; currentRect: DOMRectReadOnly }> }>) {
        if (entry.hadRecentInput) continue;
        const sources = (entry.sources ?? []).map((s) => `${describe(s.node)} ${Math.round(s.previousRect.y)}→${Math.round(s.currentRect.y)} (x ${Math.round(s.previousRect.x)}→${Math.round(s.currentRect.x)})`);
        window.__layoutShifts!.push({ value: entry.value, sources });
      }
    }).observe({ type: 'layout-shift', buffered: true });
  });
}

/** Opens `path` as a fresh load, waits until it has arrived and settled, and answers its layout shifts. */
async function shiftsOf(page: Page, path: string) {
  await page.goto(suite.url(path));
  await page.locator('main h1').first().waitFor();
  await page.waitForLoadState('networkidle');
  // Late arrivals (a lazily loaded panel, the live connection's first answers) have a moment to land.
  await page.waitForTimeout(1_500);
  const shifts = await page.evaluate(() => window.__layoutShifts ?? []);
  return { path, cls: Number(shifts.reduce((sum, s) => sum + s.value, 0).toFixed(4)), shifts };
}

describe('layout shift while a page arrives (desktop, 1280 × 900)', () => {
  it('when a visitor opens the landing page and the calculator, and a builder and a shop the board and demo job pages, then the cumulative layout shift of each stays under 0.1', async () => {
    const openJob = `/jobs/${jobIds.get(OPEN_JOB)}`;
    const inWork = `/jobs/${jobIds.get(IN_WORK_JOB)}`;
    const builder = await suite.pageFor(builderEmail, '/dashboard');
    await recordShifts(builder);
    const shop = await suite.pageFor(shopEmail, '/dashboard');
    await recordShifts(shop);
    const visitor = await suite.newPage();
    await recordShifts(visitor);

    const results = [
      await shiftsOf(visitor, '/'),
      await shiftsOf(visitor, '/calculator'),
      await shiftsOf(builder, openJob),
      await shiftsOf(builder, inWork),
      await shiftsOf(builder, '/dashboard'),
      await shiftsOf(shop, '/board'),
      await shiftsOf(shop, openJob),
      await shiftsOf(shop, inWork),
    ];
    const tooMuch = results.filter((r) => r.cls >= GOOD_CLS);
    expect(tooMuch, JSON.stringify(tooMuch, null, 1)).toEqual([]);
    expect(suite.consoleErrors).toEqual([]);
  }, 240_000);
});

describe('a signed-out visitor', () => {
  it('when they open the public pages, then the console shows no error and no request is answered with a 4xx', async () => {
    const page = await suite.newPage();
    const errors: string[] = [];
    const refused: string[] = [];
    page.on('console', (msg) => {
      if (msg.type() === 'error') errors.push(`${page.url()}: ${msg.text()}`);
    });
    page.on('response', (response: Response) => {
      if (response.status() >= 400 && response.status() < 500) refused.push(`${response.status()} ${response.request().method()} ${response.url()}`);
    });
    for (const path of ['/', '/board', '/calculator', '/shops', '/signin']) {
      await page.goto(suite.url(path));
      await page.locator('main h1').first().waitFor();
      await page.waitForLoadState('networkidle');
    }
    expect({ errors, refused }).toEqual({ errors: [], refused: [] });
  }, 120_000);
});

describe('who is signed in', () => {
  it('when a signed-in page loads, then the session is asked once, by the page itself before its code runs, and the app uses that answer', async () => {
    const page = await suite.pageFor(shopEmail, '/dashboard');
    const warnings: string[] = [];
    page.on('console', (msg) => {
      if (msg.type() === 'warning' || msg.type() === 'error') warnings.push(msg.text());
    });
    const asked: string[] = [];
    page.on('request', (request) => {
      if (new URL(request.url()).pathname === '/api/auth/session') asked.push(request.url());
    });
    await page.goto(suite.url('/board'));
    await page.locator('main h1').first().waitFor();
    await page.waitForLoadState('networkidle');
    // The preload was the only request, and the app read it (an unused preload makes Chromium warn).
    expect(asked).toHaveLength(1);
    const [entry] = await page.evaluate(() =>
      performance.getEntriesByType('resource').filter((e) => e.name.endsWith('/api/auth/session')).map((e) => (e as PerformanceResourceTiming).initiatorType),
    );
    expect(entry).toBe('link');
    await page.waitForTimeout(3_500);
    expect(warnings.filter((w) => /preload/i.test(w))).toEqual([]);
    // Signed in from that answer: the board did not send the shop to the sign-in page.
    expect(new URL(page.url()).pathname).toBe('/board');
  }, 120_000);
});
