import { request, type APIRequestContext, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, expect } from 'vitest';
import type { JobDetail, JobInput } from '../../shared/schemas/jobs';
import { DEMO_PASSWORD } from '../../server/dev/seed';
import { bidInput, jobInput, shopProfileInput } from '../factories';
import { launchBrowser, startBrowserApp } from './browser';
import { completeOnboardingPage, payOnPage } from './payments';

export type Api = <T>(method: 'GET' | 'POST' | 'PUT', path: string, data?: unknown) => Promise<T>;

/**
 * One browser and one app (production build, demo accounts, payment stand-in)
 * for a browser test file, with signed-in pages and API sessions per person
 * and console errors collected. Call at the top of the file.
 */
export function browserSuite() {
  let browser: Browser;
  let app: Awaited<ReturnType<typeof startBrowserApp>>;
  const contexts: BrowserContext[] = [];
  const apiSessions: APIRequestContext[] = [];
  const consoleErrors: string[] = [];

  beforeAll(async () => {
    [browser, app] = await Promise.all([launchBrowser(), startBrowserApp()]);
  });
  afterAll(async () => {
    await Promise.all(apiSessions.map((session) => session.dispose()));
    await browser?.close();
    await app?.close();
  });
  afterEach(async () => {
    await Promise.all(contexts.splice(0).map((context) => context.close()));
  });

  const url = (path: string) => `${app.server.url}${path}`;

  /** A signed-in API session outside the browser; it sends the CSRF token. */
  async function apiAs(email: string): Promise<Api> {
    const session = await request.newContext({ baseURL: app.server.url });
    apiSessions.push(session);
    let token: string = (await (await session.get('/api/auth/csrf')).json()).csrfToken;
    const res = await session.post('/api/auth/login', { data: { email, password: DEMO_PASSWORD }, headers: { 'X-CSRF-Token': token } });
    if (!res.ok()) throw new Error(`could not sign in: ${res.status()} ${await res.text()}`);
    token = (await res.json()).csrfToken;
    return async <T>(method: 'GET' | 'POST' | 'PUT', path: string, data: unknown = {}): Promise<T> => {
      const answer = await session.fetch(path, { method, ...(method === 'GET' ? {} : { data }), headers: { 'X-CSRF-Token': token } });
      if (!answer.ok()) throw new Error(`${method} ${path} answered ${answer.status()}: ${await answer.text()}`);
      return answer.json() as Promise<T>;
    };
  }

  /** A signed-in browser page in a context of its own, landing on `returnTo`. */
  async function pageFor(email: string, returnTo: string, viewport = { width: 1280, height: 900 }): Promise<Page> {
    const context = await browser.newContext({ viewport });
    context.setDefaultTimeout(10_000);
    contexts.push(context);
    const page = await context.newPage();
    page.on('console', (msg) => {
      if (msg.location().url.startsWith(app.payments.url)) return;
      if (msg.type() === 'error' && !/401/.test(msg.text())) consoleErrors.push(`${email}: ${msg.text()}`);
    });
    page.on('pageerror', (err) => consoleErrors.push(`${email}: ${err.message}`));
    await page.goto(url(`/signin?returnTo=${encodeURIComponent(returnTo)}`));
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(url(returnTo));
    return page;
  }

  /**
   * A job posted by `builderEmail`, bid on by `shopEmail` (payouts set up on
   * the stand-in), accepted and paid with the success card: funded and held.
   */
  async function fundedJob(builderEmail: string, shopEmail: string, input: Partial<JobInput> = {}) {
    const builder = await apiAs(builderEmail);
    const shop = await apiAs(shopEmail);
    const { job } = await builder<{ job: JobDetail }>('POST', '/api/jobs', jobInput(input));
    await builder('POST', `/api/jobs/${job.id}/publish`);
    const own = await shop<{ shop: { payouts: string; name: string } }>('GET', '/api/shop-profile').catch(() => null);
    if (!own) await shop('PUT', '/api/shop-profile', shopProfileInput({ capabilities: ['clean', 'bore', 'hone', 'deck'] }));
    if (own?.shop.payouts !== 'ready') {
      const { url: onboarding } = await shop<{ url: string }>('POST', '/api/shop-profile/payouts');
      await completeOnboardingPage(onboarding);
      await expect.poll(async () => (await shop<{ shop: { payouts: string } }>('GET', '/api/shop-profile')).shop.payouts, { timeout: 8_000 }).toBe('ready');
    }
    const { bid } = await shop<{ bid: { id: string; totalCents: number } }>('POST', `/api/jobs/${job.id}/bids`, bidInput());
    await builder('POST', `/api/bids/${bid.id}/accept`);
    const { url: checkout } = await builder<{ url: string }>('POST', `/api/jobs/${job.id}/checkout`);
    await payOnPage(checkout, '4242424242424242');
    await expect.poll(async () => (await builder<{ job: JobDetail }>('GET', `/api/jobs/${job.id}`)).job.status, { timeout: 10_000 }).toBe('funded');
    return { job, bid, builder, shop };
  }

  return {
    url,
    apiAs,
    pageFor,
    fundedJob,
    consoleErrors,
    get app() {
      return app;
    },
  };
}
