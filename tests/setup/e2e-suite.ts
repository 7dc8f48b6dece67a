import type { Browser, BrowserContext, ConsoleMessage, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll } from 'vitest';
import type { JobInput } from '../../shared/schemas/jobs';
import { DEMO_PASSWORD } from '../../server/dev/seed';
import { agentFor, signedIn, type ApiClient } from './api-session';
import { launchBrowser, startBrowserApp } from './browser';
import { apiOf, jobInState, type Api, type JobState, type JobStateOptions } from './job-states';
import { confirmationLink } from './mail-links';

export type { Api };

/** Who an API session is for: a demo account (by e-mail), an account with its own password, or a new one signed up and confirmed. */
export type ApiAccount = string | { email: string; password?: string } | { signUp: { displayName: string; email: string; role: 'shop' | 'builder' } };

/** A signed-in API session's calls, plus photo uploads and the session itself. */
export type ApiSession = Api & { upload: (path: string, field: string, files: Array<{ buffer: Buffer; name: string; mimeType?: string }>) => Promise<unknown>; client: ApiClient };

export interface BrowserSuiteOptions {
  /** Settings over the test configuration, e.g. a lower rate limit a test must reach. */
  env?: Record<string, string>;
  /** Console errors the file expects and does not count (a 401 from /api/auth/me and the payment pages' own are never counted). */
  ignoreConsole?: (msg: ConsoleMessage) => boolean;
}

/**
 * One browser and one app (production build, demo accounts, payment stand-in)
 * for a browser test file, with pages (signed out or signed in) and API
 * sessions per person, jobs in any state, and console errors collected.
 * Call at the top of the file.
 */
export function browserSuite(options: BrowserSuiteOptions = {}) {
  let browser: Browser;
  let app: Awaited<ReturnType<typeof startBrowserApp>>;
  const contexts: BrowserContext[] = [];
  const consoleErrors: string[] = [];

  beforeAll(async () => {
    [browser, app] = await Promise.all([launchBrowser(), startBrowserApp(options.env)]);
  });
  afterAll(async () => {
    await browser?.close();
    await app?.close();
  });
  afterEach(async () => {
    await Promise.all(contexts.splice(0).map((context) => context.close()));
  });

  const url = (path: string) => `${app.server.url}${path}`;

  /** A signed-in API session outside the browser (tests/setup/api-session.ts); it sends the CSRF token. */
  async function apiAs(account: ApiAccount): Promise<ApiSession> {
    let client: ApiClient;
    if (typeof account === 'object' && 'signUp' in account) {
      client = await agentFor(app.server.url);
      const res = await client.post('/api/auth/signup', { ...account.signUp, password: 'a long enough test password', acceptTerms: true });
      if (res.status >= 300) throw new Error(`could not sign up: ${res.status} ${JSON.stringify(res.body)}`);
      // Bidding needs a confirmed address: follow the link from the real sign-up mail.
      const confirmed = await client.post('/api/auth/verify-email', { token: (await confirmationLink(account.signUp.email)).token });
      if (confirmed.status >= 300) throw new Error(`could not confirm the e-mail address: ${confirmed.status} ${JSON.stringify(confirmed.body)}`);
    } else {
      const { email, password = DEMO_PASSWORD } = typeof account === 'string' ? { email: account } : account;
      client = await signedIn(app.server.url, { email, password });
    }
    const upload = async (path: string, field: string, files: Array<{ buffer: Buffer; name: string; mimeType?: string }>) => {
      const res = await client.upload(path, field, files);
      if (res.status >= 300) throw new Error(`POST ${path} answered ${res.status}: ${JSON.stringify(res.body)}`);
      return res.body;
    };
    return Object.assign(apiOf(client), { upload, client });
  }

  /** A page in a context of its own, signed out, whose console errors are collected under `who`. */
  async function newPage(viewport = { width: 1280, height: 900 }, who = 'visitor'): Promise<Page> {
    const context = await browser.newContext({ viewport });
    // How long a wait (a locator, a full-page screenshot) may take before it fails. 10 s was short on
    // this 2-core machine under load: a full-page screenshot of the review page once took longer.
    context.setDefaultTimeout(20_000);
    contexts.push(context);
    return watch(await context.newPage(), who);
  }

  /** A signed-out page the size of a shop-floor tablet (768 × 1024), for a test of its own: the console errors so far are forgotten. */
  async function newTabletPage(): Promise<Page> {
    const page = await newPage({ width: 768, height: 1024 });
    consoleErrors.length = 0;
    return page;
  }

  /** Collects the page's errors and console errors into `consoleErrors`, under `who`. */
  function watch(page: Page, who = 'visitor'): Page {
    page.on('console', (msg) => {
      // The payment pages are not ours (they answer a decline with 402); a 401 from /api/auth/me marks a signed-out visitor.
      if (msg.location().url.startsWith(app.payments.url)) return;
      if (msg.type() !== 'error' || /401/.test(msg.text()) || options.ignoreConsole?.(msg)) return;
      consoleErrors.push(`${who}: ${msg.text()}`);
    });
    page.on('pageerror', (err) => consoleErrors.push(`${who}: ${err.message}`));
    return page;
  }

  /** Signs in on `page` through the sign-in form and waits to land on `returnTo`. */
  async function signIn(page: Page, email: string, returnTo: string, password = DEMO_PASSWORD) {
    await page.goto(url(`/signin?returnTo=${encodeURIComponent(returnTo)}`));
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill(password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(url(returnTo));
  }

  /** A signed-in browser page in a context of its own, landing on `returnTo`. */
  async function pageFor(email: string, returnTo: string, viewport = { width: 1280, height: 900 }): Promise<Page> {
    const page = await newPage(viewport, email);
    await signIn(page, email, returnTo);
    return page;
  }

  /** A job posted by `builderEmail` and taken by `shopEmail` into `state` (tests/setup/job-states.ts). */
  async function jobIn(state: JobState, builderEmail: string, shopEmail: string, stateOptions: JobStateOptions = {}) {
    const [builder, shop] = await Promise.all([apiAs(builderEmail), apiAs(shopEmail)]);
    const made = await jobInState(state, { builder, shop }, stateOptions);
    return { ...made, builder, shop };
  }

  /**
   * A job posted by `builderEmail`, bid on by `shopEmail` (payouts set up on
   * the stand-in), accepted and paid with the success card: funded and held.
   */
  const fundedJob = (builderEmail: string, shopEmail: string, input: Partial<JobInput> = {}) => jobIn('funded', builderEmail, shopEmail, { input });

  return {
    url,
    apiAs,
    newPage,
    newTabletPage,
    watch,
    signIn,
    pageFor,
    jobIn,
    fundedJob,
    consoleErrors,
    get app() {
      return app;
    },
    get browser() {
      return browser;
    },
  };
}
